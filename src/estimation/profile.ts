/**
 * Profile-likelihood confidence intervals (Bates & Watts 1988, "Nonlinear Regression Analysis and
 * Its Applications", Wiley, section 6.1; Venzon & Moolgavkar 1988, Appl. Statist. 37, 87-94).
 *
 * For each free parameter theta_j: hold it at values on a grid stepping out from the estimate (in
 * the estimation space, in fractions of the linear half-width), refit the others, and find where
 * the profile sum of squares crosses
 *   SSR(theta_j) = SSR_min (1 + F(1, n - p; level) / (n - p))   when sigma is estimated,
 *   SSR(theta_j) = SSR_min + chi2(1; level)                       when sigma is known.
 * The crossing is refined by regula falsi (Illinois variant) on the signed root
 * tau = sign(theta - theta_hat) sqrt(SSR - SSR_min) / s, which is exactly linear in theta for a
 * linear model, so profile and linear intervals then coincide. An end that does not cross within the
 * search range, before a bound, or because a refit failed is reported as null (open), never as a
 * number, and `ends` says which of these happened.
 *
 * Warm starts (a predictor-corrector walk along the profile trace, as in continuation methods,
 * Allgower & Georg 1990, "Numerical Continuation Methods", Springer, chapter 2): each refit starts
 * from the other parameters predicted at the new value of theta_j, not from the last solution
 * alone. The first step of a side follows the tangent of the trace at the estimate, which the
 * covariance gives (for a linear model the conditional mean: theta_k moves by C_kj / C_jj per unit
 * of theta_j, Bates & Watts 1988, section 6.1); later steps extrapolate the secant through the last
 * two solutions; the refinement of a crossing interpolates between the solutions at the ends of the
 * bracket. A refit that fails from the predicted start is retried from the last solution.
 */
import { toExternal } from '../core/parameter.js';
import { chiSquareQuantile, fQuantile } from './distributions.js';
import type { ParameterProfile, ProfileEnd, ProfilePoint } from './fit-types.js';
import { makeProblem, solveFree, type PreparedFit } from './solve.js';

export interface ProfileRequest {
  prep: PreparedFit;
  /** Full theta at the optimum (estimation space). */
  thetaHat: Float64Array;
  /** Index into theta of the profiled parameter. */
  index: number;
  ssrMin: number;
  /** Standard error of theta_index in the estimation space. */
  internalStdError: number;
  /** Linear interval in SI units (for the disagreement flag); null if unavailable. */
  linear: [number, number] | null;
  /** Grid multiples of the linear half-width; default [0.25, 0.5, 0.75, 1, 1.25, 1.5, 2, 2.5, 3, 4, 6, 8]. */
  grid?: number[];
  /**
   * Tangent of the profile trace at the estimate: d theta / d theta_index for every theta entry
   * (estimation space; see profileTangent). Absent: the first refit of a side starts from the
   * estimate itself.
   */
  tangent?: Float64Array;
  /**
   * Relative SSR reduction (ftol) at which a refit of the profile counts as converged; default
   * PROFILE_REFIT_FTOL (1e-8), or the fit's own ftol when that is looser.
   */
  refitFtol?: number;
}

/**
 * Convergence of the refits and of the crossing (stated tolerances). A refit stopped at ftol = 1e-8
 * leaves its SSR within about 1e-8 SSR of the profile minimum, which moves tau by
 * 1e-8 SSR / (2 s^2 tau) and so an interval end by under 1e-6 of a standard error at the 95% level
 * with up to about 200 observations (measured on the demo studies: every interval end unchanged to
 * 10 significant digits against ftol = 1e-12, with 35% fewer model evaluations). The crossing is
 * refined until |tau - tau*| <= 1e-8 max(1, tau*), an end within about 1e-8 standard errors.
 */
export const PROFILE_REFIT_FTOL = 1e-8;
const CROSSING_TAU_TOL = 1e-8;

const DEFAULT_GRID = [0.25, 0.5, 0.75, 1, 1.25, 1.5, 2, 2.5, 3, 4, 6, 8];

/**
 * Tangent of the profile trace of theta[freeIndex[k]] at the estimate from the covariance of the
 * free parameters (estimation space): C_ik / C_kk for free parameter i, 0 for fixed ones.
 */
export function profileTangent(covInternal: readonly (readonly number[])[], freeIndex: readonly number[], k: number, nTheta: number): Float64Array {
  const d = new Float64Array(nTheta);
  const ckk = covInternal[k][k];
  if (!(ckk > 0) || !Number.isFinite(ckk)) return d;
  freeIndex.forEach((j, i) => {
    const v = covInternal[i][k] / ckk;
    d[j] = Number.isFinite(v) ? v : 0;
  });
  return d;
}

/** A solved point of the profile trace: the held value and the full theta of the refit. */
interface TracePoint {
  t: number;
  theta: Float64Array;
}

/** The fixed numbers of one profile (see the file header). */
interface ProfileSetup {
  n: number;
  s2: number;
  threshold: number;
  tauThreshold: number;
  halfWidth: number;
  others: number[];
  theta0: number;
  lo: number;
  hi: number;
}

function profileSetup(req: ProfileRequest): ProfileSetup {
  const { prep, thetaHat, index, ssrMin } = req;
  const n = prep.model.nObservations;
  const dof = n - prep.freeIndex.length;
  const level = prep.options.level ?? 0.95;
  const sigmaKnown = prep.data.sigmaKnown;
  const s2 = sigmaKnown ? 1 : ssrMin / dof;
  const q = sigmaKnown ? chiSquareQuantile(level, 1) : fQuantile(level, 1, dof);
  const threshold = sigmaKnown ? ssrMin + q : ssrMin * (1 + q / dof);
  return {
    n,
    s2,
    threshold,
    tauThreshold: Math.sqrt((threshold - ssrMin) / s2),
    halfWidth: Math.sqrt(q) * req.internalStdError,
    others: prep.freeIndex.filter((j) => j !== index),
    theta0: thetaHat[index],
    lo: prep.lowerFull[index],
    hi: prep.upperFull[index],
  };
}

/** Refits along the profile of one parameter, each recorded as a point of the profile. */
class ProfileWalk {
  readonly points: ProfilePoint[];
  constructor(
    readonly req: ProfileRequest,
    readonly su: ProfileSetup,
  ) {
    this.points = [{ value: toExternal(req.prep.parameters[req.index], su.theta0), ssr: req.ssrMin, tau: 0 }];
  }

  /** The estimate as the first point of the trace. */
  origin(): TracePoint {
    return { t: this.su.theta0, theta: Float64Array.from(this.req.thetaHat) };
  }

  /** Theta predicted at t: from `from`, along `slope` (d theta / dt), inside the bounds; theta_index = t. */
  predict(from: TracePoint, slope: Float64Array | undefined, t: number): Float64Array {
    const th = Float64Array.from(from.theta);
    const { lowerFull, upperFull } = this.req.prep;
    if (slope) {
      for (const j of this.su.others) th[j] = Math.min(Math.max(from.theta[j] + (t - from.t) * slope[j], lowerFull[j]), upperFull[j]);
    }
    th[this.req.index] = t;
    return th;
  }

  /** Refit at t from the predicted start (retried from `from` when that fails); records the point. */
  refit(t: number, from: TracePoint, slope: Float64Array | undefined): (TracePoint & { ssr: number; tau: number }) | null {
    let r = this.solveAt(this.predict(from, slope, t));
    if (!r && slope) r = this.solveAt(this.predict(from, undefined, t));
    if (!r) return null;
    const { s2, theta0 } = this.su;
    const tau = Math.sign(t - theta0) * Math.sqrt(Math.max(0, r.ssr - this.req.ssrMin) / s2);
    this.points.push({ value: toExternal(this.req.prep.parameters[this.req.index], t), ssr: r.ssr, tau });
    return { t, theta: r.theta, ssr: r.ssr, tau };
  }

  /** Minimum SSR over the other free parameters from the start `th` (theta_index held); null on failure. */
  private solveAt(th: Float64Array): { ssr: number; theta: Float64Array } | null {
    const { prep } = this.req;
    const { others, n } = this.su;
    if (others.length === 0) {
      const r = new Float64Array(n);
      if (!makeProblem(prep, th, []).residuals(new Float64Array(0), r)) return null;
      let s = 0;
      for (let i = 0; i < n; i++) s += r[i] * r[i];
      return { ssr: s, theta: th };
    }
    const ftol = Math.max(this.req.refitFtol ?? PROFILE_REFIT_FTOL, prep.options.ftol ?? 0);
    const { result } = solveFree({ ...prep, options: { ...prep.options, ftol } }, th, others);
    if (!result.success) return null;
    others.forEach((j, k) => (th[j] = result.x[k]));
    return { ssr: result.ssr, theta: th };
  }
}

/** d theta / dt of the secant through two trace points. */
function secant(a: TracePoint, b: TracePoint): Float64Array {
  const d = new Float64Array(a.theta.length);
  const dt = b.t - a.t;
  for (let j = 0; j < d.length; j++) d[j] = (b.theta[j] - a.theta[j]) / dt;
  return d;
}

/** Walk one side of the grid until the profile crosses the threshold; the end and why. */
function walkSide(walk: ProfileWalk, dir: 1 | -1): [number | null, ProfileEnd] {
  const { su, req } = walk;
  let prev = walk.origin();
  let prevTau = 0;
  let slope = req.tangent;
  for (const c of req.grid ?? DEFAULT_GRID) {
    let t = su.theta0 + dir * c * su.halfWidth;
    const clamped = t < su.lo || t > su.hi;
    t = Math.min(Math.max(t, su.lo), su.hi);
    const pt = walk.refit(t, prev, slope);
    if (pt === null) return [null, 'refit-failed'];
    if (pt.ssr >= su.threshold) {
      const end = refineCrossing(walk, { ...prev, tau: prevTau }, pt, dir);
      return [end, end === null ? 'refit-failed' : 'crossed'];
    }
    if (clamped) return [null, 'bound'];
    slope = secant(prev, pt);
    prev = pt;
    prevTau = pt.tau;
  }
  return [null, 'search-range'];
}

/** Illinois regula falsi for |tau(t)| = tauThreshold between a (inside) and b (outside). */
function refineCrossing(walk: ProfileWalk, inside: TracePoint & { tau: number }, outside: TracePoint & { tau: number }, dir: 1 | -1): number | null {
  const { su } = walk;
  const target = dir * su.tauThreshold;
  let a = inside.t;
  let b = outside.t;
  let fa = inside.tau - target;
  let fb = outside.tau - target;
  const slope = secant(inside, outside);
  let side0 = 0;
  let t = b;
  for (let it = 0; it < 40; it++) {
    t = (a * fb - b * fa) / (fb - fa);
    if (!Number.isFinite(t)) return null;
    if (Math.abs(b - a) <= 1e-9 * Math.max(su.halfWidth, 1e-300)) break;
    const pt = walk.refit(t, inside, slope);
    if (pt === null) return null;
    const ft = pt.tau - target;
    if (Math.abs(ft) <= CROSSING_TAU_TOL * Math.max(1, su.tauThreshold)) break;
    if (ft * fb > 0) {
      b = t;
      fb = ft;
      if (side0 === -1) fa /= 2;
      side0 = -1;
    } else {
      a = t;
      fa = ft;
      if (side0 === 1) fb /= 2;
      side0 = 1;
    }
  }
  return t;
}

/** Profile one parameter; see the file header. */
export function profileParameter(req: ProfileRequest): ParameterProfile {
  const su = profileSetup(req);
  const walk = new ProfileWalk(req, su);
  const param = req.prep.parameters[req.index];
  const [down, downEnd] = su.halfWidth > 0 ? walkSide(walk, -1) : [null, 'refit-failed' as const];
  const [up, upEnd] = su.halfWidth > 0 ? walkSide(walk, 1) : [null, 'refit-failed' as const];
  const points = walk.points.sort((x, y) => x.value - y.value);
  const ext = (t: number | null): number | null => (t === null ? null : toExternal(param, t));
  const interval: [number | null, number | null] = [ext(down), ext(up)];
  let disagrees = true;
  if (req.linear && interval[0] !== null && interval[1] !== null) {
    const width = req.linear[1] - req.linear[0];
    disagrees = Math.abs(interval[0] - req.linear[0]) > 0.1 * width || Math.abs(interval[1] - req.linear[1]) > 0.1 * width;
  }
  return { name: param.name, threshold: su.threshold, points, interval, ends: [downEnd, upEnd], disagreesWithLinear: disagrees };
}
