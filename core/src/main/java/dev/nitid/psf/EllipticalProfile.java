package dev.nitid.psf;

import dev.nitid.image.Image;
import dev.nitid.psf.internal.Grids;
import java.util.function.DoubleUnaryOperator;

/**
 * An elliptical radial profile {@code norm · f(u²/a² + v²/b²)}, with {@code (u, v)} the offsets along the
 * axes at {@code angleDeg} from +x: the shared evaluator behind {@link GaussianPsf} and {@link MoffatPsf}.
 * The quadratic form {@code Q = A x² + 2B xy + C y²} is precomputed, so a sample costs a few
 * multiplications and one call of {@code f}.
 */
final class EllipticalProfile {
    private final double a;
    private final double b;
    private final double c;
    private final double norm;
    private final DoubleUnaryOperator f;

    EllipticalProfile(double angleDeg, double widthMajor, double widthMinor, double norm, DoubleUnaryOperator f) {
        double t = Math.toRadians(angleDeg);
        double cos = Math.cos(t);
        double sin = Math.sin(t);
        double ia = 1 / (widthMajor * widthMajor);
        double ib = 1 / (widthMinor * widthMinor);
        // u = x cos + y sin, v = −x sin + y cos  ⇒  u²/a² + v²/b² = A x² + 2B xy + C y²
        this.a = cos * cos * ia + sin * sin * ib;
        this.b = cos * sin * (ia - ib);
        this.c = sin * sin * ia + cos * cos * ib;
        this.norm = norm;
        this.f = f;
    }

    double value(double x, double y) {
        return norm * f.applyAsDouble(a * x * x + 2 * b * x * y + c * y * y);
    }

    Image renderOversampled(int size, int oversample, double dx, double dy) {
        Grids.checkRender(size, oversample, dx, dy);
        int n = size * oversample;
        double[] off = new double[n];
        for (int g = 0; g < n; g++) {
            off[g] = Grids.fineOffset(g, size, oversample);
        }
        float[] out = new float[n * n];
        double area = norm / ((double) oversample * oversample);
        for (int gy = 0; gy < n; gy++) {
            double y = off[gy] - dy;
            double cyy = c * y * y;
            double bxy = 2 * b * y;
            int row = gy * n;
            for (int gx = 0; gx < n; gx++) {
                double x = off[gx] - dx;
                out[row + gx] = (float) (area * f.applyAsDouble(a * x * x + bxy * x + cyy));
            }
        }
        return Image.wrap(n, n, out);
    }
}
