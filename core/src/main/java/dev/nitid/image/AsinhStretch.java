package dev.nitid.image;

/**
 * The asinh display stretch of Lupton et al. (2004, PASP 116, 133, eq. 2 and §3), linked across colour
 * planes so that hue is kept.
 *
 * <p>With intensity {@code I = mean over planes of (v_p − m)} (clipped at 0), the displayed value of
 * plane p is {@code (v_p − m) · F(I) / I} with {@code F(I) = asinh(Q·I/s) / asinh(Q·R/s)}, where
 * {@code m} is the black point, {@code s} the softening (the linear-to-logarithmic knee) and {@code R}
 * the intensity shown as full white. Values are clipped to [0, 1]. One instance applied to the input and
 * the output of a restoration shows both on the same scale.
 *
 * @param black    black point m, in data units
 * @param softening knee s &gt; 0, in data units: below ~s the stretch is linear, above it logarithmic
 * @param q        Q &gt; 0, how strongly the bright end is compressed
 * @param white    intensity R &gt; 0 above the black point shown as full white
 */
public record AsinhStretch(double black, double softening, double q, double white) {

    /** Validates the parameters. */
    public AsinhStretch {
        if (!Double.isFinite(black)) {
            throw new IllegalArgumentException("black point is " + black + ": it must be finite");
        }
        if (!(softening > 0) || !(q > 0) || !(white > 0) || Double.isInfinite(white)) {
            throw new IllegalArgumentException("softening " + softening + ", Q " + q + " and white " + white
                    + " must all be positive and finite");
        }
    }

    /**
     * A stretch suited to a star field: black at sky − 1σ, knee at 3σ above black, white at the
     * 99.95th-percentile-like maximum (the plane maximum), Q = 8 (common practice, no source).
     *
     * @param stats statistics of the image to show (use the input's for an input/output pair)
     * @return the stretch
     */
    public static AsinhStretch forSky(ImageStats stats) {
        double sigma = stats.madSigma() > 0 ? stats.madSigma() : Math.max(1e-12, stats.max() - stats.min()) * 1e-3;
        double black = stats.median() - sigma;
        double white = Math.max(stats.max() - black, 10 * sigma);
        return new AsinhStretch(black, 3 * sigma, 8, white);
    }

    /**
     * Stretches one pixel given all its plane values.
     *
     * @param values the pixel's value in each plane (input, not modified)
     * @param out    displayed values in [0, 1], one per plane (output, modified)
     */
    public void apply(float[] values, double[] out) {
        double intensity = 0;
        for (float v : values) {
            intensity += Math.max(0, v - black);
        }
        intensity /= values.length;
        if (!(intensity > 0)) {
            java.util.Arrays.fill(out, 0, values.length, 0);
            return;
        }
        double f = Math.log(q * intensity / softening + Math.sqrt(1 + sq(q * intensity / softening)))
                / asinh(q * white / softening);
        double scale = f / intensity;
        for (int p = 0; p < values.length; p++) {
            out[p] = Math.min(1, Math.max(0, (values[p] - black) * scale));
        }
    }

    /** @return the displayed value in [0, 1] of a single-plane pixel */
    public double apply(float value) {
        double x = value - black;
        if (!(x > 0)) {
            return 0;
        }
        return Math.min(1, asinh(q * x / softening) / asinh(q * white / softening));
    }

    private static double asinh(double x) {
        return Math.log(x + Math.sqrt(1 + x * x));
    }

    private static double sq(double x) {
        return x * x;
    }
}
