package dev.nitid.testdata;

import org.junit.jupiter.api.Assertions;

/**
 * Array assertions that say where they failed: the pixel, both values, the error and the tolerance.
 */
public final class ArrayAssert {
    private ArrayAssert() {
    }

    /**
     * Asserts {@code |actual − expected| ≤ atol + rtol·|expected|} at every pixel.
     *
     * @param expected reference values, row-major
     * @param actual   values under test, row-major, same length
     * @param width    row length, used only to name the failing pixel as (x, y)
     * @param rtol     relative tolerance
     * @param atol     absolute tolerance
     */
    public static void assertClose(double[] expected, float[] actual, int width, double rtol, double atol) {
        Assertions.assertEquals(expected.length, actual.length, "array lengths");
        int worst = -1;
        double worstExcess = 0;
        for (int i = 0; i < expected.length; i++) {
            double err = Math.abs(actual[i] - expected[i]);
            double tol = atol + rtol * Math.abs(expected[i]);
            if (!(err <= tol) && (worst < 0 || err - tol > worstExcess)) {
                worst = i;
                worstExcess = err - tol;
            }
        }
        if (worst >= 0) {
            double err = Math.abs(actual[worst] - expected[worst]);
            Assertions.fail("worst pixel (" + (worst % width) + ", " + (worst / width) + "): expected "
                    + expected[worst] + " got " + actual[worst] + ", error " + err + " > tolerance "
                    + (atol + rtol * Math.abs(expected[worst])) + " (rtol " + rtol + ", atol " + atol + ")");
        }
    }

    /** Float-vs-float variant of {@link #assertClose(double[], float[], int, double, double)}. */
    public static void assertClose(float[] expected, float[] actual, int width, double rtol, double atol) {
        double[] e = new double[expected.length];
        for (int i = 0; i < e.length; i++) {
            e[i] = expected[i];
        }
        assertClose(e, actual, width, rtol, atol);
    }
}
