package dev.nitid.restore;

import dev.nitid.image.Image;
import dev.nitid.testdata.Reference;
import java.util.SplittableRandom;

/** Test images: the bundled golden case and small invented scenes. */
final class Fixtures {
    private Fixtures() {
    }

    /** Reads a golden 2-D CSV as a single-plane image. */
    static Image golden(String name) {
        double[][] m = Reference.matrix("golden/" + name + ".csv");
        Image img = Image.create(m[0].length, m.length);
        for (int y = 0; y < m.length; y++) {
            for (int x = 0; x < m[0].length; x++) {
                img.set(x, y, (float) m[y][x]);
            }
        }
        return img;
    }

    /** Reads a golden CSV as doubles, row-major. */
    static double[] goldenDoubles(String name) {
        double[][] m = Reference.matrix("golden/" + name + ".csv");
        double[] out = new double[m.length * m[0].length];
        for (int y = 0; y < m.length; y++) {
            System.arraycopy(m[y], 0, out, y * m[0].length, m[0].length);
        }
        return out;
    }

    /** A unit-sum circular Gaussian PSF of odd size {@code n}. */
    static Image gaussianPsf(int n, double sigma) {
        Image k = Image.create(n, n);
        int c = n / 2;
        double s = 0;
        for (int y = 0; y < n; y++) {
            for (int x = 0; x < n; x++) {
                double v = Math.exp(-((x - c) * (x - c) + (y - c) * (y - c)) / (2 * sigma * sigma));
                k.set(x, y, (float) v);
                s += v;
            }
        }
        for (int i = 0; i < k.pixelCount(); i++) {
            k.plane(0)[i] /= (float) s;
        }
        return k;
    }

    /** Positive random scene on a sky, with a few bright points. */
    static Image randomScene(SplittableRandom rnd, int w, int h, double sky) {
        Image img = Image.create(w, h);
        float[] a = img.plane(0);
        for (int i = 0; i < a.length; i++) {
            a[i] = (float) (sky + rnd.nextDouble() * sky);
        }
        for (int s = 0; s < 4; s++) {
            a[rnd.nextInt(a.length)] += (float) (50 * sky * rnd.nextDouble());
        }
        return img;
    }

    /** Standard normal deviate (Box–Muller). */
    static double gauss(SplittableRandom rnd) {
        double u = 1 - rnd.nextDouble();
        return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * rnd.nextDouble());
    }

    /** Poisson deviate: Knuth's product method for small means, normal approximation above 50. */
    static double poisson(SplittableRandom rnd, double mean) {
        if (mean <= 0) {
            return 0;
        }
        if (mean > 50) {
            return Math.max(0, Math.round(mean + Math.sqrt(mean) * gauss(rnd)));
        }
        double l = Math.exp(-mean);
        double p = 1;
        int k = 0;
        do {
            k++;
            p *= rnd.nextDouble();
        } while (p > l);
        return k - 1;
    }
}
