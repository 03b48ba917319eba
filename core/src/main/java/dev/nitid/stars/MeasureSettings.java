package dev.nitid.stars;

/**
 * Settings of {@link StarMeasurer#measure}. Every threshold is here, named and documented; none is hidden.
 *
 * @param background        mesh background settings
 * @param detectionFwhm     FWHM in pixels of the Gaussian matched filter used for detection, &gt; 0; a rough
 *                          guess is enough (the optimum is the stars' FWHM)
 * @param thresholdSigma    detection threshold k: the filtered image must exceed k × its own noise, &gt; 0
 * @param minSeparation     local maxima of the matched filter closer than this many pixels are merged into the
 *                          brighter one (the zero-sum second look may still add a companion beyond it), ≥ 1
 * @param stampRadius       fitting stamps are (2r+1)² pixels; also the measured PSF's radius, ≥ 3
 * @param saturation        pixel value at or above which a star is saturated (NaN = unknown; a flat top of
 *                          ≥ 3 equal peak pixels at or above half the frame's maximum still marks a star
 *                          saturated)
 * @param sampling          how profiles are compared with pixels (INTEGRATED reports the optical FWHM)
 * @param maxStars          at most this many candidates (brightest first) are fitted, ≥ 1
 * @param blendFraction     a neighbouring detection inside the stamp at least this fraction as bright as the
 *                          star (in the filtered image) makes it a blend, in (0, 1]
 * @param maxSharpness      hot pixels and cosmic rays: reject if 1 − mean(4 neighbours)/peak exceeds this,
 *                          in (0, 1]; 0.9 corresponds to a Gaussian FWHM of about 1.1 px
 * @param minFwhm           smallest FWHM in pixels a real star may have (below: too sharp), ≥ 0
 * @param sharpFactor       too sharp if FWHM &lt; sharpFactor × the median FWHM, in [0, 1)
 * @param extendedFactor    extended (galaxy, nebula knot) if FWHM &gt; extendedFactor × the median FWHM, &gt; 1
 * @param gridColumns       columns of the field grid, ≥ 1
 * @param gridRows          rows of the field grid, ≥ 1
 * @param psfOversampling   oversampling of the empirical PSF grid (Anderson &amp; King 2000 use 4), ≥ 1
 * @param psfStars          at most this many of the best stars build the empirical PSF, ≥ 1
 * @param minEmpiricalStars fewest stars for which the empirical PSF is preferred to the fitted model, ≥ 1
 * @param maxEmpiricalNoise largest estimated noise of the empirical PSF, as a fraction of its peak, for
 *                          which it is preferred to the fitted model, &gt; 0
 * @param minStars          fewest accepted stars for a usable measurement, ≥ 1
 * @param minPeakSnr        fitted peak over the local background σ below which a star is too faint to
 *                          measure its shape, ≥ 0
 * @param referenceStars    the reference FWHM for the too-sharp and extended tests is the median over this many
 *                          highest-S/N fitted stars: bright stars are rarely galaxies or knots, which crowd
 *                          the faint end, ≥ 1
 * @param minModelMismatch  the empirical PSF is preferred only if it differs from the fitted model by more than
 *                          this many times its own noise (RMS over the core): otherwise the noise-free model
 *                          describes the stars as well, &gt; 0
 * @param threads           worker threads, ≥ 1; results are identical whatever the count
 */
public record MeasureSettings(BackgroundSettings background, double detectionFwhm, double thresholdSigma,
                              int minSeparation, int stampRadius, double saturation, PixelSampling sampling,
                              int maxStars, double blendFraction, double maxSharpness, double minFwhm,
                              double sharpFactor, double extendedFactor, int gridColumns, int gridRows,
                              int psfOversampling, int psfStars, int minEmpiricalStars, double maxEmpiricalNoise,
                              int minStars, double minPeakSnr, int referenceStars, double minModelMismatch,
                              int threads) {

    /** Validates the settings. */
    public MeasureSettings {
        if (background == null) {
            throw new IllegalArgumentException("background is null: use BackgroundSettings.defaults()");
        }
        positive("detectionFwhm", detectionFwhm);
        positive("thresholdSigma", thresholdSigma);
        atLeast("minSeparation", minSeparation, 1);
        atLeast("stampRadius", stampRadius, 3);
        if (sampling == null) {
            throw new IllegalArgumentException("sampling is null: choose POINT or INTEGRATED");
        }
        atLeast("maxStars", maxStars, 1);
        if (!(blendFraction > 0 && blendFraction <= 1)) {
            throw new IllegalArgumentException("blendFraction is " + blendFraction + ": use a value in (0, 1], e.g. 0.1");
        }
        if (!(maxSharpness > 0 && maxSharpness <= 1)) {
            throw new IllegalArgumentException("maxSharpness is " + maxSharpness + ": use a value in (0, 1], e.g. 0.9");
        }
        if (!(minFwhm >= 0)) {
            throw new IllegalArgumentException("minFwhm is " + minFwhm + ": use a value ≥ 0, e.g. 1");
        }
        if (!(sharpFactor >= 0 && sharpFactor < 1)) {
            throw new IllegalArgumentException("sharpFactor is " + sharpFactor + ": use a value in [0, 1), e.g. 0.6");
        }
        if (!(extendedFactor > 1)) {
            throw new IllegalArgumentException("extendedFactor is " + extendedFactor + ": use a value > 1, e.g. 1.5");
        }
        atLeast("gridColumns", gridColumns, 1);
        atLeast("gridRows", gridRows, 1);
        atLeast("psfOversampling", psfOversampling, 1);
        atLeast("psfStars", psfStars, 1);
        atLeast("minEmpiricalStars", minEmpiricalStars, 1);
        positive("maxEmpiricalNoise", maxEmpiricalNoise);
        atLeast("minStars", minStars, 1);
        positive("minModelMismatch", minModelMismatch);
        atLeast("referenceStars", referenceStars, 1);
        if (!(minPeakSnr >= 0)) {
            throw new IllegalArgumentException("minPeakSnr is " + minPeakSnr + ": use a value ≥ 0, e.g. 3");
        }
        atLeast("threads", threads, 1);
    }

    private static void positive(String name, double v) {
        if (!(v > 0) || !Double.isFinite(v)) {
            throw new IllegalArgumentException(name + " is " + v + ": use a finite value > 0");
        }
    }

    private static void atLeast(String name, int v, int min) {
        if (v < min) {
            throw new IllegalArgumentException(name + " is " + v + ": use at least " + min);
        }
    }

    /**
     * Defaults (common practice, no source, unless stated): 3-px matched filter, 5σ threshold, 4-px
     * separation, 15×15 stamps, integrated sampling, 2000 stars, blend at 10 %, sharpness 0.9, FWHM ≥ 1 px,
     * too sharp below 0.6× and extended above 1.3× the median FWHM of the 15 highest-S/N stars, 3×3 grid, 4× oversampled PSF
     * (Anderson &amp; King 2000) from up to 300 stars, preferred with ≥ 25 stars and noise ≤ 2 % of the peak,
     * at least 5 stars, peak ≥ 3σ to be measured, empirical PSF only if it differs from the model by > 2× its noise (without a difference the ratio is
     * χ²_N/N ≈ 1 ± √(2/N), about 1 ± 0.15 for the N ≈ 100 core pixels of a 3-px FWHM), all available cores.
     *
     * @return the default settings
     */
    public static MeasureSettings defaults() {
        return new MeasureSettings(BackgroundSettings.defaults(), 3.0, 5.0, 4, 7, Double.NaN,
                PixelSampling.INTEGRATED, 2000, 0.1, 0.9, 1.0, 0.6, 1.3, 3, 3, 4, 300, 25, 0.02, 5, 3.0, 15, 2.0,
                Runtime.getRuntime().availableProcessors());
    }

    /** @return these settings with another saturation level (NaN = unknown) */
    public MeasureSettings withSaturation(double level) {
        return new MeasureSettings(background, detectionFwhm, thresholdSigma, minSeparation, stampRadius, level, sampling, maxStars, blendFraction, maxSharpness, minFwhm, sharpFactor, extendedFactor, gridColumns, gridRows, psfOversampling, psfStars, minEmpiricalStars, maxEmpiricalNoise, minStars, minPeakSnr, referenceStars, minModelMismatch, threads);
    }

    /** @return these settings with another thread count */
    public MeasureSettings withThreads(int n) {
        return new MeasureSettings(background, detectionFwhm, thresholdSigma, minSeparation, stampRadius, saturation, sampling, maxStars, blendFraction, maxSharpness, minFwhm, sharpFactor, extendedFactor, gridColumns, gridRows, psfOversampling, psfStars, minEmpiricalStars, maxEmpiricalNoise, minStars, minPeakSnr, referenceStars, minModelMismatch, n);
    }

    /** @return these settings with another detection threshold (in σ of the filtered image) */
    public MeasureSettings withThresholdSigma(double k) {
        return new MeasureSettings(background, detectionFwhm, k, minSeparation, stampRadius, saturation, sampling, maxStars, blendFraction, maxSharpness, minFwhm, sharpFactor, extendedFactor, gridColumns, gridRows, psfOversampling, psfStars, minEmpiricalStars, maxEmpiricalNoise, minStars, minPeakSnr, referenceStars, minModelMismatch, threads);
    }

    /** @return these settings with another matched-filter FWHM */
    public MeasureSettings withDetectionFwhm(double fwhm) {
        return new MeasureSettings(background, fwhm, thresholdSigma, minSeparation, stampRadius, saturation, sampling, maxStars, blendFraction, maxSharpness, minFwhm, sharpFactor, extendedFactor, gridColumns, gridRows, psfOversampling, psfStars, minEmpiricalStars, maxEmpiricalNoise, minStars, minPeakSnr, referenceStars, minModelMismatch, threads);
    }

    /** @return these settings with another stamp radius (stamps and PSF are (2r+1)²) */
    public MeasureSettings withStampRadius(int r) {
        return new MeasureSettings(background, detectionFwhm, thresholdSigma, minSeparation, r, saturation, sampling, maxStars, blendFraction, maxSharpness, minFwhm, sharpFactor, extendedFactor, gridColumns, gridRows, psfOversampling, psfStars, minEmpiricalStars, maxEmpiricalNoise, minStars, minPeakSnr, referenceStars, minModelMismatch, threads);
    }

    /** @return these settings with another pixel sampling */
    public MeasureSettings withSampling(PixelSampling s) {
        return new MeasureSettings(background, detectionFwhm, thresholdSigma, minSeparation, stampRadius, saturation, s, maxStars, blendFraction, maxSharpness, minFwhm, sharpFactor, extendedFactor, gridColumns, gridRows, psfOversampling, psfStars, minEmpiricalStars, maxEmpiricalNoise, minStars, minPeakSnr, referenceStars, minModelMismatch, threads);
    }

    /** @return these settings with another background mesh */
    public MeasureSettings withBackground(BackgroundSettings b) {
        return new MeasureSettings(b, detectionFwhm, thresholdSigma, minSeparation, stampRadius, saturation, sampling, maxStars, blendFraction, maxSharpness, minFwhm, sharpFactor, extendedFactor, gridColumns, gridRows, psfOversampling, psfStars, minEmpiricalStars, maxEmpiricalNoise, minStars, minPeakSnr, referenceStars, minModelMismatch, threads);
    }

    /** @return these settings with another limit on fitted stars */
    public MeasureSettings withMaxStars(int n) {
        return new MeasureSettings(background, detectionFwhm, thresholdSigma, minSeparation, stampRadius, saturation, sampling, n, blendFraction, maxSharpness, minFwhm, sharpFactor, extendedFactor, gridColumns, gridRows, psfOversampling, psfStars, minEmpiricalStars, maxEmpiricalNoise, minStars, minPeakSnr, referenceStars, minModelMismatch, threads);
    }

    /** @return these settings with another minimum number of accepted stars */
    public MeasureSettings withMinStars(int n) {
        return new MeasureSettings(background, detectionFwhm, thresholdSigma, minSeparation, stampRadius, saturation, sampling, maxStars, blendFraction, maxSharpness, minFwhm, sharpFactor, extendedFactor, gridColumns, gridRows, psfOversampling, psfStars, minEmpiricalStars, maxEmpiricalNoise, n, minPeakSnr, referenceStars, minModelMismatch, threads);
    }

    /** @return these settings with another faintest measurable peak */
    public MeasureSettings withMinPeakSnr(double snr) {
        return new MeasureSettings(background, detectionFwhm, thresholdSigma, minSeparation, stampRadius, saturation, sampling, maxStars, blendFraction, maxSharpness, minFwhm, sharpFactor, extendedFactor, gridColumns, gridRows, psfOversampling, psfStars, minEmpiricalStars, maxEmpiricalNoise, minStars, snr, referenceStars, minModelMismatch, threads);
    }

    /** @return these settings with another empirical-PSF oversampling */
    public MeasureSettings withPsfOversampling(int k) {
        return new MeasureSettings(background, detectionFwhm, thresholdSigma, minSeparation, stampRadius, saturation, sampling, maxStars, blendFraction, maxSharpness, minFwhm, sharpFactor, extendedFactor, gridColumns, gridRows, k, psfStars, minEmpiricalStars, maxEmpiricalNoise, minStars, minPeakSnr, referenceStars, minModelMismatch, threads);
    }

    /** @return these settings with another minimum separation of detections */
    public MeasureSettings withMinSeparation(int px) {
        return new MeasureSettings(background, detectionFwhm, thresholdSigma, px, stampRadius, saturation, sampling, maxStars, blendFraction, maxSharpness, minFwhm, sharpFactor, extendedFactor, gridColumns, gridRows, psfOversampling, psfStars, minEmpiricalStars, maxEmpiricalNoise, minStars, minPeakSnr, referenceStars, minModelMismatch, threads);
    }

    /** @return these settings with another extended-object factor */
    public MeasureSettings withExtendedFactor(double f) {
        return new MeasureSettings(background, detectionFwhm, thresholdSigma, minSeparation, stampRadius, saturation,
                sampling, maxStars, blendFraction, maxSharpness, minFwhm, sharpFactor, f, gridColumns,
                gridRows, psfOversampling, psfStars, minEmpiricalStars, maxEmpiricalNoise, minStars, minPeakSnr,
                referenceStars, minModelMismatch, threads);
    }

    /** @return these settings with another field grid */
    public MeasureSettings withGrid(int columns, int rows) {
        return new MeasureSettings(background, detectionFwhm, thresholdSigma, minSeparation, stampRadius, saturation, sampling, maxStars, blendFraction, maxSharpness, minFwhm, sharpFactor, extendedFactor, columns, rows, psfOversampling, psfStars, minEmpiricalStars, maxEmpiricalNoise, minStars, minPeakSnr, referenceStars, minModelMismatch, threads);
    }

    /** @return these settings with another empirical-versus-model mismatch threshold */
    public MeasureSettings withMinModelMismatch(double k) {
        return new MeasureSettings(background, detectionFwhm, thresholdSigma, minSeparation, stampRadius, saturation,
                sampling, maxStars, blendFraction, maxSharpness, minFwhm, sharpFactor, extendedFactor, gridColumns,
                gridRows, psfOversampling, psfStars, minEmpiricalStars, maxEmpiricalNoise, minStars, minPeakSnr, referenceStars, k,
                threads);
    }
}
