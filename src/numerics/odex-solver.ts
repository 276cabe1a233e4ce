/**
 * Method 'odex': the Gragg-Bulirsch-Stoer extrapolation code ODEX of Hairer & Wanner (Solving
 * ODEs I, 2nd ed., sec. II.9; port in the `odex` npm package, node_modules/odex/src/odex.js),
 * wrapped behind the OdeResult contract.
 *
 * Why it is wrapped rather than used as the default: it is for non-stiff problems only (no
 * switch to a stiff method), its right-hand side takes and returns plain number[] so every call
 * allocates (we copy into a Float64Array for the user's f and back), it has no event location,
 * no evaluation budget and its own step counter. This wrapper adds:
 *   - events and tEval on its dense output (the `interpolate` closure handed to the observer),
 *     with the same Illinois root finder as the other methods (ode-output.ts);
 *   - the maxEvaluations budget, by aborting from inside f with a private sentinel;
 *   - non-finite f: abort, then restart from the last accepted point with a maximum step ten
 *     times smaller (odex never starts below 1e-4 otherwise); after 5 restarts 'non-finite'.
 * Its value in rateloom is as an independent cross-check of the Dormand-Prince method in tests.
 */
import { createRequire } from 'node:module';
import type { OdeResult, OdeRhs, OdeStatus } from './ode-types.js';
import { newCounters } from './ode-common.js';
import type { OdeConfig } from './ode-input.js';
import { OdeRecorder, buildResult, type DenseSource } from './ode-output.js';

/** The part of the odex Solver API used here (typed locally; the package ships only .ts source). */
interface OdexSolver {
  maxSteps: number;
  initialStepSize: number;
  maxStepSize: number;
  relativeTolerance: number | number[];
  absoluteTolerance: number | number[];
  denseOutput: boolean;
  solve(
    f: (x: number, y: number[]) => number[],
    x: number,
    y0: number[],
    xEnd: number,
    solOut: (nr: number, xOld: number, x: number, y: number[], interp?: ((c: number, x: number) => number) | false) => boolean | void,
  ): { y: number[]; outcome: number; nStep: number; nAccept: number; nReject: number; nEval: number };
}

const requireCjs = createRequire(import.meta.url);
type OdexConstructor = new (n: number) => OdexSolver;
let solverClass: OdexConstructor | undefined;
/** odex's Solver class, loaded on first use (not at start-up of every command). */
function odexSolver(): OdexConstructor {
  solverClass ??= (requireCjs('odex') as { Solver: OdexConstructor }).Solver;
  return solverClass;
}

/** odex's Outcome enum values. */
const ODEX_CONVERGED = 0;
const ODEX_MAX_STEPS = 1;

const ABORT_EVALUATIONS = { abort: 'max-evaluations' as const };
const ABORT_NON_FINITE = { abort: 'non-finite' as const };
const MAX_RESTARTS = 5;

/** Integrate with odex (input already validated by integrate()). */
export function integrateOdex(f: OdeRhs, t0: number, t1: number, cfg: OdeConfig): OdeResult {
  const n = cfg.n;
  const counters = newCounters();
  const warnings = cfg.warnings;
  const recorder = new OdeRecorder(n, cfg.tEval, cfg.events, cfg.direction);
  recorder.start(t0, cfg.y0);

  const y = Float64Array.from(cfg.y0); // last accepted state
  let t = t0;
  const yIn = new Float64Array(n);
  const out = new Float64Array(n);
  const yCur = new Float64Array(n);
  const denseSrc: DenseSource & { interp: ((c: number, x: number) => number) | null } = {
    interp: null,
    dense(s: number, o: Float64Array) {
      for (let i = 0; i < n; i++) o[i] = this.interp!(i, s);
    },
  };
  const rhs = (x: number, yArr: number[]): number[] => {
    if (counters.rhs >= cfg.maxEvaluations) throw ABORT_EVALUATIONS;
    for (let i = 0; i < n; i++) yIn[i] = yArr[i];
    f(x, yIn, out);
    counters.rhs++;
    for (let i = 0; i < n; i++) if (!Number.isFinite(out[i])) throw ABORT_NON_FINITE;
    return Array.from(out);
  };

  let hmax = cfg.hmax;
  let restarts = 0;
  let stopped = false;
  let status: OdeStatus = 'success';
  for (;;) {
    const solver = new (odexSolver())(n);
    solver.denseOutput = true;
    solver.relativeTolerance = cfg.rtol;
    solver.absoluteTolerance = Array.from(cfg.atol);
    solver.maxStepSize = hmax;
    solver.maxSteps = Math.max(1, cfg.maxSteps - counters.steps) + 1;
    if (cfg.initialStep !== undefined) solver.initialStepSize = Math.min(cfg.initialStep, hmax);
    const solOut = (_nr: number, xOld: number, x: number, yArr: number[], interp?: ((c: number, x: number) => number) | false) => {
      if (typeof interp !== 'function') return true; // the initial call
      counters.steps++;
      for (let i = 0; i < n; i++) yCur[i] = yArr[i];
      denseSrc.interp = interp;
      const xEnd = Math.abs(x - t1) <= 4 * Number.EPSILON * Math.abs(t1) ? t1 : x;
      if (recorder.step(xOld, xEnd, yCur, denseSrc)) {
        stopped = true;
        return false;
      }
      t = xEnd;
      y.set(yCur);
      return true;
    };
    try {
      const res = solver.solve(rhs, t, Array.from(y), t1, solOut);
      counters.rejected += res.nReject;
      counters.steps += res.nReject;
      if (stopped) status = 'event';
      else if (res.outcome === ODEX_MAX_STEPS) status = 'max-steps';
      else if (res.outcome === ODEX_CONVERGED) {
        t = t1;
        for (let i = 0; i < n; i++) y[i] = res.y[i];
        status = 'success';
      } else status = 'max-steps';
      break;
    } catch (e) {
      if (e === ABORT_EVALUATIONS) {
        status = 'max-evaluations';
        break;
      }
      if (e === ABORT_NON_FINITE) {
        if (++restarts > MAX_RESTARTS) {
          status = 'non-finite';
          break;
        }
        hmax = Math.min(hmax, Math.abs(t1 - t)) * 0.1;
        warnings.push({ code: 'odex-restart', message: `non-finite right-hand side near t = ${t}; restarted with maximum step ${hmax}` });
        continue;
      }
      throw e;
    }
  }
  if (status === 'event') {
    return buildResult('event', recorder.stopT, recorder.stopY, recorder, counters, 'odex', warnings, `at t = ${recorder.stopT}`);
  }
  if (status !== 'success') {
    return buildResult(status, t, y, recorder, counters, 'odex', warnings, `stopped at t = ${t} of [${t0}, ${t1}]`);
  }
  return buildResult('success', t, y, recorder, counters, 'odex', warnings);
}
