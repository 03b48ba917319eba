package dev.nitid.quality;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.nitid.image.Image;
import java.util.Arrays;
import java.util.List;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;

class QualityMetricsTest {
    /**
     * Robust σ from ≥ 1e5 Gaussian samples: the MAD's asymptotic standard error is ≈ 1.17 σ/√n (its
     * Gaussian efficiency is 37 %, Rousseeuw &amp; Croux 1993, JASA 88, 1273 — from memory), 0.37 % here;
     * 2 % is over 5 standard errors.
     */
    static final double MAD_RTOL = 0.02;
    /** Exact constructions evaluated in float pixels. */
    static final double FLOAT_TOL = 1e-5;

    private static Image noise(int w, int h, double level, double sigma, long seed) {
        SplittableRandom rnd = new SplittableRandom(seed);
        Image img = Image.create(w, h);
        float[] px = img.plane(0);
        for (int i = 0; i < px.length; i++) {
            px[i] = (float) (level + sigma * rnd.nextGaussian());
        }
        return img;
    }

    private static boolean[] all(Image img) {
        boolean[] m = new boolean[img.pixelCount()];
        Arrays.fill(m, true);
        return m;
    }

    @Test
    void noiseRatioOfTwoGaussianSkies() {
        Image in = noise(320, 320, 100, 2.0, 1);
        Image out = noise(320, 320, 100, 3.0, 2);
        boolean[] sky = all(in);
        assertEquals(2.0, QualityMetrics.skyNoise(in, sky), MAD_RTOL * 2.0, "input σ");
        assertEquals(1.5, QualityMetrics.noiseRatio(in, out, sky), MAD_RTOL * 1.5, "σ ratio");
    }

    @Test
    void skyNoiseOfWholeNumberDataIsNotStuckOnTheLattice() {
        // Pinned failure: on a 16-bit demo field the MAD of whole-number sky values gave σ 6 % low. Rounded
        // Gaussian noise has variance σ² + 1/12 (Sheppard 1898; quantisation noise, Widrow & Kollár 2008 —
        // from memory); the dithered estimate must find it within the MAD's 2 % band.
        double sigma = 2.3;
        Image img = noise(400, 400, 1000, sigma, 21);
        float[] px = img.plane(0);
        double[] raw = new double[px.length];
        for (int i = 0; i < px.length; i++) {
            px[i] = (float) Math.rint(px[i]);
            raw[i] = px[i];
        }
        double expected = Math.sqrt(sigma * sigma + 1.0 / 12);
        assertEquals(expected, QualityMetrics.skyNoise(img, all(img)), MAD_RTOL * expected, "dithered σ");
        double plain = dev.nitid.quality.internal.Robust.madSigma(raw, raw.length);
        assertTrue(Math.abs(plain / expected - 1) > MAD_RTOL, "the plain MAD is biased here: " + plain);
    }

    @Test
    void skyNoiseOfTheReferenceExample() {
        // Reference README §7: [1,2,3,4,100] has MAD 1, so σ̂ = 1.482602 (astropy.stats.mad_std). Shifted by
        // ½ (the MAD is shift-invariant) so that the whole-number dither does not apply.
        Image img = Image.wrap(5, 1, new float[] {1.5f, 2.5f, 3.5f, 4.5f, 100.5f});
        assertEquals(1.482602218505602, QualityMetrics.skyNoise(img, all(img)), 1e-12);
    }

    /** A flat sky with a Gaussian star and an optional ring of constant depth between radii r1 and r2. */
    private static Image starWithRing(double cx, double cy, double ringDepth, double r1, double r2) {
        Image img = Image.create(128, 128);
        float[] px = img.plane(0);
        for (int y = 0; y < 128; y++) {
            for (int x = 0; x < 128; x++) {
                double r = Math.hypot(x - cx, y - cy);
                double v = 100 + 5000 * Math.exp(-r * r / (2 * 1.5 * 1.5));
                if (r >= r1 && r < r2) {
                    v -= ringDepth;
                }
                px[y * 128 + x] = (float) v;
            }
        }
        return img;
    }

    @Test
    void ringOfKnownDepthIsMeasuredInSkySigma() {
        QualitySettings s = QualitySettings.defaults();
        double sigma = 2.0;
        StarSite star = new StarSite(60.3, 64.7);
        // A ring exactly covering the annulus [6.5, 7.5), 3 σ deep: the star's own light there is
        // 5000·exp(−6.5²/4.5) ≈ 4e-1 at most, so subtract the ring-free image's reading too.
        Image ring = starWithRing(star.x(), star.y(), 3 * sigma, 6.5, 7.5);
        Image plain = starWithRing(star.x(), star.y(), 0, 0, 0);
        QualityMetrics.RingDepth none = QualityMetrics.ringDepth(plain, List.of(star), sigma, s);
        assertEquals(0.0, none.depth(), 0.0, "a Gaussian on a flat sky has no ring");
        assertEquals(1, none.stars());
        // Annulus mean of the plain image at [6.5, 7.5) is positive (star light); the ring lowers it by 3 σ.
        double plainMean = annulusMean(plain, star, 6.5, 7.5) - 100;
        QualityMetrics.RingDepth d = QualityMetrics.ringDepth(ring, List.of(star), sigma, s);
        assertEquals(3.0 - plainMean / sigma, d.depth(), FLOAT_TOL, "depth");
        assertEquals(6.5, d.worstRadius(), 0.0);
        // A star too close to the edge for the 30-px background annulus is skipped.
        assertEquals(0, QualityMetrics.ringDepth(ring, List.of(new StarSite(10, 64)), sigma, s).stars());
    }

    private static double annulusMean(Image img, StarSite s, double r1, double r2) {
        double sum = 0;
        int n = 0;
        for (int y = 0; y < img.height(); y++) {
            for (int x = 0; x < img.width(); x++) {
                double r = Math.hypot(x - s.x(), y - s.y());
                if (r >= r1 && r < r2) {
                    sum += img.get(x, y);
                    n++;
                }
            }
        }
        return sum / n;
    }

    /** A round Gaussian blob of width σ at the centre of a w×w image, peak amplitude A on a pedestal b. */
    private static Image blob(int w, double sigma, double amp, double b) {
        Image img = Image.create(w, w);
        double c = (w - 1) / 2.0;
        for (int y = 0; y < w; y++) {
            for (int x = 0; x < w; x++) {
                double r2 = (x - c) * (x - c) + (y - c) * (y - c);
                img.set(x, y, (float) (b + amp * Math.exp(-r2 / (2 * sigma * sigma))));
            }
        }
        return img;
    }

    @Test
    void truthErrorFindsTheBlurOfAGaussianBlob() {
        // A Gaussian of σ₀ blurred by a Gaussian of σ_t is a Gaussian of √(σ₀² + σ_t²) with the same integral
        // (common practice: variances add under convolution). Truth: σ₀ = 3; image: σ = √(9 + 2²), t = 2·2.3548.
        double s0 = 3;
        double st = 2.0;
        double s1 = Math.sqrt(s0 * s0 + st * st);
        Image truth = blob(97, s0, 1000, 0);
        Image image = blob(97, s1, 1000 * s0 * s0 / (s1 * s1) * 2.0, 50); // gain 2, pedestal 50
        boolean[] mask = new boolean[97 * 97];
        for (int i = 0; i < mask.length; i++) {
            double x = i % 97 - 48;
            double y = i / 97 - 48;
            mask[i] = Math.hypot(x, y) < 15;
        }
        QualitySettings s = QualitySettings.defaults();
        TruthLadder ladder = TruthLadder.build(truth, mask, s);
        QualityMetrics.TruthError e = QualityMetrics.truthError(image, ladder);
        double tExpected = st * 2 * Math.sqrt(2 * Math.log(2));
        assertEquals(tExpected, e.bestFwhm(), s.truthFwhmStep(), "best t");
        assertTrue(e.figure() < 0.02, "figure " + e.figure());
        assertEquals(2.0, e.gain(), 0.05, "gain");
    }

    @Test
    void truthErrorOfNoiseIsNoiseOverContrast() {
        // image = truth ⊛ G_t + noise: at the right t the residual is the noise, so E = σ_n / std(truth ⊛ G_t)
        // (least squares; the two fitted parameters change this by a factor √(1 − 2/n), negligible here).
        Image truth = blob(200, 20, 500, 0);
        Image smooth = Image.wrap(200, 200, dev.nitid.quality.internal.GaussianSmoothing.smooth(truth.plane(0), 200, 200, 3.0));
        double sigmaN = 4;
        SplittableRandom rnd = new SplittableRandom(9);
        Image image = smooth.copy();
        float[] px = image.plane(0);
        for (int i = 0; i < px.length; i++) {
            px[i] += (float) (sigmaN * rnd.nextGaussian());
        }
        boolean[] mask = all(truth);
        double mean = 0;
        for (float v : smooth.plane(0)) {
            mean += v;
        }
        mean /= px.length;
        double var = 0;
        for (float v : smooth.plane(0)) {
            var += (v - mean) * (v - mean);
        }
        double expected = sigmaN / Math.sqrt(var / px.length);
        QualityMetrics.TruthError e = QualityMetrics.truthError(image, TruthLadder.build(truth, mask, QualitySettings.defaults()));
        // 40 000 samples: the rms of the noise is known to 1/√(2n) ≈ 0.35 %; 2 % covers that and the t grid.
        assertEquals(expected, e.figure(), 0.02 * expected, "figure");
    }

    @Test
    void fluxRatioOfScaledStars() {
        // Output = sky + 0.9 × each star, sharpened from FWHM 4 to 2.5: photometry in radius 10 (> 6 σ) sees
        // all of both, so the ratio is 0.9 up to the Gaussian tail beyond 10 px (< 1e-9).
        List<StarSite> stars = List.of(new StarSite(40.2, 40.6), new StarSite(90.5, 35.1), new StarSite(60.9, 95.3));
        Image in = Image.create(128, 128);
        Image out = Image.create(128, 128);
        for (int y = 0; y < 128; y++) {
            for (int x = 0; x < 128; x++) {
                double a = 200;
                double b = 200;
                for (StarSite s : stars) {
                    double r2 = (x - s.x()) * (x - s.x()) + (y - s.y()) * (y - s.y());
                    a += 1e4 * gauss(r2, 4.0);
                    b += 0.9e4 * gauss(r2, 2.5);
                }
                in.set(x, y, (float) a);
                out.set(x, y, (float) b);
            }
        }
        QualityMetrics.FluxComparison f = QualityMetrics.fluxRatio(in, out, stars, 10, QualitySettings.defaults());
        assertEquals(3, f.stars());
        assertEquals(0.9, f.ratio(), 1e-4, "flux ratio");
        assertEquals(1e4, QualityMetrics.aperture(in, stars.get(0), 10, QualitySettings.defaults()), 1.0, "flux");
    }

    /** Unit-flux 2-D Gaussian of the given FWHM at squared radius r2 (peak 1/(2πσ²), reference README §3). */
    private static double gauss(double r2, double fwhm) {
        double s = fwhm / 2.354820045;
        return Math.exp(-r2 / (2 * s * s)) / (2 * Math.PI * s * s);
    }

    @Test
    void rejectsAMaskOfTheWrongSize() {
        Image img = Image.create(10, 10);
        var e = assertThrows(IllegalArgumentException.class, () -> QualityMetrics.skyNoise(img, new boolean[99]));
        assertTrue(e.getMessage().contains("99"), e.getMessage());
    }
}
