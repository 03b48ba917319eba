package dev.nitid.restore;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.nitid.fft.Boundary;
import dev.nitid.fft.ConvolutionSettings;
import dev.nitid.fft.Convolver;
import dev.nitid.image.Image;
import dev.nitid.restore.internal.RlPlan;
import dev.nitid.testdata.ArrayAssert;
import dev.nitid.testdata.SeededCases;
import java.util.List;
import java.util.SplittableRandom;
import java.util.stream.Stream;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.EnumSource;
import org.junit.jupiter.params.provider.MethodSource;

/**
 * Properties of the Richardson–Lucy iteration (reference/README.md §5.2): flux kept, non-negativity,
 * monotone likelihood (Shepp &amp; Vardi 1982, IEEE TMI 1, 113; Dempster, Laird &amp; Rubin 1977, JRSS B 39, 1),
 * fixed points (Lucy 1974, AJ 79, 745), thread-count independence.
 */
class RichardsonLucyPropertiesTest {
    /** float32 sums over a few thousand pixels: relative error of order 1e-6 (common practice, no source). */
    private static final double FLUX_RTOL = 1e-5;
    /** Allowed likelihood decrease between iterations, relative: float32 round-off of K o (common practice). */
    private static final double LOGL_SLACK = 1e-7;
    /** float32 FFT convolution round-off, relative to the largest value (common practice, no source). */
    private static final double FFT_ROUNDOFF = 2e-6;

    static Stream<Long> seeds() {
        return SeededCases.seeds("rl-properties", 8);
    }

    private static RestoreSettings plain(EdgeHandling e, int n) {
        return RestoreSettings.defaults().withMethod(Method.RICHARDSON_LUCY).withEdges(e)
                .withNoise(NoiseModel.poissonCounts()).withProtection(StarProtection.none()).withIterations(n)
                .withThreads(1);
    }

    @ParameterizedTest(name = "seed {0}")
    @MethodSource("seeds")
    void fluxKeptNonNegativeAndLikelihoodRises(long seed) {
        SplittableRandom rnd = new SplittableRandom(seed);
        int w = 17 + rnd.nextInt(20);
        int h = 13 + rnd.nextInt(20);
        Image d = Fixtures.randomScene(rnd, w, h, 5 + 20 * rnd.nextDouble());
        Image psf = Fixtures.gaussianPsf(7, 0.8 + rnd.nextDouble());
        double sumD = d.stats(0).sum();
        for (EdgeHandling e : new EdgeHandling[] {EdgeHandling.PERIODIC, EdgeHandling.REFLECT}) {
            RestorationResult r = Restorers.create(plain(e, 8)).restore(d, psf);
            // §5.2.1: Σ o_{k+1} = Σ d for the multiplicative form with the exact adjoint and Kᵀ1 = 1
            assertEquals(sumD, r.image().stats(0).sum(), FLUX_RTOL * sumD, e + ": flux");
            assertTrue(r.image().stats(0).min() >= 0, e + ": output >= 0 (§5.2.2)");
            List<IterationRecord> hist = r.planes().get(0).history();
            for (int k = 1; k < hist.size(); k++) {
                double a = hist.get(k - 1).logLikelihood();
                double b = hist.get(k).logLikelihood();
                assertTrue(b >= a - LOGL_SLACK * Math.abs(a), e + ": L fell from " + a + " to " + b + " at " + k);
            }
        }
    }

    @Test
    void noiseFreeBlurOfTheTruthHasTheTruthAsFixedPoint() {
        // §5.2.4: d = K o* exactly (periodic) ⇒ one iteration from o* changes it by ~nothing
        SplittableRandom rnd = new SplittableRandom(7);
        int w = 24;
        int h = 19;
        Image truth = Fixtures.randomScene(rnd, w, h, 10);
        Image psf = Fixtures.gaussianPsf(5, 1.0);
        Convolver c = Convolver.create(w, h, psf, new ConvolutionSettings(Boundary.PERIODIC, 1));
        float[] d = new float[w * h];
        c.convolve(truth.plane(0), d);
        RlPlan plan = new RlPlan(w, h, psf, EdgeHandling.PERIODIC, Method.RICHARDSON_LUCY, 1);
        float[] out = new float[w * h];
        plan.run(d, null, null, false, out, new RlPlan.Params(Method.RICHARDSON_LUCY, 0, 1, 0, 1, 1),
                new RlPlan.Conventions(Double.NaN, 1e-6, 0, true, truth.plane(0)), Stopping.fixed(1), 0,
                ProgressListener.NONE, () -> false);
        // float32: the ratio d/(K o*) is 1 up to FFT round-off, ≈1e-6 (README's 1e-12 is for float64)
        ArrayAssert.assertClose(truth.plane(0), out, w, 2e-6, 0);
    }

    @Test
    void deltaPsfReturnsTheDataAfterOneIterationAndAConstantStaysConstant() {
        Image delta = Image.create(3, 3);
        delta.set(1, 1, 1f);
        SplittableRandom rnd = new SplittableRandom(3);
        Image d = Fixtures.randomScene(rnd, 20, 11, 3);
        Image one = Restorers.create(plain(EdgeHandling.REFLECT, 1)).restore(d, delta).image();
        // §5.2.4, delta PSF; float32 FFT round-off relative to the largest pixel
        ArrayAssert.assertClose(d.plane(0), one.plane(0), 20, 0, FFT_ROUNDOFF * d.stats(0).max());
        Image flat = Image.create(20, 11);
        flat.fill(42f);
        Image out = Restorers.create(plain(EdgeHandling.REFLECT, 5)).restore(flat, Fixtures.gaussianPsf(5, 1.2)).image();
        ArrayAssert.assertClose(flat.plane(0), out.plane(0), 20, 0, FFT_ROUNDOFF * 42); // §5.2.4, constant image
    }

    @Test
    void aPointSourceSharpensMonotonically() {
        // Lucy (1974): on a noise-free point source the peak grows with every iteration
        int n = 33;
        Image psf = Fixtures.gaussianPsf(9, 1.5);
        Image truth = Image.create(n, n);
        truth.fill(1f);
        truth.set(16, 16, 1000f);
        Convolver c = Convolver.create(n, n, psf, new ConvolutionSettings(Boundary.REFLECT, 1));
        Image d = Image.create(n, n);
        c.convolve(truth.plane(0), d.plane(0));
        // from the flat start the first iterate is Kᵀd, so compare iterates with each other
        double prev = Restorers.create(plain(EdgeHandling.REFLECT, 1)).restore(d, psf).image().get(16, 16);
        for (int k = 2; k <= 12; k++) {
            double peak = Restorers.create(plain(EdgeHandling.REFLECT, k)).restore(d, psf).image().get(16, 16);
            assertTrue(peak > prev, "peak " + peak + " after " + k + " iterations, " + prev + " before");
            prev = peak;
        }
    }

    @ParameterizedTest
    @EnumSource(Method.class)
    void oneThreadEqualsTwoThreads(Method m) {
        SplittableRandom rnd = new SplittableRandom(11);
        Image d = Fixtures.randomScene(rnd, 40, 37, 20);
        Image psf = Fixtures.gaussianPsf(7, 1.3);
        RestoreSettings s = RestoreSettings.defaults().withMethod(m).withIterations(6);
        float[] a = Restorers.create(s.withThreads(1)).restore(d, psf).image().plane(0);
        float[] b = Restorers.create(s.withThreads(2)).restore(d, psf).image().plane(0);
        assertArrayEquals(a, b, m + ": results must not depend on the thread count");
    }

    @Test
    void acceleratedTvWithProtectedStarsIsTheSameForAnyThreadCount() {
        // the default path: α over the protected stars' cores (a list summed in order), ring floor, TV rows
        Scene scene = new Scene(3, 96, 3.5, 200, 5);
        RestoreSettings s = RestoreSettings.defaults().withIterations(12);
        RestorationResult one = Restorers.create(s.withThreads(1)).restore(scene.observed, scene.psf);
        assertTrue(one.planes().get(0).protectedStars() > 0, "the scene must have protected stars");
        for (int threads : new int[] {2, 3}) {
            float[] b = Restorers.create(s.withThreads(threads)).restore(scene.observed, scene.psf).image().plane(0);
            assertArrayEquals(one.image().plane(0), b, threads + " threads: results must not depend on the thread count");
        }
    }

    @Test
    void acceleratedReachesTheSameLikelihoodInFewerIterations() {
        // Biggs & Andrews (1997): the same likelihood in fewer iterations
        SplittableRandom rnd = new SplittableRandom(5);
        Image truth = Fixtures.randomScene(rnd, 48, 48, 10);
        Image psf = Fixtures.gaussianPsf(9, 1.6);
        Convolver c = Convolver.create(48, 48, psf, new ConvolutionSettings(Boundary.REFLECT, 1));
        Image d = Image.create(48, 48);
        c.convolve(truth.plane(0), d.plane(0));
        int plainIters = 40;
        List<IterationRecord> ph = Restorers.create(plain(EdgeHandling.REFLECT, plainIters)).restore(d, psf)
                .planes().get(0).history();
        double target = ph.get(plainIters - 1).logLikelihood();
        List<IterationRecord> ah = Restorers.create(plain(EdgeHandling.REFLECT, plainIters)
                .withMethod(Method.ACCELERATED_RL)).restore(d, psf).planes().get(0).history();
        int reached = -1;
        for (IterationRecord r : ah) {
            if (r.logLikelihood() >= target) {
                reached = r.iteration();
                break;
            }
        }
        System.out.println("accelerated RL reached plain RL's " + plainIters + "-iteration likelihood after "
                + reached + " iterations");
        assertTrue(reached > 0 && reached <= plainIters / 2,
                "accelerated RL reached plain RL's 40-iteration likelihood after " + reached + " iterations");
    }

    /**
     * Iterations the accelerated TV form may take to reach TV-RL's 60-iteration likelihood. With α clipped at
     * {@link dev.nitid.restore.internal.RlPlan#ACCEL_MAX_TV} = 0.5 an extrapolated step is at most
     * 1/(1 − α) = 2 plain steps (geometric series; Biggs &amp; Andrews 1997 for the predictor), so the gain is
     * at most 2×; we require 1.5×, i.e. 40 of 60 (project target, no source).
     */
    private static final int TV_ACCELERATED_MAX_ITERATIONS = 40;

    @Test
    void acceleratedTvReachesTvLikelihoodInFewerIterations() {
        // the extrapolation applies to any fixed-point map, TV-RL's too (Biggs & Andrews 1997); run with the
        // defaults (ring floor, α over the protected stars' discs) on the noisy Moffat field of StarProtectionTest
        Scene scene = new Scene(1, 256, 4.0, 200, 5);
        int tvIters = 60;
        RestoreSettings tv = RestoreSettings.defaults().withMethod(Method.TV_RL).withIterations(tvIters).withThreads(1);
        List<IterationRecord> th = Restorers.create(tv).restore(scene.observed, scene.psf).planes().get(0).history();
        double target = th.get(tvIters - 1).logLikelihood();
        List<IterationRecord> ah = Restorers.create(tv.withMethod(Method.ACCELERATED_TV_RL))
                .restore(scene.observed, scene.psf).planes().get(0).history();
        int reached = -1;
        for (IterationRecord r : ah) {
            if (r.logLikelihood() >= target) {
                reached = r.iteration();
                break;
            }
        }
        System.out.println("accelerated TV-RL reached TV-RL's " + tvIters + "-iteration likelihood after "
                + reached + " iterations");
        assertTrue(reached > 0 && reached <= TV_ACCELERATED_MAX_ITERATIONS,
                "accelerated TV-RL reached TV-RL's " + tvIters + "-iteration likelihood after " + reached + " iterations");
    }

    @Test
    void cancellationStopsWithTheLastIterate() {
        Image d = Fixtures.randomScene(new SplittableRandom(1), 30, 30, 10);
        int[] calls = {0};
        RestorationResult r = Restorers.create(plain(EdgeHandling.REFLECT, 50)).restore(d, Fixtures.gaussianPsf(5, 1),
                rec -> calls[0]++, () -> calls[0] >= 3);
        assertEquals(StopReason.CANCELLED, r.stopReason());
        assertEquals(3, r.iterations());
        assertEquals(3, r.planes().get(0).history().size());
    }

    @Test
    void colourCubeUsesOnePsfPerPlane() {
        SplittableRandom rnd = new SplittableRandom(9);
        Image p0 = Fixtures.randomScene(rnd, 29, 23, 10);
        Image p1 = Fixtures.randomScene(rnd, 29, 23, 30);
        Image cube = Image.wrap(29, 23, p0.plane(0).clone(), p1.plane(0).clone());
        Image k0 = Fixtures.gaussianPsf(7, 1.0);
        Image k1 = Fixtures.gaussianPsf(7, 2.0);
        Image psfCube = Image.wrap(7, 7, k0.plane(0).clone(), k1.plane(0).clone());
        Restorer r = Restorers.create(plain(EdgeHandling.REFLECT, 5));
        Image out = r.restore(cube, psfCube).image();
        assertArrayEquals(r.restore(p0, k0).image().plane(0), out.plane(0), "plane 0 with PSF 0");
        assertArrayEquals(r.restore(p1, k1).image().plane(0), out.plane(1), "plane 1 with PSF 1");
    }

    @ParameterizedTest
    @EnumSource(value = EdgeHandling.class, names = {"REFLECT", "EXTENDED_DOMAIN"})
    void onePsfForACubeReusesThePlanWithoutCrosstalk(EdgeHandling e) {
        // pins a past bug: the accelerated form's swapped buffers aliased on the plan's second run
        SplittableRandom rnd = new SplittableRandom(21);
        Image[] p = {Fixtures.randomScene(rnd, 27, 31, 10), Fixtures.randomScene(rnd, 27, 31, 40),
            Fixtures.randomScene(rnd, 27, 31, 5)};
        Image cube = Image.wrap(27, 31, p[0].plane(0).clone(), p[1].plane(0).clone(), p[2].plane(0).clone());
        Image k = Fixtures.gaussianPsf(5, 1.1);
        for (int iters : new int[] {4, 5}) {
            Restorer r = Restorers.create(plain(e, iters).withMethod(Method.ACCELERATED_RL));
            Image out = r.restore(cube, k).image();
            for (int q = 0; q < 3; q++) {
                assertArrayEquals(r.restore(p[q], k).image().plane(0), out.plane(q), e + " plane " + q + ", " + iters);
            }
        }
    }
}
