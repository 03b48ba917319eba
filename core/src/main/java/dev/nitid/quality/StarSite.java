package dev.nitid.quality;

/**
 * A star the metrics look at: its centre in pixel coordinates (pixel centres at integers).
 *
 * @param x column of the centre
 * @param y row of the centre
 */
public record StarSite(double x, double y) {
}
