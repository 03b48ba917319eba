package dev.nitid.fft;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;

import dev.nitid.testdata.ArrayAssert;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

/**
 * The contract every 2-D real transform path honours, checked against a naive DFT written in this test
 * (the definition in Bracewell, <i>The Fourier Transform and Its Applications</i>, 3rd ed. 2000, ch. 18).
 * Each subclass runs it with one thread count.
 */
abstract class RealFft2dContract {
    /**
     * float32 transform round-off: relative error of an FFT grows like ε·log₂N with ε = 6e-8 (Higham,
     * <i>Accuracy and Stability of Numerical Algorithms</i>, 2nd ed. 2002, §24.1); 2e-5 of the largest
     * value leaves a margin of ~10× for N ≤ 2¹⁰ and for Bluestein's longer intermediate transforms.
     */
    static final double REL_TOL = 2e-5;
    /**
     * The transfer function of a centred delta on a 10×9 grid, whose every value is 1 + 0i: the same
     * bound as {@link #REL_TOL}, ε·log₂N (Higham 2002, §24.1), taken at this size: 6e-8 × log₂90 = 3.9e-7 of
     * the largest value (1); 1e-6 leaves 2.5×. Not REL_TOL itself, which is sized for N ≤ 2¹⁰ and Bluestein
     * and would loosen this check 20×.
     */
    static final double DELTA_OTF_TOL = 1e-6;

    abstract int threads();

    @ParameterizedTest(name = "{0}x{1}")
    @CsvSource({"1,1", "1,7", "7,1", "2,2", "8,6", "9,5", "13,11", "16,16", "17,4", "30,25", "31,31"})
    void forwardMatchesDirectDftAndInverseRestores(int w, int h) {
        SplittableRandom rnd = new SplittableRandom(31L * w + h);
        float[] x = Oracles.random(rnd, w * h);
        try (RealFft2d fft = RealFft2d.create(w, h, threads())) {
            float[] s = fft.newSpectrum();
            fft.forward(x, s);
            double[][] ref = Oracles.dft(x, w, h);
            int cw = w / 2 + 1;
            assertEquals(cw, fft.spectrumWidth());
            double scale = w * h;
            double[] re = new double[cw * h];
            double[] im = new double[cw * h];
            float[] gotRe = new float[cw * h];
            float[] gotIm = new float[cw * h];
            for (int l = 0; l < h; l++) {
                for (int k = 0; k < cw; k++) {
                    re[l * cw + k] = ref[0][l * w + k];
                    im[l * cw + k] = ref[1][l * w + k];
                    gotRe[l * cw + k] = s[l * 2 * cw + 2 * k];
                    gotIm[l * cw + k] = s[l * 2 * cw + 2 * k + 1];
                }
            }
            ArrayAssert.assertClose(re, gotRe, cw, 0, REL_TOL * scale);
            ArrayAssert.assertClose(im, gotIm, cw, 0, REL_TOL * scale);
            // Zero-frequency term is the plain sum (the DFT definition at k = l = 0).
            double sum = 0;
            for (float v : x) {
                sum += v;
            }
            assertEquals(sum, s[0], REL_TOL * scale, "X(0,0) = Σx");
            assertEquals(0.0, s[1], 0.0, "Im X(0,0) is stored as exactly 0");

            float[] back = new float[w * h];
            fft.inverse(s, back);
            ArrayAssert.assertClose(x, back, w, 0, REL_TOL);
        }
    }

    @Test
    void repeatedCallsAtOneAndSeveralSizesGiveSameResults() {
        int[][] sizes = {{12, 10}, {5, 3}, {12, 10}, {1, 1}, {12, 10}};
        SplittableRandom rnd = new SplittableRandom(7);
        float[] x = Oracles.random(rnd, 120);
        float[] first = null;
        for (int[] sz : sizes) {
            int w = sz[0];
            int h = sz[1];
            float[] in = java.util.Arrays.copyOf(x, w * h);
            try (RealFft2d fft = RealFft2d.create(w, h, threads())) {
                float[] s = fft.newSpectrum();
                for (int rep = 0; rep < 3; rep++) {
                    fft.forward(in, s);
                    float[] back = new float[w * h];
                    fft.inverse(s.clone(), back);
                    ArrayAssert.assertClose(in, back, w, 0, REL_TOL);
                    if (w == 12) {
                        if (first == null) {
                            first = s.clone();
                        }
                        assertArrayEquals(first, s, "same input, same plan size, same bits");
                    }
                }
            }
        }
    }

    @Test
    void transferFunctionOfCentredDeltaIsOne() {
        // The PSF-centre rule: a delta at (⌊pw/2⌋, ⌊ph/2⌋) lands on the origin, whose DFT is 1 everywhere.
        dev.nitid.image.Image psf = dev.nitid.image.Image.create(4, 3);
        psf.set(2, 1, 1f);
        try (RealFft2d fft = RealFft2d.create(10, 9, threads())) {
            float[] otf = fft.transferFunction(psf);
            for (int i = 0; i < otf.length; i += 2) {
                assertEquals(1.0, otf[i], DELTA_OTF_TOL, "Re at " + i / 2);
                assertEquals(0.0, otf[i + 1], DELTA_OTF_TOL, "Im at " + i / 2);
            }
        }
    }
}
