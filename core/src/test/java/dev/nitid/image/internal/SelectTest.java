package dev.nitid.image.internal;

import static org.junit.jupiter.api.Assertions.assertEquals;

import dev.nitid.testdata.SeededCases;
import java.util.Arrays;
import java.util.SplittableRandom;
import java.util.stream.Stream;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.MethodSource;

/** Selection against sorting (the oracle), and the MAD example of the reference README §7. */
class SelectTest {
    static Stream<Long> seeds() {
        return SeededCases.seeds("select-vs-sort", 30);
    }

    @ParameterizedTest(name = "seed {0}")
    @MethodSource("seeds")
    void kthAndMedianMatchSorting(long seed) {
        SplittableRandom rnd = new SplittableRandom(seed);
        // Sizes beyond 600 take the sampling step of Floyd and Rivest's selection.
        int n = 1 + rnd.nextInt(rnd.nextBoolean() ? 300 : 6000);
        float[] a = new float[n];
        for (int i = 0; i < n; i++) {
            // Few distinct values on purpose: ties are where selection goes wrong.
            a[i] = rnd.nextInt(Math.max(1, n / 3));
        }
        float[] sorted = a.clone();
        Arrays.sort(sorted);
        int k = rnd.nextInt(n);
        float[] b = a.clone();
        assertEquals(sorted[k], Select.kth(b, n, k));
        for (int i = 0; i < n; i++) {
            // The partition the even-count median relies on: ≤ before k, ≥ after.
            if (i < k ? b[i] > sorted[k] : i > k && b[i] < sorted[k]) {
                throw new AssertionError("index " + i + " holds " + b[i] + " on the wrong side of " + sorted[k]);
            }
        }
        double med = (n & 1) == 1 ? sorted[n / 2] : 0.5 * (sorted[n / 2 - 1] + sorted[n / 2]);
        assertEquals(med, Select.median(a.clone(), n), 0.0);
    }

    @Test
    void madOfTheReferenceExample() {
        // Reference README §7 [LIB]: [1, 2, 3, 4, 100] has MAD 1, so σ̂ = 1.482602.
        assertEquals(1.482602218505602, Select.madSigma(new double[] {1, 2, 3, 4, 100}), 1e-12);
    }

    @Test
    void weightedMedianMinimisesWeightedAbsoluteDeviation() {
        // Equal weights: the ordinary median.
        assertEquals(3, Select.weightedMedian(new double[] {5, 1, 3, 2, 4}, new double[] {1, 1, 1, 1, 1}), 0);
        // One heavy value dominates.
        assertEquals(10, Select.weightedMedian(new double[] {1, 2, 10}, new double[] {1, 1, 5}), 0);
        // Exactly half the weight on each side: midpoint of the two middle values.
        assertEquals(2.5, Select.weightedMedian(new double[] {1, 2, 3, 4}, new double[] {1, 1, 1, 1}), 0);
        // Brute force: the weighted median minimises Σ w|v − m| over the data values.
        SplittableRandom rnd = new SplittableRandom(5);
        for (int t = 0; t < 50; t++) {
            int n = 1 + rnd.nextInt(20);
            double[] v = new double[n];
            double[] w = new double[n];
            for (int i = 0; i < n; i++) {
                v[i] = rnd.nextDouble(-10, 10);
                w[i] = rnd.nextDouble(0.1, 5);
            }
            double m = Select.weightedMedian(v, w);
            double best = Double.POSITIVE_INFINITY;
            for (double c : v) {
                best = Math.min(best, cost(v, w, c));
            }
            assertEquals(best, cost(v, w, m), 1e-9 * best + 1e-12, "trial " + t);
        }
    }

    private static double cost(double[] v, double[] w, double m) {
        double s = 0;
        for (int i = 0; i < v.length; i++) {
            s += w[i] * Math.abs(v[i] - m);
        }
        return s;
    }
}
