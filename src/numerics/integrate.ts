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
import type { OdeOptions, OdeResult, OdeRhs, OdeStatus } from './ode-types';
import { newCounters, type StepCode, type Stepper, type StepperSettings } from './ode-common';
import { checkOdeInput } from './ode-input';
import { OdeRecorder, buildResult } from './ode-output';
import { Dopri5 } from './dopri5';
import { Rosenbrock } from './rosenbrock';
import { integrateOdex } from './odex-solver';

export { ODE_STATUS } from './ode-common';

/**
 * h*|lambda| threshold of the automatic switch. Hairer's DOPRI5 uses 3.25, but the two-stage
 * estimate settles near 2.4-2.6 when the step is stability-limited, so the switch would come
 * thousands of steps late; 2.0 with DOPRI5's 15-test counting switched promptly on stiff
 * kinetics and never on the non-stiff set of tests/numerics (common practice, no source).
 */
export const AUTO_STIFFNESS_THRESHOLD = 2.0;

/** Build the 'bad-input' result shared by all methods. */
export function badInputResult(t0: number, y0: ArrayLike<number>, message: string): OdeResult {
  let finite = y0 !== null && y0 !== undefined && typeof y0.length === 'number';
  if (finite) for (let i = 0; i < y0.length; i++) if (!Number.isFinite(Number(y0[i]))) finite = false;
  const y = finite ? Float64Array.from(y0, Number) : new Float64Array(0);
  return buildResult('bad-input', Number.isFinite(t0) ? t0 : 0, y, undefined, newCounters(), 'nonstiff', [], message);
}

/**
 * Integrate y' = f(t, y) from t0 to t1. `f` writes dy/dt into its `out` argument and must not
 * keep references to `y` or `out`. See OdeOptions for tolerances, budgets, tEval and events.
 */
export function integrate(
  f: OdeRhs,
  t0: number,
  y0: ArrayLike<number>,
  t1: number,
  options: OdeOptions = {},
): OdeResult {
  const check = checkOdeInput(f, t0, y0, t1, options);
  if (!check.ok) return badInputResult(t0, y0, check.message);
  const cfg = check.config;
  if (cfg.method === 'odex') return integrateOdex(f, t0, t1, cfg);

  const counters = newCounters();
  const settings: StepperSettings = {
    f,
    n: cfg.n,
    rtol: cfg.rtol,
    atol: cfg.atol,
    hmax: cfg.hmax,
    maxSteps: cfg.maxSteps,
    maxEvaluations: cfg.maxEvaluations,
    counters,
  };
  const warnings = cfg.warnings;
  const recorder = new OdeRecorder(cfg.n, cfg.tEval, cfg.events, cfg.direction);
  recorder.start(t0, cfg.y0);

  const makeStiff = (h0?: number) =>
    new Rosenbrock(settings, {
      ...(cfg.jac ? { jac: cfg.jac } : {}),
      autonomous: cfg.autonomous,
      ...(h0 !== undefined ? { initialStep: h0 } : {}),
    });

  let stepper: Stepper;
  let code: StepCode;
  let method: OdeResult['stats']['method'];
  if (cfg.method === 'stiff') {
    const rb = makeStiff(cfg.initialStep);
    code = rb.start(t0, cfg.y0, t1);
    stepper = rb;
    method = 'stiff';
  } else {
    const dp = new Dopri5(settings, {
      stiffnessThreshold: AUTO_STIFFNESS_THRESHOLD,
      ...(cfg.initialStep !== undefined ? { initialStep: cfg.initialStep } : {}),
    });
    code = dp.start(t0, cfg.y0, t1);
    stepper = dp;
    method = 'nonstiff';
  }
  let warnedStiff = false;

  let status: OdeStatus = 'success';
  while (code === 'ok' && stepper.t !== t1) {
    code = stepper.step(t1);
    if (code !== 'ok') break;
    if (recorder.step(stepper.tOld, stepper.t, stepper.y, stepper)) {
      status = 'event';
      break;
    }
    if (stepper.stiff && stepper instanceof Dopri5 && stepper.t !== t1) {
      if (cfg.method === 'auto') {
        warnings.push({
          code: 'stiffness-switch',
          message: `stiffness detected at t = ${stepper.t} (h*lambda ≈ ${stepper.hLambda.toPrecision(3)}); continued with the Rosenbrock method`,
        });
        const rb = makeStiff(Math.abs(stepper.h));
        code = rb.start(stepper.t, stepper.y, t1);
        if (code !== 'ok') {
          // keep the reached point of the non-stiff stepper for the result
          return buildResult(code, stepper.t, stepper.y, recorder, counters, 'nonstiff+stiff', warnings, `at t = ${stepper.t}`);
        }
        stepper = rb;
        method = 'nonstiff+stiff';
      } else if (!warnedStiff) {
        warnedStiff = true;
        warnings.push({
          code: 'stiffness-detected',
          message: `the problem looks stiff from t = ${stepper.t}; method 'stiff' or 'auto' would be cheaper`,
        });
      }
    }
  }
  if (status === 'event') {
    return buildResult('event', recorder.stopT, recorder.stopY, recorder, counters, method, warnings, `at t = ${recorder.stopT}`);
  }
  if (code !== 'ok') {
    return buildResult(code, stepper.t, stepper.y, recorder, counters, method, warnings, `stopped at t = ${stepper.t} of [${t0}, ${t1}]`);
  }
  return buildResult('success', stepper.t, stepper.y, recorder, counters, method, warnings);
}
