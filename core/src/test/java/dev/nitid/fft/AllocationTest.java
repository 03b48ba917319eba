package dev.nitid.fft;

import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.nitid.image.Image;
import java.lang.management.ManagementFactory;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Assumptions;
import org.junit.jupiter.api.Test;

/**
 * After the first call a plan allocates nothing per call on the paths that stay inside our code and
 * JTransforms' split-radix (power-of-two) transforms. Measured with the HotSpot per-thread allocation
 * counter ({@code com.sun.management.ThreadMXBean#getThreadAllocatedBytes}), on one thread so that every
 * allocation is counted. (JTransforms' mixed-radix code allocates one scratch row per 1-D call, so the
 * whole-plane path on non-power-of-two grids is not held to this; see {@code RealFftKernel}.)
 */
class AllocationTest {
    /** Slack for the counter's own bookkeeping (a few objects), far below one image row of floats. */
    private static final long SLACK_BYTES = 1024;

    private static long allocated() {
        var mx = (com.sun.management.ThreadMXBean) ManagementFactory.getThreadMXBean();
        return mx.getThreadAllocatedBytes(Thread.currentThread().getId());
    }

    @Test
    void tiledConvolveAndCorrelateAllocateNothingAfterFirstCall() {
        Assumptions.assumeTrue(ManagementFactory.getThreadMXBean() instanceof com.sun.management.ThreadMXBean);
        int w = 700;
        int h = 500;
        SplittableRandom rnd = new SplittableRandom(3);
        float[] in = Oracles.random(rnd, w * h);
        float[] out = new float[w * h];
        Image psf = Oracles.randomPsf(rnd, 21, 21);
        try (Convolver c = Convolver.create(w, h, psf, new ConvolutionSettings(Boundary.REFLECT, 1, Tiling.TILED))) {
            assertTrue(Integer.bitCount(c.fftWidth()) == 1, "power-of-two tiles: " + c.fftWidth());
            c.convolve(in, out);
            c.correlate(in, out);
            long before = allocated();
            for (int i = 0; i < 3; i++) {
                c.convolve(in, out);
                c.correlate(in, out);
            }
            long bytes = allocated() - before;
            assertTrue(bytes <= SLACK_BYTES, "allocated " + bytes + " bytes in 6 calls");
        }
    }

    @Test
    void realFftOnPowerOfTwoGridAllocatesNothing() {
        Assumptions.assumeTrue(ManagementFactory.getThreadMXBean() instanceof com.sun.management.ThreadMXBean);
        try (RealFft2d fft = RealFft2d.create(256, 128, 1)) {
            float[] x = Oracles.random(new SplittableRandom(4), 256 * 128);
            float[] s = fft.newSpectrum();
            fft.forward(x, s);
            fft.inverse(s, x);
            long before = allocated();
            for (int i = 0; i < 3; i++) {
                fft.forward(x, s);
                fft.inverse(s, x);
            }
            long bytes = allocated() - before;
            assertTrue(bytes <= SLACK_BYTES, "allocated " + bytes + " bytes in 6 transforms");
        }
    }
}
