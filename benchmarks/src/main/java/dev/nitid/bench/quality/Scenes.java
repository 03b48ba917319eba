package dev.nitid.bench.quality;

import dev.nitid.psf.PupilPsf;
import dev.nitid.synth.DetectorSettings;
import dev.nitid.synth.ExtendedSettings;
import dev.nitid.synth.FieldSettings;
import dev.nitid.synth.FluxLaw;
import dev.nitid.synth.ImagePsf;
import dev.nitid.synth.SyntheticModelPsf;
import dev.nitid.synth.Placement;
import dev.nitid.synth.StarSettings;

/**
 * The two invented scenes of the quality harness, public so that tuning tools use exactly these settings.
 * Fixed seeds: the tables are reproducible.
 */
public final class Scenes {
    /** Side of both scenes in pixels. */
    public static final int SIZE = 512;

    /** The scene names, in table order. */
    public static final java.util.List<String> NAMES = java.util.List.of("seeing", "diffraction");

    private Scenes() {
    }

    /** Stars from 150 to 2·10⁶ ADU (about 10 magnitudes), counts N(&gt;F) ∝ F^−0.7. */
    private static StarSettings stars() {
        return new StarSettings(300, FluxLaw.POWER_LAW, 150, 2e6, 0.7, Placement.RANDOM, 12);
    }

    /** A compact nebula 25 σ bright at its peak, 14 fine filaments 1.2 px wide, three small galaxies. */
    private static ExtendedSettings extended() {
        return new ExtendedSettings(200, 14, 60, 1.2, 3, 300);
    }

    /** Sky 200 ADU per frame, gain 1.5 e⁻/ADU, read noise 6 e⁻, 4 frames: σ ≈ 5.9 ADU. */
    private static DetectorSettings detector() {
        return new DetectorSettings(200, 1.5, 6, 4, Double.POSITIVE_INFINITY);
    }

    /** @return seeing-limited: Moffat FWHM 4 px, β 3 (an invented night of average seeing) */
    public static FieldSettings seeing() {
        return new FieldSettings(SIZE, SIZE, 20261201L, stars(), extended(),
                SyntheticModelPsf.moffat(4.0, 3.0).withSize(63), detector());
    }

    /**
     * @return diffraction-limited: an invented space-borne telescope with a 33 % central obstruction and four
     *         vanes 1.5 % of the aperture wide, monochromatic 550 nm, sampled at 2.4 px per λ/D (Airy core
     *         FWHM ≈ 2.5 px); the PSF is the psf package's pupil model rendered once (stars on pixel centres)
     */
    public static FieldSettings diffraction() {
        PupilPsf pupil = PupilPsf.ofSampling(1 / 2.4, 550).withObstruction(0.33)
                .withVanes(4, 0.015 * 100, 0); // ofSampling's aperture is 100 mm
        return new FieldSettings(SIZE, SIZE, 20261202L, stars(), extended(),
                ImagePsf.of(pupil.render(101, 3, 0, 0), "pupil model: eps 0.33, 4 vanes 1.5% of D, 2.4 px per lambda/D"),
                detector());
    }

    /**
     * @param name "seeing" or "diffraction"
     * @return that scene's settings
     * @throws IllegalArgumentException for another name
     */
    public static FieldSettings byName(String name) {
        return switch (name) {
            case "seeing" -> seeing();
            case "diffraction" -> diffraction();
            default -> throw new IllegalArgumentException("scene '" + name + "' is unknown: use seeing or diffraction");
        };
    }
}
