/**
 * Lab arithmetic of gas analysis: mole fractions on a wet or dry basis, outlet flows from an
 * internal standard, conversion, selectivity, yield and element-balance closure.
 * Method: mole balance bookkeeping as practised with online gas chromatographs (common practice):
 *   dry basis      y_i,dry = y_i,wet / (1 - sum_{r removed} y_r,wet) = F_i / sum_{k kept} F_k
 *   standard       F_i = F_s,0 * y_i / y_s        (the inert s passes unchanged: F_s = F_s,0)
 *   conversion     X_A = 1 - (y_A / y_s) * (F_s,0 / F_A,0)
 *   selectivity    S_P/A = (F_P - F_P,0) / (F_A,0 - F_A) * |nu_A| / nu_P
 *   yield          Y_P/A = (F_P - F_P,0) / F_A,0 * |nu_A| / nu_P       (so Y = S * X)
 *   closure_e      = sum_k n_e,k F_k,out / sum_k n_e,k F_k,in
 * A ratio y_i / y_s is the same on either basis (the removed species cancel).
 * Pure functions on plain numbers; no units (fractions are mol/mol, flows mol/s).
 */

/** Mole fractions of the analysed stream from molar flows: removed species are not counted. */
export function fractionsFromFlows(F: ArrayLike<number>, removed: ArrayLike<boolean>): Float64Array {
  let total = 0;
  for (let k = 0; k < F.length; k++) if (!removed[k]) total += F[k];
  const out = new Float64Array(F.length);
  for (let k = 0; k < F.length; k++) out[k] = removed[k] ? 0 : F[k] / total;
  return out;
}

/**
 * Convert wet-basis fractions to the dry basis: removed species are dropped and the rest rescaled.
 * Fractions are flows over a common total, so this is fractionsFromFlows on the wet fractions.
 */
export function wetToDry(yWet: ArrayLike<number>, removed: ArrayLike<boolean>): Float64Array {
  return fractionsFromFlows(yWet, removed);
}

/** Outlet flow of a species from its fraction and the internal standard's fraction and feed flow. */
export function flowFromStandard(y: number, yStandard: number, standardFeed: number): number {
  return (standardFeed * y) / yStandard;
}

/** Conversion of reactant A from outlet fractions with an internal standard s. */
export function conversionFromStandard(yA: number, yStandard: number, feedA: number, standardFeed: number): number {
  return 1 - (yA / yStandard) * (standardFeed / feedA);
}

/** Selectivity of product P w.r.t. reactant A (molar, with factor |nu_A|/nu_P); NaN at zero conversion. */
export function selectivity(FP: number, FP0: number, FA: number, FA0: number, factor: number): number {
  return (factor * (FP - FP0)) / (FA0 - FA);
}

/** Yield of product P w.r.t. reactant A (molar, with factor |nu_A|/nu_P). */
export function yieldOf(FP: number, FP0: number, FA0: number, factor: number): number {
  return (factor * (FP - FP0)) / FA0;
}

/**
 * Closure of an element balance: atoms out over atoms in, over the species given (atoms[k] is the
 * number of atoms of the element in species k). 1 = closed; null when nothing enters.
 */
export function elementClosure(atoms: ArrayLike<number>, Fin: ArrayLike<number>, Fout: ArrayLike<number>): number | null {
  let a = 0;
  let b = 0;
  for (let k = 0; k < atoms.length; k++) {
    if (atoms[k] === 0) continue; // species without the element (their flow may be unknown)
    a += atoms[k] * Fout[k];
    b += atoms[k] * Fin[k];
  }
  return b > 0 ? a / b : null;
}

/** Stoichiometric factor |nu_A| / nu_P from the first reaction that consumes A and forms P; null if none. */
export function stoichiometricFactor(stoich: ArrayLike<number>, nS: number, product: number, reactant: number): number | null {
  const nR = stoich.length / nS;
  for (let i = 0; i < nR; i++) {
    const a = stoich[i * nS + reactant];
    const p = stoich[i * nS + product];
    if (a < 0 && p > 0) return -a / p;
  }
  return null;
}
