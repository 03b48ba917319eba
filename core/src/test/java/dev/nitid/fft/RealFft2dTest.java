package dev.nitid.fft;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.nitid.image.Image;
import java.util.SplittableRandom;
import org.jtransforms.fft.FloatFFT_2D;
import org.junit.jupiter.api.Nested;
import org.junit.jupiter.api.Test;

/** Runs the {@link RealFft2dContract} on 1 and 2 threads, and checks what only RealFft2d promises. */
class RealFft2dTest {
    @Nested
    class OneThread extends RealFft2dContract {
        @Override
        int threads() {
            return 1;
        }
    }

    @Nested
    class TwoThreads extends RealFft2dContract {
        @Override
        int threads() {
            return 2;
        }
    }

    @Test
    void oneThreadEqualsThreeThreadsBitForBit() {
        int w = 90;
        int h = 77;
        float[] x = Oracles.random(new SplittableRandom(11), w * h);
        float[] s1;
        float[] b1 = new float[w * h];
        try (RealFft2d one = RealFft2d.create(w, h, 1)) {
            s1 = one.newSpectrum();
            one.forward(x, s1);
            one.inverse(s1.clone(), b1);
        }
        try (RealFft2d three = RealFft2d.create(w, h, 3)) {
            float[] s3 = three.newSpectrum();
            three.forward(x, s3);
            float[] b3 = new float[w * h];
            three.inverse(s3.clone(), b3);
            assertArrayEquals(s1, s3, "spectra, 1 vs 3 threads");
            assertArrayEquals(b1, b3, "inverses, 1 vs 3 threads");
        }
    }

    @Test
    void jtransformsInnerThreadsDoNotChangeLongTransforms() {
        // JTransforms splits 1-D transforms longer than CommonUtils.getThreadsBeginN_1D_FFT_2Threads()
        // (8192) over its own pool when ConcurrencyUtils allows more than one thread. Our determinism
        // promise needs those results to be the same bits as its single-threaded path. 16384 takes the
        // split-radix path; 8191·2 + 1 = 16383 is 3·43·127 and takes Bluestein.
        int previous = org.visnow.jlargearrays.ConcurrencyUtils.getNumberOfThreads();
        try {
            for (int w : new int[] {16384, 16383}) {
                float[] x = Oracles.random(new SplittableRandom(w), 2 * w);
                org.visnow.jlargearrays.ConcurrencyUtils.setNumberOfThreads(1);
                float[] s1;
                try (RealFft2d one = RealFft2d.create(w, 2, 1)) {
                    s1 = one.newSpectrum();
                    one.forward(x, s1);
                }
                org.visnow.jlargearrays.ConcurrencyUtils.setNumberOfThreads(4);
                try (RealFft2d four = RealFft2d.create(w, 2, 1)) {
                    float[] s4 = four.newSpectrum();
                    four.forward(x, s4);
                    assertArrayEquals(s1, s4, "length " + w + ": JTransforms 1 vs 4 inner threads");
                }
            }
        } finally {
            org.visnow.jlargearrays.ConcurrencyUtils.setNumberOfThreads(previous);
        }
    }

    @Test
    void agreesWithJTransformsComplex2d() {
        // JTransforms 3.2 FloatFFT_2D.complexForward as an independent oracle on a 2·3·5-smooth size.
        int w = 60;
        int h = 48;
        float[] x = Oracles.random(new SplittableRandom(5), w * h);
        float[] c = new float[2 * w * h];
        for (int i = 0; i < w * h; i++) {
            c[2 * i] = x[i];
        }
        new FloatFFT_2D(h, w).complexForward(c);
        try (RealFft2d fft = RealFft2d.create(w, h, 2)) {
            float[] s = fft.newSpectrum();
            fft.forward(x, s);
            int cw = w / 2 + 1;
            double worst = 0;
            for (int l = 0; l < h; l++) {
                for (int k = 0; k < cw; k++) {
                    worst = Math.max(worst, Math.abs(s[l * 2 * cw + 2 * k] - c[2 * (l * w + k)]));
                    worst = Math.max(worst, Math.abs(s[l * 2 * cw + 2 * k + 1] - c[2 * (l * w + k) + 1]));
                }
            }
            assertTrue(worst <= RealFft2dContract.REL_TOL * w * h, "max difference " + worst);
        }
    }

    @Test
    void rejectsBadSizesAndBadPsfs() {
        assertThrows(IllegalArgumentException.class, () -> RealFft2d.create(0, 5, 1));
        assertThrows(IllegalArgumentException.class, () -> RealFft2d.create(5, 5, 0));
        try (RealFft2d fft = RealFft2d.create(8, 8, 1)) {
            IllegalArgumentException big = assertThrows(IllegalArgumentException.class,
                    () -> fft.transferFunction(Image.create(9, 3)));
            assertTrue(big.getMessage().contains("9x3") && big.getMessage().contains("crop"), big.getMessage());
            Image nan = Image.create(3, 3);
            nan.set(1, 1, Float.NaN);
            assertThrows(IllegalArgumentException.class, () -> fft.transferFunction(nan));
            assertThrows(IllegalArgumentException.class, () -> fft.forward(new float[63], fft.newSpectrum()));
        }
    }
}
