/**
 * Model-discrimination criteria for a set of planned runs.
 *
 * Box-Hill: Box & Hill 1967, "Discrimination among mechanistic models", Technometrics 9, 57-71.
 * For one new observation y with rival predictions y_i, prediction variances sigma_i^2 and error
 * variance sigma^2 their criterion is
 *   D = sum_{i<j} P_i P_j [ (sigma_i^2 - sigma_j^2)^2 / ((sigma^2 + sigma_i^2)(sigma^2 + sigma_j^2))
 *                          + (y_i - y_j)^2 (1/(sigma^2 + sigma_i^2) + 1/(sigma^2 + sigma_j^2)) ],
 * where the bracket is twice the symmetric Kullback-Leibler (J-) divergence between the two
 * predictive normals N(y_i, sigma^2 + sigma_i^2) and N(y_j, sigma^2 + sigma_j^2). For several runs
 * and responses at once the bracket here is 2 J between the multivariate predictive normals
 * N(mu_i, V_i), V_i = Sigma + G_i C_i G_i' (Kullback 1959, "Information Theory and Statistics",
 * Wiley, ch. 9: J = 1/2 tr(V_i^-1 V_j + V_j^-1 V_i - 2 I) + 1/2 d' (V_i^-1 + V_j^-1) d, d = mu_i - mu_j),
 * so a planned run that repeats what another planned run already tells (through the shared
 * parameter uncertainty) adds little. For one run and one response it is exactly Box-Hill's D.
 *
 * Hunter-Reiner: Hunter & Reiner 1965, "Designs for discriminating between two rival models",
 * Technometrics 7, 307-323: maximise the squared difference of the rivals' predictions
 * (y_1 - y_2)^2; here summed over the planned observations in units of the measurement sigma and
 * over every pair of rivals. It ignores the prediction variances (the spacing rule spreads runs).
 *
 * Everything is evaluated in coordinates whitened by the measurement sigma (Sigma = I) with
 * U_i = G_i L_i (C_i = L_i L_i'), so every term is a sum over runs of small per-run blocks
 * (Woodbury identity: V_i^-1 = I - U_i (I + U_i'U_i)^-1 U_i'), and a design's value costs
 * O(p^3) whatever the number of runs.
 */
import { inverseSpd } from './criteria.js';

export type DiscriminationKind = 'box-hill' | 'hunter-reiner';

/** Per-candidate blocks of one pair of rivals (i < j). */
export interface PairBlocks {
  i: number;
  j: number;
  /** Per candidate: d'd with d = mu_i - mu_j whitened. */
  delta: Float64Array;
  /** Per candidate: U_i' d (p_i) and U_j' d (p_j). */
  wi: Float64Array[];
  wj: Float64Array[];
  /** Per candidate: U_i' U_j (p_i x p_j, row-major). */
  cross: Float64Array[];
}

/** Per-candidate blocks of every rival and pair. */
export interface DiscriminationBlocks {
  /** Free parameters per rival. */
  p: number[];
  /** Per rival, per candidate: U'U (p x p). */
  own: Float64Array[][];
  pairs: PairBlocks[];
  /** Prior probability of each rival. */
  prior: number[];
}

function sumBlocks(blocks: readonly Float64Array[], set: readonly number[], size: number): Float64Array {
  const out = new Float64Array(size);
  for (const c of set) {
    const b = blocks[c];
    for (let k = 0; k < size; k++) out[k] += b[k];
  }
  return out;
}

function trace(A: Float64Array, p: number): number {
  let s = 0;
  for (let a = 0; a < p; a++) s += A[a * p + a];
  return s;
}

/** tr(Ainv X) for p x p matrices. */
function traceProduct(Ainv: Float64Array, X: Float64Array, p: number): number {
  let s = 0;
  for (let a = 0; a < p; a++) for (let b = 0; b < p; b++) s += Ainv[a * p + b] * X[b * p + a];
  return s;
}

/** w' Ainv w. */
function quadratic(Ainv: Float64Array, w: Float64Array, p: number): number {
  let s = 0;
  for (let a = 0; a < p; a++) for (let b = 0; b < p; b++) s += w[a] * Ainv[a * p + b] * w[b];
  return s;
}

/** M M' (rows x rows) and M' M (cols x cols) of a rows x cols matrix. */
function grams(M: Float64Array, rows: number, cols: number): { mmT: Float64Array; mTm: Float64Array } {
  const mmT = new Float64Array(rows * rows);
  const mTm = new Float64Array(cols * cols);
  for (let a = 0; a < rows; a++) for (let b = 0; b < rows; b++) for (let k = 0; k < cols; k++) mmT[a * rows + b] += M[a * cols + k] * M[b * cols + k];
  for (let a = 0; a < cols; a++) for (let b = 0; b < cols; b++) for (let k = 0; k < rows; k++) mTm[a * cols + b] += M[k * cols + a] * M[k * cols + b];
  return { mmT, mTm };
}

/** I + B and its inverse. */
function inverseOfIdentityPlus(B: Float64Array, p: number): Float64Array {
  const A = Float64Array.from(B);
  for (let a = 0; a < p; a++) A[a * p + a] += 1;
  return inverseSpd(A, p) ?? new Float64Array(p * p);
}

/**
 * J-divergence between the rivals' predictive normals over the runs in `set` (whitened units).
 * `B`, `Ainv`: per rival, U'U summed over the set and (I + U'U)^-1.
 */
export function pairDivergence(pair: PairBlocks, set: readonly number[], p: number[], B: Float64Array[], Ainv: Float64Array[]): number {
  const { i, j } = pair;
  const pi = p[i];
  const pj = p[j];
  let delta = 0;
  for (const c of set) delta += pair.delta[c];
  const wi = sumBlocks(pair.wi, set, pi);
  const wj = sumBlocks(pair.wj, set, pj);
  const M = sumBlocks(pair.cross, set, pi * pj);
  const { mmT, mTm } = grams(M, pi, pj);
  const traces = trace(B[i], pi) + trace(B[j], pj) - traceProduct(Ainv[i], B[i], pi) - traceProduct(Ainv[j], B[j], pj) - traceProduct(Ainv[i], mmT, pi) - traceProduct(Ainv[j], mTm, pj);
  const means = 2 * delta - quadratic(Ainv[i], wi, pi) - quadratic(Ainv[j], wj, pj);
  return 0.5 * traces + 0.5 * means;
}

/** Value of the discrimination criterion for the candidates in `set` (larger is better). */
export function discriminationValue(kind: DiscriminationKind, b: DiscriminationBlocks, set: readonly number[]): number {
  if (kind === 'hunter-reiner') {
    let s = 0;
    for (const pair of b.pairs) for (const c of set) s += pair.delta[c];
    return s;
  }
  const B = b.own.map((blocks, m) => sumBlocks(blocks, set, b.p[m] * b.p[m]));
  const Ainv = B.map((Bm, m) => inverseOfIdentityPlus(Bm, b.p[m]));
  let s = 0;
  for (const pair of b.pairs) {
    const w = b.prior[pair.i] * b.prior[pair.j];
    if (w > 0) s += w * 2 * pairDivergence(pair, set, b.p, B, Ainv);
  }
  return s;
}
