package dev.nitid.fits;

import dev.nitid.fits.FitsException.Kind;
import dev.nitid.fits.internal.HduScanner;
import dev.nitid.fits.internal.HduScanner.HduInfo;
import dev.nitid.fits.internal.HduScanner.Type;
import dev.nitid.image.Image;
import java.io.BufferedInputStream;
import java.io.EOFException;
import java.io.IOException;
import java.io.InputStream;
import java.math.BigInteger;
import java.nio.file.AccessDeniedException;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.util.OptionalDouble;
import java.util.zip.GZIPInputStream;
import java.util.zip.ZipException;
import nom.tam.util.FitsInputStream;
import nom.tam.util.Quantizer;

/**
 * Reads one image HDU of a FITS file ({@code .fits}, {@code .fit}, {@code .fts}, or any of them gzip
 * compressed: compression is recognised by its magic bytes 1F 8B, not by the name).
 *
 * <p>Accepted: BITPIX 8, 16, 32, 64, −32, −64; NAXIS 2, or NAXIS 3 with 1 to 4 planes (colour as planes),
 * or more axes when all beyond the third have length 1. Pixels become float32 physical values
 * {@code BZERO + BSCALE × stored} (FITS Standard 4.0 §5.3); integer pixels equal to BLANK become NaN
 * (§5.3, BLANK is ignored for floating-point data, where the standard forbids it); NaN and ±Inf are kept
 * and counted in {@link FitsImage#maskedPixels()}.
 *
 * <p>Validation happens before allocation (see {@link HduScanner}): a damaged, truncated or hostile file
 * gives a {@link FitsException}, never an {@link OutOfMemoryError}. The memory check compares the float32
 * planes needed, times {@link ReadOptions#workingCopies()}, with 90 % of the largest heap the JVM may use.
 *
 * <p>Stateless and thread-safe.
 */
public final class FitsReader {
    /** Largest number of planes read: 1 (grey) to 4 (e.g. RGB plus a luminance or alpha plane). */
    public static final int MAX_PLANES = 4;
    /**
     * Share of the maximum heap the decoded planes may take. The rest is left for the JVM and for the work
     * done on the image; a job needing several copies checks again itself. Common practice, no source.
     */
    static final double HEAP_SHARE = 0.9;
    private static final int GZIP_BUFFER = 1 << 16;

    private FitsReader() {
    }

    /**
     * Reads the first HDU holding image data.
     *
     * @param file the file (input, not modified)
     * @return the image, its header and where it came from
     * @throws FitsException if the file is missing, unreadable, not valid FITS, or too large for the heap
     */
    public static FitsImage read(Path file) throws FitsException {
        return read(file, ReadOptions.defaults());
    }

    /**
     * Reads the HDU chosen by {@code options}.
     *
     * @param file    the file (input, not modified)
     * @param options which HDU
     * @return the image, its header and where it came from
     * @throws FitsException if the file is missing, unreadable, not valid FITS, holds no usable image in
     *                       the chosen HDU, or is too large for the heap
     */
    public static FitsImage read(Path file, ReadOptions options) throws FitsException {
        if (file == null || options == null) {
            throw new IllegalArgumentException("file and options must not be null");
        }
        long length = checkReadable(file);
        try (InputStream raw = Files.newInputStream(file)) {
            BufferedInputStream buffered = new BufferedInputStream(raw, GZIP_BUFFER);
            buffered.mark(2);
            int b0 = buffered.read();
            int b1 = buffered.read();
            buffered.reset();
            boolean gzip = b0 == 0x1F && b1 == 0x8B;
            InputStream in = gzip ? new BufferedInputStream(new GZIPInputStream(buffered, GZIP_BUFFER), GZIP_BUFFER)
                    : buffered;
            return scan(file, new HduScanner(file, in, gzip ? -1 : length), options);
        } catch (ZipException | EOFException e) {
            throw new FitsException(Kind.BAD_DATA, file, -1, null, "the gzip compression is damaged or cut short ("
                    + e.getMessage() + ") (copy the file again, or test it with 'gzip -t')", e);
        } catch (IOException e) {
            throw new FitsException(Kind.UNREADABLE, file, -1, null, "reading failed: " + e
                    + " (check the disk and the file's permissions)", e);
        }
    }

    private static long checkReadable(Path file) throws FitsException {
        if (Files.isDirectory(file)) {
            throw new FitsException(Kind.UNREADABLE, file, -1, null,
                    "this is a folder, not a file (give the path of a FITS file)");
        }
        try {
            return Files.size(file);
        } catch (NoSuchFileException e) {
            throw new FitsException(Kind.NOT_FOUND, file, -1, null,
                    "the file does not exist (check the name and the folder)", e);
        } catch (AccessDeniedException e) {
            throw new FitsException(Kind.UNREADABLE, file, -1, null,
                    "permission to read the file is denied (check its permissions)", e);
        } catch (IOException e) {
            throw new FitsException(Kind.UNREADABLE, file, -1, null, "the file cannot be read: " + e
                    + " (check the path and the disk)", e);
        }
    }

    private static FitsImage scan(Path file, HduScanner scanner, ReadOptions options)
            throws FitsException, IOException {
        int wanted = options.hdu();
        String skippedWhy = null;
        int compressedAt = -1;
        for (int index = 0; ; index++) {
            HduInfo hdu = scanner.next(index);
            if (hdu == null) {
                if (wanted >= 0) {
                    throw new FitsException(Kind.BAD_DATA, file, wanted, null, "there is no HDU " + wanted
                            + ": the file holds HDUs 0 to " + (index - 1) + " (choose one of those)");
                }
                if (compressedAt >= 0) {
                    throw new FitsException(Kind.BAD_DATA, file, compressedAt, "ZIMAGE", "the only image is "
                            + "tile-compressed, which is not supported (decompress it first, e.g. with funpack)");
                }
                throw new FitsException(Kind.BAD_DATA, file, -1, null, "no HDU holds image data"
                        + (skippedWhy == null ? "" : " (" + skippedWhy + ")")
                        + " (check that this is an image and not a table or an empty header)");
            }
            if (wanted == index || (wanted < 0 && hdu.type() == Type.IMAGE)) {
                return decode(file, scanner, hdu, options.workingCopies());
            }
            if (hdu.type() == Type.EMPTY && hdu.axes().length > 0 && skippedWhy == null) {
                skippedWhy = "HDU " + index + " has " + HduScanner.describeAxes(hdu.axes()) + ", which is empty";
            }
            if (hdu.type() == Type.COMPRESSED_IMAGE && compressedAt < 0) {
                compressedAt = index;
            }
            scanner.skipData(hdu);
        }
    }

    private static FitsImage decode(Path file, HduScanner scanner, HduInfo hdu, int copies)
            throws FitsException, IOException {
        int index = hdu.index();
        long[] axes = hdu.axes();
        switch (hdu.type()) {
            case IMAGE -> { }
            case EMPTY -> throw new FitsException(Kind.BAD_DATA, file, index, "NAXIS", "this HDU holds no pixels ("
                    + HduScanner.describeAxes(axes) + ") (choose another HDU, or leave --hdu out to take the "
                    + "first image)");
            case COMPRESSED_IMAGE -> throw new FitsException(Kind.BAD_DATA, file, index, "ZIMAGE", "this HDU is a "
                    + "tile-compressed image, which is not supported (decompress it first, e.g. with funpack)");
            default -> throw new FitsException(Kind.BAD_DATA, file, index, "XTENSION", "this HDU is a "
                    + hdu.xtension() + " extension, not an image (choose an image HDU)");
        }
        if (axes.length < 2) {
            throw new FitsException(Kind.BAD_DATA, file, index, "NAXIS", "the image is one-dimensional (NAXIS = 1),"
                    + " but a 2-D image is needed (give a file with NAXIS = 2 or 3)");
        }
        for (int i = 3; i < axes.length; i++) {
            if (axes[i] != 1) {
                throw new FitsException(Kind.BAD_DATA, file, index, "NAXIS", "the data have " + axes.length
                        + " axes (" + HduScanner.describeAxes(axes) + "), but only 2-D images and cubes of 1 to "
                        + MAX_PLANES + " planes are handled (extract one plane or cube first)");
            }
        }
        long planesL = axes.length >= 3 ? axes[2] : 1;
        if (planesL > MAX_PLANES) {
            throw new FitsException(Kind.BAD_DATA, file, index, "NAXIS3", "the cube has " + planesL
                    + " planes, but only 1 to " + MAX_PLANES + " (colour channels) are handled "
                    + "(extract the planes you need first)");
        }
        long width = axes[0];
        long height = axes[1];
        int planes = (int) planesL;
        if (width * height > Integer.MAX_VALUE - 8) {
            throw new FitsException(Kind.TOO_LARGE, file, index, "NAXIS", "a plane of " + width + " x " + height
                    + " pixels exceeds the 2^31-pixel limit of one image plane (process a smaller region)");
        }
        long need = 4L * width * height * planes;
        long max = Runtime.getRuntime().maxMemory();
        if ((double) need * copies > HEAP_SHARE * max) {
            throw tooLarge(file, index, width, height, planes, need * copies, max, null);
        }
        Image image;
        try {
            image = Image.create((int) width, (int) height, planes);
        } catch (OutOfMemoryError e) {
            throw tooLarge(file, index, width, height, planes, need, max, e);
        }
        Quantizer q = quantizer(file, hdu);
        long masked = readPixels(scanner, hdu, image, q);
        return new FitsImage(image, FitsHeader.of(hdu.cards()), index, hdu.bitpix(), masked);
    }

    private static FitsException tooLarge(Path file, int index, long w, long h, int planes, long need, long max,
                                          Throwable cause) {
        return new FitsException(Kind.TOO_LARGE, file, index, null, "the job on this image (" + w + " x " + h
                + (planes > 1 ? " x " + planes : "") + " pixels) needs about " + mib(need) + " MiB but the "
                + "Java heap is limited to " + mib(max) + " MiB (raise the heap with -Xmx, or crop the image)",
                cause);
    }

    private static long mib(long bytes) {
        return (bytes + (1 << 20) - 1) >> 20;
    }

    private static Quantizer quantizer(Path file, HduInfo hdu) throws FitsException {
        double scale = number(file, hdu, "BSCALE", 1.0);
        double zero = number(file, hdu, "BZERO", 0.0);
        Long blank = null;
        if (hdu.bitpix() > 0 && hdu.card("BLANK") != null) {
            double b = number(file, hdu, "BLANK", Double.NaN);
            // BLANK names a stored integer value (FITS Standard 4.0 §4.4.2.5), so it must be an integer
            // (§4.2.3) within the range of the data type; 3.5 or 1E30 would silently match no pixel.
            if (!Double.isNaN(b)) {
                int bits = hdu.bitpix();
                BigInteger max = bits == 8 ? BigInteger.valueOf(255) : BigInteger.ONE.shiftLeft(bits - 1).subtract(BigInteger.ONE);
                BigInteger min = bits == 8 ? BigInteger.ZERO : BigInteger.ONE.shiftLeft(bits - 1).negate();
                String text = hdu.card("BLANK").getValue().trim();
                BigInteger v = text.matches("[+-]?\\d+") ? new BigInteger(text.startsWith("+") ? text.substring(1) : text) : null;
                if (v == null || v.compareTo(min) < 0 || v.compareTo(max) > 0) {
                    throw new FitsException(Kind.BAD_DATA, file, hdu.index(), "BLANK", "BLANK is '" + text
                            + "', not an integer from " + min + " to " + max + " as BITPIX " + bits
                            + " needs (FITS Standard 4.0 §4.4.2.5) (fix or remove the card with a header editor)");
                }
                blank = v.longValue();
            }
        }
        return new Quantizer(scale, zero, blank);
    }

    /**
     * A structural number card: its value, the default when absent or blank, and a {@link Kind#BAD_DATA}
     * problem when the value is not a FITS number ({@link FitsHeader#parseNumber}): guessing a scale
     * would silently change every pixel.
     */
    private static double number(Path file, HduInfo hdu, String key, double dflt) throws FitsException {
        var card = hdu.card(key);
        if (card == null || card.getValue() == null || card.getValue().isBlank()) {
            return dflt;
        }
        OptionalDouble d = card.isStringValue() ? OptionalDouble.empty() : FitsHeader.parseNumber(card.getValue());
        if (d.isPresent()) {
            return d.getAsDouble();
        }
        throw new FitsException(Kind.BAD_DATA, file, hdu.index(), key, key + " is '" + card.getValue().trim()
                + "', not a finite number (FITS Standard 4.0 §4.2.3-4.2.4) (fix or remove the card with a header "
                + "editor)");
    }

    /** Reads the data unit row by row into the image; returns the count of non-finite pixels. */
    private static long readPixels(HduScanner scanner, HduInfo hdu, Image image, Quantizer q)
            throws FitsException, IOException {
        int w = image.width();
        int h = image.height();
        int bitpix = hdu.bitpix();
        FitsInputStream in = new FitsInputStream(scanner.stream(), 1 << 16);
        boolean identity = q.isDefault();
        double scale = 1;
        double zero = 0;
        if (!identity) {
            scale = q.toDouble(1) - q.toDouble(0);
            zero = q.toDouble(0);
        }
        byte[] b8 = bitpix == 8 ? new byte[w] : null;
        short[] b16 = bitpix == 16 ? new short[w] : null;
        int[] b32 = bitpix == 32 ? new int[w] : null;
        long[] b64 = bitpix == 64 ? new long[w] : null;
        float[] f32 = bitpix == -32 ? new float[w] : null;
        double[] f64 = bitpix == -64 ? new double[w] : null;
        long rowBytes = (long) w * Math.abs(bitpix) / 8;
        long done = 0;
        long masked = 0;
        try {
            for (int p = 0; p < image.planes(); p++) {
                float[] plane = image.plane(p);
                for (int y = 0; y < h; y++) {
                    int off = y * w;
                    switch (bitpix) {
                        case 8 -> {
                            in.readFully(b8, 0, w);
                            for (int x = 0; x < w; x++) {
                                plane[off + x] = (float) q.toDouble(b8[x] & 0xFF);
                            }
                        }
                        case 16 -> {
                            in.readArrayFully(b16);
                            for (int x = 0; x < w; x++) {
                                plane[off + x] = (float) q.toDouble(b16[x]);
                            }
                        }
                        case 32 -> {
                            in.readArrayFully(b32);
                            for (int x = 0; x < w; x++) {
                                plane[off + x] = (float) q.toDouble(b32[x]);
                            }
                        }
                        case 64 -> {
                            in.readArrayFully(b64);
                            for (int x = 0; x < w; x++) {
                                plane[off + x] = (float) q.toDouble(b64[x]);
                            }
                        }
                        case -32 -> {
                            in.readArrayFully(f32);
                            if (identity) {
                                System.arraycopy(f32, 0, plane, off, w);
                            } else {
                                for (int x = 0; x < w; x++) {
                                    plane[off + x] = (float) (zero + scale * f32[x]);
                                }
                            }
                        }
                        default -> {
                            in.readArrayFully(f64);
                            for (int x = 0; x < w; x++) {
                                plane[off + x] = (float) (identity ? f64[x] : zero + scale * f64[x]);
                            }
                        }
                    }
                    done += rowBytes;
                    for (int x = 0; x < w; x++) {
                        if (!Float.isFinite(plane[off + x])) {
                            masked++;
                        }
                    }
                }
            }
        } catch (EOFException e) {
            // Buffered decoding may fail before the last complete row, so the count is not reported.
            throw scanner.truncated(hdu, -1);
        }
        scanner.advance(done);
        return masked;
    }
}
