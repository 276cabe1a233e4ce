/**
 * OdeWorkspace: a reusable integration context. It runs the integrate() algorithm (integrate.ts:
 * Dormand-Prince 5(4) of Dormand & Prince 1980 with Hairer's stiffness test and the automatic switch
 * to RODAS4, events and tEval on the dense output) but keeps its steppers, recorder, counters and
 * work arrays from one solve to the next, per state dimension. A caller that solves the same kind
 * of system many times (a reactor model inside a fit, a Monte Carlo loop) keeps one workspace and
 * pays no per-call set-up beyond the result it gets back.
 *
 * A workspace is not re-entrant: a right-hand side must not call integrate() on the workspace
 * that is running it (the free function integrate() takes its workspace from a pool and is safe).
 */
import type { OdeOptions, OdeResult, OdeRhs, OdeStatus } from './ode-types.js';
import { newCounters, type OdeCounters, type StepCode, type Stepper, type StepperSettings } from './ode-common.js';
import { checkOdeInput, type OdeConfig } from './ode-input.js';
import { OdeRecorder, buildResult } from './ode-output.js';
import { Dopri5, type Dopri5Options } from './dopri5.js';
import { Rosenbrock } from './rosenbrock.js';
import { integrateOdex } from './odex-solver.js';

/**
 * h*|lambda| threshold of the automatic switch. Hairer's DOPRI5 uses 3.25. Measured with
 * bench/stiffness-estimate.ts (rtol 1e-6): once the step is stability-limited the two-stage
 * estimate settles at 3.29-3.32 (median 3.294 on y' = -1e4 (y - cos t), 3.307 on Robertson and on
 * van der Pol with mu = 1000), only just above 3.25; the switch then comes after 35-50 steps at
 * 3.25 and 27-43 steps at 2.0. 2.0 keeps a margin below the settled value, so a slightly lower
 * estimate still counts, and it never fired on the non-stiff set of tests/numerics (common
 * practice, no source).
 */
export const AUTO_STIFFNESS_THRESHOLD = 2.0;

/** Build the 'bad-input' result shared by all methods. */
export function badInputResult(t0: number, y0: ArrayLike<number>, message: string): OdeResult {
  let finite = y0 !== null && y0 !== undefined && typeof y0.length === 'number';
  if (finite) for (let i = 0; i < y0.length; i++) if (!Number.isFinite(Number(y0[i]))) finite = false;
  const y = finite ? Float64Array.from(y0, Number) : new Float64Array(0);
  return buildResult('bad-input', Number.isFinite(t0) ? t0 : 0, y, undefined, newCounters(), 'nonstiff', [], message);
}

/** The per-dimension part of a workspace. */
interface Slot {
  y: Float64Array;
  atol: Float64Array;
  dopri?: Dopri5;
  recorder?: OdeRecorder;
}

const NO_OPTIONS: OdeOptions = {};

/** A reusable integrator (see the file header). */
export class OdeWorkspace {
  private readonly slots = new Map<number, Slot>();
  private last: Slot | undefined;
  private lastN = -1;
  private readonly counters: OdeCounters = newCounters();
  private readonly settings: StepperSettings;
  private readonly dpOptions: Dopri5Options = { stiffnessThreshold: AUTO_STIFFNESS_THRESHOLD };
  private readonly lend = (n: number): Slot => this.slot(n);

  constructor() {
    this.settings = {
      f: noRhs, n: 0, rtol: 1e-8, atol: new Float64Array(0), hmax: 1, maxSteps: 1, maxEvaluations: 1, counters: this.counters,
    };
  }

  private slot(n: number): Slot {
    if (n === this.lastN) return this.last!;
    let s = this.slots.get(n);
    if (!s) this.slots.set(n, (s = { y: new Float64Array(n), atol: new Float64Array(n) }));
    this.last = s;
    this.lastN = n;
    return s;
  }

  /**
   * Integrate y' = f(t, y) from t0 to t1; the same contract, options and result as integrate().
   * The result owns its arrays (nothing in it is overwritten by later solves).
   */
  integrate(f: OdeRhs, t0: number, y0: ArrayLike<number>, t1: number, options: OdeOptions = NO_OPTIONS): OdeResult {
    const check = checkOdeInput(f, t0, y0, t1, options, this.lend);
    if (!check.ok) return badInputResult(t0, y0, check.message);
    const cfg = check.config;
    if (cfg.method === 'odex') return integrateOdex(f, t0, t1, cfg);
    const slot = this.slot(cfg.n);

    const counters = this.counters;
    counters.rhs = counters.jac = counters.steps = counters.rejected = counters.lu = 0;
    const settings = this.settings;
    settings.f = f;
    settings.n = cfg.n;
    settings.rtol = cfg.rtol;
    settings.atol = cfg.atol;
    settings.hmax = cfg.hmax;
    settings.maxSteps = cfg.maxSteps;
    settings.maxEvaluations = cfg.maxEvaluations;
    const warnings = cfg.warnings;
    let recorder = slot.recorder;
    if (recorder) recorder.reset(cfg.tEval, cfg.events, cfg.direction);
    else recorder = slot.recorder = new OdeRecorder(cfg.n, cfg.tEval, cfg.events, cfg.direction);
    recorder.start(t0, cfg.y0);

    let stepper: Stepper;
    let code: StepCode;
    let method: OdeResult['stats']['method'];
    let dp: Dopri5 | undefined;
    if (cfg.method === 'stiff') {
      const rb = makeStiff(settings, cfg, cfg.initialStep);
      code = rb.start(t0, cfg.y0, t1);
      stepper = rb;
      method = 'stiff';
    } else {
      const o = this.dpOptions;
      if (cfg.initialStep !== undefined) o.initialStep = cfg.initialStep;
      else delete o.initialStep;
      dp = slot.dopri;
      if (dp) dp.reset(settings, o);
      else dp = slot.dopri = new Dopri5(settings, o);
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
      if (dp !== undefined && dp.stiff && stepper === dp && dp.t !== t1) {
        if (cfg.method === 'auto') {
          warnings.push({
            code: 'stiffness-switch',
            message: `stiffness detected at t = ${dp.t} (h*lambda ≈ ${dp.hLambda.toPrecision(3)}); continued with the Rosenbrock method`,
          });
          const rb = makeStiff(settings, cfg, Math.abs(dp.h));
          code = rb.start(dp.t, dp.y, t1);
          if (code !== 'ok') {
            // keep the reached point of the non-stiff stepper for the result
            return buildResult(code, dp.t, dp.y, recorder, counters, 'nonstiff+stiff', warnings, `at t = ${dp.t}`);
          }
          stepper = rb;
          method = 'nonstiff+stiff';
        } else if (!warnedStiff) {
          warnedStiff = true;
          warnings.push({
            code: 'stiffness-detected',
            message: `the problem looks stiff from t = ${dp.t}; method 'stiff' or 'auto' would be cheaper`,
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
}

function noRhs(): void {}

/** The stiff stepper (allocated when needed; stiff solves are rare and cost far more than this). */
function makeStiff(settings: StepperSettings, cfg: OdeConfig, h0: number | undefined): Rosenbrock {
  return new Rosenbrock(settings, {
    ...(cfg.jac ? { jac: cfg.jac } : {}),
    autonomous: cfg.autonomous,
    ...(h0 !== undefined ? { initialStep: h0 } : {}),
  });
}

/** Workspaces not in use by a running integrate() call. */
const pool: OdeWorkspace[] = [];

/** Run `integrate` on a pooled workspace (re-entrant: a nested call takes another workspace). */
export function integratePooled(f: OdeRhs, t0: number, y0: ArrayLike<number>, t1: number, options?: OdeOptions): OdeResult {
  const ws = pool.pop() ?? new OdeWorkspace();
  try {
    return ws.integrate(f, t0, y0, t1, options);
  } finally {
    pool.push(ws);
  }
}
