package dev.nitid.psf;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import dev.nitid.image.Image;
import dev.nitid.testdata.Reference;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

/**
 * Gaussian and Moffat models against their published formulas and astropy 5.2.1 (golden values made by
 * {@code testdata/scripts/gen_moffat_reference.py}; constants from the reference README §3).
 */
class AnalyticModelsTest {
    /** Closed-form constants: 1e-12 relative (reference README §3, "FWHM from the analytic formula"). */
    static final double FORMULA_RTOL = 1e-12;
    /** FWHM measured on a sampled PSF with σ ≥ 1 px: 1 % (reference README §3). */
    static final double MEASURED_FWHM_RTOL = 0.01;
    /**
     * Round profiles, composite Simpson with h = 9/4000 px: the error is (h⁴/180)·[g‴(R) − g‴(0)] for
     * g(r) = r·∮f dθ (Abramowitz &amp; Stegun 1964, 25.4.5, from memory) = 1.4e-13·|g‴(0)|, and
     * |g‴(0)| = 12β(β−1)/α⁴ is at most 13.5 here (Moffat α = 2, β = 4.765; derived here); the trapezoid rule
     * in angle is exact for a round profile. Bound 2e-12, measured 1.9e-12; 1e-10 leaves room for the
     * rounding of 10⁶ double terms. (Was 1e-8.)
     */
    static final double ROUND_QUADRATURE_ATOL = 1e-10;
    /**
     * Elliptical profiles integrated to r = 400 px with h = 0.1 px: the same Simpson term is
     * 5.6e-7·|g‴(0)|, with |g‴(0)| = 1.5(σ₁⁻² + σ₂⁻²)/(σ₁σ₂) = 0.47 for the Gaussian (derived here; 2.6e-7,
     * as measured) and ≈ 2.1 for the narrower Moffat core (measured 1.2e-6); the tail beyond 400 px is
     * below 1e-8 and the angular trapezoid rule converges geometrically for these smooth periodic integrands
     * (common practice, no source). 2e-6 covers the larger Simpson term.
     */
    static final double ELLIPTICAL_QUADRATURE_ATOL = 2e-6;
    /**
     * Flux centroid of a point-sampled float32 image: each pixel is rounded by at most 2⁻²⁴ of itself, which
     * moves Σx·v/Σv by at most 2⁻²⁴ × (largest |x − centroid|, 30 px on a 61-px stamp) = 1.8e-6 px; the
     * Gaussian's own aliasing term exp(−2π²σ²) is below 1e-18 for σ ≥ 1.4 px (Poisson summation, common
     * practice, no source). Measured ≤ 1e-8. (Was 1e-3.)
     */
    static final double CENTROID_ATOL = 2e-6;
    /**
     * Half-light radius of the box-convolved Gaussian vs 1.17741·√(σ² + 1/12): 0.5 %. The profile is not
     * exactly Gaussian and the radius is read off a curve sampled every ½ px (common practice, no source);
     * measured +0.15 %.
     */
    static final double R50_RTOL = 5e-3;
    /**
     * EE at r = FWHM_eff against 15/16. scipy 1.10.1 quadrature of the exact Gaussian ⊛ box gives 15/16 +
     * 1.7e-6, so the profile's shape is not the issue; the measurement is. {@link PsfFigures}
     * spreads each pixel's flux evenly over 8 × 8 parts (a second pixel box in effect), −1.49e-3 at this
     * radius, and the curve, sampled every ½ px, is interpolated linearly, −0.77e-3 more: −2.26e-3 in all,
     * as measured, reproduced by {@code testdata/scripts/derive_ee_measurement_bias.py} (numpy 1.24.2).
     * 3e-3 is that plus a third (project target, no source).
     */
    static final double EE_AT_FWHM_ATOL = 3e-3;

    /** Significant digits constants.csv prints (the generator writes {@code %.12g}; reference README §3). */
    static final int CSV_DIGITS = 12;

    /**
     * One unit in the last printed digit of a value printed with {@code digits} significant digits: the
     * printed value is within half of it of the true one, so a correct computation is within one.
     *
     * @param v      the printed value
     * @param digits significant digits printed
     * @return the tolerance
     */
    static double lastDigit(double v, int digits) {
        return Math.pow(10, Math.floor(Math.log10(Math.abs(v))) - digits + 1);
    }

    static double constant(String name) {
        return RefCsv.num(RefCsv.row("constants.csv", "name", name), "value");
    }

    static List<Map<String, String>> astropy(String file) {
        String[] lines = new String(Reference.bundledBytes("psf/" + file), StandardCharsets.UTF_8).split("\r?\n");
        List<Map<String, String>> rows = new ArrayList<>();
        String[] header = null;
        for (String l : lines) {
            if (l.startsWith("#") || l.isBlank()) {
                continue;
            }
            String[] p = l.split(",");
            if (header == null) {
                header = p;
                continue;
            }
            Map<String, String> m = new java.util.HashMap<>();
            for (int i = 0; i < p.length; i++) {
                m.put(header[i], p[i]);
            }
            rows.add(m);
        }
        return rows;
    }

    @Test
    void gaussianFwhmOverSigma() {
        // 2√(2 ln 2) (any statistics handbook), constants.csv: 2.35482004503 (astropy gaussian_sigma_to_fwhm)
        double ratio = constant("gauss_fwhm_over_sigma");
        assertEquals(ratio, GaussianPsf.FWHM_PER_SIGMA, lastDigit(ratio, CSV_DIGITS));
        assertEquals(2.354820045, GaussianPsf.ofSigma(1).fwhmMajor(), lastDigit(2.354820045, 10), "10 digits");
        assertEquals(1.0, GaussianPsf.ofFwhm(2.354820045030949).sigmaMajor(), FORMULA_RTOL);
        double peak = constant("gauss2d_peak_unit_flux_sigma1");
        assertEquals(peak, GaussianPsf.ofSigma(1).value(0, 0), lastDigit(peak, CSV_DIGITS));
    }

    @ParameterizedTest(name = "beta {0}")
    @CsvSource({"2.5", "3.0", "4.765"})
    void moffatFwhmFromAlpha(String beta) {
        // FWHM = 2α√(2^(1/β) − 1) (Moffat 1969, A&A 3, 455; Trujillo et al. 2001, MNRAS 328, 977), α = 2
        double expected = constant("moffat_fwhm_alpha2_beta" + beta);
        MoffatPsf m = MoffatPsf.ofAlpha(2, Double.parseDouble(beta));
        assertEquals(expected, m.fwhmMajor(), lastDigit(expected, CSV_DIGITS), "FWHM (constants.csv, 12 digits)");
        assertEquals(2, m.alphaMajor(), FORMULA_RTOL * 2, "alpha round trip");
        double peak = constant("moffat_peak_unit_flux_alpha2_beta" + beta);
        assertEquals(peak, m.value(0, 0), lastDigit(peak, CSV_DIGITS), "peak (constants.csv, 12 digits)");
    }

    @Test
    void moffatMatchesAstropyMoffat2D() {
        for (Map<String, String> r : astropy("moffat2d_astropy.csv")) {
            double alpha = Double.parseDouble(r.get("core_width_alpha"));
            double beta = Double.parseDouble(r.get("beta"));
            MoffatPsf m = MoffatPsf.ofAlpha(alpha, beta);
            double x = Double.parseDouble(r.get("x"));
            double y = Double.parseDouble(r.get("y"));
            double v = Double.parseDouble(r.get("value"));
            // double-precision evaluation of the same closed form: 1e-12 relative (reference README §3)
            assertEquals(v, m.value(x, y), 1e-12 * v, "Moffat value at (" + x + ", " + y + ") α " + alpha + " β " + beta);
            assertEquals(v, m.evaluator().applyAsDouble(x, y), 1e-12 * v, "evaluator = value");
            double fwhm = Double.parseDouble(r.get("fwhm"));
            assertEquals(fwhm, m.fwhmMajor(), 1e-12 * fwhm, "astropy Moffat2D.fwhm");
        }
    }

    @Test
    void ellipticalGaussianMatchesAstropyGaussian2D() {
        for (Map<String, String> r : astropy("gaussian2d_astropy.csv")) {
            double sx = Double.parseDouble(r.get("x_stddev"));
            double sy = Double.parseDouble(r.get("y_stddev"));
            double deg = Double.parseDouble(r.get("theta_deg"));
            GaussianPsf g = new GaussianPsf(sx * GaussianPsf.FWHM_PER_SIGMA, sy * GaussianPsf.FWHM_PER_SIGMA, deg);
            double x = Double.parseDouble(r.get("x"));
            double y = Double.parseDouble(r.get("y"));
            double v = Double.parseDouble(r.get("value"));
            assertEquals(v, g.value(x, y), 1e-12 * v + 1e-300, "Gaussian2D at (" + x + ", " + y + ") θ " + deg);
            assertEquals(v, g.evaluator().applyAsDouble(x, y), 1e-12 * v + 1e-300, "evaluator = value");
            assertEquals(Double.parseDouble(r.get("x_fwhm")), g.fwhmMajor(), 1e-12 * g.fwhmMajor());
        }
    }

    /**
     * Unit integral by independent quadrature: Moffat EE within radius R is 1 − (1 + R²/α²)^(1−β)
     * (reference README §3, from Trujillo et al. 2001); Gaussian EE(r) = 1 − exp(−r²/2σ²) (closed form).
     * Polar composite Simpson in r and the trapezoid rule in angle (exact for trigonometric polynomials);
     * tolerances {@link #ROUND_QUADRATURE_ATOL} and {@link #ELLIPTICAL_QUADRATURE_ATOL} bound the Simpson
     * error term.
     */
    @ParameterizedTest(name = "{0}")
    @CsvSource({"moffat-2.5", "moffat-4.765", "moffat-ellip", "gauss-round", "gauss-ellip"})
    void encircledEnergyByQuadrature(String which) {
        AnalyticPsf m;
        double radius = 9;
        double expected;
        switch (which) {
            case "moffat-2.5" -> m = MoffatPsf.ofAlpha(2, 2.5);
            case "moffat-4.765" -> m = MoffatPsf.ofAlpha(2, 4.765);
            case "moffat-ellip" -> m = MoffatPsf.ofFwhmEllipticity(3, 0.3, 3, 25);
            case "gauss-round" -> m = GaussianPsf.ofSigma(2);
            default -> m = GaussianPsf.ofFwhmEllipticity(5, 0.4, -70);
        }
        if (m instanceof MoffatPsf mo && mo.ellipticity() == 0) {
            double a = mo.alphaMajor();
            expected = 1 - Math.pow(1 + radius * radius / (a * a), 1 - mo.beta());
        } else if (m instanceof GaussianPsf g && g.ellipticity() == 0) {
            expected = 1 - Math.exp(-radius * radius / (2 * g.sigmaMajor() * g.sigmaMajor()));
        } else {
            radius = 400; // elliptical: integrate far out; the remaining tail is below 1e-6 for these
            expected = 1;
        }
        double got = polarIntegral(m, radius);
        assertEquals(expected, got, which.contains("ellip") ? ELLIPTICAL_QUADRATURE_ATOL : ROUND_QUADRATURE_ATOL,
                which + " flux within r=" + radius);
    }

    static double polarIntegral(AnalyticPsf m, double radius) {
        int nr = 4000;
        int nt = 256;
        double h = radius / nr;
        double sum = 0;
        for (int i = 0; i <= nr; i++) {
            double r = i * h;
            double ring = 0;
            for (int k = 0; k < nt; k++) {
                double t = 2 * Math.PI * k / nt;
                ring += m.value(r * Math.cos(t), r * Math.sin(t));
            }
            ring *= 2 * Math.PI / nt * r;
            double w = (i == 0 || i == nr) ? 1 : (i % 2 == 1 ? 4 : 2);
            sum += w * ring;
        }
        return sum * h / 3;
    }

    /** FWHM measured on the rendered, point-sampled PSF within 1 % (reference README §3). */
    @ParameterizedTest(name = "{0}")
    @CsvSource({"gauss,1.0", "gauss,1.5", "gauss,3.0", "moffat2.5,3.0", "moffat4.765,2.5", "moffat4.765,6.0"})
    void measuredFwhmOnRenderedPsf(String family, double width) {
        AnalyticPsf m = switch (family) {
            case "gauss" -> GaussianPsf.ofSigma(width);
            case "moffat2.5" -> MoffatPsf.ofFwhm(width, 2.5);
            default -> MoffatPsf.ofFwhm(width, 4.765);
        };
        double expected = m instanceof GaussianPsf g ? g.fwhmMajor() : ((MoffatPsf) m).fwhmMajor();
        Image img = m.render(61, 1, 0, 0);
        PsfFigures f = PsfFigures.of(img);
        assertEquals(expected, f.fwhmPx(), MEASURED_FWHM_RTOL * expected, family + " FWHM measured");
        assertEquals(expected, f.fwhmMajorPx(), MEASURED_FWHM_RTOL * expected, family + " major FWHM");
        assertEquals(expected, f.fwhmMinorPx(), MEASURED_FWHM_RTOL * expected, family + " minor FWHM");
    }

    /** Elliptical Gaussian: major, minor FWHM and angle recovered from the rendered image, offset too. */
    @ParameterizedTest(name = "angle {0}")
    @CsvSource({"0", "30", "-65", "90", "120"})
    void measuredEllipse(double angle) {
        GaussianPsf g = new GaussianPsf(6, 3.5, angle);
        Image img = g.render(61, 1, 0.3, -0.2);
        PsfFigures f = PsfFigures.of(img);
        assertEquals(6, f.fwhmMajorPx(), MEASURED_FWHM_RTOL * 6, "major");
        assertEquals(3.5, f.fwhmMinorPx(), MEASURED_FWHM_RTOL * 3.5, "minor");
        // axes are undirected: compare modulo 180°. 1°: orientation from moments on an interpolated grid
        // (common practice, no source)
        double diff = Math.floorMod(Math.round((f.angleDeg() - angle) * 1e6), 180_000_000L) / 1e6;
        diff = diff > 90 ? diff - 180 : diff;
        assertEquals(0, diff, 1.0, "angle " + f.angleDeg() + " vs " + angle);
        assertEquals(30.3, f.centroidX(), CENTROID_ATOL, "centroid x follows dx");
        assertEquals(29.8, f.centroidY(), CENTROID_ATOL, "centroid y follows dy");
    }

    /**
     * Encircled energy of the rendered image: a Gaussian convolved with the 1-px box has variance σ² + 1/12
     * per axis (Sheppard 1898's correction; exact for the variance, close to Gaussian for σ = 3), so its
     * half-light radius is ≈ 1.17741·√(σ² + 1/12) (constants.csv gauss2d_half_light_radius_over_sigma).
     * Tolerances {@link #R50_RTOL} and {@link #EE_AT_FWHM_ATOL}.
     */
    @Test
    void encircledEnergyCurveOfRenderedGaussian() {
        double sigma = 3;
        Image img = GaussianPsf.ofSigma(sigma).render(61, 8, 0, 0);
        PsfFigures f = PsfFigures.of(img);
        double expected = constant("gauss2d_half_light_radius_over_sigma") * Math.sqrt(sigma * sigma + 1.0 / 12);
        assertEquals(expected, f.r50Px(), R50_RTOL * expected, "half-light radius");
        // EE(r = FWHM) = 15/16 for a Gaussian (constants.csv); with the box, at r = FWHM of σ_eff
        double fwhmEff = GaussianPsf.FWHM_PER_SIGMA * Math.sqrt(sigma * sigma + 1.0 / 12);
        double ee = interpolate(f.eeRadiusPx(), f.encircledEnergy(), fwhmEff);
        assertEquals(constant("gauss2d_EE_at_FWHM_radius"), ee, EE_AT_FWHM_ATOL, "EE at r = FWHM");
    }

    static double interpolate(double[] x, double[] y, double at) {
        for (int i = 1; i < x.length; i++) {
            if (x[i] >= at) {
                double t = (at - x[i - 1]) / (x[i] - x[i - 1]);
                return y[i - 1] + t * (y[i] - y[i - 1]);
            }
        }
        throw new AssertionError("radius " + at + " beyond the curve");
    }

    @Test
    void callerMistakesAreNamed() {
        assertThrows(IllegalArgumentException.class, () -> MoffatPsf.ofFwhm(3, 1.0), "beta 1");
        assertThrows(IllegalArgumentException.class, () -> GaussianPsf.ofFwhm(-1));
        assertThrows(IllegalArgumentException.class, () -> new GaussianPsf(2, 3, 0), "minor > major");
        assertThrows(IllegalArgumentException.class, () -> GaussianPsf.ofFwhmEllipticity(3, 1.0, 0));
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> GaussianPsf.ofFwhm(3).render(20, 1, 0, 0));
        assertEquals(true, e.getMessage().contains("odd"), e.getMessage());
        assertThrows(IllegalArgumentException.class, () -> GaussianPsf.ofFwhm(3).render(21, 0, 0, 0));
        assertThrows(IllegalArgumentException.class, () -> GaussianPsf.ofFwhm(3).render(21, 1, Double.NaN, 0));
    }
}
