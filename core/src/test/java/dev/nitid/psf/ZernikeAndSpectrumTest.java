package dev.nitid.psf;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import java.util.Map;
import org.junit.jupiter.api.Test;

/** Noll's Zernike normalisation and ordering, and the band sampling convention. */
class ZernikeAndSpectrumTest {
    /**
     * Midpoint-rule bound for the orthonormality sums. In θ the 256-point midpoint rule is exact for
     * trigonometric polynomials of degree below 256. In u = ρ² the products Z_j·Z_k (j, k ≤ 11, radial
     * degree ≤ 4) are polynomials of degree ≤ 4 in u, and the midpoint rule with h = 1/400 errs by
     * (h²/24)·[f′(1) − f′(0)] + O(h⁴) (Davis &amp; Rabinowitz, Methods of Numerical Integration, midpoint
     * rule, from memory). The largest case, Z11² = 5(6u² − 6u + 1)², has f′(1) − f′(0) = 120: 3.1e-5, as
     * measured. 5e-5 leaves the O(h⁴) term and rounding. (Was 1e-4.)
     */
    static final double ORTHONORMALITY_ATOL = 5e-5;
    /**
     * Closed forms evaluated in double (Zernike values ≤ 3, wavelengths and band edges ≤ 600 nm): a few ulps
     * (ulp(600) = 1.1e-13), so 1e-12 absolute, the reference README §7 tolerance for closed forms. (The band
     * edges were checked to 1e-9 nm.)
     */
    static final double CLOSED_FORM_ATOL = 1e-12;
    /** A weight of 0.2 from normalising five equal weights: a few ulps (ulp(0.2) = 2.8e-17), 1e-15. */
    static final double WEIGHT_ATOL = 1e-15;

    /**
     * Orthonormality over the unit circle with weight 1/π (Noll 1976, JOSA 66, 207, eq. 4): the mean of
     * Z_j·Z_k over the disk is δ_jk. Quadrature: midpoint rule in u = ρ² (uniform area) and θ at 400 × 256
     * points; tolerance {@link #ORTHONORMALITY_ATOL}.
     */
    @Test
    void nollPolynomialsAreOrthonormal() {
        int nu = 400;
        int nt = 256;
        for (int j = Zernike.FIRST; j <= Zernike.LAST; j++) {
            for (int k = j; k <= Zernike.LAST; k++) {
                Zernike zj = Zernike.single(j, 1);
                Zernike zk = Zernike.single(k, 1);
                double sum = 0;
                for (int a = 0; a < nu; a++) {
                    double rho = Math.sqrt((a + 0.5) / nu);
                    for (int b = 0; b < nt; b++) {
                        double t = 2 * Math.PI * (b + 0.5) / nt;
                        double x = rho * Math.cos(t);
                        double y = rho * Math.sin(t);
                        sum += zj.wavefront(x, y) * zk.wavefront(x, y);
                    }
                }
                double mean = sum / (nu * nt);
                assertEquals(j == k ? 1 : 0, mean, ORTHONORMALITY_ATOL, "<Z" + j + " Z" + k + ">");
            }
        }
    }

    /** Values from Noll 1976, Table 1 (which term is sin and which cos follows his even/odd rule). */
    @Test
    void nollTableValues() {
        double s3 = Math.sqrt(3);
        double s5 = Math.sqrt(5);
        double s6 = Math.sqrt(6);
        double s8 = Math.sqrt(8);
        assertEquals(s3, Zernike.single(4, 1).wavefront(1, 0), CLOSED_FORM_ATOL, "Z4 = √3(2ρ²−1) at the rim");
        assertEquals(-s3, Zernike.single(4, 1).wavefront(0, 0), CLOSED_FORM_ATOL, "Z4 at the centre");
        assertEquals(s6, Zernike.single(5, 1).wavefront(Math.sqrt(0.5), Math.sqrt(0.5)), CLOSED_FORM_ATOL,
                "Z5 = √6ρ² sin2θ at 45°");
        assertEquals(s6, Zernike.single(6, 1).wavefront(1, 0), CLOSED_FORM_ATOL, "Z6 = √6ρ² cos2θ at 0°");
        assertEquals(s8, Zernike.single(7, 1).wavefront(0, 1), CLOSED_FORM_ATOL, "Z7 = √8(3ρ³−2ρ) sinθ at 90°");
        assertEquals(s8, Zernike.single(8, 1).wavefront(1, 0), CLOSED_FORM_ATOL, "Z8 = √8(3ρ³−2ρ) cosθ at 0°");
        assertEquals(s8, Zernike.single(9, 1).wavefront(Math.cos(Math.PI / 6), Math.sin(Math.PI / 6)), CLOSED_FORM_ATOL,
                "Z9 = √8ρ³ sin3θ at 30°");
        assertEquals(s8, Zernike.single(10, 1).wavefront(1, 0), CLOSED_FORM_ATOL, "Z10 = √8ρ³ cos3θ at 0°");
        assertEquals(s5, Zernike.single(11, 1).wavefront(0, 0), CLOSED_FORM_ATOL, "Z11 = √5(6ρ⁴−6ρ²+1) at the centre");
        assertEquals(0.5, Zernike.of(Map.of(4, 0.3, 6, 0.4)).rmsWaves(), CLOSED_FORM_ATOL, "RMS adds in quadrature");
        assertThrows(IllegalArgumentException.class, () -> Zernike.single(3, 0.1), "tilt is not a PSF aberration");
        assertThrows(IllegalArgumentException.class, () -> Zernike.single(12, 0.1));
    }

    @Test
    void bandSampling() {
        Spectrum s = Spectrum.band(500, 600);
        assertEquals(5, s.size(), "100 nm at one per 20 nm, at least 5");
        assertEquals(510, s.wavelength(0), CLOSED_FORM_ATOL, "bin centres");
        assertEquals(590, s.wavelength(4), CLOSED_FORM_ATOL);
        assertEquals(500, s.edgesNm()[0], CLOSED_FORM_ATOL);
        assertEquals(600, s.edgesNm()[1], CLOSED_FORM_ATOL);
        assertEquals(550, s.centreNm(), CLOSED_FORM_ATOL);
        assertEquals(0.2, s.weight(2), WEIGHT_ATOL, "equal photon weights");
        assertEquals(15, Spectrum.band(400, 700).size());
        assertThrows(IllegalArgumentException.class, () -> Spectrum.band(600, 500));
        assertThrows(IllegalArgumentException.class, () -> Spectrum.band(500, 600, 4), "at least 5 wavelengths");
        Spectrum mono = Spectrum.monochromatic(656.3);
        assertEquals(656.3, mono.edgesNm()[0], 0);
    }
}
