/**
 * The shape of a fit: input data, options and the FitResult contract (see shared design,
 * "Contracts"). Everything is plain data: no NaN (a value that cannot be computed is null) and no
 * class instances, so a FitResult serialises to JSON as is.
 */
import type { Outcome } from '../core/outcome.js';
import type { Parameter } from '../core/parameter.js';
import type { FitStatus } from './status.js';
import type { FitVerdict, VerdictRules } from './verdict.js';
import type { WhitenBlock } from './whiten.js';

export interface FitData {
  /** Measured values, one per observation (same order as the model's predictions). */
  measured: Float64Array;
  /** Standard deviation of each measurement (> 0), same unit as `measured`. */
  sigma: Float64Array;
  /**
   * True when sigma is the known measurement error (covariance (J'J)^-1, chi-square statistics);
   * false when sigma only gives relative weights and the scale is estimated (s^2 (J'J)^-1).
   */
  sigmaKnown: boolean;
  /** Replicate group label per observation (same label = same conditions), for the lack-of-fit test. */
  groups?: ReadonlyArray<string | number>;
  /**
   * Blocks of observations whose errors are correlated (whiten.ts): the fit minimises the
   * generalised sum e' R^-1 e and its residuals r are the whitened ones. Default: independent errors.
   */
  whiten?: readonly WhitenBlock[];
}

export type SolverName = 'trust-region' | 'card';

export interface FitOptions {
  /** Confidence level of the intervals; default 0.95. */
  level?: number;
  /** Least-squares solver; default 'trust-region' (see solve.ts for why). */
  solver?: SolverName;
  /** ftol of the solver; default 1e-12. */
  ftol?: number;
  /** xtol of the solver; default 1e-12. */
  xtol?: number;
  /** gtol of the solver; default 1e-10. */
  gtol?: number;
  /** Maximum solver iterations; default 200. */
  maxIterations?: number;
  /** Maximum model evaluations; default 200 (p + 1) + 1000. */
  maxEvaluations?: number;
  /** Finite differences when the model has no Jacobian: 'forward' (default) or 'central'. */
  differences?: 'forward' | 'central';
  /** Compute profile-likelihood intervals for every free parameter; default true. */
  profile?: boolean;
  /** Called after each parameter's profile with (done, total); default none. */
  profileProgress?: (done: number, total: number) => void;
  /** Condition number of the column-scaled J'J above which a warning is given; default 1e8. */
  conditionWarning?: number;
  /** |correlation| above which a pair is flagged; default 0.95. */
  correlationWarning?: number;
  /** Family-wise rate of false outlier warnings on correct data (see influence.ts); default 0.01. */
  outlierLevel?: number;
  /** Thresholds of the verdict rules (see verdict.ts); defaults there. */
  verdict?: VerdictRules;
}

export interface ParameterInterval {
  /** Confidence level, for example 0.95. */
  level: number;
  /**
   * 'transformed': the linear interval was built in the estimation (log) space and mapped back, so
   * it is asymmetric; 'direct': built on the value itself.
   */
  basis: 'transformed' | 'direct';
  /** Linear (Wald, t-based) interval in SI units; null when the covariance is unavailable. */
  linear: [number, number] | null;
  /** Profile-likelihood interval; a null end means the profile did not cross within the search range. */
  profile?: [number | null, number | null];
}

/** A fitted parameter: a new Parameter object plus its uncertainty. */
export interface FittedParameter extends Parameter {
  /** Delta-method standard error of `value` (SI units); null when unavailable (fixed or singular). */
  stdError: number | null;
  ci: ParameterInterval;
  /** Estimate in the estimation space (ln value for log-transformed parameters). */
  internalValue: number;
  /** Standard error in the estimation space; null when unavailable. */
  internalStdError: number | null;
  /** The estimate lies on a bound. */
  atBound: boolean;
}

export interface ObservationDiagnostics {
  index: number;
  measured: number;
  predicted: number;
  /** measured - predicted. */
  residual: number;
  /** (measured - predicted) / sigma; for observations in a correlated block (FitData.whiten), the whitened residual. */
  weightedResidual: number;
  /** Internally studentised residual; null when the leverage is 1. */
  studentizedResidual: number | null;
  /** Diagonal of the hat matrix J (J'J)^-1 J'. */
  leverage: number;
  /** Cook's distance; null when the leverage is 1. */
  cooksDistance: number | null;
}

export interface InfluentialObservation {
  index: number;
  cooksDistance: number | null;
  studentizedResidual: number | null;
  /** Cook's distance is above the median of F(p, n - p): dropping it moves the estimates beyond their 50 % region. */
  movesEstimates: boolean;
  reason: string;
}

export interface LackOfFit {
  pureErrorSS: number;
  dofPure: number;
  lackSS: number;
  dofLack: number;
  F: number;
  pValue: number;
}

export interface FitStatistics {
  /** Observations. */
  n: number;
  /** Free parameters. */
  p: number;
  /** n - p. */
  dof: number;
  /** Sum of squared weighted residuals. */
  ssr: number;
  /** sqrt(ssr / dof) (in units of sigma); null when dof <= 0. */
  residualStdDev: number | null;
  /** ssr read as chi-square (meaningful when sigma is known). */
  chiSquare: number;
  /** P(chi2_dof > ssr) when sigma is known; null otherwise. */
  chiSquarePValue: number | null;
  /** Akaike criterion (Gaussian likelihood, constants dropped; see statistics.ts). */
  aic: number;
  /** Small-sample AIC; null when n - k - 1 <= 0. */
  aicc: number | null;
  bic: number;
  /** Condition number of the column-scaled J'J; null when singular. */
  conditionNumber: number | null;
  /** Smallest / largest singular value of the column-scaled Jacobian; null when not evaluated. */
  singularRatio: number | null;
  covarianceBasis: 's2-scaled' | 'known-sigma';
  lackOfFit: LackOfFit | null;
  /** Status the solver itself reported (the result's status may differ after the verdict). */
  solverStatus: FitStatus;
  /** The solver's own message (with its detail). */
  solverMessage: string;
  iterations: number;
  evaluations: number;
  solver: SolverName;
  /** Whether the model's exact Jacobian was used. */
  exactJacobian: boolean;
}

export interface ProfilePoint {
  /** Parameter value (SI units). */
  value: number;
  /** Minimum of the sum of squares with the parameter held at `value`. */
  ssr: number;
  /** Signed root statistic tau = sign(v - v_hat) sqrt(ssr - ssr_min) / s (Bates & Watts 1988, 6.1). */
  tau: number;
}

/** How a profile interval end was found: the threshold was crossed, or why it stays open. */
export type ProfileEnd = 'crossed' | 'bound' | 'search-range' | 'refit-failed';

export interface ParameterProfile {
  name: string;
  /** SSR level that bounds the interval. */
  threshold: number;
  points: ProfilePoint[];
  interval: [number | null, number | null];
  /** Lower and upper end: 'crossed', or why the end is open (null). */
  ends: [ProfileEnd, ProfileEnd];
  /** The profile interval differs from the linear one by more than 10% of the linear width. */
  disagreesWithLinear: boolean;
}

/**
 * A fit result. `status` is the solver's convergence status ('converged-ftol', ...) when the
 * verdict is trustworthy, and otherwise the status of the first failed verdict rule; `success`
 * follows from it, so it is true only for a trustworthy fit. `verdict` holds every reason.
 */
export interface FitResult extends Outcome<FitStatus> {
  /** Whether the fit may be trusted, and why not (verdict.ts). */
  verdict: FitVerdict;
  /** Every parameter the model uses, in the model's theta order (fixed ones included). */
  parameters: FittedParameter[];
  correlation: { names: string[]; matrix: number[][] | null };
  covariance: { names: string[]; internal: number[][] | null; external: number[][] | null };
  statistics: FitStatistics;
  /** Per-observation diagnostics; empty when the model could not be evaluated at the estimate. */
  observations: ObservationDiagnostics[];
  influential: InfluentialObservation[];
  profiles: ParameterProfile[];
}
