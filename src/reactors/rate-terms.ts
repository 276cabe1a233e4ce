/**
 * Net species rates from reaction rates through the stoichiometric matrix, with per-reaction
 * weights that carry the rate basis into the reactor's balance coordinate:
 *   R_j = sum_i nu_ij w_i r_i,   dR_j/dC_k = sum_i nu_ij w_i dr_i/dC_k,
 *   dR_j/dtheta_k = sum_i nu_ij w_i dr_i/dtheta_k.
 * Method: relative rates from stoichiometry (mole balance bookkeeping); no external reference.
 * All buffers are allocated once in the constructor; the methods do not allocate.
 */
import type { CompiledKinetics } from '../kinetics/compiled.js';

/**
 * out (nS x ncol) = nu^T diag(w) src, with src a reaction-level matrix (nR x ncol) and nu the
 * stoichiometric matrix (nR x nS). Plain loops (no TypedArray.fill: at these sizes it costs more
 * than the product); skips zero weights and zero coefficients.
 */
export function speciesFromReactions(nu: Float64Array, w: Float64Array, src: Float64Array, nR: number, nS: number, ncol: number, out: Float64Array): void {
  for (let q = 0; q < nS * ncol; q++) out[q] = 0;
  for (let i = 0; i < nR; i++) {
    const wi = w[i];
    if (wi === 0) continue;
    const rowS = i * nS;
    const rowC = i * ncol;
    for (let j = 0; j < nS; j++) {
      const c = nu[rowS + j] * wi;
      if (c === 0) continue;
      const o = j * ncol;
      for (let k = 0; k < ncol; k++) out[o + k] += c * src[rowC + k];
    }
  }
}

export class RateTerms {
  readonly nS: number;
  readonly nR: number;
  readonly nP: number;
  /** Reaction rates from the last `net` call. */
  readonly r: Float64Array;
  private readonly jc: Float64Array;
  private readonly jp: Float64Array;

  constructor(readonly kinetics: CompiledKinetics) {
    this.nS = kinetics.speciesNames.length;
    this.nR = kinetics.reactionIds.length;
    this.nP = kinetics.parameterNames.length;
    this.r = new Float64Array(this.nR);
    this.jc = new Float64Array(this.nR * this.nS);
    this.jp = new Float64Array(this.nR * this.nP);
  }

  /** R (length nS) = nu^T diag(w) r(C). Leaves r(C) in `this.r`. */
  net(C: Float64Array, T: number, theta: Float64Array, w: Float64Array, out: Float64Array): void {
    const { nS, nR, r } = this;
    const nu = this.kinetics.stoich;
    this.kinetics.rates(C, T, theta, r);
    out.fill(0, 0, nS);
    for (let i = 0; i < nR; i++) {
      const wr = w[i] * r[i];
      if (wr === 0) continue;
      const row = i * nS;
      for (let j = 0; j < nS; j++) out[j] += nu[row + j] * wr;
    }
  }

  /** Weighted net rate from the rates already in `this.r` (no kinetics call). */
  netFromLast(w: Float64Array, out: Float64Array): void {
    const { nS, nR, r } = this;
    const nu = this.kinetics.stoich;
    out.fill(0, 0, nS);
    for (let i = 0; i < nR; i++) {
      const wr = w[i] * r[i];
      if (wr === 0) continue;
      const row = i * nS;
      for (let j = 0; j < nS; j++) out[j] += nu[row + j] * wr;
    }
  }

  /** dR/dC (nS x nS row-major) = nu^T diag(w) dr/dC. */
  jacC(C: Float64Array, T: number, theta: Float64Array, w: Float64Array, out: Float64Array): void {
    this.kinetics.ratesJacC(C, T, theta, this.jc);
    speciesFromReactions(this.kinetics.stoich, w, this.jc, this.nR, this.nS, this.nS, out);
  }

  /** dR/dtheta (nS x nP row-major) = nu^T diag(w) dr/dtheta. */
  jacP(C: Float64Array, T: number, theta: Float64Array, w: Float64Array, out: Float64Array): void {
    this.kinetics.ratesJacP(C, T, theta, this.jp);
    speciesFromReactions(this.kinetics.stoich, w, this.jp, this.nR, this.nS, this.nP, out);
  }
}
