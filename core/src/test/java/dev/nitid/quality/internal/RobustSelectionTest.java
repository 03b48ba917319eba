package dev.nitid.quality.internal;

import static org.junit.jupiter.api.Assertions.assertEquals;

import dev.nitid.testdata.SeededCases;
import java.util.Arrays;
import java.util.SplittableRandom;
import java.util.stream.Stream;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.MethodSource;

/**
 * The selection-based median and MAD against the textbook definition computed through a full sort
 * ({@code java.util.Arrays.sort}, JDK 17, as the oracle): the middle value of the sorted sample, or the mean
 * of the two middle values for an even count (Hyndman &amp; Fan 1996, The American Statistician 50, 361,
 * sample median). Selection returns order statistics, never approximations, so equality is exact.
 */
class RobustSelectionTest {

    static Stream<Long> smallCases() {
        return SeededCases.seeds("robust-select-small", 40);
    }

    static Stream<Long> largeCases() {
        return SeededCases.seeds("robust-select-large", 3);
    }

    @ParameterizedTest(name = "seed {0}")
    @MethodSource("smallCases")
    void selectionMatchesTheSortedDefinition(long seed) {
        SplittableRandom rnd = new SplittableRandom(seed);
        int n = 1 + rnd.nextInt(3000);
        double[] v = sample(rnd, n);
        double[] before = v.clone();
        assertEquals(sortedMedian(v, n), Robust.median(v, n), 0.0, "median n=" + n);
        assertEquals(sortedMad(v, n), Robust.madSigma(v, n), 0.0, "MAD σ n=" + n);
        assertEquals(Arrays.toString(before), Arrays.toString(v), "median and madSigma leave the input alone");
        int k = rnd.nextInt(n);
        double[] sorted = v.clone();
        Arrays.sort(sorted);
        assertEquals(sorted[k], Robust.select(v.clone(), n, k), 0.0, "order statistic " + k);
    }

    @ParameterizedTest(name = "seed {0}")
    @MethodSource("largeCases")
    void parallelMedianIsExactForAnyThreadCount(long seed) {
        SplittableRandom rnd = new SplittableRandom(seed);
        int n = Robust.PARALLEL_MIN + rnd.nextInt(4000);
        double[] v = sample(rnd, n);
        double median = sortedMedian(v, n);
        double mad = sortedMad(v, n);
        for (int threads : new int[] {1, 2, 3}) {
            assertEquals(median, Robust.medianParallel(v, n, threads), 0.0, "median, " + threads + " threads");
            assertEquals(mad, Robust.madSigmaParallel(v.clone(), n, threads), 0.0, "MAD σ, " + threads + " threads");
        }
    }

    @Test
    void middleValuesInDifferentHistogramBins() {
        // Half zeros, half ones: the two middle order statistics sit in the first and the last bin; the
        // median by definition is their mean, 0.5.
        int n = 2 * Robust.PARALLEL_MIN;
        double[] v = new double[n];
        for (int i = 0; i < n; i++) {
            v[i] = i % 2;
        }
        assertEquals(0.5, Robust.medianParallel(v, n, 2), 0.0);
        assertEquals(sortedMedian(v, n), Robust.median(v, n), 0.0);
        double[] same = new double[Robust.PARALLEL_MIN + 1];
        Arrays.fill(same, 3.25);
        assertEquals(3.25, Robust.medianParallel(same, same.length, 2), 0.0, "constant sample");
        assertEquals(0.0, Robust.madSigmaParallel(same, same.length, 2), 0.0, "constant sample has no spread");
    }

    /** Gaussian noise with outliers, sometimes rounded to whole numbers (runs of equal values). */
    private static double[] sample(SplittableRandom rnd, int n) {
        boolean quantised = rnd.nextBoolean();
        double[] v = new double[n];
        for (int i = 0; i < n; i++) {
            double x = 100 + 5 * gauss(rnd);
            if (rnd.nextInt(50) == 0) {
                x += rnd.nextDouble() * 1e6 * (rnd.nextBoolean() ? 1 : -1);
            }
            v[i] = quantised ? Math.rint(x) : x;
        }
        return v;
    }

    private static double gauss(SplittableRandom rnd) {
        return Math.sqrt(-2 * Math.log(1 - rnd.nextDouble())) * Math.cos(2 * Math.PI * rnd.nextDouble());
    }

    private static double sortedMedian(double[] v, int n) {
        double[] c = Arrays.copyOf(v, n);
        Arrays.sort(c);
        return n % 2 == 1 ? c[n / 2] : 0.5 * (c[n / 2 - 1] + c[n / 2]);
    }

    /** 1.4826 · MAD (Rousseeuw &amp; Croux 1993, JASA 88, 1273). */
    private static double sortedMad(double[] v, int n) {
        double m = sortedMedian(v, n);
        double[] d = new double[n];
        for (int i = 0; i < n; i++) {
            d[i] = Math.abs(v[i] - m);
        }
        return 1.482602218505602 * sortedMedian(d, n);
    }
}
