package dev.nitid.restore;

/**
 * Poisson plus Gaussian read-noise model of the data, in the data's own units.
 *
 * <p>With gain {@code g} (photo-electrons per data unit), read noise {@code r} (data units) and a pedestal
 * {@code P} (data units added back to a sky-subtracted frame), the electrons {@code g (d + P)} are Poisson
 * with mean {@code g (K o + P)} plus Gaussian noise of variance {@code g² r²}. Adding {@code g² r²} to both
 * makes the sum approximately Poisson (the "σ² shift" of Snyder, Hammoud &amp; White 1993, JOSA A 10,
 * 1014 — from memory), so Richardson–Lucy uses the ratio {@code (d + c) / (K o + c)} with the offset
 * <pre>  c = P + g r²</pre>
 * and the per-pixel variance is {@code v = (K o + c) / g}. Negative pixels of a sky-subtracted frame stay
 * valid as long as {@code d + c ≥ 0}; smaller values are treated as 0 in the ratio.
 *
 * <p>{@link #estimated()} derives the model from each plane: sky level {@code m} (3σ-clipped median) and
 * noise {@code σ} (1.4826·MAD of neighbouring-pixel differences / √2, blind to smooth nebulae); the pedestal lifts the sky to at least
 * {@link #MIN_SKY_SIGMAS}·σ ({@code P = max(0, MIN_SKY_SIGMAS·σ − m)}), read noise 0, and the gain follows
 * from Poisson statistics of the sky, {@code g = (m + P) / σ²}.
 *
 * @param gain      photo-electrons per data unit, &gt; 0, or NaN with the others to estimate
 * @param readNoise Gaussian read noise in data units, ≥ 0
 * @param pedestal  level added to data and model, in data units, ≥ 0
 */
public record NoiseModel(double gain, double readNoise, double pedestal) {
    /**
     * Lowest sky level, in units of the sky noise, that the estimated model assumes (our choice: a
     * Poisson sky of 10σ holds 100 electrons, typical of a short exposure; a higher value damps faint
     * areas more).
     */
    public static final double MIN_SKY_SIGMAS = 10.0;

    /** Validates the model. */
    public NoiseModel {
        boolean auto = Double.isNaN(gain) && Double.isNaN(readNoise) && Double.isNaN(pedestal);
        if (!auto) {
            if (!(gain > 0) || Double.isInfinite(gain)) {
                throw new IllegalArgumentException("gain is " + gain + ": give electrons per data unit, > 0");
            }
            if (!(readNoise >= 0) || Double.isInfinite(readNoise)) {
                throw new IllegalArgumentException("readNoise is " + readNoise + ": give a finite value >= 0 in data units");
            }
            if (!(pedestal >= 0) || Double.isInfinite(pedestal)) {
                throw new IllegalArgumentException("pedestal is " + pedestal + ": give a finite value >= 0 in data units");
            }
        }
    }

    /** @return a model estimated from each plane's sky (see the class comment) */
    public static NoiseModel estimated() {
        return new NoiseModel(Double.NaN, Double.NaN, Double.NaN);
    }

    /** @return pure Poisson counts: gain 1, no read noise, no pedestal */
    public static NoiseModel poissonCounts() {
        return new NoiseModel(1, 0, 0);
    }

    /** @return true if this model is to be estimated from the data */
    public boolean isEstimated() {
        return Double.isNaN(gain);
    }

    /** @return the offset {@code c = P + g r²} added to data and model, in data units */
    public double offset() {
        return pedestal + gain * readNoise * readNoise;
    }
}
