package dev.nitid.restore.internal;

import static org.junit.jupiter.api.Assertions.assertEquals;

import dev.nitid.testdata.SeededCases;
import java.util.Arrays;
import java.util.SplittableRandom;
import java.util.stream.Stream;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.MethodSource;

/**
 * The selection median of {@link SkyNoise} against the definition by sorting (oracle: JDK
 * {@code Arrays.sort}; sample median as the middle value or the mean of the two middle values, Hyndman
 * &amp; Fan 1996, Am. Stat. 50, 361): the values must be the same bits, for odd and even counts, ties,
 * outliers and sorted or reversed input (the cases where a careless pivot degrades).
 */
class SkyNoiseMedianTest {
    static Stream<Long> seeds() {
        return SeededCases.seeds("sky-median", 40);
    }

    @ParameterizedTest
    @MethodSource("seeds")
    void selectionMedianEqualsSortedMedian(long seed) {
        SplittableRandom rnd = new SplittableRandom(seed);
        int n = 1 + rnd.nextInt(5000);
        float[] a = new float[n];
        int kind = rnd.nextInt(4);
        for (int i = 0; i < n; i++) {
            a[i] = switch (kind) {
                case 0 -> (float) (300 + 6 * rnd.nextGaussian());          // sky noise
                case 1 -> rnd.nextInt(7);                                   // heavy ties
                case 2 -> i;                                                // already sorted
                default -> rnd.nextDouble() < 0.1 ? 1e6f : (float) -i;      // reversed with outliers
            };
        }
        float[] sorted = a.clone();
        Arrays.sort(sorted);
        double expected = (n & 1) == 1 ? sorted[n / 2] : 0.5 * ((double) sorted[n / 2 - 1] + sorted[n / 2]);
        float[] work = a.clone();
        assertEquals(expected, SkyNoise.median(work, n), 0.0, "seed " + seed + ", n " + n + ", kind " + kind);
        float[] back = work.clone();
        Arrays.sort(back);
        assertEquals(Arrays.toString(sorted), Arrays.toString(back), "selection must only reorder the samples");
    }
}
