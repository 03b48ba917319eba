package dev.nitid.stars;

/** Which measured PSF a {@link StarMeasurement} recommends to the restorers. */
public enum PsfSource {
    /**
     * The empirical (effective) PSF stacked from the stars (Anderson &amp; King 2000, PASP 112, 1360): keeps
     * every asymmetry the stars share (coma, spikes, tracking). Chosen when enough stars built it, its noise is
     * low, and it differs from the best model by more than its noise (see
     * {@link MeasureSettings#minEmpiricalStars()}, {@link MeasureSettings#maxEmpiricalNoise()},
     * {@link MeasureSettings#minModelMismatch()}).
     */
    EMPIRICAL,
    /**
     * The best-fitting analytic profile (elliptical Moffat or Gaussian) with the median parameters, rendered
     * pixel-integrated: noise-free, chosen whenever the empirical PSF adds nothing beyond noise.
     */
    MODEL
}
