package dev.nitid.quality;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.nitid.image.Image;
import dev.nitid.restore.Method;
import dev.nitid.restore.RestoreSettings;
import dev.nitid.restore.Restorers;
import dev.nitid.stars.MeasureSettings;
import dev.nitid.stars.StarMeasurer;
import dev.nitid.synth.DetectorSettings;
import dev.nitid.synth.ExtendedSettings;
import dev.nitid.synth.FieldGenerator;
import dev.nitid.synth.FieldSettings;
import dev.nitid.synth.FluxLaw;
import dev.nitid.synth.ModelPsf;
import dev.nitid.synth.Placement;
import dev.nitid.synth.StarSettings;
import dev.nitid.synth.SyntheticField;
import org.junit.jupiter.api.Test;

/**
 * The figures {@code sharpen} prints, chosen from the image alone, against the harness metrics computed
 * with the known truth of a synthetic field (the quality definitions of the restorer issue).
 */
class ObservedCheckTest {
    /** Different star sets (detected vs catalogue) give medians a few per cent apart (measured here). */
    private static final double FWHM_RTOL = 0.05;
    /** Different sky masks (detections vs noise-free model) estimate σ within a few per cent. */
    private static final double NOISE_RTOL = 0.08;

    @Test
    void agreesWithTheTruthBasedHarnessOnASyntheticField() {
        SyntheticField f = FieldGenerator.generate(new FieldSettings(300, 300, 7,
                new StarSettings(36, FluxLaw.UNIFORM_MAGNITUDE, 2e3, 1e6, 1, Placement.GRID, 32),
                new ExtendedSettings(150, 6, 50, 1.2, 1, 200), ModelPsf.moffat(3.5, 3).withSize(41),
                new DetectorSettings(150, 1.5, 6, 2, Double.POSITIVE_INFINITY)));
        Image out = Restorers.create(RestoreSettings.defaults().withMethod(Method.RICHARDSON_LUCY)
                .withIterations(15)).restore(f.observed(), f.psf()).image();

        QualityReference truthRef = QualityReference.of(f, QualitySettings.defaults());
        QualityReport truth = truthRef.evaluate(out);
        ObservedCheck check = ObservedCheck.prepare(f.observed(),
                StarMeasurer.measure(f.observed(), MeasureSettings.defaults()), QualitySettings.defaults());
        ObservedCheck.Figures seen = check.evaluate(out);

        assertTrue(check.starCount() >= 10, "stars chosen from the image: " + check.starCount());
        assertEquals(truthRef.inputFwhm(), seen.fwhmIn(), FWHM_RTOL * truthRef.inputFwhm(), "input FWHM");
        assertEquals(truth.fwhmRatio(), seen.fwhmRatio(), FWHM_RTOL * truth.fwhmRatio(), "FWHM ratio");
        assertEquals(truth.noiseIn(), seen.noiseIn(), NOISE_RTOL * truth.noiseIn(), "input sky noise");
        assertEquals(truth.noiseRatio(), seen.noiseRatio(), NOISE_RTOL * truth.noiseRatio(), "noise ratio");
        assertEquals(truth.flux().ratio(), seen.fluxRatio(), 0.02, "flux ratio");
        assertTrue(seen.fwhmRatio() < 0.95, "15 RL iterations sharpen: ratio " + seen.fwhmRatio());
    }

    @Test
    void inputAgainstItselfIsNeutral() {
        SyntheticField f = FieldGenerator.generate(FieldSettings.of(200, 200, 11)
                .withPsf(ModelPsf.gaussian(3).withSize(21))
                .withStars(new StarSettings(16, FluxLaw.UNIFORM_MAGNITUDE, 1e4, 1e5, 1, Placement.GRID, 20)));
        ObservedCheck check = ObservedCheck.prepare(f.observed(),
                StarMeasurer.measure(f.observed(), MeasureSettings.defaults()), QualitySettings.defaults());
        ObservedCheck.Figures same = check.evaluate(f.observed());
        // Definitions: every ratio of an image with itself is exactly 1.
        assertEquals(1.0, same.fwhmRatio(), 1e-12);
        assertEquals(1.0, same.noiseRatio(), 1e-12);
        assertEquals(1.0, same.fluxRatio(), 1e-12);
    }
}
