package dev.nitid.restore;

/**
 * The stopping rule of an iterative restoration, and what each iteration records.
 *
 * @param rule             which rule
 * @param maxIterations    the count for {@link StopRule#FIXED_COUNT}, the cap otherwise; ≥ 1
 * @param threshold        target χ²/N for {@link StopRule#CHI_SQUARE}, likelihood gain per pixel for
 *                         {@link StopRule#LIKELIHOOD_GAIN}; ignored for a fixed count; finite and &gt; 0
 * @param minChange        automatic rules also stop when an update changes the estimate by less than this,
 *                         {@code Σ|o_new − o| / Σ|o_new|} (a stall); ≥ 0
 * @param recordLikelihood compute the Poisson log-likelihood every iteration (one logarithm per pixel,
 *                         a noticeable share of an iteration's time on large frames); always on for
 *                         {@link StopRule#LIKELIHOOD_GAIN}; when off, the records carry NaN
 */
public record Stopping(StopRule rule, int maxIterations, double threshold, double minChange,
                       boolean recordLikelihood) {
    /**
     * Default cap of automatic rules. With χ² counted over all pixels the default TV-RL reached χ²/N = 1 after
     * 88 iterations on the harness's seeing scene and 32 on the diffraction scene; counted over the
     * protected stars' discs (the rule now, see {@link StopRule#CHI_SQUARE}) it reaches the cap on the
     * seeing scene and stops after 56 on the diffraction scene (benchmarks/README.md).
     */
    public static final int DEFAULT_CAP = 100;
    /**
     * Default stall threshold: an update that moves the estimate by less than 1e-5 of its total is not worth
     * another iteration (our choice, not tuned: a safety net for runs whose χ² never reaches the target,
     * e.g. with a PSF that does not match the data).
     */
    public static final double DEFAULT_MIN_CHANGE = 1e-5;

    /** Validates the rule. */
    public Stopping {
        if (rule == null) {
            throw new IllegalArgumentException("stop rule is null: choose FIXED_COUNT, CHI_SQUARE or LIKELIHOOD_GAIN");
        }
        if (maxIterations < 1) {
            throw new IllegalArgumentException("maxIterations is " + maxIterations + ": use at least 1");
        }
        if (!(threshold > 0) || Double.isInfinite(threshold)) {
            throw new IllegalArgumentException("stop threshold is " + threshold + ": use a finite value > 0");
        }
        if (!(minChange >= 0) || Double.isInfinite(minChange)) {
            throw new IllegalArgumentException("minChange is " + minChange + ": use a finite value >= 0");
        }
    }

    /** @return exactly {@code n} iterations, recording the likelihood */
    public static Stopping fixed(int n) {
        return new Stopping(StopRule.FIXED_COUNT, n, 1, 0, true);
    }

    /** @return stop when χ²/N reaches 1 (or the estimate stalls), at most {@link #DEFAULT_CAP} iterations */
    public static Stopping chiSquare() {
        return new Stopping(StopRule.CHI_SQUARE, DEFAULT_CAP, 1.0, DEFAULT_MIN_CHANGE, true);
    }

    /**
     * Cap of {@link #accelerated()} (project choice, measured; docs/restore.md). On the 24-megapixel
     * seeing-limited test frame, where χ²/N never reaches 1, the default {@link Method#ACCELERATED_TV_RL} gave a
     * star FWHM ratio of 0.631 after 35 iterations and 0.607 after 45, against 0.59 for TV-RL after 100
     * (the previous default); 45 keeps the ratio within 0.03 of it at under half the iterations. On the
     * quality harness's seeing scene 45 iterations give 0.528 against TV-RL's 0.518 after 100.
     */
    public static final int ACCELERATED_CAP = 45;

    /**
     * The rule of the default accelerated restoration: χ²/N reaches 1 (or the estimate stalls), at most
     * {@value #ACCELERATED_CAP} iterations.
     *
     * @return the rule
     */
    public static Stopping accelerated() {
        return new Stopping(StopRule.CHI_SQUARE, ACCELERATED_CAP, 1.0, DEFAULT_MIN_CHANGE, true);
    }

    /** @return stop when the likelihood gain per pixel falls below {@code gain}, at most {@link #DEFAULT_CAP} */
    public static Stopping likelihoodGain(double gain) {
        return new Stopping(StopRule.LIKELIHOOD_GAIN, DEFAULT_CAP, gain, DEFAULT_MIN_CHANGE, true);
    }

    /** @return this rule with another cap or count */
    public Stopping withMaxIterations(int n) {
        return new Stopping(rule, n, threshold, minChange, recordLikelihood);
    }

    /** @return this rule with another threshold */
    public Stopping withThreshold(double t) {
        return new Stopping(rule, maxIterations, t, minChange, recordLikelihood);
    }

    /** @return this rule with the likelihood recorded or not */
    public Stopping withRecordLikelihood(boolean on) {
        return new Stopping(rule, maxIterations, threshold, minChange, on);
    }

    /** @return true if iterations must compute the likelihood */
    public boolean needsLikelihood() {
        return recordLikelihood || rule == StopRule.LIKELIHOOD_GAIN;
    }
}
