/**
 * Optimal-design criteria on a Fisher information matrix F (p x p, row-major, symmetric):
 *   D:  log det F                                   (maximise the determinant; Wald 1943, Kiefer 1959)
 *   Ds: -log det (F^-1)_ss for a parameter subset s  (Ds-optimality; Atkinson, Donev & Tobias 2007,
 *       "Optimum Experimental Designs, with SAS", Oxford, ch. 10)
 *   A:  -sum_i w_i (F^-1)_ii                         (weighted A-optimality, same book ch. 10; the
 *       weights are 1 / today's variance, so the criterion is free of units: it is the mean ratio
 *       of variance after to variance now, negated).
 * Every criterion is "larger is better" and -Infinity for a singular F.
 */
import { cholesky } from '../design/random.js';

export type CriterionKind = 'D' | 'Ds' | 'A';

export interface Criterion {
  kind: CriterionKind;
  /** Ds: indices (into the free parameters) of the parameters of interest. */
  subset?: readonly number[];
  /** A: weight of each free parameter's variance; default 1. */
  weights?: Float64Array;
}

/** log det of a symmetric positive definite matrix; -Infinity when it is not positive definite. */
export function logDetSpd(F: ArrayLike<number>, p: number): number {
  const L = cholesky(F, p);
  if (!L) return -Infinity;
  let s = 0;
  for (let i = 0; i < p; i++) {
    const d = L[i * p + i];
    if (!(d > 0)) return -Infinity;
    s += 2 * Math.log(d);
  }
  return s;
}

/** Inverse of a symmetric positive definite matrix through its Cholesky factor; null when singular. */
export function inverseSpd(F: ArrayLike<number>, p: number): Float64Array | null {
  const L = cholesky(F, p);
  if (!L) return null;
  for (let i = 0; i < p; i++) if (!(L[i * p + i] > 0)) return null;
  const inv = new Float64Array(p * p);
  const col = new Float64Array(p);
  for (let j = 0; j < p; j++) {
    // Solve L y = e_j, then L' x = y.
    for (let i = 0; i < p; i++) {
      let s = i === j ? 1 : 0;
      for (let k = 0; k < i; k++) s -= L[i * p + k] * col[k];
      col[i] = s / L[i * p + i];
    }
    for (let i = p - 1; i >= 0; i--) {
      let s = col[i];
      for (let k = i + 1; k < p; k++) s -= L[k * p + i] * col[k];
      col[i] = s / L[i * p + i];
    }
    for (let i = 0; i < p; i++) inv[i * p + j] = col[i];
  }
  return inv;
}

/** Value of a criterion at F (larger is better; -Infinity when F is singular). */
export function criterionValue(F: ArrayLike<number>, p: number, c: Criterion): number {
  if (c.kind === 'D') return logDetSpd(F, p);
  const inv = inverseSpd(F, p);
  if (!inv) return -Infinity;
  if (c.kind === 'A') {
    let s = 0;
    for (let i = 0; i < p; i++) s += (c.weights ? c.weights[i] : 1) * inv[i * p + i];
    return -s;
  }
  const s = c.subset ?? [];
  const q = s.length;
  const sub = new Float64Array(q * q);
  for (let a = 0; a < q; a++) for (let b = 0; b < q; b++) sub[a * q + b] = inv[s[a] * p + s[b]];
  const ld = logDetSpd(sub, q);
  return Number.isFinite(ld) ? -ld : -Infinity;
}
