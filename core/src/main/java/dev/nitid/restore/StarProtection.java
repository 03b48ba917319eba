package dev.nitid.restore;

/**
 * Settings of the star-ringing protection.
 *
 * @param guard        the method
 * @param detectSigma  a star is protected when its peak is this many sky σ above the sky; &gt; 0
 * @param radiusFactor protected disc radius in units of the PSF's radius at 1/1000 of its peak (at least
 *                     3 px); &gt; 0
 * @param marginSigma  how far below the local sky the estimate may go inside the disc, in sky σ; ≥ 0
 */
public record StarProtection(StarGuard guard, double detectSigma, double radiusFactor, double marginSigma) {
    /** Validates the settings. */
    public StarProtection {
        if (guard == null) {
            throw new IllegalArgumentException("star guard is null: choose NONE, SKY_FLOOR or RING_FLOOR");
        }
        if (!(detectSigma > 0) || Double.isInfinite(detectSigma)) {
            throw new IllegalArgumentException("detectSigma is " + detectSigma + ": use a finite value > 0");
        }
        if (!(radiusFactor > 0) || Double.isInfinite(radiusFactor)) {
            throw new IllegalArgumentException("radiusFactor is " + radiusFactor + ": use a finite value > 0");
        }
        if (!(marginSigma >= 0) || Double.isInfinite(marginSigma)) {
            throw new IllegalArgumentException("marginSigma is " + marginSigma + ": use a finite value >= 0");
        }
    }

    /** @return no protection */
    public static StarProtection none() {
        return new StarProtection(StarGuard.NONE, 30, 1.5, 0.5);
    }

    /** @return the sky floor with the default parameters (tuned on synthetic fields, see docs/restore.md) */
    public static StarProtection skyFloor() {
        return new StarProtection(StarGuard.SKY_FLOOR, 30, 1.5, 0.5);
    }

    /**
     * The ring floor with the default parameters: stars above 30 σ, discs of 1.5 PSF radii, annuli kept at or
     * above the local sky − 0.25 σ. The margin was tuned on the quality harness (docs/restore.md): 0.5 σ left
     * rings of 1.3 σ on the seeing scene, 0 σ reached 0.7 σ but moved 2.6 % of the diffraction stars' light
     * out of the photometric aperture; 0.25 σ gives 1.0 σ and 0.5 σ rings with fluxes at their ideal.
     *
     * @return the settings
     */
    public static StarProtection ringFloor() {
        return new StarProtection(StarGuard.RING_FLOOR, 30, 1.5, 0.25);
    }

    /** @return these settings with another guard */
    public StarProtection withGuard(StarGuard g) {
        return new StarProtection(g, detectSigma, radiusFactor, marginSigma);
    }

    /** @return these settings with another margin */
    public StarProtection withMarginSigma(double m) {
        return new StarProtection(guard, detectSigma, radiusFactor, m);
    }

    /** @return these settings with another detection threshold */
    public StarProtection withDetectSigma(double t) {
        return new StarProtection(guard, t, radiusFactor, marginSigma);
    }

    /** @return these settings with another radius factor */
    public StarProtection withRadiusFactor(double f) {
        return new StarProtection(guard, detectSigma, f, marginSigma);
    }
}
