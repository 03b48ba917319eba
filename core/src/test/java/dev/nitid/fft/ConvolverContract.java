package dev.nitid.fft;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;

import dev.nitid.image.Image;
import dev.nitid.testdata.ArrayAssert;
import dev.nitid.testdata.SeededCases;
import java.util.SplittableRandom;
import java.util.stream.Stream;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.Arguments;
import org.junit.jupiter.params.provider.MethodSource;

/**
 * What every convolution path must do (whole plane or tiles, any thread count), checked against a naive
 * direct sum written from the definition in {@link Convolver} (scipy.ndimage.convolve's definition for
 * modes 'constant', 'reflect', 'wrap'; scipy 1.10.1 documentation).
 */
abstract class ConvolverContract {
    /**
     * float32 FFT convolution error relative to the largest output: ε·log₂N growth (Higham 2002, §24.1)
     * for N ≤ 2¹² gives ~1e-6; 1e-5 leaves a 10× margin.
     */
    static final double REL_TOL = 1e-5;
    /** Relative tolerance of ⟨Kx, y⟩ = ⟨x, Kᵀy⟩ for sums of ~10³ float products (from float ε = 6e-8, 10× margin). */
    static final double ADJOINT_TOL = 1e-5;

    /** Builds the plan under test. */
    abstract Convolver plan(int w, int h, Image psf, Boundary b);

    static Stream<Arguments> shapes() {
        // image w, h, PSF pw, ph: odd, even, prime, one-pixel and PSF-as-large-as-image cases.
        int[][] s = {{1, 1, 1, 1}, {13, 11, 5, 3}, {16, 12, 4, 4}, {17, 19, 7, 5}, {2, 3, 2, 3},
            {29, 31, 9, 9}, {40, 7, 3, 7}, {1, 9, 1, 4}};
        Stream.Builder<Arguments> out = Stream.builder();
        for (int[] v : s) {
            for (Boundary b : Boundary.values()) {
                out.add(Arguments.of(v[0], v[1], v[2], v[3], b));
            }
        }
        return out.build();
    }

    @ParameterizedTest(name = "{0}x{1} psf {2}x{3} {4}")
    @MethodSource("shapes")
    void convolveMatchesDirectSum(int w, int h, int pw, int ph, Boundary b) {
        SplittableRandom rnd = new SplittableRandom(1000L * w + 10L * h + pw + b.ordinal());
        float[] img = Oracles.random(rnd, w * h);
        Image psf = Oracles.randomPsf(rnd, pw, ph);
        try (Convolver c = plan(w, h, psf, b)) {
            float[] out = new float[w * h];
            c.convolve(img, out);
            double[] expect = Oracles.convolve(img, w, h, psf, b);
            double scale = 0;
            for (double v : expect) {
                scale = Math.max(scale, Math.abs(v));
            }
            ArrayAssert.assertClose(expect, out, w, 0, REL_TOL * scale);
            // Second call on the same plan: workspace reuse must not leak state.
            float[] again = new float[w * h];
            c.convolve(img, again);
            assertArrayEquals(out, again, "second call differs");
            // In place.
            float[] inPlace = img.clone();
            c.convolve(inPlace, inPlace);
            assertArrayEquals(out, inPlace, "in-place call differs");
        }
    }

    record AdjointCase(int w, int h, int pw, int ph, Boundary b, float[] x, float[] y, Image psf) {
    }

    static Stream<SeededCases.Case<AdjointCase>> adjointCases() {
        return SeededCases.cases("convolver-adjoint", 24, rnd -> {
            int w = 1 + rnd.nextInt(40);
            int h = 1 + rnd.nextInt(40);
            int pw = 1 + rnd.nextInt(Math.min(w, 12));
            int ph = 1 + rnd.nextInt(Math.min(h, 12));
            Boundary b = Boundary.values()[rnd.nextInt(3)];
            return new AdjointCase(w, h, pw, ph, b, Oracles.random(rnd, w * h), Oracles.random(rnd, w * h),
                    Oracles.randomPsf(rnd, pw, ph));
        });
    }

    /** ⟨Kx, y⟩ = ⟨x, Kᵀy⟩, the definition of the adjoint (any linear-algebra text, e.g. Strang 2016, §4.1). */
    @ParameterizedTest
    @MethodSource("adjointCases")
    void correlateIsTheAdjoint(SeededCases.Case<AdjointCase> cs) {
        AdjointCase a = cs.value();
        try (Convolver c = plan(a.w(), a.h(), a.psf(), a.b())) {
            float[] kx = new float[a.w() * a.h()];
            float[] kty = new float[a.w() * a.h()];
            c.convolve(a.x(), kx);
            c.correlate(a.y(), kty);
            double lhs = Oracles.dot(kx, a.y());
            double rhs = Oracles.dot(a.x(), kty);
            assertEquals(lhs, rhs, ADJOINT_TOL * Math.abs(lhs), cs + " " + a.w() + "x" + a.h() + " psf "
                    + a.pw() + "x" + a.ph() + " " + a.b());
            float[] inPlace = a.y().clone();
            c.correlate(inPlace, inPlace);
            assertArrayEquals(kty, inPlace, "in-place correlate differs");
        }
    }

    @ParameterizedTest(name = "{0}x{1} psf {2}x{3} {4}")
    @MethodSource("shapes")
    void centredDeltaIsIdentity(int w, int h, int pw, int ph, Boundary b) {
        Image psf = Image.create(pw, ph);
        psf.set(pw / 2, ph / 2, 1f);
        float[] img = Oracles.random(new SplittableRandom(w * 7L + h), w * h);
        try (Convolver c = plan(w, h, psf, b)) {
            float[] out = new float[w * h];
            c.convolve(img, out);
            ArrayAssert.assertClose(img, out, w, 0, REL_TOL);
            c.correlate(img, out);
            ArrayAssert.assertClose(img, out, w, 0, REL_TOL);
        }
    }

    /** Circular convolution commutes with circular shifts (Bracewell 2000, shift theorem). */
    @ParameterizedTest
    @MethodSource("adjointCases")
    void periodicConvolutionCommutesWithShifts(SeededCases.Case<AdjointCase> cs) {
        AdjointCase a = cs.value();
        int w = a.w();
        int h = a.h();
        SplittableRandom rnd = new SplittableRandom(cs.seed());
        int dx = rnd.nextInt(w);
        int dy = rnd.nextInt(h);
        try (Convolver c = plan(w, h, a.psf(), Boundary.PERIODIC)) {
            float[] kx = new float[w * h];
            c.convolve(a.x(), kx);
            float[] shifted = shift(a.x(), w, h, dx, dy);
            float[] kShifted = new float[w * h];
            c.convolve(shifted, kShifted);
            ArrayAssert.assertClose(shift(kx, w, h, dx, dy), kShifted, w, 0, REL_TOL * Oracles.maxAbs(kx));
        }
    }

    static float[] shift(float[] a, int w, int h, int dx, int dy) {
        float[] out = new float[a.length];
        for (int y = 0; y < h; y++) {
            for (int x = 0; x < w; x++) {
                out[((y + dy) % h) * w + (x + dx) % w] = a[y * w + x];
            }
        }
        return out;
    }
}
