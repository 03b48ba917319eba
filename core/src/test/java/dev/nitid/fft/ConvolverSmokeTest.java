package dev.nitid.fft;

import static org.junit.jupiter.api.Assertions.assertEquals;

import dev.nitid.image.Image;
import dev.nitid.testdata.ArrayAssert;
import java.util.SplittableRandom;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.EnumSource;

/** Checks the convolver against a naive direct sum written from the definition in {@link Convolver}. */
class ConvolverSmokeTest {
    /**
     * Absolute: float32 FFT round-off on outputs up to 6.7 (20 PSF values and pixels in [0, 1)): ε·log₂N
     * growth (Higham 2002, §24.1, as {@link ConvolverContract#REL_TOL}) gives 6e-8 × 7 × 6.7 ≈ 2.8e-6; 2e-5
     * leaves 7×. Measured 1.4e-6.
     */
    private static final double TOL = 2e-5;

    @ParameterizedTest
    @EnumSource(Boundary.class)
    void matchesDirectSumAndAdjoint(Boundary b) {
        int w = 13;
        int h = 8;
        SplittableRandom rnd = new SplittableRandom(42);
        float[] img = new float[w * h];
        for (int i = 0; i < img.length; i++) {
            img[i] = (float) rnd.nextDouble();
        }
        Image psf = Image.create(5, 4);
        for (int i = 0; i < psf.pixelCount(); i++) {
            psf.plane(0)[i] = (float) rnd.nextDouble();
        }
        Convolver c = Convolver.create(w, h, psf, new ConvolutionSettings(b, 1));
        float[] out = new float[w * h];
        c.convolve(img, out);
        float[] expect = new float[w * h];
        int cx = psf.width() / 2;
        int cy = psf.height() / 2;
        for (int y = 0; y < h; y++) {
            for (int x = 0; x < w; x++) {
                double s = 0;
                for (int j = 0; j < psf.height(); j++) {
                    for (int i = 0; i < psf.width(); i++) {
                        int sx = map(x - (i - cx), w, b);
                        int sy = map(y - (j - cy), h, b);
                        if (sx >= 0 && sy >= 0) {
                            s += psf.get(i, j) * img[sy * w + sx];
                        }
                    }
                }
                expect[y * w + x] = (float) s;
            }
        }
        ArrayAssert.assertClose(expect, out, w, 0, TOL);

        float[] y2 = new float[w * h];
        for (int i = 0; i < y2.length; i++) {
            y2[i] = (float) rnd.nextDouble();
        }
        float[] aty = new float[w * h];
        c.correlate(y2, aty);
        double lhs = 0;
        double rhs = 0;
        for (int i = 0; i < y2.length; i++) {
            lhs += (double) out[i] * y2[i];
            rhs += (double) img[i] * aty[i];
        }
        assertEquals(lhs, rhs, ConvolverContract.ADJOINT_TOL * Math.abs(lhs), "adjoint identity <Kx,y> = <x,K'y>");
    }

    private static int map(int x, int n, Boundary b) {
        return switch (b) {
            case ZERO -> (x >= 0 && x < n) ? x : -1;
            case PERIODIC -> Math.floorMod(x, n);
            case REFLECT -> {
                int m = Math.floorMod(x, 2 * n);
                yield m < n ? m : 2 * n - 1 - m;
            }
        };
    }
}
