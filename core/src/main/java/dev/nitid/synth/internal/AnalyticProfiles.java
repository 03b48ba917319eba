package dev.nitid.synth.internal;

/**
 * Analytic PSF profiles integrated over square pixels by sub-sampling — the one place where the synthetic
 * field generator draws a PSF model. When {@code dev.nitid.psf} offers a model renderer this method is
 * the single switch point.
 *
 * <ul>
 *   <li>Gaussian: {@code I(r) ∝ exp(−r²/2σ²)}, {@code FWHM = 2√(2 ln 2) σ} (any statistics handbook).</li>
 *   <li>Moffat: {@code I(r) ∝ [1 + (r/α)²]^(−β)}, {@code FWHM = 2α√(2^(1/β) − 1)} (Moffat 1969, A&amp;A 3,
 *       455; Trujillo et al. 2001, MNRAS 328, 977, eqs. 1–2).</li>
 * </ul>
 */
public final class AnalyticProfiles {
    /** FWHM/σ of a Gaussian, 2√(2 ln 2). */
    public static final double GAUSS_FWHM_PER_SIGMA = 2 * Math.sqrt(2 * Math.log(2));

    private AnalyticProfiles() {
    }

    /**
     * Renders a unit-sum profile on a {@code size × size} stamp whose centre pixel is
     * {@code (⌊size/2⌋, ⌊size/2⌋)}, the source sitting at {@code (centre + dx, centre + dy)}; each pixel is
     * the mean of {@code oversample²} point samples at the centres of its sub-pixels.
     *
     * @param moffat     true for Moffat, false for Gaussian
     * @param fwhm       full width at half maximum in pixels, &gt; 0
     * @param beta       Moffat power index (&gt; 1), ignored for Gaussian
     * @param size       stamp side
     * @param oversample sub-samples per pixel and axis, ≥ 1
     * @param dx         source offset along x in pixels
     * @param dy         source offset along y in pixels
     * @param out        stamp, {@code size²} values (output, modified)
     */
    public static void render(boolean moffat, double fwhm, double beta, int size, int oversample,
                              double dx, double dy, float[] out) {
        int c = size / 2;
        double alpha = fwhm / (2 * Math.sqrt(Math.pow(2, 1 / beta) - 1));
        double sigma = fwhm / GAUSS_FWHM_PER_SIGMA;
        double invA2 = 1 / (alpha * alpha);
        double inv2s2 = 1 / (2 * sigma * sigma);
        double step = 1.0 / oversample;
        double total = 0;
        for (int j = 0; j < size; j++) {
            for (int i = 0; i < size; i++) {
                double acc = 0;
                for (int sj = 0; sj < oversample; sj++) {
                    double y = j - c - dy - 0.5 + (sj + 0.5) * step;
                    for (int si = 0; si < oversample; si++) {
                        double x = i - c - dx - 0.5 + (si + 0.5) * step;
                        double r2 = x * x + y * y;
                        acc += moffat ? Math.exp(-beta * Math.log1p(r2 * invA2)) : Math.exp(-r2 * inv2s2);
                    }
                }
                out[j * size + i] = (float) acc;
                total += acc;
            }
        }
        float norm = (float) (1 / total);
        for (int k = 0; k < size * size; k++) {
            out[k] *= norm;
        }
    }
}
