package dev.nitid.restore;

/**
 * Everything a restorer needs besides the image and the PSF. Immutable; use the {@code withX} methods for
 * variants.
 *
 * @param method         the algorithm
 * @param edges          edge handling
 * @param stopping       when iterative methods stop (ignored by Wiener and Tikhonov)
 * @param noise          noise model, or {@link NoiseModel#estimated()}
 * @param protection     star-ringing protection (iterative methods only)
 * @param saturation     pixels at or above this level carry no weight and are filled by the restoration;
 *                       {@code +∞} for none (NaN and ±∞ pixels are always masked)
 * @param tvWeight       λ of {@link Method#TV_RL}, ≥ 0 (Dey et al. 2006 use about 0.002; default 0.004)
 * @param dampingSigma   threshold T of {@link Method#DAMPED_RL} in standard deviations, &gt; 0
 * @param regularisation K of {@link Method#WIENER} (NaN: estimate per frequency from the image) or λ of
 *                       {@link Method#TIKHONOV} (must be &gt; 0)
 * @param threads        worker threads, ≥ 1; results are identical whatever the count
 */
public record RestoreSettings(Method method, EdgeHandling edges, Stopping stopping, NoiseModel noise,
                              StarProtection protection, double saturation, double tvWeight,
                              double dampingSigma, double regularisation, int threads) {
    /**
     * Default λ of TV-regularised RL: twice the 0.002 of Dey et al. (2006, Microsc. Res. Tech. 69, 260),
     * the best of 0.002 / 0.004 / 0.008 on the quality harness's two scenes (docs/restore.md).
     */
    public static final double DEFAULT_TV_WEIGHT = 0.004;
    /** Default damping threshold T, in σ (White 1994 suggests a few σ; from memory). */
    public static final double DEFAULT_DAMPING_SIGMA = 3.0;
    /** Default Tikhonov λ (scikit-image's examples use balance values of this order; our choice). */
    public static final double DEFAULT_TIKHONOV = 0.01;

    /** Validates the settings. */
    public RestoreSettings {
        if (method == null || edges == null || stopping == null || noise == null || protection == null) {
            throw new IllegalArgumentException("method, edges, stopping, noise and protection must all be given"
                    + " (start from RestoreSettings.defaults())");
        }
        if (Double.isNaN(saturation)) {
            throw new IllegalArgumentException("saturation is NaN: give a level, or +Infinity for none");
        }
        if (!(tvWeight >= 0) || Double.isInfinite(tvWeight)) {
            throw new IllegalArgumentException("tvWeight is " + tvWeight + ": use a finite value >= 0");
        }
        if (!(dampingSigma > 0) || Double.isInfinite(dampingSigma)) {
            throw new IllegalArgumentException("dampingSigma is " + dampingSigma + ": use a finite value > 0");
        }
        if (method == Method.TIKHONOV && !(regularisation > 0)) {
            throw new IllegalArgumentException("Tikhonov regularisation is " + regularisation
                    + ": use a finite value > 0 (for example " + DEFAULT_TIKHONOV + ")");
        }
        if (!Double.isNaN(regularisation) && (!(regularisation >= 0) || Double.isInfinite(regularisation))) {
            throw new IllegalArgumentException("regularisation is " + regularisation
                    + ": use a finite value >= 0, or NaN to estimate it");
        }
        if (threads < 1) {
            throw new IllegalArgumentException("threads is " + threads + ": use at least 1");
        }
    }

    /**
     * The best general setting we measured on the quality harness (see docs/restore.md): TV-regularised
     * Richardson–Lucy (λ = {@value #DEFAULT_TV_WEIGHT}) with Biggs &amp; Andrews' extrapolation, reflective
     * edges, stop at χ²/N = 1 within {@value Stopping#ACCELERATED_CAP}
     * iterations ({@link Stopping#accelerated()}), noise model estimated from the sky, ring floor around
     * bright stars, all available cores. It comes within the quality margins of TV-RL at 100 iterations in under half the iterations.
     *
     * @return the defaults
     */
    public static RestoreSettings defaults() {
        return new RestoreSettings(Method.ACCELERATED_TV_RL, EdgeHandling.REFLECT, Stopping.accelerated(),
                NoiseModel.estimated(), StarProtection.ringFloor(), Double.POSITIVE_INFINITY,
                DEFAULT_TV_WEIGHT, DEFAULT_DAMPING_SIGMA, Double.NaN,
                Runtime.getRuntime().availableProcessors());
    }

    /** @return these settings with another method (Tikhonov gets its default λ if none is set) */
    public RestoreSettings withMethod(Method m) {
        double reg = (m == Method.TIKHONOV && !(regularisation > 0)) ? DEFAULT_TIKHONOV : regularisation;
        return new RestoreSettings(m, edges, stopping, noise, protection, saturation, tvWeight, dampingSigma,
                reg, threads);
    }

    /** @return these settings with other edge handling */
    public RestoreSettings withEdges(EdgeHandling e) {
        return new RestoreSettings(method, e, stopping, noise, protection, saturation, tvWeight, dampingSigma,
                regularisation, threads);
    }

    /** @return these settings with another stopping rule */
    public RestoreSettings withStopping(Stopping s) {
        return new RestoreSettings(method, edges, s, noise, protection, saturation, tvWeight, dampingSigma,
                regularisation, threads);
    }

    /** @return these settings with exactly {@code n} iterations */
    public RestoreSettings withIterations(int n) {
        return withStopping(Stopping.fixed(n));
    }

    /** @return these settings with another noise model */
    public RestoreSettings withNoise(NoiseModel n) {
        return new RestoreSettings(method, edges, stopping, n, protection, saturation, tvWeight, dampingSigma,
                regularisation, threads);
    }

    /** @return these settings with another star protection */
    public RestoreSettings withProtection(StarProtection p) {
        return new RestoreSettings(method, edges, stopping, noise, p, saturation, tvWeight, dampingSigma,
                regularisation, threads);
    }

    /** @return these settings with a saturation level ({@code +∞} for none) */
    public RestoreSettings withSaturation(double level) {
        return new RestoreSettings(method, edges, stopping, noise, protection, level, tvWeight, dampingSigma,
                regularisation, threads);
    }

    /** @return these settings with another TV weight λ */
    public RestoreSettings withTvWeight(double w) {
        return new RestoreSettings(method, edges, stopping, noise, protection, saturation, w, dampingSigma,
                regularisation, threads);
    }

    /** @return these settings with another damping threshold T (σ) */
    public RestoreSettings withDampingSigma(double t) {
        return new RestoreSettings(method, edges, stopping, noise, protection, saturation, tvWeight, t,
                regularisation, threads);
    }

    /** @return these settings with another Wiener K / Tikhonov λ (NaN: estimate, Wiener only) */
    public RestoreSettings withRegularisation(double r) {
        return new RestoreSettings(method, edges, stopping, noise, protection, saturation, tvWeight, dampingSigma,
                r, threads);
    }

    /** @return these settings with another thread count */
    public RestoreSettings withThreads(int n) {
        return new RestoreSettings(method, edges, stopping, noise, protection, saturation, tvWeight, dampingSigma,
                regularisation, n);
    }
}
