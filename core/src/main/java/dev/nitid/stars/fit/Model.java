package dev.nitid.stars.fit;

/**
 * A model {@code f(p)} of {@link #pointCount()} data points with {@link #parameterCount()} parameters,
 * fitted by {@link LevenbergMarquardt}.
 *
 * <p>Implementations give values and the analytic Jacobian {@code J[i][k] = ∂f_i/∂p_k}. They may keep
 * scratch state, so one instance must not be used by two fits at the same time.
 */
public interface Model {

    /** @return number of parameters {@code p}, ≥ 1 */
    int parameterCount();

    /** @return number of data points {@code n}, ≥ 1 */
    int pointCount();

    /**
     * Evaluates the model.
     *
     * @param params   parameters, length {@link #parameterCount()} (input, not modified)
     * @param values   model values {@code f_i(p)}, length {@link #pointCount()} (output, modified)
     * @param jacobian row-major {@code n × p} Jacobian, {@code jacobian[i*p + k] = ∂f_i/∂p_k}
     *                 (output, modified); {@code null} when only values are needed
     */
    void evaluate(double[] params, double[] values, double[] jacobian);

    /**
     * Tells whether parameters are inside the model's domain (for example a width &gt; 0). A trial step
     * that leaves the domain is treated like a step that raised χ²: the damping grows and the step
     * shrinks. The default accepts every finite vector.
     *
     * @param params parameters (input, not modified)
     * @return true if the model can be evaluated there
     */
    default boolean isValid(double[] params) {
        for (double v : params) {
            if (!Double.isFinite(v)) {
                return false;
            }
        }
        return true;
    }
}
