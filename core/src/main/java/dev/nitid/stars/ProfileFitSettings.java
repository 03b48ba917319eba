package dev.nitid.stars;

import dev.nitid.stars.fit.FitSettings;

/**
 * Settings of {@link StarProfileFit}.
 *
 * @param sampling how the profile is compared with pixels
 * @param solver   Levenberg–Marquardt damping and stopping rules
 */
public record ProfileFitSettings(PixelSampling sampling, FitSettings solver) {

    /** Validates the settings. */
    public ProfileFitSettings {
        if (sampling == null) {
            throw new IllegalArgumentException("sampling is null: choose POINT or INTEGRATED");
        }
        if (solver == null) {
            throw new IllegalArgumentException("solver is null: use FitSettings.defaults()");
        }
    }

    /** @return point sampling at pixel centres, default solver settings */
    public static ProfileFitSettings defaults() {
        return new ProfileFitSettings(PixelSampling.POINT, FitSettings.defaults());
    }

    /** @return these settings with another sampling */
    public ProfileFitSettings withSampling(PixelSampling s) {
        return new ProfileFitSettings(s, solver);
    }

    /** @return these settings with other solver settings */
    public ProfileFitSettings withSolver(FitSettings s) {
        return new ProfileFitSettings(sampling, s);
    }
}
