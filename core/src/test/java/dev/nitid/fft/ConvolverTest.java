package dev.nitid.fft;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.nitid.image.Image;
import dev.nitid.testdata.ArrayAssert;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.EnumSource;

/** Checks across paths: thread-count invariance, tiled ≡ whole plane, sizes reported, and caller errors. */
class ConvolverTest {
    /** Tiled and whole-plane results differ only by float round-off of different FFT sizes (see ConvolverContract). */
    private static final double PATH_TOL = ConvolverContract.REL_TOL;

    private static float[] run(Convolver c, float[] in, boolean adjoint) {
        float[] out = new float[in.length];
        if (adjoint) {
            c.correlate(in, out);
        } else {
            c.convolve(in, out);
        }
        return out;
    }

    @ParameterizedTest
    @EnumSource(Boundary.class)
    void oneThreadEqualsManyThreadsBitForBit(Boundary b) {
        int w = 203;
        int h = 157;
        SplittableRandom rnd = new SplittableRandom(99);
        float[] img = Oracles.random(rnd, w * h);
        Image psf = Oracles.randomPsf(rnd, 15, 11);
        for (boolean adjoint : new boolean[] {false, true}) {
            // Explicit pairs: whole plane 1 vs 2 and 1 vs 3 threads; tiles 1 vs 2 and 1 vs 4 threads.
            try (Convolver w1 = Convolver.create(w, h, psf, new ConvolutionSettings(b, 1, Tiling.WHOLE_PLANE));
                 Convolver w2 = Convolver.create(w, h, psf, new ConvolutionSettings(b, 2, Tiling.WHOLE_PLANE));
                 Convolver w3 = Convolver.create(w, h, psf, new ConvolutionSettings(b, 3, Tiling.WHOLE_PLANE));
                 Convolver t1 = Convolver.createTiled(w, h, psf, new ConvolutionSettings(b, 1), 48, 40);
                 Convolver t2 = Convolver.createTiled(w, h, psf, new ConvolutionSettings(b, 2), 48, 40);
                 Convolver t4 = Convolver.createTiled(w, h, psf, new ConvolutionSettings(b, 4), 48, 40)) {
                float[] r1 = run(w1, img, adjoint);
                assertArrayEquals(r1, run(w2, img, adjoint), "whole plane 1 vs 2 threads, adjoint=" + adjoint);
                assertArrayEquals(r1, run(w3, img, adjoint), "whole plane 1 vs 3 threads, adjoint=" + adjoint);
                float[] s1 = run(t1, img, adjoint);
                assertArrayEquals(s1, run(t2, img, adjoint), "tiles 1 vs 2 threads, adjoint=" + adjoint);
                assertArrayEquals(s1, run(t4, img, adjoint), "tiles 1 vs 4 threads, adjoint=" + adjoint);
                // Tiled ≡ whole plane within float tolerance.
                ArrayAssert.assertClose(r1, s1, w, 0, PATH_TOL * Oracles.maxAbs(r1));
            }
        }
    }

    @Test
    void reportsFastFftSizesAndTiling() {
        Image psf = Image.create(31, 31);
        psf.set(15, 15, 1f);
        try (Convolver c = Convolver.create(4144, 2822, psf,
                new ConvolutionSettings(Boundary.REFLECT, 1, Tiling.WHOLE_PLANE))) {
            // 4144 + 30 = 4174 → 4320 = 2^5·3^3·5; 2822 + 30 = 2852 → 2880 = 2^6·3^2·5.
            assertEquals(4320, c.fftWidth());
            assertEquals(2880, c.fftHeight());
            assertFalse(c.tiled());
        }
        try (Convolver c = Convolver.create(2000, 1500, psf, new ConvolutionSettings(Boundary.REFLECT, 1))) {
            assertTrue(c.tiled(), "AUTO tiles a large image with a small PSF");
            assertTrue(FftSizes.isSmooth235(c.fftWidth()) && c.fftWidth() % 2 == 0, "tile " + c.fftWidth());
        }
        try (Convolver c = Convolver.create(100, 80, psf, new ConvolutionSettings(Boundary.REFLECT, 1))) {
            assertFalse(c.tiled(), "AUTO keeps a small image whole");
        }
    }

    @Test
    void rejectsPsfLargerThanImage() {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> Convolver.create(64, 64, Image.create(129, 129), ConvolutionSettings.defaults()));
        assertTrue(e.getMessage().contains("129x129") && e.getMessage().contains("64x64")
                && e.getMessage().contains("crop the PSF or pad the image"), e.getMessage());
    }

    @Test
    void rejectsNaNInPsf() {
        Image psf = Image.create(5, 5);
        psf.fill(1f);
        psf.set(3, 1, Float.NaN);
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> Convolver.create(32, 32, psf, ConvolutionSettings.defaults()));
        assertTrue(e.getMessage().contains("(3, 1)") && e.getMessage().contains("NaN")
                && e.getMessage().contains("finite"), e.getMessage());
    }

    @Test
    void rejectsZeroSumPsf() {
        Image psf = Image.create(3, 1);
        psf.set(0, 0, 1f);
        psf.set(2, 0, -1f);
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> Convolver.create(32, 32, psf, ConvolutionSettings.defaults()));
        assertTrue(e.getMessage().contains("sums to 0") && e.getMessage().contains("normalise"), e.getMessage());
    }

    @Test
    void rejectsWrongArrayLengthAndBadSettings() {
        Image psf = Image.create(3, 3);
        psf.set(1, 1, 1f);
        try (Convolver c = Convolver.create(10, 10, psf, ConvolutionSettings.defaults())) {
            IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                    () -> c.convolve(new float[99], new float[100]));
            assertTrue(e.getMessage().contains("99") && e.getMessage().contains("10x10"), e.getMessage());
        }
        assertThrows(IllegalArgumentException.class, () -> new ConvolutionSettings(Boundary.ZERO, 0));
        assertThrows(IllegalArgumentException.class, () -> new ConvolutionSettings(Boundary.ZERO, 1, null));
        assertThrows(IllegalArgumentException.class, () -> new ConvolutionSettings(null, 1));
    }

    @Test
    void closedPlanRefusesWorkAndKeepsNoThreads() throws InterruptedException {
        Image psf = Image.create(3, 3);
        psf.set(1, 1, 1f);
        Convolver c = Convolver.create(50, 50, psf, new ConvolutionSettings(Boundary.ZERO, 3));
        c.convolve(new float[2500], new float[2500]);
        c.close();
        c.close();
        assertThrows(IllegalStateException.class, () -> c.convolve(new float[2500], new float[2500]));
        for (Thread t : Thread.getAllStackTraces().keySet()) {
            if (t.getName().startsWith("nitid-fft-") && t.isAlive() && !t.getName().equals("nitid-fft-cleaner")) {
                assertTrue(t.isDaemon(), "worker " + t.getName() + " is not a daemon");
            }
        }
    }
}
