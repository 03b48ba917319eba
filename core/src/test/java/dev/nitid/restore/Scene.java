package dev.nitid.restore;

import dev.nitid.fft.Boundary;
import dev.nitid.fft.ConvolutionSettings;
import dev.nitid.fft.Convolver;
import dev.nitid.image.Image;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.SplittableRandom;

/**
 * An invented seeing-limited star field for quick quality checks inside the unit tests (the full harness
 * lives in benchmarks): stars on a sky with Poisson and read noise, blurred by a Moffat PSF, plus the
 * metrics of issue 5 in a simplified form.
 */
final class Scene {
    final Image truth;
    final Image observed;
    final Image psf;
    final List<int[]> brightStars = new ArrayList<>();
    final double sky;
    final double sigma;

    /**
     * @param seed   random seed
     * @param size   frame side
     * @param fwhm   Moffat FWHM, px
     * @param sky    sky level, electrons (gain 1)
     * @param read   read noise, electrons
     */
    Scene(long seed, int size, double fwhm, double sky, double read) {
        SplittableRandom rnd = new SplittableRandom(seed);
        this.sky = sky;
        this.psf = moffat(31, fwhm, 3.0);
        truth = Image.create(size, size);
        truth.fill((float) sky);
        float[] t = truth.plane(0);
        // a faint filament: a curved ridge 1.5 px wide
        for (int x = 10; x < size - 10; x++) {
            double yc = size * 0.7 + 12 * Math.sin(x / 15.0);
            for (int y = (int) yc - 4; y <= (int) yc + 4; y++) {
                t[y * size + x] += (float) (0.5 * sky * Math.exp(-(y - yc) * (y - yc) / (2 * 1.5 * 1.5)));
            }
        }
        // stars on a jittered grid so the bright ones are isolated
        int step = 40;
        for (int gy = step / 2; gy < size - step / 2; gy += step) {
            for (int gx = step / 2; gx < size - step / 2; gx += step) {
                int x = gx + rnd.nextInt(7) - 3;
                int y = gy + rnd.nextInt(7) - 3;
                double flux = Math.pow(10, 3 + 2.5 * rnd.nextDouble());
                t[y * size + x] += (float) flux;
                if (flux > 3e4) {
                    brightStars.add(new int[] {x, y});
                }
            }
        }
        Convolver c = Convolver.create(size, size, psf, new ConvolutionSettings(Boundary.REFLECT, 1));
        observed = Image.create(size, size);
        c.convolve(t, observed.plane(0));
        float[] o = observed.plane(0);
        for (int i = 0; i < o.length; i++) {
            o[i] = (float) (Fixtures.poisson(rnd, o[i]) + read * Fixtures.gauss(rnd));
        }
        this.sigma = Math.sqrt(sky + read * read);
    }

    static Image moffat(int n, double fwhm, double beta) {
        double alpha = fwhm / (2 * Math.sqrt(Math.pow(2, 1 / beta) - 1));
        Image k = Image.create(n, n);
        int c = n / 2;
        double s = 0;
        for (int y = 0; y < n; y++) {
            for (int x = 0; x < n; x++) {
                double r2 = (x - c) * (x - c) + (y - c) * (y - c);
                double v = Math.pow(1 + r2 / (alpha * alpha), -beta);
                k.set(x, y, (float) v);
                s += v;
            }
        }
        for (int i = 0; i < k.pixelCount(); i++) {
            k.plane(0)[i] /= (float) s;
        }
        return k;
    }

    /**
     * Ring depth of issue 5: per bright star, the azimuthal mean in 1-px annuli from 1.5 to 12 px minus
     * the median of the 20–30 px annulus; the most negative value over the stars, in units of the input
     * sky noise.
     */
    double ringDepth(Image img) {
        float[] a = img.plane(0);
        int w = img.width();
        double worst = Double.POSITIVE_INFINITY;
        for (int[] s : brightStars) {
            List<Float> outer = new ArrayList<>();
            for (int dy = -30; dy <= 30; dy++) {
                for (int dx = -30; dx <= 30; dx++) {
                    double r = Math.hypot(dx, dy);
                    int x = s[0] + dx;
                    int y = s[1] + dy;
                    if (r >= 20 && r <= 30 && x >= 0 && y >= 0 && x < w && y < img.height()) {
                        outer.add(a[y * w + x]);
                    }
                }
            }
            float[] ov = new float[outer.size()];
            for (int i = 0; i < ov.length; i++) {
                ov[i] = outer.get(i);
            }
            Arrays.sort(ov);
            double med = ov[ov.length / 2];
            for (double r0 = 1.5; r0 < 12; r0 += 1) {
                double sum = 0;
                int n = 0;
                for (int dy = -13; dy <= 13; dy++) {
                    for (int dx = -13; dx <= 13; dx++) {
                        double r = Math.hypot(dx, dy);
                        int x = s[0] + dx;
                        int y = s[1] + dy;
                        if (r >= r0 && r < r0 + 1 && x >= 0 && y >= 0 && x < w && y < img.height()) {
                            sum += a[y * w + x];
                            n++;
                        }
                    }
                }
                worst = Math.min(worst, (sum / n - med) / sigma);
            }
        }
        return worst;
    }

    /**
     * Median over bright stars of the Gaussian-equivalent FWHM {@code 2.3548·sqrt(F / (2π·peak))} with F the
     * sky-subtracted flux within 6 px and peak the sky-subtracted brightest pixel (for a 2-D Gaussian,
     * peak = F/(2πσ²); common practice, no source).
     */
    double fwhm(Image img) {
        float[] a = img.plane(0);
        int w = img.width();
        double[] v = new double[brightStars.size()];
        int k = 0;
        for (int[] s : brightStars) {
            double bg = localMedian(img, s, 20, 30);
            double peak = Double.NEGATIVE_INFINITY;
            double flux = 0;
            for (int dy = -6; dy <= 6; dy++) {
                for (int dx = -6; dx <= 6; dx++) {
                    if (dx * dx + dy * dy <= 36) {
                        double val = a[(s[1] + dy) * w + s[0] + dx] - bg;
                        flux += val;
                        peak = Math.max(peak, val);
                    }
                }
            }
            v[k++] = 2.3548 * Math.sqrt(flux / (2 * Math.PI * peak));
        }
        Arrays.sort(v);
        return v[v.length / 2];
    }

    /** Median over bright stars of the aperture flux ratio (radius 10, sky annulus 14–22). */
    double fluxRatio(Image out) {
        double[] v = new double[brightStars.size()];
        int k = 0;
        for (int[] s : brightStars) {
            v[k++] = aperture(out, s) / aperture(observed, s);
        }
        Arrays.sort(v);
        return v[v.length / 2];
    }

    /** Sky noise ratio: MAD σ over the star-free top band, output over input. */
    double noiseRatio(Image out) {
        return bandSigma(out) / bandSigma(observed);
    }

    private double bandSigma(Image img) {
        // rows 2..12 hold no star centre (the grid starts at 17) but may hold wings; MAD is robust to them
        int w = img.width();
        float[] band = Arrays.copyOfRange(img.plane(0), 2 * w, 12 * w);
        Image b = Image.wrap(w, 10, band);
        return b.stats(0).madSigma();
    }

    private double aperture(Image img, int[] s) {
        double bg = localMedian(img, s, 14, 22);
        double sum = 0;
        float[] a = img.plane(0);
        for (int dy = -10; dy <= 10; dy++) {
            for (int dx = -10; dx <= 10; dx++) {
                if (dx * dx + dy * dy <= 100) {
                    sum += a[(s[1] + dy) * img.width() + s[0] + dx] - bg;
                }
            }
        }
        return sum;
    }

    private static double localMedian(Image img, int[] s, double r1, double r2) {
        List<Float> vals = new ArrayList<>();
        for (int dy = (int) -r2; dy <= r2; dy++) {
            for (int dx = (int) -r2; dx <= r2; dx++) {
                double r = Math.hypot(dx, dy);
                int x = s[0] + dx;
                int y = s[1] + dy;
                if (r >= r1 && r <= r2 && x >= 0 && y >= 0 && x < img.width() && y < img.height()) {
                    vals.add(img.plane(0)[y * img.width() + x]);
                }
            }
        }
        vals.sort(null);
        return vals.get(vals.size() / 2);
    }
}
