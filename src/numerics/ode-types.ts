/**
 * The contract of the ODE integrators (numerics/ knows no chemistry).
 * y' = f(t, y), y(t0) = y0, integrated to t1, with optional events and dense output.
 */

/** Right-hand side, writing dy/dt into `out` (no allocation expected). */
export type OdeRhs = (t: number, y: Float64Array, out: Float64Array) => void;
/** Jacobian df/dy, n x n row-major, into `out`. */
export type OdeJac = (t: number, y: Float64Array, out: Float64Array) => void;

export interface OdeEvent {
  /** Name reported in the result. */
  name: string;
  /** Event function; the event fires where it changes sign. */
  g: (t: number, y: Float64Array) => number;
  /** Stop the integration at the event; default true. */
  terminal?: boolean;
  /** +1 only rising, -1 only falling, 0 both; default 0. */
  direction?: -1 | 0 | 1;
}

export interface OdeOptions {
  /** Relative tolerance; default 1e-8. */
  rtol?: number;
  /** Absolute tolerance (scalar or per component); default 1e-10. */
  atol?: number | Float64Array;
  /**
   * 'auto' (non-stiff Dormand-Prince first, switch to the stiff Rosenbrock method on detection),
   * 'nonstiff' (Dormand-Prince 5(4)), 'stiff' (Rosenbrock RODAS4), 'odex' (extrapolation, a
   * cross-check method that allocates per call); default 'auto'.
   */
  method?: 'auto' | 'nonstiff' | 'stiff' | 'odex';
  /** Analytic Jacobian for the stiff method; finite differences when omitted. */
  jac?: OdeJac;
  /** Maximum accepted+rejected steps; default 100000. */
  maxSteps?: number;
  /** Maximum right-hand-side evaluations; default 2000000. */
  maxEvaluations?: number;
  /** Initial step size; default chosen automatically. */
  initialStep?: number;
  /** Times at which to report the solution (dense output); default none. */
  tEval?: ArrayLike<number>;
  events?: OdeEvent[];
  /** Largest step size magnitude, same unit as t; default |t1 - t0|. */
  maxStep?: number;
  /**
   * Declare that f does not depend on t explicitly; the stiff method then skips the numerical
   * df/dt (one right-hand-side evaluation per step saved). Default false.
   */
  autonomous?: boolean;
}

/**
 * Outcome of integrate() (table ODE_STATUS in ode-common.ts; success = 'success' | 'event').
 * 'bad-input' is returned, never thrown, for invalid arguments (see ode-input.ts).
 */
export type OdeStatus =
  | 'success'
  | 'event'
  | 'max-steps'
  | 'max-evaluations'
  | 'step-size-too-small'
  | 'non-finite'
  | 'bad-input';

export interface OdeResult {
  status: OdeStatus;
  success: boolean;
  message: string;
  warnings: { code: string; message: string }[];
  /** Final time reached (the event time when an event stopped it). */
  t: number;
  /** State at `t`. */
  y: Float64Array;
  /** Solution at tEval points reached (rows), when tEval was given. */
  tOut: number[];
  yOut: Float64Array[];
  /** Fired events in order. */
  events: { name: string; t: number; y: Float64Array }[];
  stats: {
    rhsEvaluations: number;
    jacobianEvaluations: number;
    steps: number;
    rejectedSteps: number;
    /** Method(s) that did the work. */
    method: 'nonstiff' | 'stiff' | 'nonstiff+stiff' | 'odex';
    luDecompositions: number;
  };
}
