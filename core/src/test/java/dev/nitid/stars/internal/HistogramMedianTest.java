package dev.nitid.stars.internal;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import dev.nitid.image.internal.Select;
import dev.nitid.testdata.SeededCases;
import java.util.Arrays;
import java.util.SplittableRandom;
import java.util.stream.Stream;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.MethodSource;

/** Histogram narrowing against sorting (the oracle): the same value, bit for bit, on awkward data. */
class HistogramMedianTest {
    static Stream<Long> seeds() {
        return SeededCases.seeds("histogram-median-vs-sort", 60);
    }

    /** The median by sorting a copy: the middle value, or the mean of the two middle ones (in double). */
    private static double sortedMedian(float[] a, int n) {
        float[] s = Arrays.copyOf(a, n);
        Arrays.sort(s);
        return (n & 1) == 1 ? s[n / 2] : 0.5 * ((double) s[n / 2 - 1] + s[n / 2]);
    }

    @ParameterizedTest(name = "seed {0}")
    @MethodSource("seeds")
    void equalsTheSortedMedian(long seed) {
        SplittableRandom rnd = new SplittableRandom(seed);
        int n = 1 + rnd.nextInt(rnd.nextBoolean() ? 100 : 9000);
        float[] a = new float[n];
        int kind = rnd.nextInt(4);
        for (int i = 0; i < n; i++) {
            double sky = 300 + 6 * rnd.nextGaussian();
            a[i] = switch (kind) {
                // A background cell: noisy sky.
                case 0 -> (float) sky;
                // ... with a bright star in it (a few values 10⁴ times the noise above the rest).
                case 1 -> (float) (rnd.nextInt(50) == 0 ? sky + 6e4 * rnd.nextDouble() : sky);
                // Whole-number data with many ties (16-bit frames).
                case 2 -> (float) Math.rint(sky);
                // Values one float step apart and mixed signs: the narrowest possible bins.
                default -> rnd.nextBoolean() ? Math.nextUp(1f) * (rnd.nextInt(3) - 1) : (float) (rnd.nextInt(3) - 1);
            };
        }
        float[] copy = a.clone();
        HistogramMedian h = new HistogramMedian(16);
        assertEquals(sortedMedian(a, n), h.median(a, n), 0.0, "n " + n + " kind " + kind);
        assertEquals(Select.median(copy.clone(), n), h.median(a, n), 0.0, "same as selection");
        assertArrayEquals(copy, a, "input not modified");
        // A prefix: only the first values count.
        int m = 1 + rnd.nextInt(n);
        assertEquals(sortedMedian(a, m), h.median(a, m), 0.0, "prefix of " + m);
    }

    @Test
    void constantAndTinyInputs() {
        HistogramMedian h = new HistogramMedian(4);
        assertEquals(7, h.median(new float[] {7}, 1), 0.0);
        assertEquals(2.5, h.median(new float[] {3, 2}, 2), 0.0);
        float[] same = new float[5000];
        Arrays.fill(same, 42.5f);
        assertEquals(42.5, h.median(same, same.length), 0.0);
        assertThrows(IllegalArgumentException.class, () -> h.median(new float[3], 0));
    }
}
