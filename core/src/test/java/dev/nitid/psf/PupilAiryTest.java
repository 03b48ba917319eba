package dev.nitid.psf;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.nitid.image.Image;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

/**
 * The pupil-FFT diffraction PSF against the analytic Airy and annular-Airy patterns.
 *
 * <p>Reference values: {@code airy_constants.csv} and {@code annular_airy_constants.csv} (scipy 1.10.1,
 * from Airy 1835 / Born &amp; Wolf, Principles of Optics §8.5.2 and Schroeder, Astronomical Optics §10.2;
 * see reference README §1–2). Analytic profile: {@link AiryOracle} with Hipparchus' Bessel J.
 * The set-up follows the reference's pupil-FFT check: pupil ≥ 256 samples, PSF sample 0.25 λ/D.
 */
class PupilAiryTest {
    /** PSF sample in λ/D used for the profile checks (reference README §2b). */
    static final double SAMPLE_LD = 0.25;
    /** Sub-sample steps per pixel along x for the dense profile: 0.025 λ/D spacing. */
    static final int STEPS = 10;
    /** Ring positions from an FFT builder: 1e-3 relative (reference README §1, "How to test", step 2). */
    static final double ZERO_RTOL = 1e-3;
    /** Ring peaks and profile from an FFT builder: 2e-3 of the peak, absolute (reference README §1 step 3, §2b). */
    static final double PROFILE_ATOL = 2e-3;
    /** Encircled energy from an FFT builder with a pupil ≥ 256 px: 2e-3 (reference README §1, step 4). */
    static final double EE_ATOL = 2e-3;
    /** FWHM from the sampled profile of an FFT builder: 0.5 % (reference README §1, step 5). */
    static final double FWHM_RTOL = 5e-3;
    /**
     * Ring-peak position, λ/D: 0.01 (project target, no source). A maximum is flat, so its position is less
     * certain than a zero's; 0.01 is 0.4 of the 0.025 λ/D profile spacing. Measured 8e-5.
     */
    static final double RING_PEAK_X_ATOL = 0.01;

    static PupilPsf model(double eps) {
        return PupilPsf.ofSampling(SAMPLE_LD, 550).withPupilSamples(256).withObstruction(eps);
    }

    /** Dense profile along +x: {x in λ/D, flux density per (λ/D)²}, from renders at sub-pixel offsets. */
    static double[][] profile(PupilPsf m, int size) {
        int c = size / 2;
        int n = (c + 1) * STEPS;
        double[] x = new double[n];
        double[] d = new double[n];
        double area = SAMPLE_LD * SAMPLE_LD;
        for (int k = 0; k < STEPS; k++) {
            Image fine = m.renderDetailed(size, 1, -k / (double) STEPS, 0).fine();
            for (int i = c; i < size; i++) {
                int idx = (i - c) * STEPS + k;
                if (idx < n) {
                    x[idx] = (i - c + k / (double) STEPS) * SAMPLE_LD;
                    d[idx] = fine.get(i, c) / area;
                }
            }
        }
        return new double[][] {x, d};
    }

    /** Vertex of the parabola through three equally spaced points: {position, value}. */
    static double[] vertex(double[] x, double[] y, int i) {
        double h = x[i + 1] - x[i];
        double denom = y[i - 1] - 2 * y[i] + y[i + 1];
        double t = 0.5 * (y[i - 1] - y[i + 1]) / denom;
        return new double[] {x[i] + t * h, y[i] - 0.25 * (y[i - 1] - y[i + 1]) * t};
    }

    /** Local minima (first) or maxima of the profile beyond the centre, refined by parabolas. */
    static List<double[]> extrema(double[][] p, boolean minima) {
        List<double[]> out = new ArrayList<>();
        double[] x = p[0];
        double[] y = p[1];
        for (int i = 1; i < x.length - 1; i++) {
            boolean isMin = y[i] < y[i - 1] && y[i] <= y[i + 1];
            boolean isMax = y[i] > y[i - 1] && y[i] >= y[i + 1];
            if (minima ? isMin : isMax) {
                out.add(vertex(x, y, i));
            }
        }
        return out;
    }

    /** Flux within radius r (λ/D) from the point-sampled stamp: Σ samples with distance ≤ r. */
    static double encircled(Image fine, double rLd) {
        int n = fine.width();
        int c = n / 2;
        double s = 0;
        for (int y = 0; y < n; y++) {
            for (int x = 0; x < n; x++) {
                double r = Math.hypot(x - c, y - c) * SAMPLE_LD;
                if (r <= rLd) {
                    s += fine.get(x, y);
                }
            }
        }
        return s;
    }

    @Test
    void unobstructedRingsPeaksEnergyAndFwhm() {
        PupilPsf m = model(0);
        double[][] p = profile(m, 31);
        double centre = p[1][0];
        List<double[]> zeros = extrema(p, true);
        List<double[]> peaks = extrema(p, false);
        // airy_constants.csv (scipy 1.10.1): zeros of J1 over π; ring peaks at zeros of J2
        String[][] rows = {{"min1", "max1"}, {"min2", "max2"}, {"min3", "max3"}};
        Image fine = m.renderDetailed(41, 1, 0, 0).fine();
        for (int k = 0; k < 3; k++) {
            Map<String, String> zr = RefCsv.row("airy_constants.csv", "feature", rows[k][0]);
            double xz = RefCsv.num(zr, "x_lambda_over_D");
            assertEquals(xz, zeros.get(k)[0], ZERO_RTOL * xz, "dark ring " + (k + 1) + " position [λ/D]");
            assertEquals(RefCsv.num(zr, "EE"), encircled(fine, xz), EE_ATOL, "EE inside dark ring " + (k + 1));
            if (k < 2) {
                Map<String, String> pr = RefCsv.row("airy_constants.csv", "feature", rows[k][1]);
                assertEquals(RefCsv.num(pr, "I_rel_peak"), peaks.get(k)[1] / centre, PROFILE_ATOL,
                        "ring " + (k + 1) + " peak over centre");
                assertEquals(RefCsv.num(pr, "x_lambda_over_D"), peaks.get(k)[0], RING_PEAK_X_ATOL,
                        "ring " + (k + 1) + " peak position [λ/D]");
            }
        }
        double fwhm = 2 * halfMaxCrossing(p);
        double expected = RefCsv.num(RefCsv.row("annular_airy_constants.csv", "eps", "0"), "fwhm_x");
        assertEquals(expected, fwhm, FWHM_RTOL * expected, "Airy FWHM [λ/D]");
    }

    static double halfMaxCrossing(double[][] p) {
        double half = 0.5 * p[1][0];
        for (int i = 1; i < p[0].length; i++) {
            if (p[1][i] < half) {
                double t = (p[1][i - 1] - half) / (p[1][i - 1] - p[1][i]);
                return p[0][i - 1] + t * (p[0][i] - p[0][i - 1]);
            }
        }
        throw new AssertionError("no half-maximum crossing");
    }

    /** Annular apertures: first zero and core energy (reference README §2, annular_airy_constants.csv). */
    @ParameterizedTest(name = "eps {0}")
    @ValueSource(strings = {"0.2", "0.33", "0.5"})
    void annularFirstZeroAndCoreEnergy(String eps) {
        double e = Double.parseDouble(eps);
        PupilPsf m = model(e);
        Map<String, String> ref = RefCsv.row("annular_airy_constants.csv", "eps", eps);
        double[][] p = profile(m, 13);
        double zero = extrema(p, true).get(0)[0];
        double xz = RefCsv.num(ref, "zero1_x");
        assertEquals(xz, zero, ZERO_RTOL * xz, "first zero [λ/D], eps " + eps);
        Image fine = m.renderDetailed(41, 1, 0, 0).fine();
        assertEquals(RefCsv.num(ref, "EE_core_closed_form"), encircled(fine, xz), EE_ATOL, "EE in the core, eps " + eps);
        assertEquals(RefCsv.num(ref, "fwhm_x"), 2 * halfMaxCrossing(p), FWHM_RTOL * RefCsv.num(ref, "fwhm_x"),
                "FWHM [λ/D], eps " + eps);
    }

    /**
     * Every sample within 10 λ/D against P(x)·p² from Hipparchus' Bessel J, including off-centre renders
     * (the shift theorem must move the pattern exactly). Tolerance: reference README §2b.
     */
    @ParameterizedTest(name = "eps {0}")
    @ValueSource(doubles = {0, 0.33})
    void wholePatternMatchesBesselOracle(double eps) {
        PupilPsf m = model(eps);
        int size = 81;
        int c = size / 2;
        double[][] offsets = {{0, 0}, {0.3, -0.45}};
        for (double[] off : offsets) {
            Image fine = m.renderDetailed(size, 1, off[0], off[1]).fine();
            double peak = AiryOracle.density(0, eps) * SAMPLE_LD * SAMPLE_LD;
            double worst = 0;
            for (int y = 0; y < size; y++) {
                for (int x = 0; x < size; x++) {
                    double r = Math.hypot(x - c - off[0], y - c - off[1]) * SAMPLE_LD;
                    if (r > 10) {
                        continue;
                    }
                    double expect = AiryOracle.density(r, eps) * SAMPLE_LD * SAMPLE_LD;
                    worst = Math.max(worst, Math.abs(fine.get(x, y) - expect) / peak);
                }
            }
            assertTrue(worst <= PROFILE_ATOL, "eps " + eps + " offset (" + off[0] + ", " + off[1]
                    + "): worst deviation " + worst + " of the peak > " + PROFILE_ATOL);
        }
    }

    /** Our Bessel oracle reproduces the reference's scipy profile (guards the oracle itself). */
    @Test
    void oracleAgreesWithScipyProfile() {
        List<Map<String, String>> rows = RefCsv.rows("annular_airy_eps0.33_profile.csv");
        for (int i = 0; i < rows.size(); i += 37) {
            Map<String, String> r = rows.get(i);
            double v = RefCsv.num(r, "v");
            double expect = RefCsv.num(r, "I_peak_norm");
            // 1e-9 relative: reference README §2 tolerance for an analytic evaluation
            assertEquals(expect, AiryOracle.intensity(v / Math.PI, 0.33), 1e-9 * Math.max(expect, 1e-6), "v=" + v);
        }
    }
}
