package dev.nitid.stars.fit;

/**
 * The outcome of a {@link LevenbergMarquardt} fit.
 *
 * @param params      best-fit parameters
 * @param sigmas      standard errors, {@code sqrt(diag(C))} with C the covariance (NaN if singular)
 * @param covariance  row-major {@code p × p} covariance C (NaN-filled if JᵀWJ is singular)
 * @param chi2        weighted sum of squared residuals {@code Σ wᵢ (dᵢ − fᵢ)²} at {@code params}
 * @param dof         degrees of freedom: usable points minus parameters
 * @param iterations  trial steps taken (accepted and rejected)
 * @param converged   true if a convergence criterion was met
 * @param reason      why it stopped
 */
public record FitResult(double[] params, double[] sigmas, double[] covariance, double chi2, int dof,
                        int iterations, boolean converged, FitStopReason reason) {

    /** @return χ²/dof, or NaN when dof ≤ 0 */
    public double reducedChi2() {
        return dof > 0 ? chi2 / dof : Double.NaN;
    }

    /** @return covariance element {@code C[i][k]} */
    public double covariance(int i, int k) {
        return covariance[i * params.length + k];
    }
}
