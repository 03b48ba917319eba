package dev.nitid.stars;

import java.util.ArrayList;
import java.util.List;
import java.util.SplittableRandom;

/**
 * A small synthetic star field for tests, with known truth: stars of one elliptical PSF (pixel-integrated
 * by a 5×5 midpoint average), a linear sky gradient, optional saturated stars (clipped to a level),
 * extended "galaxies" (elliptical Gaussians of large FWHM), hot pixels, an optional asymmetric "ghost"
 * component of every star, and Poisson noise (gain 1).
 * Poisson deviates: Knuth's product method below a mean of 30, else the normal approximation rounded
 * to an integer (Knuth, TAOCP vol. 2, 3rd ed. 1997, §3.4.1; the approximation is common practice).
 */
final class SyntheticField {
    final int width;
    final int height;
    final float[] pixels;
    final List<double[]> stars = new ArrayList<>();      // x, y, peak
    final List<double[]> saturated = new ArrayList<>();  // x, y
    final List<double[]> galaxies = new ArrayList<>();   // x, y
    final List<int[]> hotPixels = new ArrayList<>();     // x, y

    SyntheticField(int width, int height) {
        this.width = width;
        this.height = height;
        this.pixels = new float[width * height];
    }

    /** Parameters of a field. */
    record Spec(int width, int height, int stars, double fwhmMajor, double fwhmMinor, double angle, double beta,
                double sky, double gradient, double minPeak, double maxPeak, int saturatedStars,
                double saturation, int galaxies, int hotPixels, boolean noise, double ghostFraction,
                double ghostDx) {
    }

    static SyntheticField make(Spec s, long seed) {
        SplittableRandom rnd = new SplittableRandom(seed);
        SyntheticField f = new SyntheticField(s.width(), s.height());
        int margin = 12;
        double minDist = 14;
        List<double[]> taken = new ArrayList<>();
        int radius = (int) Math.ceil(6 * s.fwhmMajor());
        for (int i = 0; i < s.stars() + s.saturatedStars() + s.galaxies(); i++) {
            double x = 0;
            double y = 0;
            for (int attempt = 0; attempt < 1000; attempt++) {
                x = rnd.nextDouble(margin, s.width() - margin);
                y = rnd.nextDouble(margin, s.height() - margin);
                boolean ok = true;
                for (double[] t : taken) {
                    if (Math.hypot(t[0] - x, t[1] - y) < minDist) {
                        ok = false;
                        break;
                    }
                }
                if (ok) {
                    break;
                }
            }
            taken.add(new double[] {x, y});
            if (i < s.stars()) {
                // Log-uniform peaks: many faint, few bright, as in real fields.
                double peak = s.minPeak() * Math.pow(s.maxPeak() / s.minPeak(), rnd.nextDouble());
                TestStars.addStar(f.pixels, f.width, f.height, x, y, peak, s.fwhmMajor(), s.fwhmMinor(), s.angle(),
                        s.beta(), 5, radius);
                if (s.ghostFraction() > 0) {
                    // An asymmetric PSF: a fainter copy displaced along x (like a coma tail or a double image).
                    TestStars.addStar(f.pixels, f.width, f.height, x + s.ghostDx(), y, peak * s.ghostFraction(),
                            s.fwhmMajor(), s.fwhmMinor(), s.angle(), s.beta(), 5, radius);
                }
                f.stars.add(new double[] {x, y, peak});
            } else if (i < s.stars() + s.saturatedStars()) {
                TestStars.addStar(f.pixels, f.width, f.height, x, y, s.saturation() * 4, s.fwhmMajor(),
                        s.fwhmMinor(), s.angle(), s.beta(), 5, radius);
                f.saturated.add(new double[] {x, y});
            } else {
                TestStars.addStar(f.pixels, f.width, f.height, x, y, s.maxPeak() / 10, 12, 9, 1.0, Double.NaN, 1, 40);
                f.galaxies.add(new double[] {x, y});
            }
        }
        for (int j = 0; j < s.height(); j++) {
            for (int i = 0; i < s.width(); i++) {
                f.pixels[j * s.width() + i] += (float) (s.sky() + s.gradient() * (i + 0.5 * j));
            }
        }
        if (s.noise()) {
            for (int k = 0; k < f.pixels.length; k++) {
                f.pixels[k] = (float) poisson(rnd, f.pixels[k]);
            }
        }
        for (int i = 0; i < s.hotPixels(); i++) {
            int x = rnd.nextInt(margin, s.width() - margin);
            int y = rnd.nextInt(margin, s.height() - margin);
            f.pixels[y * s.width() + x] += (float) (s.maxPeak() / 5);
            f.hotPixels.add(new int[] {x, y});
        }
        if (s.saturatedStars() > 0) {
            for (int k = 0; k < f.pixels.length; k++) {
                f.pixels[k] = Math.min(f.pixels[k], (float) s.saturation());
            }
        }
        return f;
    }

    static double poisson(SplittableRandom rnd, double mean) {
        if (mean <= 0) {
            return 0;
        }
        if (mean < 30) {
            double l = Math.exp(-mean);
            int k = 0;
            double p = rnd.nextDouble();
            while (p > l) {
                k++;
                p *= rnd.nextDouble();
            }
            return k;
        }
        return Math.max(0, Math.rint(mean + Math.sqrt(mean) * rnd.nextGaussian()));
    }
}
