package dev.nitid.cli;

import dev.nitid.fits.FitsException;
import dev.nitid.fits.FitsImage;
import dev.nitid.stars.PlateScale;
import dev.nitid.stars.StarMeasurer;
import java.nio.file.Path;
import java.util.Optional;
import java.util.OptionalDouble;

/**
 * The header numbers the commands read beyond the structural ones — the saturation level and the plate
 * scale — with a malformed card (a value that is not a FITS number, FITS 4.0 §4.2.3–4.2.4) turned into a data
 * error (exit 65) that names the file, the card and the option that replaces it. Read them before any long
 * step, so that a bad card stops the command at once.
 */
final class HeaderNumbers {
    private HeaderNumbers() {
    }

    /**
     * The plate scale the header implies ({@link PlateScale#fromHeader}).
     *
     * @param input       the file, for the message
     * @param frame       the frame read from it (input, not modified)
     * @param replacement the command's options that replace the header's scale, for the message
     * @return the scale, or empty when the header gives none
     * @throws FitsException BAD_DATA when a card it needs is malformed
     */
    static Optional<PlateScale> plateScale(Path input, FitsImage frame, String replacement) throws FitsException {
        try {
            return PlateScale.fromHeader(frame.header());
        } catch (IllegalArgumentException e) {
            throw problem(input, frame, e, replacement);
        }
    }

    /**
     * The saturation level the header implies ({@link StarMeasurer#saturationLevel}).
     *
     * @param input the file, for the message
     * @param frame the frame read from it (input, not modified)
     * @return the level, or empty when unknown
     * @throws FitsException BAD_DATA when SATURATE or a scaling card is malformed
     */
    static OptionalDouble saturation(Path input, FitsImage frame) throws FitsException {
        try {
            return StarMeasurer.saturationLevel(frame.header(), frame.bitpix());
        } catch (IllegalArgumentException e) {
            throw problem(input, frame, e, "--saturation");
        }
    }

    private static FitsException problem(Path input, FitsImage frame, IllegalArgumentException e, String option) {
        String msg = java.util.Objects.toString(e.getMessage(), e.toString());
        int colon = msg.lastIndexOf(": ");
        String what = colon > 0 ? msg.substring(0, colon) : msg;
        return new FitsException(FitsException.Kind.BAD_DATA, input, frame.hdu(), null,
                what + " (correct or remove the card, or give " + option + ")", e);
    }
}
