package dev.nitid.stars;

/**
 * Median figures of the best-fitting profile in one region of the field grid.
 *
 * @param column      grid column, 0 = left (x = 0)
 * @param row         grid row, 0 = first image row (y = 0)
 * @param x0          first column of the region
 * @param y0          first row of the region
 * @param x1          one past the last column
 * @param y1          one past the last row
 * @param count       accepted stars in it
 * @param fwhm        median √(major·minor), px (NaN when empty)
 * @param fwhmMajor   major FWHM of the median shape (see StarMeasurer.MedianShape), px
 * @param fwhmMinor   minor FWHM of the median shape, px
 * @param ellipticity 1 − minor/major of the median shape (median of the signed components)
 * @param angle       major-axis angle of the median shape, radians in [0, π)
 */
public record RegionSummary(int column, int row, int x0, int y0, int x1, int y1, int count, double fwhm,
                            double fwhmMajor, double fwhmMinor, double ellipticity, double angle) {
}
