package dev.nitid.quality;

/**
 * The constants of the quality metrics (see {@link QualityMetrics} for how each is used). The defaults are
 * the definitions of the restorer issue; change them only to explore.
 *
 * @param fitStamp          side of the stamp for the Gaussian+constant FWHM fit, odd (15)
 * @param minPeakSigma      stars must peak above this many input sky σ to enter the FWHM and flux metrics (30)
 * @param ringStars         how many of the brightest selected stars the ring metric looks at (12)
 * @param ringFrom          inner radius of the first 1-px ring annulus (1.5)
 * @param ringTo            the last annulus starts below this radius (12)
 * @param backgroundInner   inner radius of the local background annulus of the ring metric (20)
 * @param backgroundOuter   outer radius of that annulus (30)
 * @param isolationRadius   no other star brighter than {@code isolationFraction} of a star's flux within this
 *                          radius (16)
 * @param isolationFraction see above (0.01)
 * @param brighterRadius    and no brighter star at all within this radius (32)
 * @param apertureFwhm      photometry radius in input FWHMs (2.5) ...
 * @param apertureMin       ... but at least this many pixels (10)
 * @param annulusGap        the sky annulus starts this far outside the aperture (4)
 * @param annulusWidth      and is this wide (8)
 * @param truthFwhmMin      smallest Gaussian FWHM t tried by the error-vs-truth metric (0.5)
 * @param truthFwhmMax      largest t (8)
 * @param truthFwhmStep     step of the t grid (0.25)
 * @param starLightLimit    masks: a pixel is "away from stars" where the noise-free star light is below this
 *                          many sky σ (0.1)
 * @param skyExtendedMax    sky mask: and the blurred extended light below this many σ (0.25)
 * @param nebulaMin         nebula mask: and the blurred extended light at least this many σ (2)
 */
public record QualitySettings(int fitStamp, double minPeakSigma, int ringStars, double ringFrom, double ringTo,
                              double backgroundInner, double backgroundOuter, double isolationRadius,
                              double isolationFraction, double brighterRadius, double apertureFwhm,
                              double apertureMin, double annulusGap, double annulusWidth, double truthFwhmMin,
                              double truthFwhmMax, double truthFwhmStep, double starLightLimit,
                              double skyExtendedMax, double nebulaMin) {

    /** Validates the settings. */
    public QualitySettings {
        if (fitStamp < 5 || fitStamp % 2 == 0) {
            throw new IllegalArgumentException("fit stamp is " + fitStamp + ": use an odd size ≥ 5 (15 is the definition)");
        }
        if (ringStars < 1) {
            throw new IllegalArgumentException("ring stars is " + ringStars + ": use at least 1 (12 is the definition)");
        }
        if (!(ringFrom >= 0 && ringTo > ringFrom && backgroundInner > ringTo && backgroundOuter > backgroundInner)) {
            throw new IllegalArgumentException("ring radii " + ringFrom + ", " + ringTo + ", " + backgroundInner + ", "
                    + backgroundOuter + " must increase");
        }
        if (!(truthFwhmMin > 0 && truthFwhmMax >= truthFwhmMin && truthFwhmStep > 0)) {
            throw new IllegalArgumentException("truth FWHM grid " + truthFwhmMin + " to " + truthFwhmMax + " step "
                    + truthFwhmStep + " is invalid: use 0 < min ≤ max and a step > 0");
        }
        if (!(apertureFwhm > 0 && apertureMin > 0 && annulusGap >= 0 && annulusWidth > 0)) {
            throw new IllegalArgumentException("aperture settings must be positive");
        }
    }

    /** @return the definitions of the restorer issue */
    public static QualitySettings defaults() {
        return new QualitySettings(15, 30, 12, 1.5, 12, 20, 30, 16, 0.01, 32, 2.5, 10, 4, 8, 0.5, 8, 0.25,
                0.1, 0.25, 2);
    }
}
