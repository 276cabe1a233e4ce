/**
 * Distribution-free confidence interval of a quantile from order statistics. For n independent
 * draws sorted x_(1) <= ... <= x_(n) and the q-quantile xi_q of their distribution,
 *   P(x_(l) <= xi_q < x_(u)) = sum_{k=l}^{u-1} C(n, k) q^k (1 - q)^(n - k)
 * (the binomial argument for quantile intervals; W.J. Conover, Practical Nonparametric Statistics,
 * 3rd ed., Wiley 1999, sec. 3.2; reference from memory). The ranks grow outward from the one
 * nearest n q, one side at a time (the side with the larger next probability first), until the
 * coverage reaches the level or both ends are reached; the coverage achieved is returned with it.
 * Binomial probabilities from log-factorials (sums of logs), exact to rounding.
 */

/** ln k! for k = 0..n. */
function logFactorials(n: number): Float64Array {
  const lf = new Float64Array(n + 1);
  for (let k = 2; k <= n; k++) lf[k] = lf[k - 1] + Math.log(k);
  return lf;
}

/** Binomial probabilities P(K = k), k = 0..n, for n trials with success probability q (0 < q < 1). */
function binomialPmf(n: number, q: number): Float64Array {
  const lf = logFactorials(n);
  const lq = Math.log(q);
  const lr = Math.log1p(-q);
  return Float64Array.from({ length: n + 1 }, (_, k) => Math.exp(lf[n] - lf[k] - lf[n - k] + k * lq + (n - k) * lr));
}

/** Coverage of the rank interval [x_(l), x_(u)) (1-based ranks, l < u <= n + 1) for the q-quantile of n draws. */
export function binomialCoverage(n: number, q: number, l: number, u: number): number {
  const pmf = binomialPmf(n, q);
  let s = 0;
  for (let k = l; k <= u - 1; k++) s += pmf[k];
  return s;
}

export interface QuantileInterval {
  /** Confidence level asked for, fraction. */
  level: number;
  /** Ranks (1-based) of the lower and upper order statistics. */
  ranks: [number, number];
  lower: number;
  upper: number;
  /** Coverage achieved (at least `level` unless the sample is too small). */
  coverage: number;
}

/** The interval of the q-quantile from `sorted` (ascending, finite values); null with fewer than 2 values. */
export function quantileInterval(sorted: ArrayLike<number>, q: number, level = 0.95): QuantileInterval | null {
  const n = sorted.length;
  if (n < 2 || !(q > 0 && q < 1)) return null;
  const pmf = binomialPmf(n, q);
  // [x_(l), x_(u)) covers xi_q when l <= K <= u - 1 (K: draws below xi_q)
  let l = Math.min(Math.max(Math.round(n * q), 1), n - 1);
  let u = l + 1;
  let cov = pmf[l];
  while (cov < level && (l > 1 || u < n)) {
    const down = l > 1 ? pmf[l - 1] : -1;
    const up = u < n ? pmf[u] : -1;
    if (down >= up) cov += pmf[--l];
    else cov += pmf[u++];
  }
  return { level, ranks: [l, u], lower: sorted[l - 1], upper: sorted[u - 1], coverage: cov };
}
