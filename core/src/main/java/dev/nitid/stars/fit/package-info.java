/**
 * General nonlinear least squares: {@link dev.nitid.stars.fit.LevenbergMarquardt} fits any
 * {@link dev.nitid.stars.fit.Model} that supplies its values and analytic Jacobian, and reports the
 * parameters with their standard errors from the covariance (JᵀWJ)⁻¹.
 *
 * <p>The normal equations are solved with EJML's Cholesky solver; this package adds only the damping
 * loop, the stopping rules and the covariance scaling.
 */
package dev.nitid.stars.fit;
