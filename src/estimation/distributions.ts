/**
 * Student t, F and chi-square distribution functions and their quantiles, for confidence
 * intervals, lack-of-fit and nested-model tests.
 *
 * Method: log-gamma by the Lanczos approximation (g = 7, 9 terms; Lanczos 1964, SIAM J. Numer. Anal.
 * B1, 86-96); the regularised incomplete beta function by its continued fraction evaluated with the
 * modified Lentz algorithm, and the regularised incomplete gamma function by its series / continued
 * fraction (both as in Press et al., Numerical Recipes, 3rd ed., sections 6.2 and 6.4); quantiles by
 * bracketing and bisection on the CDF to full double precision (slow but robust; these are called a
 * handful of times per fit). Tested against SciPy (tests/reference/scipy/distributions.py).
 */
import { RateloomError } from '../core/errors.js';

const LANCZOS = [
  0.99999999999980993, 676.5203681218851, -1259.1392167224028, 771.32342877765313,
  -176.61502916214059, 12.507343278686905, -0.13857109526572012, 9.9843695780195716e-6,
  1.5056327351493116e-7,
];

/** ln Gamma(x) for x > 0. */
export function logGamma(x: number): number {
  if (x < 0.5) return Math.log(Math.PI / Math.abs(Math.sin(Math.PI * x))) - logGamma(1 - x);
  const z = x - 1;
  let a = LANCZOS[0];
  const t = z + 7.5;
  for (let i = 1; i < 9; i++) a += LANCZOS[i] / (z + i);
  return 0.5 * Math.log(2 * Math.PI) + (z + 0.5) * Math.log(t) - t + Math.log(a);
}

function betaContinuedFraction(a: number, b: number, x: number): number {
  const tiny = 1e-300;
  const qab = a + b;
  const qap = a + 1;
  const qam = a - 1;
  let c = 1;
  let d = 1 - (qab * x) / qap;
  if (Math.abs(d) < tiny) d = tiny;
  d = 1 / d;
  let h = d;
  for (let m = 1; m <= 1000; m++) {
    const m2 = 2 * m;
    let aa = (m * (b - m) * x) / ((qam + m2) * (a + m2));
    d = 1 + aa * d;
    if (Math.abs(d) < tiny) d = tiny;
    c = 1 + aa / c;
    if (Math.abs(c) < tiny) c = tiny;
    d = 1 / d;
    h *= d * c;
    aa = (-(a + m) * (qab + m) * x) / ((a + m2) * (qap + m2));
    d = 1 + aa * d;
    if (Math.abs(d) < tiny) d = tiny;
    c = 1 + aa / c;
    if (Math.abs(c) < tiny) c = tiny;
    d = 1 / d;
    const del = d * c;
    h *= del;
    if (Math.abs(del - 1) < 1e-16) break;
  }
  return h;
}

/** Regularised incomplete beta I_x(a, b), a, b > 0, 0 <= x <= 1. */
export function incompleteBeta(x: number, a: number, b: number): number {
  if (x <= 0) return 0;
  if (x >= 1) return 1;
  const lbt = logGamma(a + b) - logGamma(a) - logGamma(b) + a * Math.log(x) + b * Math.log1p(-x);
  const bt = Math.exp(lbt);
  if (x < (a + 1) / (a + b + 2)) return (bt * betaContinuedFraction(a, b, x)) / a;
  return 1 - (bt * betaContinuedFraction(b, a, 1 - x)) / b;
}

/**
 * Continued fraction of the upper incomplete gamma function for x >= a + 1 (modified Lentz
 * method): Q(a, x) = exp(-x) x^a / Gamma(a) * h.
 */
function gammaContinuedFraction(a: number, x: number): number {
  const tiny = 1e-300;
  let b = x + 1 - a;
  let c = 1 / tiny;
  let d = 1 / b;
  let h = d;
  for (let i = 1; i < 10000; i++) {
    const an = -i * (i - a);
    b += 2;
    d = an * d + b;
    if (Math.abs(d) < tiny) d = tiny;
    c = b + an / c;
    if (Math.abs(c) < tiny) c = tiny;
    d = 1 / d;
    const del = d * c;
    h *= del;
    if (Math.abs(del - 1) < 1e-16) break;
  }
  return h;
}

/** Regularised lower incomplete gamma P(a, x), a > 0, x >= 0. */
export function incompleteGamma(a: number, x: number): number {
  if (x <= 0) return 0;
  const gln = logGamma(a);
  if (x < a + 1) {
    let ap = a;
    let sum = 1 / a;
    let del = sum;
    for (let n = 0; n < 10000; n++) {
      ap += 1;
      del *= x / ap;
      sum += del;
      if (Math.abs(del) < Math.abs(sum) * 1e-17) break;
    }
    return sum * Math.exp(-x + a * Math.log(x) - gln);
  }
  return 1 - Math.exp(-x + a * Math.log(x) - gln) * gammaContinuedFraction(a, x);
}

function checkDof(name: string, v: number): void {
  if (!(v > 0) || !Number.isFinite(v)) {
    throw new RateloomError('E_VALUE', `${name} must be a positive finite number of degrees of freedom, got ${v}`, {
      path: [name],
    });
  }
}

function checkProb(p: number): void {
  if (!(p > 0 && p < 1)) {
    throw new RateloomError('E_VALUE', `probability must lie strictly between 0 and 1, got ${p}`, { path: ['p'] });
  }
}

/** Student t CDF P(T <= t) with `dof` degrees of freedom. */
export function studentTCdf(t: number, dof: number): number {
  checkDof('dof', dof);
  if (t === 0) return 0.5;
  const tail = 0.5 * incompleteBeta(dof / (dof + t * t), dof / 2, 0.5);
  return t > 0 ? 1 - tail : tail;
}

/** F CDF P(X <= x) with d1, d2 degrees of freedom. */
export function fCdf(x: number, d1: number, d2: number): number {
  checkDof('d1', d1);
  checkDof('d2', d2);
  if (x <= 0) return 0;
  return incompleteBeta((d1 * x) / (d1 * x + d2), d1 / 2, d2 / 2);
}

/** Upper tail P(X > x) of the F distribution, computed without cancellation. */
export function fSurvival(x: number, d1: number, d2: number): number {
  checkDof('d1', d1);
  checkDof('d2', d2);
  if (x <= 0) return 1;
  return incompleteBeta(d2 / (d2 + d1 * x), d2 / 2, d1 / 2);
}

/** Chi-square CDF P(X <= x) with k degrees of freedom. */
export function chiSquareCdf(x: number, k: number): number {
  checkDof('k', k);
  return x <= 0 ? 0 : incompleteGamma(k / 2, x / 2);
}

/** Standard normal CDF. */
export function normalCdf(z: number): number {
  // P(Z <= z) = P(chi2_1 <= z^2)/2 + 1/2 for z >= 0.
  const tail = 0.5 * upperGamma(0.5, (z * z) / 2);
  return z >= 0 ? 1 - tail : tail;
}

/** Invert a monotone CDF on [0, inf) (or symmetric on R) by bracketing and bisection. */
function invertPositive(cdf: (x: number) => number, p: number): number {
  let lo = 0;
  let hi = 1;
  while (cdf(hi) < p) {
    lo = hi;
    hi *= 2;
    if (hi > 1e300) return hi;
  }
  for (let i = 0; i < 2000; i++) {
    const mid = 0.5 * (lo + hi);
    if (mid === lo || mid === hi) break;
    if (cdf(mid) < p) lo = mid;
    else hi = mid;
  }
  return 0.5 * (lo + hi);
}

/** Solve tail(x) = q for x >= 0 where tail decreases from tail(0) >= q towards 0. */
function invertTail(tail: (x: number) => number, q: number): number {
  let lo = 0;
  let hi = 1;
  while (tail(hi) > q) {
    lo = hi;
    hi *= 2;
    if (hi > 1e300) return hi;
  }
  for (let i = 0; i < 2000; i++) {
    const mid = 0.5 * (lo + hi);
    if (mid === lo || mid === hi) break;
    if (tail(mid) > q) lo = mid;
    else hi = mid;
  }
  return 0.5 * (lo + hi);
}

/** Quantile of Student's t: the t with P(T <= t) = p. */
export function studentTQuantile(p: number, dof: number): number {
  checkProb(p);
  checkDof('dof', dof);
  if (p === 0.5) return 0;
  // Solve the smaller tail q = min(p, 1 - p) directly, so tiny tails keep full precision.
  const q = p < 0.5 ? p : 1 - p;
  const t = invertTail((x) => 0.5 * incompleteBeta(dof / (dof + x * x), dof / 2, 0.5), q);
  return p < 0.5 ? -t : t;
}

/** Quantile of the F distribution with d1, d2 degrees of freedom. */
export function fQuantile(p: number, d1: number, d2: number): number {
  checkProb(p);
  return invertPositive((x) => fCdf(x, d1, d2), p);
}

/** Quantile of the chi-square distribution with k degrees of freedom. */
export function chiSquareQuantile(p: number, k: number): number {
  checkProb(p);
  return invertPositive((x) => chiSquareCdf(x, k), p);
}

/** Regularised upper incomplete gamma Q(a, x) = 1 - P(a, x), accurate in the far tail. */
function upperGamma(a: number, x: number): number {
  if (x < a + 1) return 1 - incompleteGamma(a, x);
  return Math.exp(-x + a * Math.log(x) - logGamma(a)) * gammaContinuedFraction(a, x);
}

/** Quantile of the standard normal distribution. */
export function normalQuantile(p: number): number {
  checkProb(p);
  if (p === 0.5) return 0;
  const q = p < 0.5 ? p : 1 - p;
  // P(Z > z) = Q(1/2, z^2/2) / 2 for z >= 0.
  const z = invertTail((x) => 0.5 * upperGamma(0.5, (x * x) / 2), q);
  return p < 0.5 ? -z : z;
}
