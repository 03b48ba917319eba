package dev.nitid.quality;

/**
 * A place the metrics or the preview look at: a star's centre, or the centre of a region of faint light
 * ({@link ObservedQuality#faintRegion}), in pixel coordinates (pixel centres at integers).
 *
 * @param x column of the centre
 * @param y row of the centre
 */
public record StarSite(double x, double y) {
}
