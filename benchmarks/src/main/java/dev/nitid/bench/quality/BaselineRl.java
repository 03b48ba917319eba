package dev.nitid.bench.quality;

import dev.nitid.fft.Boundary;
import dev.nitid.fft.ConvolutionSettings;
import dev.nitid.fft.Convolver;
import dev.nitid.image.Image;

/**
 * Textbook Richardson–Lucy (Richardson 1972, JOSA 62, 55; Lucy 1974, AJ 79, 745) as a fixed baseline for the
 * harness, independent of {@code dev.nitid.restore}:
 * <pre>  u₀ = mean(d),   u_{k+1} = u_k · Kᵀ( d / max(K u_k, FLOOR) )</pre>
 * with the reflective boundary and no clipping, for a fixed number of iterations.
 */
final class BaselineRl {
    /** Guards the division where the model is zero; far below any sky level in the scenes. */
    static final float FLOOR = 1e-12f;

    private BaselineRl() {
    }

    static Image restore(Image data, Image psf, int iterations, int threads) {
        int w = data.width();
        int h = data.height();
        Convolver k = Convolver.create(w, h, psf, new ConvolutionSettings(Boundary.REFLECT, threads));
        float[] d = data.plane(0);
        double mean = 0;
        for (float v : d) {
            mean += v;
        }
        mean /= d.length;
        float[] u = new float[d.length];
        java.util.Arrays.fill(u, (float) mean);
        float[] model = new float[d.length];
        float[] corr = new float[d.length];
        for (int it = 0; it < iterations; it++) {
            k.convolve(u, model);
            for (int i = 0; i < d.length; i++) {
                model[i] = d[i] / Math.max(model[i], FLOOR);
            }
            k.correlate(model, corr);
            for (int i = 0; i < d.length; i++) {
                u[i] *= corr[i];
            }
        }
        return Image.wrap(w, h, u);
    }
}
