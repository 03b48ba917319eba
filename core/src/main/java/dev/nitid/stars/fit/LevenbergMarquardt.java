package dev.nitid.stars.fit;

import java.util.Arrays;
import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.factory.LinearSolverFactory_DDRM;
import org.ejml.interfaces.linsol.LinearSolverDense;

/**
 * Weighted nonlinear least squares by the Levenberg–Marquardt method: minimises
 * {@code χ²(p) = Σᵢ wᵢ (dᵢ − fᵢ(p))²}.
 *
 * <p>Each step solves the damped normal equations
 * {@code (JᵀWJ + λ·diag(JᵀWJ)) δ = JᵀW(d − f)} (Levenberg 1944, Q. Appl. Math. 2, 164; Marquardt 1963,
 * J. SIAM 11, 431, eq. for the scaled damping; Press et al., Numerical Recipes 3rd ed. 2007, §15.5.2).
 * A step that lowers χ² is accepted and λ is divided by {@code lambdaDown}; otherwise λ is multiplied by
 * {@code lambdaUp} and the step is retried. The solve uses EJML's Cholesky decomposition.
 *
 * <p>Covariance: {@code C = (JᵀWJ)⁻¹} at the solution, multiplied by the reduced χ² {@code χ²/(n−p)}
 * unless {@link FitSettings.CovarianceScaling#ABSOLUTE} is chosen (Press et al. 2007, §15.5–15.6); the
 * standard errors are {@code sqrt(diag C)}.
 *
 * <p>Data points that are not finite, or whose weight is 0 or not finite, are ignored: a stamp with NaN
 * pixels can be fitted as it is. Stateless and thread-safe; each call allocates its own work arrays
 * (once per fit, not per step).
 */
public final class LevenbergMarquardt {

    /** Smallest diagonal of the damped matrix, relative to its largest (numerical safeguard). */
    private static final double DIAGONAL_FLOOR = 1e-15;

    private LevenbergMarquardt() {
    }

    /**
     * Fits a model with default settings; see {@link #fit(Model, double[], double[], double[], FitSettings)}.
     *
     * @param model the model
     * @param start starting parameters (input, not modified)
     * @param data  observed values, NaN = ignore (input, not modified)
     * @return the fit
     */
    public static FitResult fit(Model model, double[] start, double[] data) {
        return fit(model, start, data, null, FitSettings.defaults());
    }

    /**
     * Fits a model to data.
     *
     * @param model    the model
     * @param start    starting parameters, length {@code model.parameterCount()} (input, not modified)
     * @param data     observed values, length {@code model.pointCount()}; non-finite values are ignored
     *                 (input, not modified)
     * @param weights  weights {@code wᵢ} (usually 1/σᵢ²), same length as data, or {@code null} for all 1;
     *                 points with weight 0 are ignored (input, not modified)
     * @param settings damping and stopping rules
     * @return parameters, standard errors, χ², steps and why it stopped
     * @throws IllegalArgumentException if a length does not match the model or a weight is negative
     */
    public static FitResult fit(Model model, double[] start, double[] data, double[] weights, FitSettings settings) {
        final int p = model.parameterCount();
        final int n = model.pointCount();
        if (p < 1 || n < 1) {
            throw new IllegalArgumentException("model has " + p + " parameters and " + n
                    + " points: both must be at least 1");
        }
        if (start.length != p) {
            throw new IllegalArgumentException("start has " + start.length + " values but the model has " + p
                    + " parameters: pass one start value per parameter");
        }
        if (data.length != n) {
            throw new IllegalArgumentException("data has " + data.length + " values but the model has " + n
                    + " points: pass one value per model point");
        }
        if (weights != null && weights.length != n) {
            throw new IllegalArgumentException("weights has " + weights.length + " values but data has " + n
                    + ": pass one weight per point or null");
        }
        if (settings == null) {
            throw new IllegalArgumentException("settings is null: use FitSettings.defaults()");
        }
        double[] w = new double[n];
        int used = 0;
        for (int i = 0; i < n; i++) {
            double wi = weights == null ? 1.0 : weights[i];
            if (wi < 0) {
                throw new IllegalArgumentException("weight " + i + " is " + wi + ": weights must be ≥ 0 (use 0 to ignore a point)");
            }
            if (Double.isFinite(data[i]) && Double.isFinite(wi) && wi > 0) {
                w[i] = wi;
                used++;
            }
        }
        double[] x = start.clone();
        double[] nanSigmas = new double[p];
        Arrays.fill(nanSigmas, Double.NaN);
        double[] nanCov = new double[p * p];
        Arrays.fill(nanCov, Double.NaN);
        if (used < p) {
            return new FitResult(x, nanSigmas, nanCov, Double.NaN, used - p, 0, false, FitStopReason.TOO_FEW_POINTS);
        }

        double[] f = new double[n];
        double[] jac = new double[n * p];
        double[] fTrial = new double[n];
        double[] jacTrial = new double[n * p];
        double[] xTrial = new double[p];
        DMatrixRMaj alpha = new DMatrixRMaj(p, p);
        DMatrixRMaj damped = new DMatrixRMaj(p, p);
        DMatrixRMaj beta = new DMatrixRMaj(p, 1);
        DMatrixRMaj delta = new DMatrixRMaj(p, 1);
        LinearSolverDense<DMatrixRMaj> solver = LinearSolverFactory_DDRM.symmPosDef(p);

        if (!model.isValid(x)) {
            return new FitResult(x, nanSigmas, nanCov, Double.NaN, used - p, 0, false, FitStopReason.INVALID_START);
        }
        model.evaluate(x, f, jac);
        double chi2 = chi2(data, f, w);
        if (!Double.isFinite(chi2)) {
            return new FitResult(x, nanSigmas, nanCov, chi2, used - p, 0, false, FitStopReason.INVALID_START);
        }
        double lambda = settings.initialLambda();
        int iterations = 0;
        FitStopReason reason = FitStopReason.MAX_ITERATIONS;
        boolean needNormal = true;
        outer:
        while (iterations < settings.maxIterations()) {
            if (chi2 == 0) {
                reason = FitStopReason.EXACT_FIT;
                break;
            }
            if (needNormal) {
                normalEquations(data, f, jac, w, p, alpha, beta);
                needNormal = false;
            }
            iterations++;
            damped.setTo(alpha);
            double maxDiag = 0;
            for (int k = 0; k < p; k++) {
                maxDiag = Math.max(maxDiag, alpha.get(k, k));
            }
            for (int k = 0; k < p; k++) {
                // A parameter the data barely constrain has a (near) zero diagonal; a small floor keeps
                // the damped system positive definite so the other parameters can still move.
                double d = Math.max(alpha.get(k, k), DIAGONAL_FLOOR * maxDiag);
                damped.set(k, k, d * (1 + lambda));
            }
            boolean stepOk = solver.setA(damped);
            if (stepOk) {
                solver.solve(beta, delta);
                for (int k = 0; k < p; k++) {
                    xTrial[k] = x[k] + delta.get(k);
                }
                stepOk = model.isValid(xTrial);
            }
            double chi2Trial = Double.NaN;
            if (stepOk) {
                model.evaluate(xTrial, fTrial, jacTrial);
                chi2Trial = chi2(data, fTrial, w);
                stepOk = Double.isFinite(chi2Trial) && chi2Trial <= chi2;
            }
            if (!stepOk) {
                lambda *= settings.lambdaUp();
                if (lambda > settings.maxLambda()) {
                    reason = FitStopReason.LAMBDA_LIMIT;
                    break;
                }
                continue;
            }
            boolean smallStep = true;
            for (int k = 0; k < p; k++) {
                if (Math.abs(delta.get(k)) > settings.stepTolerance() * (Math.abs(x[k]) + settings.stepTolerance())) {
                    smallStep = false;
                    break;
                }
            }
            double decrease = chi2 - chi2Trial;
            System.arraycopy(xTrial, 0, x, 0, p);
            double[] t = f;
            f = fTrial;
            fTrial = t;
            t = jac;
            jac = jacTrial;
            jacTrial = t;
            chi2 = chi2Trial;
            needNormal = true;
            lambda = Math.max(lambda / settings.lambdaDown(), 1e-300);
            if (decrease <= settings.chi2Tolerance() * chi2) {
                reason = FitStopReason.CHI2_CONVERGED;
                break outer;
            }
            if (smallStep) {
                reason = FitStopReason.STEP_CONVERGED;
                break outer;
            }
        }
        normalEquations(data, f, jac, w, p, alpha, beta);
        boolean converged = reason == FitStopReason.CHI2_CONVERGED || reason == FitStopReason.STEP_CONVERGED
                || reason == FitStopReason.EXACT_FIT;
        if (reason == FitStopReason.LAMBDA_LIMIT) {
            // No downhill step exists at any damping: a minimum if the gradient JᵀW r is negligible
            // against the curvature (scale-free test: δ-Newton step tiny relative to the parameters).
            converged = newtonStepNegligible(alpha, beta, x, settings, solver);
        }
        int dof = used - p;
        double[] cov = nanCov.clone();
        double[] sig = nanSigmas.clone();
        DMatrixRMaj inv = new DMatrixRMaj(p, p);
        if (solver.setA(alpha.copy())) {
            solver.invert(inv);
            double scale = 1.0;
            if (settings.covariance() == FitSettings.CovarianceScaling.REDUCED_CHI2) {
                scale = dof > 0 ? chi2 / dof : Double.NaN;
            }
            for (int i = 0; i < p * p; i++) {
                cov[i] = inv.data[i] * scale;
            }
            for (int k = 0; k < p; k++) {
                sig[k] = Math.sqrt(cov[k * p + k]);
            }
        }
        return new FitResult(x, sig, cov, chi2, dof, iterations, converged, reason);
    }

    private static boolean newtonStepNegligible(DMatrixRMaj alpha, DMatrixRMaj beta, double[] x,
                                                FitSettings settings, LinearSolverDense<DMatrixRMaj> solver) {
        if (!solver.setA(alpha.copy())) {
            return false;
        }
        DMatrixRMaj step = new DMatrixRMaj(x.length, 1);
        solver.solve(beta, step);
        double tol = Math.max(settings.stepTolerance(), 1e-8);
        for (int k = 0; k < x.length; k++) {
            if (!(Math.abs(step.get(k)) <= tol * (Math.abs(x[k]) + tol))) {
                return false;
            }
        }
        return true;
    }

    private static double chi2(double[] data, double[] f, double[] w) {
        double s = 0;
        for (int i = 0; i < data.length; i++) {
            if (w[i] > 0) {
                double r = data[i] - f[i];
                s += w[i] * r * r;
            }
        }
        return s;
    }

    /** alpha = JᵀWJ (p × p, symmetric), beta = JᵀW(d − f). */
    private static void normalEquations(double[] data, double[] f, double[] jac, double[] w, int p,
                                        DMatrixRMaj alpha, DMatrixRMaj beta) {
        double[] a = alpha.data;
        double[] b = beta.data;
        Arrays.fill(a, 0);
        Arrays.fill(b, 0);
        for (int i = 0; i < data.length; i++) {
            double wi = w[i];
            if (wi == 0) {
                continue;
            }
            double r = wi * (data[i] - f[i]);
            int row = i * p;
            for (int k = 0; k < p; k++) {
                double jk = jac[row + k];
                if (jk == 0) {
                    continue;
                }
                b[k] += jk * r;
                double wjk = wi * jk;
                for (int m = 0; m <= k; m++) {
                    a[k * p + m] += wjk * jac[row + m];
                }
            }
        }
        for (int k = 0; k < p; k++) {
            for (int m = 0; m < k; m++) {
                a[m * p + k] = a[k * p + m];
            }
        }
    }
}
