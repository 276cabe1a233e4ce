/**
 * integrate(): the one entry point for initial-value problems y' = f(t, y), y(t0) = y0 on [t0, t1]
 * (t1 < t0 integrates backwards). Methods:
 *   - 'auto' (default): Dormand-Prince 5(4) (dopri5.ts); when its stiffness test (Hairer & Wanner,
 *     Solving ODEs II, sec. IV.2; threshold AUTO_STIFFNESS_THRESHOLD) fires 15 times without 6
 *     quiet steps in between, the run
 *     continues from the current (t, y) with the L-stable Rosenbrock method RODAS4
 *     (rosenbrock.ts); stats.method is then 'nonstiff+stiff' and a warning records the switch.
 *   - 'nonstiff': Dormand-Prince only (a 'stiffness-detected' warning is added if the test fires).
 *   - 'stiff': RODAS4 only.
 *   - 'odex': the GBS extrapolation code of the `odex` package (odex-solver.ts), a cross-check.
 *
 * Input policy: invalid input never throws; the result has status 'bad-input', success false,
 * a message naming the field, t = t0 and y = y0 (or an empty array when y0 itself is not finite).
 * Numerical failure (budgets, step-size underflow, persistent non-finite f) is likewise a status;
 * t and y are then the last accepted point. Events and tEval are handled on the dense output.
 */
import type { OdeOptions, OdeResult, OdeRhs } from './ode-types.js';
import { integratePooled } from './ode-workspace.js';

export { badInputResult, OdeWorkspace } from './ode-workspace.js';

/**
 * Integrate y' = f(t, y) from t0 to t1. `f` writes dy/dt into its `out` argument and must not
 * keep references to `y` or `out`. See OdeOptions for tolerances, budgets, tEval and events.
 * Work arrays come from a pool of OdeWorkspace objects (ode-workspace.ts); a caller that solves
 * many times may keep its own OdeWorkspace instead.
 */
export function integrate(
  f: OdeRhs,
  t0: number,
  y0: ArrayLike<number>,
  t1: number,
  options: OdeOptions = {},
): OdeResult {
  return integratePooled(f, t0, y0, t1, options);
}
