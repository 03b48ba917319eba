package dev.nitid.image;

import dev.nitid.image.internal.Select;

/**
 * Summary statistics of one plane, accumulated in double over the finite pixels only.
 *
 * <p>{@code madSigma} is the robust noise estimate {@code 1.482602218505602 · median(|v − median(v)|)},
 * which equals σ for Gaussian data: the factor is 1/Φ⁻¹(3/4) (Hampel 1974, JASA 69, 383; Rousseeuw &amp;
 * Croux 1993, JASA 88, 1273). The median of an even count is the mean of the two middle values.
 *
 * @param count     finite pixels
 * @param nonFinite NaN or infinite pixels (masked)
 * @param sum       sum of finite pixels
 * @param min       smallest finite pixel (NaN if none)
 * @param max       largest finite pixel (NaN if none)
 * @param mean      mean of finite pixels (NaN if none)
 * @param median    median of finite pixels (NaN if none)
 * @param madSigma  1.4826 × median absolute deviation (NaN if none)
 */
public record ImageStats(long count, long nonFinite, double sum, double min, double max, double mean,
                         double median, double madSigma) {

    /** 1/Φ⁻¹(3/4): scales the median absolute deviation to σ for Gaussian noise. */
    public static final double MAD_TO_SIGMA = 1.482602218505602;

    /**
     * Computes the statistics of an array of pixels.
     *
     * @param pixels the pixels (input, not modified)
     * @return their statistics
     */
    public static ImageStats of(float[] pixels) {
        float[] finite = new float[pixels.length];
        int n = 0;
        double sum = 0;
        double min = Double.POSITIVE_INFINITY;
        double max = Double.NEGATIVE_INFINITY;
        for (float v : pixels) {
            if (Float.isFinite(v)) {
                finite[n++] = v;
                sum += v;
                if (v < min) {
                    min = v;
                }
                if (v > max) {
                    max = v;
                }
            }
        }
        long nonFinite = pixels.length - n;
        if (n == 0) {
            return new ImageStats(0, nonFinite, 0, Double.NaN, Double.NaN, Double.NaN, Double.NaN, Double.NaN);
        }
        double median = medianInPlace(finite, n);
        for (int i = 0; i < n; i++) {
            finite[i] = (float) Math.abs(finite[i] - median);
        }
        double mad = medianInPlace(finite, n);
        return new ImageStats(n, nonFinite, sum, min, max, sum / n, median, MAD_TO_SIGMA * mad);
    }

    /**
     * Median of the first {@code n} values; reorders them.
     *
     * @param values the values (input, reordered)
     * @param n      how many leading values to use, ≥ 1
     * @return the median; the mean of the two middle values for even n (the same value as after sorting,
     *         found by selection in O(n): sorting a 24-megapixel frame twice took seconds of the preview)
     */
    static double medianInPlace(float[] values, int n) {
        return Select.median(values, n);
    }
}
