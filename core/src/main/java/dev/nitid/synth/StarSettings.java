package dev.nitid.synth;

/**
 * The stars of a synthetic field.
 *
 * @param count     number of stars, ≥ 0
 * @param law       flux distribution
 * @param minFlux   faintest total flux in ADU, &gt; 0
 * @param maxFlux   brightest total flux in ADU, ≥ minFlux
 * @param slope     γ of {@link FluxLaw#POWER_LAW}, &gt; 0 (ignored by the other law)
 * @param placement where the stars go
 * @param margin    stars keep at least this many pixels from every edge, ≥ 0
 */
public record StarSettings(int count, FluxLaw law, double minFlux, double maxFlux, double slope,
                           Placement placement, double margin) {

    /** Validates the settings. */
    public StarSettings {
        if (count < 0) {
            throw new IllegalArgumentException("star count is " + count + ": use 0 or more");
        }
        if (law == null || placement == null) {
            throw new IllegalArgumentException("flux law and placement must be given");
        }
        if (!(minFlux > 0) || !(maxFlux >= minFlux) || Double.isInfinite(maxFlux)) {
            throw new IllegalArgumentException("star flux range " + minFlux + " to " + maxFlux
                    + " is invalid: use 0 < faintest ≤ brightest, both finite");
        }
        if (!(slope > 0) || Double.isInfinite(slope)) {
            throw new IllegalArgumentException("power-law slope is " + slope + ": use a finite value > 0 (1 is typical)");
        }
        if (!(margin >= 0)) {
            throw new IllegalArgumentException("margin is " + margin + ": use 0 or more pixels");
        }
    }

    /** @return 200 stars, power law γ = 1 from 100 to 10⁶ ADU, random positions, 8-pixel margin */
    public static StarSettings defaults() {
        return new StarSettings(200, FluxLaw.POWER_LAW, 100, 1e6, 1.0, Placement.RANDOM, 8);
    }

    /** @return no stars */
    public static StarSettings none() {
        return defaults().withCount(0);
    }

    /** @return these settings with another star count */
    public StarSettings withCount(int n) {
        return new StarSettings(n, law, minFlux, maxFlux, slope, placement, margin);
    }

    /** @return these settings with another flux law and range */
    public StarSettings withFluxes(FluxLaw l, double min, double max) {
        return new StarSettings(count, l, min, max, slope, placement, margin);
    }

    /** @return these settings with another power-law slope */
    public StarSettings withSlope(double s) {
        return new StarSettings(count, law, minFlux, maxFlux, s, placement, margin);
    }

    /** @return these settings with another placement */
    public StarSettings withPlacement(Placement p) {
        return new StarSettings(count, law, minFlux, maxFlux, slope, p, margin);
    }

    /** @return these settings with another margin */
    public StarSettings withMargin(double m) {
        return new StarSettings(count, law, minFlux, maxFlux, slope, placement, m);
    }
}
