package dev.nitid.quality.internal;

/**
 * Separable convolution with a sampled, unit-sum Gaussian of a given FWHM, the image extended by reflection
 * at its edges (half-sample symmetric, as {@code scipy.ndimage}'s "reflect").
 */
public final class GaussianSmoothing {
    /** Kernel half-width in σ: the Gaussian beyond 4σ holds less than 1e-4 of the flux. */
    static final double TRUNCATE_SIGMA = 4.0;

    private GaussianSmoothing() {
    }

    /**
     * @param in     pixels, row-major (input, not modified)
     * @param width  columns
     * @param height rows
     * @param fwhm   Gaussian FWHM in pixels, &gt; 0
     * @return the smoothed pixels, a new array
     */
    public static float[] smooth(float[] in, int width, int height, double fwhm) {
        double sigma = fwhm / (2 * Math.sqrt(2 * Math.log(2)));
        int r = Math.max(1, (int) Math.ceil(TRUNCATE_SIGMA * sigma));
        double[] k = new double[2 * r + 1];
        double sum = 0;
        for (int i = -r; i <= r; i++) {
            k[i + r] = Math.exp(-0.5 * i * i / (sigma * sigma));
            sum += k[i + r];
        }
        for (int i = 0; i < k.length; i++) {
            k[i] /= sum;
        }
        float[] tmp = new float[in.length];
        for (int y = 0; y < height; y++) {
            int row = y * width;
            for (int x = 0; x < width; x++) {
                double acc = 0;
                for (int i = -r; i <= r; i++) {
                    acc += k[i + r] * in[row + reflect(x + i, width)];
                }
                tmp[row + x] = (float) acc;
            }
        }
        float[] out = new float[in.length];
        for (int y = 0; y < height; y++) {
            for (int x = 0; x < width; x++) {
                double acc = 0;
                for (int i = -r; i <= r; i++) {
                    acc += k[i + r] * tmp[reflect(y + i, height) * width + x];
                }
                out[y * width + x] = (float) acc;
            }
        }
        return out;
    }

    private static int reflect(int i, int n) {
        int m = Math.floorMod(i, 2 * n);
        return m < n ? m : 2 * n - 1 - m;
    }
}
