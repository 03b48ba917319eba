package dev.nitid.fft;

import dev.nitid.image.Image;
import dev.nitid.testdata.ArrayAssert;
import dev.nitid.testdata.Reference;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.List;
import java.util.stream.Stream;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.Arguments;
import org.junit.jupiter.params.provider.MethodSource;

/**
 * Convolutions against {@code scipy.ndimage.convolve} (scipy and numpy versions recorded in
 * {@code testdata/.../convolution/manifest.csv}, made by {@code testdata/scripts/gen_convolution_reference.py}):
 * ZERO ↔ mode 'constant', REFLECT ↔ 'reflect', PERIODIC ↔ 'wrap'; odd, even, prime, even-PSF and
 * one-pixel cases, on every path.
 */
class ScipyReferenceTest {
    /** Folder below {@code dev/nitid/testdata/}, read through the testdata module (works on the module path). */
    private static final String FOLDER = "convolution/";
    /** Inputs are float32 written with 9 significant digits, the reference is float64 (see ConvolverContract.REL_TOL). */
    private static final double REL_TOL = ConvolverContract.REL_TOL;

    static Stream<Arguments> cases() {
        List<Arguments> out = new ArrayList<>();
        for (String line : lines("manifest.csv")) {
            if (line.startsWith("#") || line.startsWith("case,")) {
                continue;
            }
            String[] f = line.split(",");
            for (String path : new String[] {"whole-1", "whole-2", "tiled-1", "tiled-2"}) {
                out.add(Arguments.of(f[0], Boundary.valueOf(f[5]), f[7], path));
            }
        }
        return out.stream();
    }

    @ParameterizedTest(name = "{0} {1} {3}")
    @MethodSource("cases")
    void matchesScipyNdimageConvolve(String name, Boundary b, String outFile, String path) {
        double[][] in = matrix(name + "_input.csv");
        double[][] k = matrix(name + "_psf.csv");
        double[][] ref = matrix(outFile);
        int h = in.length;
        int w = in[0].length;
        float[] img = flatten(in);
        Image psf = Image.wrap(k[0].length, k.length, flatten(k));
        int threads = path.endsWith("2") ? 2 : 1;
        ConvolutionSettings s = new ConvolutionSettings(b, threads, Tiling.WHOLE_PLANE);
        try (Convolver c = path.startsWith("whole") ? Convolver.create(w, h, psf, s)
                : Convolver.createTiled(w, h, psf, s, FftSizes.nextFast(psf.width() + 1),
                FftSizes.nextFast(psf.height() + 1))) {
            float[] out = new float[w * h];
            c.convolve(img, out);
            double[] expect = new double[w * h];
            double scale = 0;
            for (int y = 0; y < h; y++) {
                for (int x = 0; x < w; x++) {
                    expect[y * w + x] = ref[y][x];
                    scale = Math.max(scale, Math.abs(ref[y][x]));
                }
            }
            ArrayAssert.assertClose(expect, out, w, 0, REL_TOL * scale);
        }
    }

    private static float[] flatten(double[][] m) {
        float[] a = new float[m.length * m[0].length];
        for (int r = 0; r < m.length; r++) {
            for (int c = 0; c < m[r].length; c++) {
                a[r * m[0].length + c] = (float) m[r][c];
            }
        }
        return a;
    }

    private static List<String> lines(String file) {
        byte[] bytes;
        try {
            bytes = Reference.bundledBytes(FOLDER + file);
        } catch (IllegalArgumentException e) {
            throw new IllegalStateException(e.getMessage() + ": run testdata/scripts/gen_convolution_reference.py", e);
        }
        List<String> out = new ArrayList<>();
        for (String l : new String(bytes, StandardCharsets.UTF_8).split("\r?\n")) {
            if (!l.isBlank()) {
                out.add(l.trim());
            }
        }
        return out;
    }

    private static double[][] matrix(String file) {
        List<String> ls = lines(file);
        double[][] m = new double[ls.size()][];
        for (int r = 0; r < m.length; r++) {
            String[] p = ls.get(r).split(",");
            m[r] = new double[p.length];
            for (int c = 0; c < p.length; c++) {
                m[r][c] = Double.parseDouble(p[c]);
            }
        }
        return m;
    }
}
