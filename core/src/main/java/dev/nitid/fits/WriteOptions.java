package dev.nitid.fits;

import java.nio.file.Path;
import java.util.List;

/**
 * How to write a FITS file.
 *
 * @param bitpix          the stored type: −32 float32 (default, lossless for this library's images),
 *                        −64 float64, 8 unsigned 0..255, 16 unsigned 0..65535 stored with BZERO 32768 (FITS
 *                        Standard 4.0 Table 11), 32 signed 32-bit. Integer output rounds to nearest (ties
 *                        to even) and clips to the range; {@link WriteReport} tells how many pixels were
 *                        clipped (NaN counts as clipped and is written as 0)
 * @param overwrite       replace an existing output file; otherwise an existing output is refused
 * @param protectedInputs files that must never be written, compared as the same file through links and
 *                        {@code ..} (typically the inputs of the job)
 */
public record WriteOptions(int bitpix, boolean overwrite, List<Path> protectedInputs) {
    /** Validates BITPIX and copies the list. */
    public WriteOptions {
        if (bitpix != -32 && bitpix != -64 && bitpix != 8 && bitpix != 16 && bitpix != 32) {
            throw new IllegalArgumentException("output BITPIX " + bitpix
                    + " is not supported: use -32 (float32, default), -64, 8, 16 (unsigned) or 32");
        }
        protectedInputs = protectedInputs == null ? List.of() : List.copyOf(protectedInputs);
    }

    /** @return float32, no overwrite, no protected inputs */
    public static WriteOptions defaults() {
        return new WriteOptions(-32, false, List.of());
    }

    /**
     * @param overwrite whether an existing output may be replaced
     * @return a copy with that setting
     */
    public WriteOptions withOverwrite(boolean overwrite) {
        return new WriteOptions(bitpix, overwrite, protectedInputs);
    }

    /**
     * @param bitpix −32, −64, 8, 16 or 32
     * @return a copy with that output type
     */
    public WriteOptions withBitpix(int bitpix) {
        return new WriteOptions(bitpix, overwrite, protectedInputs);
    }

    /**
     * @param inputs files never to be written (input, copied)
     * @return a copy protecting those files
     */
    public WriteOptions withProtectedInputs(Path... inputs) {
        return new WriteOptions(bitpix, overwrite, List.of(inputs));
    }
}
