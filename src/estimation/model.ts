/**
 * The one interface through which estimation knows a model: given the free parameters in the
 * estimation (transformed) space, predict every observation, and optionally the exact Jacobian.
 */
export interface RegressionModel {
  /** Number of observations (residuals). */
  readonly nObservations: number;
  /**
   * Names of the parameters in theta, in order (theta is in the estimation space: ln value for
   * log-transformed parameters). fitModel matches them by name to its Parameter list and holds the
   * ones marked fixed at their values, so theta may also carry fixed parameters.
   */
  readonly parameterNames: readonly string[];
  /**
   * Predictions for all observations into `out` (length nObservations). Returns false when the
   * model cannot be evaluated at theta (the step is then rejected); failure detail goes to `failures`.
   */
  predict(theta: Float64Array, out: Float64Array, failures?: PredictionFailure[]): boolean;
  /** Exact Jacobian d prediction / d theta (nObservations x nP row-major) and the predictions. */
  jacobian?(theta: Float64Array, pred: Float64Array, J: Float64Array, failures?: PredictionFailure[]): boolean;
}

export interface PredictionFailure {
  /** Run or observation group that failed. */
  run: string;
  message: string;
}
