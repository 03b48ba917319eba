package dev.nitid.stars;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.nitid.psf.MoffatPsf;
import dev.nitid.synth.FieldGenerator;
import dev.nitid.synth.FieldSettings;
import dev.nitid.synth.FluxLaw;
import dev.nitid.synth.Placement;
import dev.nitid.synth.StarSettings;
import dev.nitid.synth.RenderedModelPsf;
import dev.nitid.synth.SyntheticField;
import dev.nitid.synth.TruthStar;
import org.junit.jupiter.api.Test;

/**
 * A field from the project's synthetic-field generator ({@code dev.nitid.synth}, written independently of this
 * package): elliptical Moffat stars rendered pixel-integrated by the psf package, the generator's default sky,
 * noise and saturation. Issue 6 tolerances.
 */
class SynthFieldTest {
    static final double MAJOR = 3.6;
    static final double MINOR = 3.2;
    static final double BETA = 3.0;
    static final double ANGLE_DEG = 35;

    @Test
    void measuresTheGeneratorsPsf() {
        // 300 stars of 3·10³ to 3·10⁵ ADU (peak S/N ≈ 10 to 1000 on the generator's default sky and read noise):
        // enough well-measured stars for the 2 % figure, which faint stars alone cannot reach.
        FieldSettings fs = FieldSettings.of(512, 512, 4242L)
                .withStars(new StarSettings(300, FluxLaw.POWER_LAW, 3e3, 3e5, 1.0, Placement.RANDOM, 12))
                .withPsf(new RenderedModelPsf(new MoffatPsf(MAJOR, MINOR, BETA, ANGLE_DEG), 31, 5));
        SyntheticField f = FieldGenerator.generate(fs);
        StarMeasurement m = StarMeasurer.measure(f.observed(),
                MeasureSettings.defaults().withSaturation(fs.detector().saturation()));
        ProfileSummary b = m.best();
        assertEquals(ProfileShape.MOFFAT, m.bestShape());
        assertEquals(MAJOR, b.fwhmMajor(), 0.02 * MAJOR, "major");
        assertEquals(MINOR, b.fwhmMinor(), 0.02 * MINOR, "minor");
        assertEquals(BETA, b.beta(), 0.10 * BETA, "beta");
        assertEquals(1 - MINOR / MAJOR, b.ellipticity(), 0.02, "ellipticity");
        assertEquals(0, Math.IEEEremainder(b.angle() - Math.toRadians(ANGLE_DEG), Math.PI), 0.1, "angle");
        double sum = 0;
        int n = 0;
        for (MeasuredStar s : m.stars()) {
            TruthStar best = null;
            double bd = 1.5;
            for (TruthStar t : f.catalogue()) {
                double d = Math.hypot(t.x() - s.x(), t.y() - s.y());
                if (d < bd) {
                    bd = d;
                    best = t;
                }
            }
            assertTrue(best != null, "accepted star at " + s.x() + ", " + s.y() + " is not in the catalogue");
            assertTrue(!best.saturated(), "a saturated star was accepted at " + s.x() + ", " + s.y());
            if (s.snr() >= 100) {
                sum += bd * bd;
                n++;
            }
        }
        assertTrue(n > 10, "bright stars " + n);
        double rms = Math.sqrt(sum / (2 * n));
        assertTrue(rms <= 0.05, "centroid RMS per axis " + rms + " px");
    }
}
