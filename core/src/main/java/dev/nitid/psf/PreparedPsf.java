package dev.nitid.psf;

import dev.nitid.image.Image;
import java.util.List;

/**
 * A PSF made ready for use from raw pixels by {@link Psfs#fromImage}.
 *
 * @param psf            odd-sized, each plane summing to 1, centroid in the centre pixel (within ½ pixel)
 * @param clippedPixels  negative pixels set to 0, all planes
 * @param residualShiftX per plane, centroid x minus the centre pixel after recentring, pixels (|·| ≤ ½)
 * @param residualShiftY per plane, same in y
 * @param warnings       plain sentences about what was changed (empty when nothing was)
 */
public record PreparedPsf(Image psf, long clippedPixels, double[] residualShiftX, double[] residualShiftY,
                          List<String> warnings) {

    /** Copies the warning list. */
    public PreparedPsf {
        warnings = List.copyOf(warnings);
    }
}
