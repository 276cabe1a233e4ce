/**
 * The common driver of the ODE-based reactor models (packed bed, plug flow, membrane, batch,
 * semibatch): tolerances scaled to the state, profile via dense output (tEval), a terminal
 * pressure event, status mapping from the integrator, and forward parameter sensitivities.
 *
 * Method (sensitivities): forward sensitivity equations, S = dy/dtheta, dS/dx = (df/dy) S + df/dtheta,
 * S(0) = 0, integrated together with the state (the "simultaneous corrector" arrangement of
 * Caracotsios & Stewart, Comput. Chem. Eng. 9 (1985) 359-365). The Jacobian of the augmented
 * system handed to the stiff method is exact on its block diagonal (df/dy); the coupling blocks
 * d((df/dy) S + df/dtheta)/dy are formed by central differences of the exact df/dy and df/dtheta
 * (forward differences there cost the Rosenbrock method about three times the steps on stiff cases).
 * The sensitivities are integrated on the steps chosen for the state alone (they take no part in
 * the error control, the default of CVODES, Hindmarsh et al., ACM TOMS 31 (2005) 363-396,
 * "errconS = false"): the same Runge-Kutta or Rosenbrock formula applied to the augmented system
 * differentiates the discrete solution exactly for a fixed step sequence, so the sensitivities agree
 * with differences of the computed outlet, and a Jacobian solve costs the steps of a plain solve.
 */
import { OdeWorkspace } from '../numerics/integrate.js';
import type { OdeEvent, OdeJac, OdeOptions, OdeResult, OdeRhs } from '../numerics/ode-types.js';
import type { ReactorOptions, ReactorStatus } from './types.js';

/** One reactor model written as y' = f(x, y) with exact derivatives. */
export interface OdeCore {
  /** State length. */
  n: number;
  /** Number of parameters. */
  nP: number;
  rhs: OdeRhs;
  /** df/dy, n x n row-major. */
  jac: OdeJac;
  /** df/dtheta, n x nP row-major. */
  dtheta: (x: number, y: Float64Array, out: Float64Array) => void;
  /**
   * Optional: the sensitivity part of the augmented right-hand side, out[n + i*nP + k] =
   * ((df/dy) S + df/dtheta)_ik for the state y[0..n) and S = y[n..) (row-major n x nP), computed
   * without forming df/dy; when absent it is formed from jac and dtheta.
   */
  sensRhs?: (x: number, y: Float64Array, out: Float64Array) => void;
  /** Absolute tolerance per state component (already scaled). */
  atol: Float64Array;
  /** Index of the pressure ratio p in the state, if it is a state. */
  pressureIndex?: number;
}

export interface OdeDriverResult {
  status: ReactorStatus;
  message: string;
  /** Final state (finite). */
  y: Float64Array;
  /** Final sensitivities (n x nP) when asked. */
  S?: Float64Array;
  /** Position reached. */
  x: number;
  profileX: number[];
  profileY: Float64Array[];
  exhaustedAt?: number;
  stats: { rhsEvaluations: number; jacobianEvaluations: number; steps: number; method: string };
  warnings: { code: string; message: string }[];
}

/** Absolute tolerance of the sensitivity components: large enough to drop them from the error norm. */
const SENS_ATOL = 1e300;

/** p below which the bed is taken as exhausted; the rest of the way to p = 0 is extrapolated. */
export const P_EXHAUSTED = 1e-3;

function allFinite(v: Float64Array, n: number): boolean {
  for (let i = 0; i < n; i++) if (!Number.isFinite(v[i])) return false;
  return true;
}

/**
 * Integrate a reactor core from x = 0 to x1 with y(0) = y0.
 * y0 is only read (the result never refers to it), so a caller may pass a reused buffer.
 * `profileX` (ascending, in [0, x1]) asks for dense output; `theta` scales the sensitivity tolerances.
 * `pressureSlope(y)` gives -d(p^2)/dx at the exhaustion event to extrapolate exhaustedAt.
 */
export function runOde(
  core: OdeCore,
  y0: Float64Array,
  x1: number,
  theta: Float64Array,
  options: ReactorOptions,
  profileX: number[] | undefined,
  pressureSlope?: (y: Float64Array) => number,
): OdeDriverResult {
  const { n, nP } = core;
  const sens = options.sensitivities === true && nP > 0;
  const N = sens ? n + n * nP : n;
  // without sensitivities the state, its tolerances and the core's functions are used as they are
  // (y0 is only read: integrate copies it into its own buffer)
  let yStart = y0;
  let atol = core.atol;
  let f: OdeRhs = core.rhs;
  let jac: OdeJac = core.jac;
  let rtol = options.rtol ?? 1e-8;
  if (sens) {
    yStart = new Float64Array(N);
    yStart.set(y0);
    atol = new Float64Array(N);
    // Sensitivities are left out of the step-size control (see the file header): their atol is
    // so large that they add nothing to the weighted RMS norm sqrt(sum (e_i/sk_i)^2 / N), and the
    // state tolerances are scaled by c = sqrt(n/N) so that the norm over N components equals the
    // state-only norm over n components exactly: the steps are those of the state-only solve.
    const c = Math.sqrt(n / N);
    rtol *= c;
    for (let i = 0; i < n; i++) atol[i] = core.atol[i] * c;
    atol.fill(SENS_ATOL, n, N);
    const aug = augmentedFor(core);
    f = aug.rhs;
    jac = aug.jac;
  }
  const run = runState(core);
  const pi = core.pressureIndex;
  const events = pi === undefined ? NO_EVENTS : run.pressureEvents(pi);
  // one options object per core, refilled (integrate reads it and keeps no reference)
  const odeOptions = run.options;
  odeOptions.rtol = rtol;
  odeOptions.atol = atol;
  odeOptions.method = options.method ?? 'auto';
  odeOptions.jac = jac;
  odeOptions.maxSteps = options.maxSteps ?? 100000;
  odeOptions.events = events;
  odeOptions.tEval = profileX ?? NO_TIMES;
  let res: OdeResult;
  if (x1 === 0) {
    res = {
      status: 'success', success: true, message: 'zero size', warnings: [], t: 0, y: Float64Array.from(yStart),
      tOut: profileX ? profileX.map(() => 0) : [], yOut: profileX ? profileX.map(() => Float64Array.from(yStart)) : [],
      events: [], stats: { rhsEvaluations: 0, jacobianEvaluations: 0, steps: 0, rejectedSteps: 0, method: 'nonstiff', luDecompositions: 0 },
    };
  } else {
    res = run.workspace.integrate(f, 0, yStart, x1, odeOptions);
  }
  const stats = {
    rhsEvaluations: res.stats.rhsEvaluations,
    jacobianEvaluations: res.stats.jacobianEvaluations,
    steps: res.stats.steps,
    method: res.stats.method,
  };
  const warnings = res.warnings.length === 0 ? [] : res.warnings.map((w) => ({ code: w.code, message: w.message }));
  // keep only finite profile rows
  const profX: number[] = [];
  const profY: Float64Array[] = [];
  if (profileX) {
    for (let i = 0; i < res.tOut.length; i++) {
      if (allFinite(res.yOut[i], N)) {
        profX.push(res.tOut[i]);
        profY.push(res.yOut[i]);
      }
    }
  }
  let status: ReactorStatus;
  let message: string;
  let yEnd = res.y;
  let xEnd = res.t;
  let exhaustedAt: number | undefined;
  const fired = res.events.length === 0 ? undefined : res.events.find((e) => e.name === 'pressure-exhausted');
  if (fired && pi !== undefined) {
    yEnd = fired.y;
    xEnd = fired.t;
    const slope = pressureSlope ? pressureSlope(fired.y) : 0;
    const pe = fired.y[pi];
    exhaustedAt = slope > 0 && pe > 0 ? fired.t + (pe * pe) / slope : fired.t;
    status = 'pressure-exhausted';
    message =
      `the pressure falls to zero inside the reactor at about ${exhaustedAt.toPrecision(6)} ` +
      `(of ${x1} requested); reduce the pressure drop (larger particles, wider tubes, lower flux) or the reactor size`;
  } else if (res.success) {
    status = 'success';
    message = 'reactor solved';
  } else if (res.status === 'non-finite') {
    status = 'non-finite';
    message = `the integration met a non-finite value: ${res.message}`;
  } else {
    status = 'integration-failed';
    message = `the integration failed at ${res.t.toPrecision(6)} of ${x1}: ${res.message}`;
  }
  if (!allFinite(yEnd, N)) {
    // never hand out NaN: fall back to the last finite profile row, else the inlet
    const last = profY.length > 0 ? profY[profY.length - 1] : Float64Array.from(yStart);
    xEnd = profX.length > 0 ? profX[profX.length - 1] : 0;
    yEnd = last;
    if (status === 'success' || status === 'pressure-exhausted') status = 'non-finite';
    message += '; the reported state is the last finite one';
  }
  const out: OdeDriverResult = {
    status,
    message,
    // the rows handed out here are owned by the result (buildSolution copies what it keeps)
    y: N === n ? yEnd : yEnd.slice(0, n),
    x: xEnd,
    profileX: profX,
    profileY: profY,
    stats,
    warnings,
  };
  if (sens) out.S = yEnd.slice(n, N);
  if (exhaustedAt !== undefined) out.exhaustedAt = exhaustedAt;
  return out;
}

const NO_EVENTS: OdeEvent[] = [];
const NO_TIMES: number[] = [];
const NO_ATOL = new Float64Array(0);

/** What a core keeps between solves: its integrator workspace and its pressure event. */
class CoreRun {
  /** Reused by every solve of the core (solves of one core never nest). */
  readonly workspace = new OdeWorkspace();
  /** The integrator options of the current solve (refilled by every solve of the core). */
  readonly options: OdeOptions = {
    rtol: 1e-8, atol: NO_ATOL, method: 'auto', maxSteps: 100000, autonomous: true, events: NO_EVENTS, tEval: NO_TIMES,
  };
  private pi = -1;
  private events: OdeEvent[] = NO_EVENTS;
  /** The terminal event p = P_EXHAUSTED (falling) on state component pi. */
  pressureEvents(pi: number): OdeEvent[] {
    if (pi !== this.pi) {
      this.pi = pi;
      this.events = [{ name: 'pressure-exhausted', g: (_x, y) => y[pi] - P_EXHAUSTED, terminal: true, direction: -1 }];
    }
    return this.events;
  }
}

const coreRuns = new WeakMap<OdeCore, CoreRun>();

function runState(core: OdeCore): CoreRun {
  let r = coreRuns.get(core);
  if (!r) coreRuns.set(core, (r = new CoreRun()));
  return r;
}

const augmentedCache = new WeakMap<OdeCore, { rhs: OdeRhs; jac: OdeJac; n: number; nP: number }>();

/** The augmented system of a core, built once per core object (cores may be reused across solves). */
function augmentedFor(core: OdeCore): { rhs: OdeRhs; jac: OdeJac } {
  let a = augmentedCache.get(core);
  if (!a || a.n !== core.n || a.nP !== core.nP) {
    a = { ...augmented(core), n: core.n, nP: core.nP };
    augmentedCache.set(core, a);
  }
  return a;
}

/** The state+sensitivity system and its Jacobian; buffers allocated once here. */
function augmented(core: OdeCore): { rhs: OdeRhs; jac: OdeJac } {
  const { n, nP } = core;
  const N = n + n * nP;
  const J = new Float64Array(n * n);
  const Ft = new Float64Array(n * nP);
  const J2 = new Float64Array(n * n);
  const Ft2 = new Float64Array(n * nP);
  const ySh = new Float64Array(n);
  const base = new Float64Array(n * nP);
  const yTmp = new Float64Array(n);

  // dS/dx = J S + Ft, into out (n x nP) using S at y[n..]
  const sensPart = (y: Float64Array, Jm: Float64Array, Fm: Float64Array, out: Float64Array, off: number): void => {
    for (let i = 0; i < n; i++) {
      for (let k = 0; k < nP; k++) {
        let s = Fm[i * nP + k];
        for (let m = 0; m < n; m++) s += Jm[i * n + m] * y[n + m * nP + k];
        out[off + i * nP + k] = s;
      }
    }
  };

  const sensRhs = core.sensRhs;
  const rhs: OdeRhs = sensRhs
    ? (x, y, out) => {
        core.rhs(x, y, out);
        sensRhs(x, y, out);
      }
    : (x, y, out) => {
        core.rhs(x, y, out);
        core.jac(x, y, J);
        core.dtheta(x, y, Ft);
        sensPart(y, J, Ft, out, n);
      };

  const jac: OdeJac = (x, y, out) => {
    out.fill(0, 0, N * N);
    for (let i = 0; i < n; i++) yTmp[i] = y[i];
    core.jac(x, y, J);
    core.dtheta(x, y, Ft);
    // state block and block-diagonal sensitivity blocks
    for (let i = 0; i < n; i++) {
      for (let j = 0; j < n; j++) {
        const v = J[i * n + j];
        out[i * N + j] = v;
        if (v === 0) continue;
        for (let k = 0; k < nP; k++) out[(n + i * nP + k) * N + (n + j * nP + k)] = v;
      }
    }
    // coupling columns d(J S + Ft)/dy_j by central differences of the exact J and Ft
    for (let j = 0; j < n; j++) {
      for (let i = 0; i < n; i++) ySh[i] = yTmp[i];
      const h = 6.0554544523933395e-6 * Math.max(Math.abs(yTmp[j]), core.atol[j] * 1e3, 1e-300);
      ySh[j] = yTmp[j] + h;
      const hp = ySh[j] - yTmp[j];
      core.jac(x, ySh, J2);
      core.dtheta(x, ySh, Ft2);
      sensPart(y, J2, Ft2, base, 0);
      ySh[j] = yTmp[j] - h;
      const hm = yTmp[j] - ySh[j];
      core.jac(x, ySh, J2);
      core.dtheta(x, ySh, Ft2);
      for (let i = 0; i < n; i++) {
        for (let k = 0; k < nP; k++) {
          let s = Ft2[i * nP + k];
          for (let m = 0; m < n; m++) s += J2[i * n + m] * y[n + m * nP + k];
          out[(n + i * nP + k) * N + j] = (base[i * nP + k] - s) / (hp + hm);
        }
      }
    }
  };
  return { rhs, jac };
}
