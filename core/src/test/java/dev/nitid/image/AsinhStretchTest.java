package dev.nitid.image;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;

/** Lupton et al. 2004, PASP 116, 133: F(I) = asinh(Q I / s) normalised; colour ratios kept (their §3). */
class AsinhStretchTest {
    private static final double TIGHT = 1e-12;

    @Test
    void singlePlaneFollowsTheAsinhFormula() {
        AsinhStretch s = new AsinhStretch(100, 5, 8, 1000);
        // Hand-evaluated asinh via its definition asinh(x) = ln(x + sqrt(1 + x^2)); Java has no Math.asinh.
        double x = 250 - 100;
        double expected = Math.log(8 * x / 5 + Math.sqrt(1 + Math.pow(8 * x / 5, 2)))
                / Math.log(8 * 1000 / 5.0 + Math.sqrt(1 + Math.pow(8 * 1000 / 5.0, 2)));
        assertEquals(expected, s.apply(250f), TIGHT);
        assertEquals(0, s.apply(90f), 0, "below black is black");
        assertEquals(1, s.apply(1e9f), 0, "far above white is clipped to white");
        assertEquals(1, s.apply(1100f), TIGHT, "the white intensity maps to exactly 1");
    }

    @Test
    void linkedColourKeepsPlaneRatios() {
        AsinhStretch s = new AsinhStretch(0, 5, 8, 1e6);
        double[] out = new double[3];
        s.apply(new float[] {300, 150, 75}, out);
        assertEquals(2.0, out[0] / out[1], 1e-9, "R:G kept");
        assertEquals(2.0, out[1] / out[2], 1e-9, "G:B kept");
    }

    @Test
    void monotonic() {
        AsinhStretch s = new AsinhStretch(-3, 2, 10, 500);
        double prev = -1;
        for (float v = -10; v < 600; v += 0.5f) {
            double d = s.apply(v);
            assertTrue(d >= prev, "not monotonic at " + v);
            prev = d;
        }
    }

    @Test
    void rejectsNonPositiveSoftening() {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> new AsinhStretch(0, 0, 8, 10));
        assertTrue(e.getMessage().contains("softening 0.0"), e.getMessage());
    }
}
