package dev.nitid.psf.internal;

/**
 * Evaluates Noll's Zernike polynomials 4–11 (Noll 1976, JOSA 66, 207, Table 1; unit RMS over the unit
 * circle) from Cartesian pupil coordinates, without trigonometric calls.
 */
public final class ZernikeKernel {
    private static final double SQRT3 = Math.sqrt(3);
    private static final double SQRT5 = Math.sqrt(5);
    private static final double SQRT6 = Math.sqrt(6);
    private static final double SQRT8 = Math.sqrt(8);

    private ZernikeKernel() {
    }

    /**
     * {@code Σ c_j Z_j(x, y)} for j = 4..11.
     *
     * @param c coefficients for Noll 4..11, 8 values (input, not modified)
     * @param x pupil x over the pupil radius
     * @param y pupil y over the pupil radius
     * @return the wavefront in the units of {@code c}
     */
    public static double wavefront(double[] c, double x, double y) {
        double r2 = x * x + y * y;
        double w = c[0] * SQRT3 * (2 * r2 - 1);
        // ρ² sin 2θ = 2xy, ρ² cos 2θ = x² − y²
        w += c[1] * SQRT6 * (2 * x * y);
        w += c[2] * SQRT6 * (x * x - y * y);
        // (3ρ³ − 2ρ) sin θ = (3ρ² − 2)·y, and cos θ → x
        double comaRadial = 3 * r2 - 2;
        w += c[3] * SQRT8 * comaRadial * y;
        w += c[4] * SQRT8 * comaRadial * x;
        // ρ³ sin 3θ = 3x²y − y³, ρ³ cos 3θ = x³ − 3xy²
        w += c[5] * SQRT8 * (3 * x * x * y - y * y * y);
        w += c[6] * SQRT8 * (x * x * x - 3 * x * y * y);
        w += c[7] * SQRT5 * (6 * r2 * r2 - 6 * r2 + 1);
        return w;
    }
}
