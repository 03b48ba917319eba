package dev.nitid.psf;

import dev.nitid.image.Image;
import dev.nitid.psf.internal.Grids;
import java.util.function.DoubleBinaryOperator;

/**
 * A PSF with a closed form: a density of unit integral over the plane that can be evaluated anywhere,
 * as star fitting needs.
 */
public interface AnalyticPsf extends PsfModel {

    /**
     * The PSF density at {@code (x, y)} pixels from its centre; its integral over the plane is 1.
     *
     * @param x offset in x, pixels
     * @param y offset in y, pixels
     * @return the density, per square pixel
     */
    double value(double x, double y);

    /**
     * The same density as {@link #value}, with everything that does not depend on (x, y) computed once:
     * fetch it once and call it in loops (star fitting, rendering). Thread-safe.
     *
     * @return {@code (x, y) → value(x, y)}
     */
    default DoubleBinaryOperator evaluator() {
        return this::value;
    }

    /** Point samples of {@link #value} on the fine grid; see {@link PsfModel#renderOversampled}. */
    @Override
    default Image renderOversampled(int size, int oversample, double dx, double dy) {
        Grids.checkRender(size, oversample, dx, dy);
        int n = size * oversample;
        float[] out = new float[n * n];
        double area = 1.0 / ((double) oversample * oversample);
        DoubleBinaryOperator f = evaluator();
        for (int gy = 0; gy < n; gy++) {
            double y = Grids.fineOffset(gy, size, oversample) - dy;
            for (int gx = 0; gx < n; gx++) {
                double x = Grids.fineOffset(gx, size, oversample) - dx;
                out[gy * n + gx] = (float) (f.applyAsDouble(x, y) * area);
            }
        }
        return Image.wrap(n, n, out);
    }
}
