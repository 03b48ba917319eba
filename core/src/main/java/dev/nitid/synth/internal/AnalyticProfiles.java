package dev.nitid.synth.internal;

import dev.nitid.psf.GaussianPsf;
import dev.nitid.psf.MoffatPsf;
import dev.nitid.psf.PsfModel;

/**
 * Analytic PSF profiles integrated over square pixels by sub-sampling — the one place where the synthetic
 * field generator draws an analytic PSF. It delegates to {@code dev.nitid.psf}'s {@link MoffatPsf} and
 * {@link GaussianPsf}, whose rendering rule (centre pixel {@code ⌊size/2⌋}, offsets, sub-pixel means, unit
 * sum) is the one this package documents.
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
        PsfModel model = moffat ? MoffatPsf.ofFwhm(fwhm, beta) : GaussianPsf.ofFwhm(fwhm);
        float[] k = model.render(size, oversample, dx, dy).plane(0);
        System.arraycopy(k, 0, out, 0, k.length);
    }
}
