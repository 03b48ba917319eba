package dev.nitid.stars;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.nitid.image.Image;
import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;

/**
 * Synthetic fields with known elliptical Moffat and Gaussian PSFs, Poisson noise, a sky gradient,
 * saturated stars, galaxies and hot pixels. Tolerances are the acceptance figures of the project's
 * issue 6 (FWHM 2 %, β 10 %, ellipticity 0.02, centroids 0.05 px, empirical PSF residual 2 % of peak).
 */
class StarMeasurerTest {
    /** Relative FWHM tolerance (issue 6 acceptance figure). */
    private static final double FWHM_REL = 0.02;
    /** Relative β tolerance (issue 6). */
    private static final double BETA_REL = 0.10;
    /** Absolute ellipticity tolerance (issue 6). */
    private static final double ELLIPTICITY_ABS = 0.02;
    /** Centroid RMS error for well-exposed stars, px (issue 6). */
    private static final double CENTROID_PX = 0.05;
    /** Empirical PSF: max |measured − true| over the true peak (issue 6). */
    private static final double EPSF_REL = 0.02;
    /**
     * Position angle of the summary, radians (project target, no source): 0.1 rad ≈ 6°; with e ≈ 0.11 and
     * more than 100 stars the angle is known far better, but a field with e ≈ 0.05 must still pass.
     */
    private static final double ANGLE_RAD = 0.1;
    /** Fewest stars the Moffat field must give (project choice: the 2 % median needs ~100 measured stars). */
    private static final int MIN_USED = 100;
    /** Fewest stars of peak S/N ≥ 100 for the centroid figure (project choice, no source). */
    private static final int MIN_BRIGHT = 30;
    /** Peak S/N from which a star counts as well exposed for the centroid figure (issue 6 wording, no number). */
    private static final double BRIGHT_SNR = 100;
    /**
     * An accepted star this close to an impostor is the impostor, px (project choice, no source): about one
     * FWHM for a saturated core, 1.5 FWHM for a galaxy's bright centre, half a FWHM for a hot pixel.
     */
    private static final double SATURATED_MATCH_PX = 3;
    private static final double GALAXY_MATCH_PX = 5;
    private static final double HOT_PIXEL_MATCH_PX = 1.5;
    /**
     * An accepted star matches a true one within max(1 px, 4 standard errors of its position) (project choice:
     * 4σ leaves a false alarm of ~3·10⁻⁴ per star for Gaussian errors, from memory).
     */
    private static final double TRUE_MATCH_PX = 1;
    private static final double TRUE_MATCH_SIGMAS = 4;
    /** PSF sum: float32 rounding of the normalised values adds at most ~10⁻⁷; a generous project margin. */
    private static final double PSF_SUM_TOL = 1e-5;
    /** The ghost's third moment along x must exceed the one along y (0 for the truth) this many times. */
    private static final double SKEW_DOMINANCE = 3;
    /**
     * Region FWHM against the truth (project target, no source): a median of few stars (≥ {@value #MIN_REGION_STARS})
     * scatters by a few per cent, unlike the frame's median over hundreds.
     */
    private static final double REGION_FWHM_REL = 0.05;
    private static final int MIN_REGION_STARS = 6;

    static final double MAJOR = 3.6;
    static final double MINOR = 3.2;
    static final double ANGLE = 0.6;
    static final double BETA = 3.0;
    static final double SATURATION = 60000;

    static SyntheticField moffatField;
    static StarMeasurement moffat;
    static SyntheticField gaussField;
    static StarMeasurement gauss;

    @BeforeAll
    static void measureFields() {
        moffatField = SyntheticField.make(new SyntheticField.Spec(600, 500, 220, MAJOR, MINOR, ANGLE, BETA, 400, 0.3,
                300, 40000, 4, SATURATION, 3, 6, true, 0, 0), 20240611L);
        moffat = StarMeasurer.measure(Image.wrap(600, 500, moffatField.pixels),
                MeasureSettings.defaults().withDetectionFwhm(3.4).withSaturation(SATURATION));
        gaussField = SyntheticField.make(new SyntheticField.Spec(400, 400, 120, MAJOR, MINOR, ANGLE, Double.NaN, 400,
                -0.2, 300, 40000, 0, SATURATION, 0, 0, true, 0, 0), 7L);
        gauss = StarMeasurer.measure(Image.wrap(400, 400, gaussField.pixels), MeasureSettings.defaults());
    }

    @Test
    void moffatFieldFiguresMatchTruth() {
        ProfileSummary b = moffat.best();
        assertEquals(ProfileShape.MOFFAT, moffat.bestShape(), "BIC should prefer the true Moffat shape");
        assertTrue(b.count() > MIN_USED, "stars used: " + b.count());
        assertEquals(MAJOR, b.fwhmMajor(), FWHM_REL * MAJOR, "major FWHM");
        assertEquals(MINOR, b.fwhmMinor(), FWHM_REL * MINOR, "minor FWHM");
        assertEquals(Math.sqrt(MAJOR * MINOR), b.fwhm(), FWHM_REL * Math.sqrt(MAJOR * MINOR), "FWHM");
        assertEquals(BETA, b.beta(), BETA_REL * BETA, "beta");
        assertEquals(1 - MINOR / MAJOR, b.ellipticity(), ELLIPTICITY_ABS, "ellipticity");
        assertEquals(0, Math.IEEEremainder(b.angle() - ANGLE, Math.PI), ANGLE_RAD, "angle");
    }

    @Test
    void gaussianFieldFiguresMatchTruth() {
        ProfileSummary b = gauss.best();
        assertEquals(ProfileShape.GAUSSIAN, gauss.bestShape(), "BIC should prefer the true Gaussian shape");
        assertEquals(MAJOR, b.fwhmMajor(), FWHM_REL * MAJOR, "major FWHM");
        assertEquals(MINOR, b.fwhmMinor(), FWHM_REL * MINOR, "minor FWHM");
        assertEquals(1 - MINOR / MAJOR, b.ellipticity(), ELLIPTICITY_ABS, "ellipticity");
    }

    @Test
    void centroidsOfWellExposedStarsWithinTolerance() {
        double sum = 0;
        int n = 0;
        for (MeasuredStar m : moffat.stars()) {
            if (m.snr() < BRIGHT_SNR) {
                continue;
            }
            double[] t = nearest(moffatField.stars, m.x(), m.y());
            assertTrue(t != null, () -> "accepted star at " + m.x() + ", " + m.y() + " matches no true star");
            sum += (m.x() - t[0]) * (m.x() - t[0]) + (m.y() - t[1]) * (m.y() - t[1]);
            n++;
        }
        assertTrue(n > MIN_BRIGHT, "bright stars: " + n);
        double rms = Math.sqrt(sum / (2 * n));
        assertTrue(rms <= CENTROID_PX, "centroid RMS per axis " + rms + " px > " + CENTROID_PX);
    }

    @Test
    void impostorsAreRejected() {
        for (double[] s : moffatField.saturated) {
            assertTrue(nearestStar(moffat, s[0], s[1], SATURATED_MATCH_PX) == null, "saturated star at " + s[0] + "," + s[1] + " accepted");
        }
        for (double[] g : moffatField.galaxies) {
            assertTrue(nearestStar(moffat, g[0], g[1], GALAXY_MATCH_PX) == null, "galaxy at " + g[0] + "," + g[1] + " accepted");
        }
        for (int[] h : moffatField.hotPixels) {
            assertTrue(nearestStar(moffat, h[0], h[1], HOT_PIXEL_MATCH_PX) == null, "hot pixel at " + h[0] + "," + h[1] + " accepted");
        }
        assertTrue(moffat.rejected().get(RejectReason.SATURATED) >= moffatField.saturated.size(),
                "saturated count " + moffat.rejected());
        assertTrue(moffat.rejected().get(RejectReason.TOO_SHARP) >= 1, "too-sharp count " + moffat.rejected());
        // Every accepted star is a true star, within 1 px or 4 standard errors of its position.
        for (MeasuredStar m : moffat.stars()) {
            double tol = Math.max(TRUE_MATCH_PX, TRUE_MATCH_SIGMAS * Math.hypot(m.gaussian().errors().x(), m.gaussian().errors().y()));
            assertTrue(nearest(moffatField.stars, m.x(), m.y(), tol) != null, "false star at " + m.x() + "," + m.y());
        }
    }

    /** Effective PSF against the truth: the pixel-integrated Moffat on the same grid, normalised to sum 1. */
    @Test
    void empiricalPsfMatchesTruePsf() {
        EmpiricalPsf e = moffat.empirical();
        Image psf = e.sampled();
        int r = psf.width() / 2;
        double[] truth = new double[psf.width() * psf.height()];
        double sum = 0;
        for (int j = 0; j < psf.height(); j++) {
            for (int i = 0; i < psf.width(); i++) {
                double v = 0;
                for (int sj = 0; sj < 20; sj++) {
                    for (int si = 0; si < 20; si++) {
                        v += TestStars.profile(i - r + (si + 0.5) / 20 - 0.5, j - r + (sj + 0.5) / 20 - 0.5,
                                MAJOR, MINOR, ANGLE, BETA);
                    }
                }
                truth[j * psf.width() + i] = v;
                sum += v;
            }
        }
        double peak = 0;
        double worst = 0;
        for (int k = 0; k < truth.length; k++) {
            truth[k] /= sum;
            peak = Math.max(peak, truth[k]);
        }
        for (int k = 0; k < truth.length; k++) {
            worst = Math.max(worst, Math.abs(psf.plane(0)[k] - truth[k]));
        }
        assertTrue(worst <= EPSF_REL * peak, "max residual " + worst / peak + " of the peak");
        double total = 0;
        for (float v : psf.plane(0)) {
            total += v;
            assertTrue(v >= 0);
        }
        assertEquals(1, total, PSF_SUM_TOL, "PSF sum");
        // The model is exact here, so the noise-free model must be preferred.
        assertEquals(PsfSource.MODEL, moffat.psfSource(), moffat.psfReason());
    }

    /**
     * Stars with an asymmetric PSF (a 30 % copy 2 px to the side): no elliptical profile describes them, so the
     * empirical PSF must be chosen, and it must show the asymmetry at the right place.
     */
    @Test
    void asymmetricPsfChoosesEmpirical() {
        SyntheticField f = SyntheticField.make(new SyntheticField.Spec(400, 400, 150, 3.0, 3.0, 0, 3.0, 300, 0,
                500, 40000, 0, SATURATION, 0, 0, true, 0.3, 2.0), 99L);
        StarMeasurement m = StarMeasurer.measure(Image.wrap(400, 400, f.pixels), MeasureSettings.defaults());
        assertEquals(PsfSource.EMPIRICAL, m.psfSource(), m.psfReason());
        Image psf = m.psf();
        // The ghost on the +x side skews the light distribution towards +x: the third central moment along x
        // is positive and dominates the one along y (which is 0 for the truth).
        double sx = 0;
        double sy = 0;
        double mx = 0;
        double my = 0;
        double tot = 0;
        for (int j = 0; j < psf.height(); j++) {
            for (int i = 0; i < psf.width(); i++) {
                double v = psf.get(i, j);
                tot += v;
                mx += v * i;
                my += v * j;
            }
        }
        mx /= tot;
        my /= tot;
        for (int j = 0; j < psf.height(); j++) {
            for (int i = 0; i < psf.width(); i++) {
                double v = psf.get(i, j);
                sx += v * Math.pow(i - mx, 3);
                sy += v * Math.pow(j - my, 3);
            }
        }
        assertTrue(sx > 0 && sx > SKEW_DOMINANCE * Math.abs(sy), "skewness x " + sx + ", y " + sy);
    }

    @Test
    void regionsCoverTheField() {
        assertEquals(9, moffat.regions().size());
        int total = 0;
        for (RegionSummary r : moffat.regions()) {
            total += r.count();
            if (r.count() >= MIN_REGION_STARS) {
                assertEquals(Math.sqrt(MAJOR * MINOR), r.fwhm(), REGION_FWHM_REL * Math.sqrt(MAJOR * MINOR),
                        "region " + r);
            }
        }
        assertEquals(moffat.stars().size(), total);
    }

    /** Results do not depend on the thread count (explicit pair, not reflection). */
    @Test
    void singleThreadEqualsTwoThreads() {
        MeasureSettings s = MeasureSettings.defaults().withDetectionFwhm(3.4).withSaturation(SATURATION);
        Image img = Image.wrap(600, 500, moffatField.pixels);
        StarMeasurement one = StarMeasurer.measure(img, s.withThreads(1));
        StarMeasurement two = StarMeasurer.measure(img, s.withThreads(2));
        assertEquals(one.stars().size(), two.stars().size());
        for (int i = 0; i < one.stars().size(); i++) {
            assertEquals(one.stars().get(i).x(), two.stars().get(i).x(), 0.0);
            assertEquals(one.stars().get(i).gaussian().fwhm(), two.stars().get(i).gaussian().fwhm(), 0.0);
        }
        assertEquals(one.rejected(), two.rejected());
        assertEquals(one.best().fwhm(), two.best().fwhm(), 0.0);
        assertArrayEquals(one.psf().plane(0), two.psf().plane(0), 0f);
    }

    static double[] nearest(List<double[]> truth, double x, double y) {
        return nearest(truth, x, y, TRUE_MATCH_PX);
    }

    static double[] nearest(List<double[]> truth, double x, double y, double within) {
        double[] best = null;
        double bd = within;
        for (double[] t : truth) {
            double d = Math.hypot(t[0] - x, t[1] - y);
            if (d < bd) {
                bd = d;
                best = t;
            }
        }
        return best;
    }

    static MeasuredStar nearestStar(StarMeasurement m, double x, double y, double within) {
        List<MeasuredStar> hits = new ArrayList<>();
        for (MeasuredStar s : m.stars()) {
            if (Math.hypot(s.x() - x, s.y() - y) <= within) {
                hits.add(s);
            }
        }
        return hits.isEmpty() ? null : hits.get(0);
    }
}
