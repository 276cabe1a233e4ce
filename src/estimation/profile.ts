/**
 * Profile-likelihood confidence intervals (Bates & Watts 1988, "Nonlinear Regression Analysis and
 * Its Applications", Wiley, section 6.1; Venzon & Moolgavkar 1988, Appl. Statist. 37, 87-94).
 *
 * For each free parameter theta_j: hold it at values on a grid stepping out from the estimate (in
 * the estimation space, in fractions of the linear half-width), refit the others (warm-started from
 * the previous grid point), and find where the profile sum of squares crosses
 *   SSR(theta_j) = SSR_min (1 + F(1, n - p; level) / (n - p))   when sigma is estimated,
 *   SSR(theta_j) = SSR_min + chi2(1; level)                       when sigma is known.
 * The crossing is refined by regula falsi (Illinois variant) on the signed root
 * tau = sign(theta - theta_hat) sqrt(SSR - SSR_min) / s, which is exactly linear in theta for a
 * linear model, so profile and linear intervals then coincide. An end that does not cross within the
 * search range, before a bound, or because a refit failed is reported as null (open), never as a
 * number, and `ends` says which of these happened.
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
}

const DEFAULT_GRID = [0.25, 0.5, 0.75, 1, 1.25, 1.5, 2, 2.5, 3, 4, 6, 8];

/** Profile one parameter; see the file header. */
export function profileParameter(req: ProfileRequest): ParameterProfile {
  const { prep, thetaHat, index, ssrMin } = req;
  const n = prep.model.nObservations;
  const p = prep.freeIndex.length;
  const dof = n - p;
  const level = prep.options.level ?? 0.95;
  const sigmaKnown = prep.data.sigmaKnown;
  const param = prep.parameters[index];
  const s2 = sigmaKnown ? 1 : ssrMin / dof;
  const q = sigmaKnown ? chiSquareQuantile(level, 1) : fQuantile(level, 1, dof);
  const threshold = sigmaKnown ? ssrMin + q : ssrMin * (1 + q / dof);
  const tauThreshold = Math.sqrt((threshold - ssrMin) / s2);
  const halfWidth = Math.sqrt(q) * req.internalStdError;
  const others = prep.freeIndex.filter((j) => j !== index);
  const theta0 = thetaHat[index];
  const points: ProfilePoint[] = [{ value: toExternal(param, theta0), ssr: ssrMin, tau: 0 }];
  const lo = prep.lowerFull[index];
  const hi = prep.upperFull[index];

  let warm = Float64Array.from(thetaHat);
  const profileSsr = (t: number): number | null => {
    const th = Float64Array.from(warm);
    th[index] = t;
    if (others.length === 0) {
      const prob = makeProblem(prep, th, []);
      const r = new Float64Array(n);
      if (!prob.residuals(new Float64Array(0), r)) return null;
      let s = 0;
      for (let i = 0; i < n; i++) s += r[i] * r[i];
      return s;
    }
    const { result } = solveFree(prep, th, others);
    if (!result.success) return null;
    const next = Float64Array.from(th);
    others.forEach((j, k) => (next[j] = result.x[k]));
    warm = next;
    return result.ssr;
  };
  const tauOf = (t: number, ssr: number): number => Math.sign(t - theta0) * Math.sqrt(Math.max(0, ssr - ssrMin) / s2);

  const side = (dir: 1 | -1): [number | null, ProfileEnd] => {
    warm = Float64Array.from(thetaHat);
    let prevT = theta0;
    let prevTau = 0;
    for (const c of req.grid ?? DEFAULT_GRID) {
      let t = theta0 + dir * c * halfWidth;
      let clamped = false;
      if (t < lo) {
        t = lo;
        clamped = true;
      }
      if (t > hi) {
        t = hi;
        clamped = true;
      }
      const ssr = profileSsr(t);
      if (ssr === null) return [null, 'refit-failed'];
      const tau = tauOf(t, ssr);
      points.push({ value: toExternal(param, t), ssr, tau });
      if (ssr >= threshold) {
        const end = refine(prevT, prevTau, t, tau, dir);
        return [end, end === null ? 'refit-failed' : 'crossed'];
      }
      if (clamped) return [null, 'bound'];
      prevT = t;
      prevTau = tau;
    }
    return [null, 'search-range'];
  };

  /** Illinois regula falsi for |tau(t)| = tauThreshold between a (inside) and b (outside). */
  const refine = (a: number, ta: number, b: number, tb: number, dir: 1 | -1): number | null => {
    const target = dir * tauThreshold;
    let fa = ta - target;
    let fb = tb - target;
    let side0 = 0;
    let t = b;
    const saved = Float64Array.from(warm);
    for (let it = 0; it < 40; it++) {
      t = (a * fb - b * fa) / (fb - fa);
      if (!Number.isFinite(t)) return null;
      if (Math.abs(b - a) <= 1e-9 * Math.max(halfWidth, 1e-300)) break;
      warm = Float64Array.from(saved);
      const ssr = profileSsr(t);
      if (ssr === null) return null;
      const tau = tauOf(t, ssr);
      points.push({ value: toExternal(param, t), ssr, tau });
      const ft = tau - target;
      if (Math.abs(ft) <= 1e-10 * Math.max(1, tauThreshold)) break;
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
  };

  const [down, downEnd] = halfWidth > 0 ? side(-1) : [null, 'refit-failed' as const];
  const [up, upEnd] = halfWidth > 0 ? side(1) : [null, 'refit-failed' as const];
  points.sort((x, y) => x.value - y.value);
  const ext = (t: number | null): number | null => (t === null ? null : toExternal(param, t));
  const interval: [number | null, number | null] = [ext(down), ext(up)];
  let disagrees = true;
  if (req.linear && interval[0] !== null && interval[1] !== null) {
    const width = req.linear[1] - req.linear[0];
    disagrees = Math.abs(interval[0] - req.linear[0]) > 0.1 * width || Math.abs(interval[1] - req.linear[1]) > 0.1 * width;
  }
  return { name: param.name, threshold, points, interval, ends: [downEnd, upEnd], disagreesWithLinear: disagrees };
}
