package dev.nitid.restore;

/**
 * The stopping rule of an iterative restoration.
 *
 * @param rule          which rule
 * @param maxIterations the count for {@link StopRule#FIXED_COUNT}, the cap otherwise; ≥ 1
 * @param threshold     target χ²/N for {@link StopRule#CHI_SQUARE}, likelihood gain per pixel for
 *                      {@link StopRule#LIKELIHOOD_GAIN}; ignored for a fixed count; finite and &gt; 0
 * @param minGain       the likelihood-gain floor that also stops a {@link StopRule#CHI_SQUARE} run; ≥ 0
 */
public record Stopping(StopRule rule, int maxIterations, double threshold, double minGain) {
    /** Default cap of automatic rules: enough for the accelerated form on seeing-limited data (measured). */
    public static final int DEFAULT_CAP = 100;
    /**
     * Default likelihood gain per pixel below which iterating is not worth it: 1e-4 electron-units per
     * pixel, i.e. the whole image's likelihood improves by less than a ten-thousandth of a count per
     * pixel (our choice, tuned on synthetic fields; see notes/restore.md).
     */
    public static final double DEFAULT_MIN_GAIN = 1e-4;

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
        if (!(minGain >= 0) || Double.isInfinite(minGain)) {
            throw new IllegalArgumentException("minGain is " + minGain + ": use a finite value >= 0");
        }
    }

    /** @return exactly {@code n} iterations */
    public static Stopping fixed(int n) {
        return new Stopping(StopRule.FIXED_COUNT, n, 1, 0);
    }

    /** @return stop when χ²/N reaches 1 (or the gain falls below the default), at most {@link #DEFAULT_CAP} */
    public static Stopping chiSquare() {
        return new Stopping(StopRule.CHI_SQUARE, DEFAULT_CAP, 1.0, DEFAULT_MIN_GAIN);
    }

    /** @return stop when the likelihood gain per pixel falls below {@code gain}, at most {@link #DEFAULT_CAP} */
    public static Stopping likelihoodGain(double gain) {
        return new Stopping(StopRule.LIKELIHOOD_GAIN, DEFAULT_CAP, gain, gain);
    }

    /** @return this rule with another cap or count */
    public Stopping withMaxIterations(int n) {
        return new Stopping(rule, n, threshold, minGain);
    }

    /** @return this rule with another threshold */
    public Stopping withThreshold(double t) {
        return new Stopping(rule, maxIterations, t, minGain);
    }
}
