package dev.nitid.stars.internal;

import dev.nitid.stars.fit.Model;

/**
 * Elliptical 2-D Gaussian or Moffat profile plus a constant, over a {@code w × h} stamp, as a
 * least-squares {@link Model}.
 *
 * <p>The ellipse is the quadratic form {@code Q = a·dx² + 2b·dx·dy + c·dy²} with {@code dx = x − x0},
 * {@code dy = y − y0}; this parametrisation has no degeneracy for round stars (unlike major/minor/angle).
 * <ul>
 *   <li>Gaussian, parameters {@code [A, x0, y0, a, b, c, B]}: {@code f = A·exp(−Q/2) + B}.</li>
 *   <li>Moffat (Moffat 1969, A&amp;A 3, 455), parameters {@code [A, x0, y0, a, b, c, β, B]}:
 *       {@code f = A·(1 + Q)^(−β) + B}; for a round star {@code a = c = 1/α²}.</li>
 * </ul>
 * Pixel {@code (i, j)} has its centre at {@code x = i, y = j}. With point sampling the model is evaluated
 * at the centre; with integration it is averaged over the pixel square by 2×2-point Gauss–Legendre
 * quadrature (nodes ±1/(2√3), equal weights; Abramowitz &amp; Stegun 1964, 25.4.29 and Table 25.4), exact
 * for cubic polynomials. For a Gaussian its largest error is 0.26 % of the peak at a FWHM of 2 px, 0.11 % at
 * 2.5 px and 0.05 % at 3 px (compared with the exact erf integral, scipy 1.10.1).
 * Not thread-safe (scratch state); one instance per fit.
 */
public final class EllipticalProfileModel implements Model {
    /** Gauss–Legendre 2-point nodes on [−1/2, 1/2]. */
    private static final double[] NODES = {-0.5 / Math.sqrt(3), 0.5 / Math.sqrt(3)};
    /** Gauss–Legendre 2-point weights on [−1/2, 1/2], summing to 1. */
    private static final double[] WEIGHTS = {0.5, 0.5};
    /** Smallest β allowed: below 1 a Moffat profile has infinite flux. */
    public static final double MIN_BETA = 1.0 + 1e-6;
    /** Largest β allowed: beyond it the Moffat is a Gaussian to working precision. */
    public static final double MAX_BETA = 100;

    private final boolean moffat;
    private final boolean integrated;
    private final int width;
    private final int height;
    private final double[] grad;
    /** Scratch: {@code (i + NODES[s]) − x0} for every column i and node s, filled once per evaluation. */
    private final double[] dxs;
    /** Scratch: {@code (j + NODES[s]) − y0} for every row j and node s. */
    private final double[] dys;

    /**
     * @param moffat     true for Moffat, false for Gaussian
     * @param integrated true to integrate over each pixel, false to sample its centre
     * @param width      stamp width
     * @param height     stamp height
     */
    public EllipticalProfileModel(boolean moffat, boolean integrated, int width, int height) {
        this.moffat = moffat;
        this.integrated = integrated;
        this.width = width;
        this.height = height;
        this.grad = new double[8];
        this.dxs = new double[NODES.length * width];
        this.dys = new double[NODES.length * height];
    }

    @Override
    public int parameterCount() {
        return moffat ? 8 : 7;
    }

    @Override
    public int pointCount() {
        return width * height;
    }

    @Override
    public boolean isValid(double[] q) {
        for (double v : q) {
            if (!Double.isFinite(v)) {
                return false;
            }
        }
        double a = q[3];
        double b = q[4];
        double c = q[5];
        if (!(a > 0 && c > 0 && a * c - b * b > 0)) {
            return false;
        }
        // Keep the centre within one stamp size of the stamp: beyond that the fit has lost the star.
        if (q[1] < -width || q[1] > 2 * width || q[2] < -height || q[2] > 2 * height) {
            return false;
        }
        return !moffat || (q[6] >= MIN_BETA && q[6] <= MAX_BETA);
    }

    @Override
    public void evaluate(double[] q, double[] values, double[] jacobian) {
        if (integrated && jacobian != null) {
            if (moffat) {
                integratedMoffat(q, values, jacobian);
            } else {
                integratedGaussian(q, values, jacobian);
            }
            return;
        }
        final int p = parameterCount();
        for (int j = 0; j < height; j++) {
            for (int i = 0; i < width; i++) {
                int idx = j * width + i;
                double v;
                if (!integrated) {
                    v = point(q, i, j, jacobian != null);
                    if (jacobian != null) {
                        System.arraycopy(grad, 0, jacobian, idx * p, p);
                    }
                } else {
                    // Values only (the Jacobian case is one of the kernels above).
                    v = 0;
                    for (int sj = 0; sj < NODES.length; sj++) {
                        for (int si = 0; si < NODES.length; si++) {
                            v += WEIGHTS[si] * WEIGHTS[sj] * point(q, i + NODES[si], j + NODES[sj], false);
                        }
                    }
                }
                values[idx] = v;
            }
        }
    }

    private void offsets(double[] q) {
        for (int i = 0; i < width; i++) {
            for (int si = 0; si < NODES.length; si++) {
                dxs[i * NODES.length + si] = (i + NODES[si]) - q[1];
            }
        }
        for (int j = 0; j < height; j++) {
            for (int sj = 0; sj < NODES.length; sj++) {
                dys[j * NODES.length + sj] = (j + NODES[sj]) - q[2];
            }
        }
    }

    /*
     * The two kernels below are point() unrolled over the 2×2 quadrature with the sums in registers: the same
     * operations in the same order (so the same bits), without the per-point gradient array. They are most of
     * the time of a star measurement.
     */

    private void integratedGaussian(double[] q, double[] values, double[] jacobian) {
        offsets(q);
        final double amp = q[0];
        final double a = q[3];
        final double b = q[4];
        final double c = q[5];
        final double back = q[6];
        final int n = NODES.length;
        for (int j = 0; j < height; j++) {
            for (int i = 0; i < width; i++) {
                double v = 0;
                double j0 = 0;
                double j1 = 0;
                double j2 = 0;
                double j3 = 0;
                double j4 = 0;
                double j5 = 0;
                double j6 = 0;
                for (int sj = 0; sj < n; sj++) {
                    double dy = dys[j * n + sj];
                    for (int si = 0; si < n; si++) {
                        double wgt = WEIGHTS[si] * WEIGHTS[sj];
                        double dx = dxs[i * n + si];
                        double quad = a * dx * dx + 2 * b * dx * dy + c * dy * dy;
                        double e = Math.exp(-0.5 * quad);
                        double ae = amp * e;
                        v += wgt * (ae + back);
                        j0 += wgt * e;
                        j1 += wgt * (ae * (a * dx + b * dy));
                        j2 += wgt * (ae * (b * dx + c * dy));
                        j3 += wgt * (-0.5 * ae * dx * dx);
                        j4 += wgt * (-ae * dx * dy);
                        j5 += wgt * (-0.5 * ae * dy * dy);
                        j6 += wgt * 1;
                    }
                }
                int idx = j * width + i;
                int row = idx * 7;
                jacobian[row] = j0;
                jacobian[row + 1] = j1;
                jacobian[row + 2] = j2;
                jacobian[row + 3] = j3;
                jacobian[row + 4] = j4;
                jacobian[row + 5] = j5;
                jacobian[row + 6] = j6;
                values[idx] = v;
            }
        }
    }

    private void integratedMoffat(double[] q, double[] values, double[] jacobian) {
        offsets(q);
        final double amp = q[0];
        final double a = q[3];
        final double b = q[4];
        final double c = q[5];
        final double beta = q[6];
        final double back = q[7];
        final int n = NODES.length;
        for (int j = 0; j < height; j++) {
            for (int i = 0; i < width; i++) {
                double v = 0;
                double j0 = 0;
                double j1 = 0;
                double j2 = 0;
                double j3 = 0;
                double j4 = 0;
                double j5 = 0;
                double j6 = 0;
                double j7 = 0;
                for (int sj = 0; sj < n; sj++) {
                    double dy = dys[j * n + sj];
                    for (int si = 0; si < n; si++) {
                        double wgt = WEIGHTS[si] * WEIGHTS[sj];
                        double dx = dxs[i * n + si];
                        double quad = a * dx * dx + 2 * b * dx * dy + c * dy * dy;
                        double u = 1 + quad;
                        double lu = Math.log(u);
                        double m = Math.exp(-beta * lu);
                        double am = amp * m;
                        double dq = -beta * am / u;
                        v += wgt * (am + back);
                        j0 += wgt * m;
                        j1 += wgt * (-2 * dq * (a * dx + b * dy));
                        j2 += wgt * (-2 * dq * (b * dx + c * dy));
                        j3 += wgt * (dq * dx * dx);
                        j4 += wgt * (2 * dq * dx * dy);
                        j5 += wgt * (dq * dy * dy);
                        j6 += wgt * (-am * lu);
                        j7 += wgt * 1;
                    }
                }
                int idx = j * width + i;
                int row = idx * 8;
                jacobian[row] = j0;
                jacobian[row + 1] = j1;
                jacobian[row + 2] = j2;
                jacobian[row + 3] = j3;
                jacobian[row + 4] = j4;
                jacobian[row + 5] = j5;
                jacobian[row + 6] = j6;
                jacobian[row + 7] = j7;
                values[idx] = v;
            }
        }
    }

    /** Value at (x, y); fills {@link #grad} with ∂f/∂q when asked. */
    private double point(double[] q, double x, double y, boolean wantGrad) {
        double amp = q[0];
        double dx = x - q[1];
        double dy = y - q[2];
        double a = q[3];
        double b = q[4];
        double c = q[5];
        double quad = a * dx * dx + 2 * b * dx * dy + c * dy * dy;
        if (!moffat) {
            double e = Math.exp(-0.5 * quad);
            double ae = amp * e;
            if (wantGrad) {
                grad[0] = e;
                grad[1] = ae * (a * dx + b * dy);
                grad[2] = ae * (b * dx + c * dy);
                grad[3] = -0.5 * ae * dx * dx;
                grad[4] = -ae * dx * dy;
                grad[5] = -0.5 * ae * dy * dy;
                grad[6] = 1;
            }
            return ae + q[6];
        }
        double beta = q[6];
        double u = 1 + quad;
        double lu = Math.log(u);
        double m = Math.exp(-beta * lu);
        double am = amp * m;
        if (wantGrad) {
            double dq = -beta * am / u;
            grad[0] = m;
            grad[1] = -2 * dq * (a * dx + b * dy);
            grad[2] = -2 * dq * (b * dx + c * dy);
            grad[3] = dq * dx * dx;
            grad[4] = 2 * dq * dx * dy;
            grad[5] = dq * dy * dy;
            grad[6] = -am * lu;
            grad[7] = 1;
        }
        return am + q[7];
    }
}
