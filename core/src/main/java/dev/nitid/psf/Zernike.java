package dev.nitid.psf;

import dev.nitid.psf.internal.ZernikeKernel;
import java.util.Arrays;
import java.util.Map;
import java.util.TreeMap;

/**
 * Low-order wavefront aberrations as Zernike coefficients in Noll's order and normalisation
 * (Noll 1976, "Zernike polynomials and atmospheric turbulence", JOSA 66, 207, Table 1): each polynomial
 * has unit RMS over the unit circle, so a coefficient is the RMS wavefront error it contributes, in waves
 * (at the reference wavelength; see {@link PupilPsf}). Indices 4–11:
 * <pre>
 *  4 defocus           √3 (2ρ² − 1)
 *  5 astigmatism (sin) √6 ρ² sin 2θ          6 astigmatism (cos) √6 ρ² cos 2θ
 *  7 coma (sin)        √8 (3ρ³ − 2ρ) sin θ   8 coma (cos)        √8 (3ρ³ − 2ρ) cos θ
 *  9 trefoil (sin)     √8 ρ³ sin 3θ          10 trefoil (cos)    √8 ρ³ cos 3θ
 * 11 spherical         √5 (6ρ⁴ − 6ρ² + 1)
 * </pre>
 * θ is measured from +x towards +y on the pupil. The normalisation is over the full, unobstructed circle.
 */
public final class Zernike {
    /** First Noll index accepted (piston and tilts are not aberrations of the PSF's shape). */
    public static final int FIRST = 4;
    /** Last Noll index accepted. */
    public static final int LAST = 11;

    private static final Zernike NONE = new Zernike(new double[LAST - FIRST + 1]);

    private final double[] c;

    private Zernike(double[] c) {
        this.c = c;
    }

    /** @return no aberration */
    public static Zernike none() {
        return NONE;
    }

    /**
     * Coefficients by Noll index.
     *
     * @param byNoll Noll index (4–11) → waves RMS (input, not modified)
     * @return the aberrations
     * @throws IllegalArgumentException for an index outside 4–11 or a non-finite coefficient
     */
    public static Zernike of(Map<Integer, Double> byNoll) {
        double[] c = new double[LAST - FIRST + 1];
        for (Map.Entry<Integer, Double> e : byNoll.entrySet()) {
            int j = e.getKey();
            if (j < FIRST || j > LAST) {
                throw new IllegalArgumentException("Zernike index " + j + " is not supported: use Noll indices "
                        + FIRST + "-" + LAST + " (4 defocus, 5-6 astigmatism, 7-8 coma, 9-10 trefoil, 11 spherical)");
            }
            double v = e.getValue();
            if (!Double.isFinite(v) || Math.abs(v) > 10) {
                throw new IllegalArgumentException("Zernike coefficient " + j + "=" + v
                        + " waves RMS is not a finite value within ±10 waves");
            }
            c[j - FIRST] = v;
        }
        return new Zernike(c);
    }

    /** @return a single term, e.g. {@code Zernike.single(4, 0.05)} for 0.05 waves RMS of defocus */
    public static Zernike single(int noll, double wavesRms) {
        return of(Map.of(noll, wavesRms));
    }

    /** @return the coefficient of Noll index {@code j} (4–11), waves RMS */
    public double coefficient(int j) {
        if (j < FIRST || j > LAST) {
            throw new IllegalArgumentException("Zernike index " + j + " outside " + FIRST + "-" + LAST);
        }
        return c[j - FIRST];
    }

    /** @return the non-zero coefficients by Noll index */
    public Map<Integer, Double> nonZero() {
        Map<Integer, Double> m = new TreeMap<>();
        for (int i = 0; i < c.length; i++) {
            if (c[i] != 0) {
                m.put(i + FIRST, c[i]);
            }
        }
        return m;
    }

    /** @return true if every coefficient is zero */
    public boolean isNone() {
        for (double v : c) {
            if (v != 0) {
                return false;
            }
        }
        return true;
    }

    /**
     * Total RMS wavefront error over the unit circle: the root-sum-square of the coefficients, because
     * Noll's polynomials are orthonormal there.
     *
     * @return waves RMS
     */
    public double rmsWaves() {
        double s = 0;
        for (double v : c) {
            s += v * v;
        }
        return Math.sqrt(s);
    }

    /**
     * The wavefront at a pupil point, in waves: {@code Σ c_j Z_j(ρ, θ)}.
     *
     * @param x pupil x over the pupil radius
     * @param y pupil y over the pupil radius
     * @return wavefront error in waves
     */
    public double wavefront(double x, double y) {
        return ZernikeKernel.wavefront(c, x, y);
    }

    /** @return the coefficients for Noll 4..11 (a copy) */
    public double[] toArray() {
        return c.clone();
    }

    @Override
    public boolean equals(Object o) {
        return o instanceof Zernike z && Arrays.equals(c, z.c);
    }

    @Override
    public int hashCode() {
        return Arrays.hashCode(c);
    }

    @Override
    public String toString() {
        StringBuilder sb = new StringBuilder();
        for (Map.Entry<Integer, Double> e : nonZero().entrySet()) {
            if (sb.length() > 0) {
                sb.append(',');
            }
            sb.append(e.getKey()).append('=').append(e.getValue());
        }
        return sb.length() == 0 ? "none" : sb.toString();
    }
}
