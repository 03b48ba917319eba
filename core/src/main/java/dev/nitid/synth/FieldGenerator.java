package dev.nitid.synth;

import dev.nitid.fft.Boundary;
import dev.nitid.fft.ConvolutionSettings;
import dev.nitid.fft.Convolver;
import dev.nitid.image.Image;
import dev.nitid.synth.internal.ExtendedRenderer;
import dev.nitid.synth.internal.PoissonSampler;
import java.util.ArrayList;
import java.util.List;
import java.util.SplittableRandom;

/**
 * Makes {@link SyntheticField}s. Stateless and thread-safe; single-threaded, so the result depends on the
 * settings only.
 *
 * <h2>Forward model</h2>
 * <pre>  noiseless = sky + PSF_centre ⊛ extended + Σ_stars flux · PSF(u, v, phase)</pre>
 * The extended structure is drawn on a canvas larger than the field by half a PSF on each side and
 * convolved with the zero boundary, so light from just outside the field spills in as on a real detector.
 * Each star is rendered with its own field position and sub-pixel phase; its stamp sums to one, so the
 * catalogue flux is exactly the light the star adds (less what falls outside the field). Noise follows
 * {@link DetectorSettings}: a stack of N frames is drawn as one Poisson deviate of N times the frame's
 * electrons plus Gaussian read noise of √N σ (sums of independent Poisson and Gaussian variables keep their
 * family: their generating functions multiply; common practice, no source), except near saturation,
 * where each frame is drawn and clipped on its own.
 */
public final class FieldGenerator {
    /** Pixels within this many frame σ of saturation are simulated frame by frame (clip probability ~1e-9). */
    static final double SATURATION_GUARD_SIGMA = 6.0;

    private FieldGenerator() {
    }

    /**
     * Generates a field.
     *
     * @param settings what to make (input, not modified)
     * @return the field and its truth
     */
    public static SyntheticField generate(FieldSettings settings) {
        int w = settings.width();
        int h = settings.height();
        SplittableRandom root = new SplittableRandom(settings.seed());
        SplittableRandom starRnd = root.split();
        SplittableRandom extRnd = root.split();
        SplittableRandom noiseRnd = root.split();
        FieldPsf psf = settings.psf();

        Image psfCentre = psf.centre();
        Image extended = Image.create(w, h);
        Image extendedLight = Image.create(w, h);
        if (!settings.extended().isEmpty()) {
            Image canvas = extendedCanvas(settings, extRnd);
            crop(canvas, pad(settings), extended);
            crop(blur(canvas, psfCentre), pad(settings), extendedLight);
        }
        Image noiseless = extendedLight.copy();
        float[] nl = noiseless.plane(0);

        Image truth = extended.copy();

        List<double[]> stars = drawStars(settings, starRnd);
        int size = psf.size();
        int c = size / 2;
        float[] stamp = new float[size * size];
        double[] peaks = new double[stars.size()];
        int[] peakIndex = new int[stars.size()];
        for (int s = 0; s < stars.size(); s++) {
            double[] st = stars.get(s);
            int ix = (int) Math.round(st[0]);
            int iy = (int) Math.round(st[1]);
            psf.render((st[0] - w / 2.0) / w, (st[1] - h / 2.0) / h, st[0] - ix, st[1] - iy, stamp);
            double peak = -1;
            int best = -1;
            for (int j = 0; j < size; j++) {
                int y = iy + j - c;
                for (int i = 0; i < size; i++) {
                    int x = ix + i - c;
                    double v = st[2] * stamp[j * size + i];
                    if (v > peak) {
                        peak = v;
                        best = (x >= 0 && x < w && y >= 0 && y < h) ? y * w + x : -1;
                    }
                    if (x >= 0 && x < w && y >= 0 && y < h) {
                        nl[y * w + x] += (float) v;
                    }
                }
            }
            peaks[s] = peak;
            peakIndex[s] = best;
            if (ix >= 0 && ix < w && iy >= 0 && iy < h) {
                truth.plane(0)[iy * w + ix] += (float) st[2];
            }
        }
        DetectorSettings det = settings.detector();
        for (int i = 0; i < nl.length; i++) {
            nl[i] += (float) det.sky();
        }

        List<TruthStar> catalogue = new ArrayList<>(stars.size());
        for (int s = 0; s < stars.size(); s++) {
            double[] st = stars.get(s);
            boolean sat = peakIndex[s] >= 0 && nl[peakIndex[s]] >= det.saturation();
            catalogue.add(new TruthStar(st[0], st[1], st[2], peaks[s], sat));
        }
        Image observed = addNoise(noiseless, det, noiseRnd);
        return new SyntheticField(observed, truth, extended, extendedLight, noiseless, psfCentre, catalogue, settings);
    }

    /** Pads by half a PSF so that the blurred field sees light from just outside it. */
    private static int pad(FieldSettings s) {
        return s.psf().size() / 2;
    }

    private static Image extendedCanvas(FieldSettings s, SplittableRandom rnd) {
        int p = pad(s);
        int cw = s.width() + 2 * p;
        int ch = s.height() + 2 * p;
        Image canvas = Image.create(cw, ch);
        float[] px = canvas.plane(0);
        ExtendedSettings e = s.extended();
        // Each component draws from its own stream, so turning one off leaves the others unchanged.
        SplittableRandom nebulaRnd = rnd.split();
        SplittableRandom filamentRnd = rnd.split();
        SplittableRandom galaxyRnd = rnd.split();
        if (e.nebulaPeak() > 0) {
            ExtendedRenderer.nebula(px, cw, ch, p, s.width(), s.height(), e.nebulaPeak(), nebulaRnd);
        }
        if (e.filaments() > 0 && e.filamentPeak() > 0) {
            ExtendedRenderer.filaments(px, cw, ch, p, s.width(), s.height(), e.filaments(), e.filamentPeak(),
                    e.filamentWidth(), filamentRnd);
        }
        if (e.galaxies() > 0 && e.galaxyPeak() > 0) {
            ExtendedRenderer.galaxies(px, cw, ch, p, s.width(), s.height(), e.galaxies(), e.galaxyPeak(),
                    galaxyRnd);
        }
        return canvas;
    }

    private static Image blur(Image canvas, Image psf) {
        int cw = canvas.width();
        int ch = canvas.height();
        Convolver conv = Convolver.create(cw, ch, psf, new ConvolutionSettings(Boundary.ZERO, 1));
        Image out = Image.create(cw, ch);
        conv.convolve(canvas.plane(0), out.plane(0));
        return out;
    }

    private static void crop(Image canvas, int p, Image field) {
        int cw = canvas.width();
        float[] src = canvas.plane(0);
        float[] dst = field.plane(0);
        for (int y = 0; y < field.height(); y++) {
            System.arraycopy(src, (y + p) * cw + p, dst, y * field.width(), field.width());
        }
    }

    /** Stars as {x, y, flux}, fluxes drawn first, then positions. */
    private static List<double[]> drawStars(FieldSettings s, SplittableRandom rnd) {
        StarSettings st = s.stars();
        int n = st.count();
        double[] flux = new double[n];
        for (int i = 0; i < n; i++) {
            double u = rnd.nextDouble();
            flux[i] = switch (st.law()) {
                case POWER_LAW -> {
                    // Inverse of the truncated N(>F) ∝ F^−γ between the limits.
                    double a = Math.pow(st.minFlux(), -st.slope());
                    double b = Math.pow(st.maxFlux(), -st.slope());
                    yield Math.pow(a - u * (a - b), -1 / st.slope());
                }
                case UNIFORM_MAGNITUDE -> st.minFlux() * Math.pow(st.maxFlux() / st.minFlux(), u);
            };
        }
        double m = st.margin();
        double x0 = m;
        double y0 = m;
        double spanX = s.width() - 1 - 2 * m;
        double spanY = s.height() - 1 - 2 * m;
        List<double[]> out = new ArrayList<>(n);
        int cols = 0;
        int rows = 0;
        if (st.placement() == Placement.GRID && n > 0) {
            cols = (int) Math.ceil(Math.sqrt(n * Math.max(spanX, 1) / Math.max(spanY, 1)));
            cols = Math.max(1, Math.min(cols, n));
            rows = (n + cols - 1) / cols;
        }
        for (int i = 0; i < n; i++) {
            double x;
            double y;
            if (st.placement() == Placement.GRID) {
                double cellW = spanX / cols;
                double cellH = spanY / rows;
                x = x0 + ((i % cols) + 0.5) * cellW + rnd.nextDouble(-0.5, 0.5);
                y = y0 + ((i / cols) + 0.5) * cellH + rnd.nextDouble(-0.5, 0.5);
                x = Math.min(Math.max(x, x0), x0 + spanX);
                y = Math.min(Math.max(y, y0), y0 + spanY);
            } else {
                x = x0 + rnd.nextDouble() * spanX;
                y = y0 + rnd.nextDouble() * spanY;
            }
            if (!s.psf().subPixel()) {
                x = Math.round(x);
                y = Math.round(y);
            }
            out.add(new double[] {x, y, flux[i]});
        }
        return out;
    }

    /**
     * Draws the stack's noise (see the class comment).
     *
     * @param noiseless expected ADU per pixel per frame (input, not modified)
     * @param det       the noise model
     * @param rnd       random source (modified: advanced)
     * @return the noisy stack
     */
    static Image addNoise(Image noiseless, DetectorSettings det, SplittableRandom rnd) {
        Image out = Image.create(noiseless.width(), noiseless.height());
        float[] src = noiseless.plane(0);
        float[] dst = out.plane(0);
        int n = det.frames();
        double g = det.gain();
        double rn = det.readNoise();
        double sat = det.saturation();
        double sqrtN = Math.sqrt(n);
        for (int i = 0; i < src.length; i++) {
            double electrons = Math.max(0, src[i] * g);
            double frameSigma = Math.sqrt(electrons + rn * rn) / g;
            if (src[i] + SATURATION_GUARD_SIGMA * frameSigma < sat) {
                double e = PoissonSampler.sample(n * electrons, rnd) + rn * sqrtN * rnd.nextGaussian();
                dst[i] = (float) (e / (g * n));
            } else {
                double acc = 0;
                for (int f = 0; f < n; f++) {
                    double adu = (PoissonSampler.sample(electrons, rnd) + rn * rnd.nextGaussian()) / g;
                    acc += Math.min(adu, sat);
                }
                dst[i] = (float) (acc / n);
            }
        }
        return out;
    }
}
