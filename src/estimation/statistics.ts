/**
 * Linearised statistics of a least-squares fit at its solution (Bates & Watts 1988, "Nonlinear
 * Regression Analysis and Its Applications", Wiley, ch. 2-3; Seber & Wild 1989, ch. 2):
 *
 * - covariance in the estimation space: s^2 (J'J)^-1 with s^2 = SSR/(n - p) when sigma is estimated
 *   ('s2-scaled'), (J'J)^-1 when sigma is known ('known-sigma'); J is the weighted residual Jacobian.
 *   (J'J)^-1 comes from the SVD of the column-scaled J (numerics/svd.ts), never from forming J'J.
 * - leverage h_ii (hat-matrix diagonal), internally studentised residuals r_i / (s sqrt(1 - h_ii)),
 *   Cook's distance D_i = r_i^2 h_ii / (p s^2 (1 - h_ii)^2) (Cook 1977, Technometrics 19, 15-18);
 *   with known sigma, s = 1.
 * - lack of fit from replicate groups: pure-error SS about the weighted group means, F test
 *   (Draper & Smith 1998, "Applied Regression Analysis", 3rd ed., section 2.1).
 * - information criteria for a Gaussian likelihood with constants dropped: sigma estimated:
 *   AIC = n ln(SSR/n) + 2k, k = p + 1 (the variance counts); sigma known: AIC = SSR + 2k, k = p.
 *   AICc = AIC + 2k(k+1)/(n-k-1) (Hurvich & Tsai 1989, Biometrika 76, 297-307); BIC = ... + k ln n
 *   (Schwarz 1978). Only differences between models fitted to the same data mean anything.
 */
import { conditionNumber, leverages, normalInverse, svd, svdRank, type Svd } from '../numerics/svd.js';
import { fSurvival } from './distributions.js';
import type { LackOfFit } from './fit-types.js';

/** Cosine-free singularity threshold: column-scaled J with condition number above this is singular. */
export const SINGULAR_CONDITION = 1e12;

export interface JacobianAnalysis {
  /** Column norms of J. */
  columnNorms: Float64Array;
  /** SVD of the column-scaled J. */
  scaled: Svd;
  /** Numerical rank. */
  rank: number;
  /** Condition number of the column-scaled J'J (the square of that of J). */
  conditionNumber: number;
  /** Rank-deficient, a zero column, or condition of scaled J above SINGULAR_CONDITION. */
  singular: boolean;
  /** Unscaled (J'J)^-1, p x p row-major; null when singular. */
  normalInverse: Float64Array | null;
  /** Hat-matrix diagonal (length m). */
  leverage: Float64Array;
}

/** Column-scale J (m x p), decompose, and derive (J'J)^-1, the condition number and leverages. */
export function analyseJacobian(J: Float64Array, m: number, p: number): JacobianAnalysis {
  const columnNorms = new Float64Array(p);
  for (let j = 0; j < p; j++) {
    let s = 0;
    for (let i = 0; i < m; i++) s += J[i * p + j] ** 2;
    columnNorms[j] = Math.sqrt(s);
  }
  const Js = new Float64Array(m * p);
  for (let i = 0; i < m; i++) {
    for (let j = 0; j < p; j++) Js[i * p + j] = columnNorms[j] > 0 ? J[i * p + j] / columnNorms[j] : 0;
  }
  const d = svd(Js, m, p);
  const rank = svdRank(d);
  const condJ = conditionNumber(d);
  const zeroColumn = Array.from(columnNorms).some((c) => !(c > 0));
  const singular = p > 0 && (zeroColumn || rank < p || !(condJ <= SINGULAR_CONDITION) || m < p);
  let inv: Float64Array | null = null;
  if (!singular && p > 0) {
    const sInv = normalInverse(d, p);
    inv = new Float64Array(p * p);
    for (let i = 0; i < p; i++) for (let j = 0; j < p; j++) inv[i * p + j] = sInv[i * p + j] / (columnNorms[i] * columnNorms[j]);
  }
  return {
    columnNorms,
    scaled: d,
    rank,
    conditionNumber: p === 0 ? 1 : condJ * condJ,
    singular,
    normalInverse: inv,
    leverage: leverages(d, rank),
  };
}

/** Parameters (indices) that make up the most nearly singular direction of the scaled J. */
export function nullDirection(a: JacobianAnalysis): number[] {
  const p = a.scaled.n;
  if (p === 0) return [];
  const k = p - 1;
  const out: number[] = [];
  for (let j = 0; j < p; j++) if (Math.abs(a.scaled.V[j * p + k]) > 0.1) out.push(j);
  return out;
}

export interface ObservationStats {
  studentized: (number | null)[];
  cooks: (number | null)[];
}

/** Studentised residuals and Cook's distances; s = residual standard deviation (1 if sigma known). */
export function observationStats(r: Float64Array, leverage: Float64Array, s: number, p: number): ObservationStats {
  const studentized: (number | null)[] = [];
  const cooks: (number | null)[] = [];
  for (let i = 0; i < r.length; i++) {
    const h = Math.min(leverage[i], 1);
    const oneMinus = 1 - h;
    if (oneMinus <= 1e-12 || !(s > 0)) {
      studentized.push(null);
      cooks.push(null);
      continue;
    }
    studentized.push(r[i] / (s * Math.sqrt(oneMinus)));
    cooks.push(p > 0 ? (r[i] * r[i] * h) / (p * s * s * oneMinus * oneMinus) : 0);
  }
  return { studentized, cooks };
}

/**
 * Lack-of-fit F test from replicate groups. Returns null when there is no replicate (no pure-error
 * degrees of freedom) or no lack-of-fit degrees of freedom.
 */
export function lackOfFit(
  measured: Float64Array,
  sigma: Float64Array,
  groups: ReadonlyArray<string | number>,
  ssr: number,
  dof: number,
): LackOfFit | null {
  const sums = new Map<string | number, { w: number; wy: number; idx: number[] }>();
  for (let i = 0; i < measured.length; i++) {
    const w = 1 / (sigma[i] * sigma[i]);
    const g = sums.get(groups[i]) ?? { w: 0, wy: 0, idx: [] };
    g.w += w;
    g.wy += w * measured[i];
    g.idx.push(i);
    sums.set(groups[i], g);
  }
  let pure = 0;
  let dofPure = 0;
  for (const g of sums.values()) {
    const mean = g.wy / g.w;
    for (const i of g.idx) pure += (measured[i] - mean) ** 2 / (sigma[i] * sigma[i]);
    dofPure += g.idx.length - 1;
  }
  const dofLack = dof - dofPure;
  if (dofPure <= 0 || dofLack <= 0) return null;
  const lackSS = Math.max(0, ssr - pure);
  if (!(pure > 0)) return null;
  const F = lackSS / dofLack / (pure / dofPure);
  return { pureErrorSS: pure, dofPure, lackSS, dofLack, F, pValue: fSurvival(F, dofLack, dofPure) };
}

export interface InformationCriteria {
  aic: number;
  aicc: number | null;
  bic: number;
}

/** AIC, AICc and BIC for a Gaussian least-squares fit (see the header for the convention). */
export function informationCriteria(ssr: number, n: number, p: number, sigmaKnown: boolean): InformationCriteria {
  const k = sigmaKnown ? p : p + 1;
  const fitTerm = sigmaKnown ? ssr : n * Math.log(Math.max(ssr, Number.MIN_VALUE) / n);
  const aic = fitTerm + 2 * k;
  const aicc = n - k - 1 > 0 ? aic + (2 * k * (k + 1)) / (n - k - 1) : null;
  const bic = fitTerm + k * Math.log(n);
  return { aic, aicc, bic };
}
