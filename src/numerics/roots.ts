/**
 * Scalar root finding: Brent's method (Brent, Algorithms for Minimization without Derivatives,
 * 1973, ch. 4, procedure zero: bisection safeguarding secant and inverse quadratic
 * interpolation), and `findAllRoots`, which scans an interval on a uniform grid for sign changes
 * and refines each bracket with Brent's method (for equilibrium conversions, multiple steady
 * states, sizing). A root where f touches zero without changing sign between grid points cannot
 * be bracketed; the scan then adds a 'possible-double-root' warning where |f| has a small local
 * minimum. Numerical trouble is a status, never a throw.
 */
import { outcome, type Outcome, type StatusTable, type Warning } from '../core/outcome.js';

export type BrentStatus = 'converged' | 'no-bracket' | 'max-iterations' | 'non-finite' | 'bad-input';

export const BRENT_STATUS: StatusTable<BrentStatus> = {
  converged: { success: true, message: 'root located' },
  'no-bracket': { success: false, message: 'f(a) and f(b) have the same sign; the interval does not bracket a root' },
  'max-iterations': { success: false, message: 'the root was not located within maxIterations' },
  'non-finite': { success: false, message: 'f returned a non-finite value' },
  'bad-input': { success: false, message: 'the root-finding input is invalid' },
};

export interface BrentOptions {
  /** Absolute tolerance on x (unit of x); default 1e-14 * max(|a|, |b|). */
  xtol?: number;
  /** Maximum iterations; default 200. */
  maxIterations?: number;
}

export interface BrentResult extends Outcome<BrentStatus> {
  /** Best estimate of the root (the bracket end with the smaller |f|). */
  x: number;
  fx: number;
  iterations: number;
  evaluations: number;
}

/**
 * Root of f in [a, b] with f(a) f(b) <= 0. The root is located to
 * 4 eps |x| + xtol / 2 (default xtol = 1e-14 * max(|a|, |b|)).
 */
export function brent(f: (x: number) => number, a: number, b: number, options: BrentOptions = {}): BrentResult {
  const maxIt = options.maxIterations ?? 200;
  let evaluations = 0;
  const res = (status: BrentStatus, x: number, fx: number, iterations: number, detail?: string): BrentResult => ({
    ...outcome(BRENT_STATUS, status, [], detail),
    x: Number.isFinite(x) ? x : 0,
    fx: Number.isFinite(fx) ? fx : 0,
    iterations,
    evaluations,
  });
  if (!Number.isFinite(a) || !Number.isFinite(b) || a === b) return res('bad-input', 0, 0, 0, `interval [${a}, ${b}]`);
  const xtol = options.xtol ?? 1e-14 * Math.max(Math.abs(a), Math.abs(b));
  if (!(xtol >= 0)) return res('bad-input', a, 0, 0, 'xtol must be non-negative');
  let fa = f(a);
  let fb = f(b);
  evaluations += 2;
  if (!Number.isFinite(fa)) return res('non-finite', a, 0, 0, `f(${a}) = ${fa}`);
  if (!Number.isFinite(fb)) return res('non-finite', b, 0, 0, `f(${b}) = ${fb}`);
  if (fa === 0) return res('converged', a, 0, 0);
  if (fb === 0) return res('converged', b, 0, 0);
  if ((fa > 0) === (fb > 0)) return res('no-bracket', Math.abs(fa) < Math.abs(fb) ? a : b, Math.min(Math.abs(fa), Math.abs(fb)), 0, `f(${a}) = ${fa}, f(${b}) = ${fb}`);
  let c = a;
  let fc = fa;
  let d = b - a;
  let e = d;
  for (let it = 1; it <= maxIt; it++) {
    if ((fb > 0) === (fc > 0)) {
      c = a;
      fc = fa;
      d = e = b - a;
    }
    if (Math.abs(fc) < Math.abs(fb)) {
      a = b;
      b = c;
      c = a;
      fa = fb;
      fb = fc;
      fc = fa;
    }
    const tol1 = 2 * Number.EPSILON * Math.abs(b) + 0.5 * xtol;
    const xm = 0.5 * (c - b);
    if (Math.abs(xm) <= tol1 || fb === 0) return res('converged', b, fb, it);
    if (Math.abs(e) >= tol1 && Math.abs(fa) > Math.abs(fb)) {
      const s = fb / fa;
      let p: number;
      let q: number;
      if (a === c) {
        p = 2 * xm * s; // secant
        q = 1 - s;
      } else {
        const qq = fa / fc; // inverse quadratic interpolation
        const r = fb / fc;
        p = s * (2 * xm * qq * (qq - r) - (b - a) * (r - 1));
        q = (qq - 1) * (r - 1) * (s - 1);
      }
      if (p > 0) q = -q;
      else p = -p;
      if (2 * p < Math.min(3 * xm * q - Math.abs(tol1 * q), Math.abs(e * q))) {
        e = d;
        d = p / q;
      } else {
        d = xm;
        e = d;
      }
    } else {
      d = xm;
      e = d;
    }
    a = b;
    fa = fb;
    b += Math.abs(d) > tol1 ? d : xm > 0 ? tol1 : -tol1;
    fb = f(b);
    evaluations++;
    if (!Number.isFinite(fb)) return res('non-finite', a, fa, it, `f(${b}) = ${fb}`);
  }
  return res('max-iterations', b, fb, maxIt);
}

export type AllRootsStatus = 'ok' | 'incomplete' | 'bad-input';

export const ALL_ROOTS_STATUS: StatusTable<AllRootsStatus> = {
  ok: { success: true, message: 'interval scanned; every sign change refined to a root' },
  incomplete: {
    success: false,
    message: 'roots may be missing: f was non-finite somewhere or a bracket failed to converge',
  },
  'bad-input': { success: false, message: 'the root-scan input is invalid' },
};

export interface AllRootsOptions {
  /** Number of uniform subintervals scanned for sign changes; default 200. */
  intervals?: number;
  /** Absolute x tolerance passed to Brent; default 1e-14 * max(|a|, |b|). */
  xtol?: number;
  /** Maximum Brent iterations per bracket; default 200. */
  maxIterations?: number;
}

export interface AllRootsResult extends Outcome<AllRootsStatus> {
  /** Roots in increasing order. */
  roots: number[];
  evaluations: number;
}

/** All roots of f on [a, b] that show a sign change on the scan grid (see file header). */
export function findAllRoots(f: (x: number) => number, a: number, b: number, options: AllRootsOptions = {}): AllRootsResult {
  const m = options.intervals ?? 200;
  if (!Number.isFinite(a) || !Number.isFinite(b) || !(a < b)) {
    return { ...outcome(ALL_ROOTS_STATUS, 'bad-input', [], `need finite a < b, got [${a}, ${b}]`), roots: [], evaluations: 0 };
  }
  if (!Number.isInteger(m) || m < 1) {
    return { ...outcome(ALL_ROOTS_STATUS, 'bad-input', [], `intervals must be a positive integer, got ${m}`), roots: [], evaluations: 0 };
  }
  const xtol = options.xtol ?? 1e-14 * Math.max(Math.abs(a), Math.abs(b));
  const xs = new Float64Array(m + 1);
  const fs = new Float64Array(m + 1);
  let evaluations = 0;
  const warnings: Warning[] = [];
  let incomplete = false;
  for (let i = 0; i <= m; i++) {
    xs[i] = i === m ? b : a + ((b - a) * i) / m;
    fs[i] = f(xs[i]);
    evaluations++;
  }
  const roots: number[] = [];
  const push = (r: number) => {
    if (roots.length === 0 || Math.abs(r - roots[roots.length - 1]) > 2 * xtol + 4 * Number.EPSILON * Math.abs(r)) roots.push(r);
  };
  let nonFinite = 0;
  for (let i = 0; i <= m; i++) {
    if (!Number.isFinite(fs[i])) {
      nonFinite++;
      continue;
    }
    if (fs[i] === 0) {
      push(xs[i]);
      continue;
    }
    if (i < m && Number.isFinite(fs[i + 1]) && fs[i + 1] !== 0 && (fs[i] > 0) !== (fs[i + 1] > 0)) {
      const r = brent(f, xs[i], xs[i + 1], { xtol, ...(options.maxIterations ? { maxIterations: options.maxIterations } : {}) });
      evaluations += r.evaluations;
      if (r.success) push(r.x);
      else {
        incomplete = true;
        warnings.push({ code: 'bracket-failed', message: `bracket [${xs[i]}, ${xs[i + 1]}]: ${r.message}` });
      }
    }
    // touching root: |f| has a local minimum much smaller than its neighbours without a sign change
    if (i > 0 && i < m && Number.isFinite(fs[i - 1]) && Number.isFinite(fs[i + 1])) {
      const sameSign = (fs[i - 1] > 0) === (fs[i] > 0) && (fs[i + 1] > 0) === (fs[i] > 0);
      const af = Math.abs(fs[i]);
      if (sameSign && af < Math.abs(fs[i - 1]) && af < Math.abs(fs[i + 1]) && af < 1e-3 * Math.max(Math.abs(fs[i - 1]), Math.abs(fs[i + 1]))) {
        warnings.push({ code: 'possible-double-root', message: `|f| has a sharp local minimum ${af.toExponential(2)} near x = ${xs[i]} without a sign change` });
      }
    }
  }
  if (nonFinite > 0) {
    incomplete = true;
    warnings.push({ code: 'non-finite', message: `f was non-finite at ${nonFinite} of ${m + 1} scan points; roots there cannot be found` });
  }
  return { ...outcome(ALL_ROOTS_STATUS, incomplete ? 'incomplete' : 'ok', warnings), roots, evaluations };
}
