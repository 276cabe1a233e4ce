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

/** odex's Outcome.Converged (reached xEnd); the others are 1 MaxStepsExceeded, 2 EarlyReturn (stopped by the observer). */
const ODEX_CONVERGED = 0;

const ABORT_EVALUATIONS = { abort: 'max-evaluations' as const };
const ABORT_NON_FINITE = { abort: 'non-finite' as const };
const MAX_RESTARTS = 5;

/** The last accepted point of an odex run, and whether a terminal event stopped it. */
interface OdexProgress {
  t: number;
  readonly y: Float64Array;
  stopped: boolean;
}

type Counters = ReturnType<typeof newCounters>;
type OdexInterp = (c: number, x: number) => number;
type OdexObserver = (nr: number, xOld: number, x: number, y: number[], interp?: OdexInterp | false) => boolean;

/** Integrate with odex (input already validated by integrate()). */
export function integrateOdex(f: OdeRhs, t0: number, t1: number, cfg: OdeConfig): OdeResult {
  const counters = newCounters();
  const recorder = new OdeRecorder(cfg.n, cfg.tEval, cfg.events, cfg.direction);
  recorder.start(t0, cfg.y0);
  const progress: OdexProgress = { t: t0, y: Float64Array.from(cfg.y0), stopped: false };
  const rhs = checkedRhs(f, cfg, counters);
  const observer = stepObserver(progress, t1, recorder, counters, cfg.n);
  const status = solveWithRestarts(rhs, observer, progress, t1, cfg, counters);
  const { t, y } = progress;
  if (status === 'event') {
    return buildResult('event', recorder.stopT, recorder.stopY, recorder, counters, 'odex', cfg.warnings, `at t = ${recorder.stopT}`);
  }
  if (status !== 'success') {
    return buildResult(status, t, y, recorder, counters, 'odex', cfg.warnings, `stopped at t = ${t} of [${t0}, ${t1}]`);
  }
  return buildResult('success', t, y, recorder, counters, 'odex', cfg.warnings);
}

/**
 * The user's f behind odex's number[] interface: counts evaluations, aborts past the
 * maxEvaluations budget and on a non-finite derivative (private sentinels caught by the caller).
 */
function checkedRhs(f: OdeRhs, cfg: OdeConfig, counters: Counters): (x: number, y: number[]) => number[] {
  const n = cfg.n;
  const yIn = new Float64Array(n);
  const out = new Float64Array(n);
  return (x, yArr) => {
    if (counters.rhs >= cfg.maxEvaluations) throw ABORT_EVALUATIONS;
    for (let i = 0; i < n; i++) yIn[i] = yArr[i];
    f(x, yIn, out);
    counters.rhs++;
    for (let i = 0; i < n; i++) if (!Number.isFinite(out[i])) throw ABORT_NON_FINITE;
    return Array.from(out);
  };
}

/**
 * odex's per-step callback: hands each accepted step with its dense output to the recorder
 * (events, tEval), records the point in `progress`, and stops odex at a terminal event.
 */
function stepObserver(progress: OdexProgress, t1: number, recorder: OdeRecorder, counters: Counters, n: number): OdexObserver {
  const yCur = new Float64Array(n);
  const denseSrc: DenseSource & { interp: OdexInterp | null } = {
    interp: null,
    dense(s: number, o: Float64Array) {
      for (let i = 0; i < n; i++) o[i] = this.interp!(i, s);
    },
  };
  return (_nr, xOld, x, yArr, interp) => {
    if (typeof interp !== 'function') return true; // the initial call
    counters.steps++;
    for (let i = 0; i < n; i++) yCur[i] = yArr[i];
    denseSrc.interp = interp;
    const xEnd = Math.abs(x - t1) <= 4 * Number.EPSILON * Math.abs(t1) ? t1 : x;
    if (recorder.step(xOld, xEnd, yCur, denseSrc)) {
      progress.stopped = true;
      return false;
    }
    progress.t = xEnd;
    progress.y.set(yCur);
    return true;
  };
}

/** A fresh odex solver for the remaining step budget and maximum step hmax. */
function newSolver(cfg: OdeConfig, hmax: number, counters: Counters): OdexSolver {
  const solver = new (odexSolver())(cfg.n);
  solver.denseOutput = true;
  solver.relativeTolerance = cfg.rtol;
  solver.absoluteTolerance = Array.from(cfg.atol);
  solver.maxStepSize = hmax;
  solver.maxSteps = Math.max(1, cfg.maxSteps - counters.steps) + 1;
  if (cfg.initialStep !== undefined) solver.initialStepSize = Math.min(cfg.initialStep, hmax);
  return solver;
}

/**
 * Run odex from the last accepted point to t1; after a non-finite derivative restart from that
 * point with a maximum step ten times smaller (at most MAX_RESTARTS times, each with a warning).
 */
function solveWithRestarts(
  rhs: (x: number, y: number[]) => number[],
  observer: OdexObserver,
  progress: OdexProgress,
  t1: number,
  cfg: OdeConfig,
  counters: Counters,
): OdeStatus {
  let hmax = cfg.hmax;
  let restarts = 0;
  for (;;) {
    try {
      const res = newSolver(cfg, hmax, counters).solve(rhs, progress.t, Array.from(progress.y), t1, observer);
      counters.rejected += res.nReject;
      counters.steps += res.nReject;
      if (progress.stopped) return 'event';
      if (res.outcome !== ODEX_CONVERGED) return 'max-steps';
      progress.t = t1;
      for (let i = 0; i < cfg.n; i++) progress.y[i] = res.y[i];
      return 'success';
    } catch (e) {
      if (e === ABORT_EVALUATIONS) return 'max-evaluations';
      if (e !== ABORT_NON_FINITE) throw e;
      if (++restarts > MAX_RESTARTS) return 'non-finite';
      hmax = Math.min(hmax, Math.abs(t1 - progress.t)) * 0.1;
      cfg.warnings.push({ code: 'odex-restart', message: `non-finite right-hand side near t = ${progress.t}; restarted with maximum step ${hmax}` });
    }
  }
}
