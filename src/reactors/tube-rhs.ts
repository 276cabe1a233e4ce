/**
 * The right-hand side of the tube balances (flow-tube.ts), specialised for one compiled kinetics:
 *
 *   C_j = C_T0 (F_j / F_T) p (gas) or F_j / v0 (liquid),  a_i = w_i r_i(C),
 *   dF_j/dx = sum_i nu_ij a_i [- k_j (C_j - C_sweep,j)],  dp/dx = -alpha / (2 p) (F_T / F_T0).
 *
 * Method: the mole balances of an ideal plug-flow reactor with the Ergun pressure-drop relation in
 * its differential form (Ergun 1952, common design form). The stoichiometric sum is written out
 * over the non-zero coefficients only (a sparse stoichiometry list, fixed per kinetics), the
 * concentrations go straight into the kinetics input buffer and the kinetics is called once.
 * The function is generated once per kinetics and variant (gas or liquid, with or without
 * permeation) with `new Function`, so that each kinetics has its own call site of
 * `kinetics.rates`: one shared closure would see every kinetics of the process and stop inlining.
 * The generated text holds only numbers formatted here (array indices and stoichiometric
 * coefficients, which String() prints so that they read back exactly) and fixed identifiers;
 * nothing from user input is pasted in. The operations and their order are those of the generic
 * loop (sum_j F_j left to right, nu_ij a_i accumulated in reaction order), so the result is the
 * same to the last bit.
 */
import type { CompiledKinetics } from '../kinetics/compiled.js';
import type { OdeRhs } from '../numerics/ode-types.js';

/** The per-run values the generated right-hand side reads on every call (set before each solve). */
export interface TubeRhsState {
  /** Inlet total concentration C_T0, mol/m3 (gas). */
  cT0: number;
  /** Inlet total molar flow F_T0, mol/s (gas). */
  FT0: number;
  /** Pressure-drop parameter alpha, 1/kg or 1/m3 (gas; 0 for none). */
  alpha: number;
  /** Temperature, K. */
  T: number;
  /** 1 / v0, s/m3 (liquid). */
  invV0: number;
  /** Per-reaction basis weights (length nR). */
  weights: Float64Array;
  /** Permeation coefficients, 1/s (length nS; membrane only). */
  perm: Float64Array;
  /** Sweep-side concentrations, mol/m3 (length nS; membrane only). */
  sweep: Float64Array;
  /** Kinetic parameters (physical values, length nP). */
  theta: Float64Array;
}

/** A number as JavaScript source that reads back to the same double. */
function lit(v: number): string {
  if (!Number.isFinite(v)) throw new RangeError(`tube-rhs: stoichiometric coefficient ${v} is not finite`);
  return `(${String(v)})`;
}

/** Source of the body of the specialised right-hand side (exported for tests and inspection). */
export function tubeRhsSource(kinetics: CompiledKinetics, gas: boolean, membrane: boolean): string {
  const nS = kinetics.speciesNames.length;
  const nR = kinetics.reactionIds.length;
  const nu = kinetics.stoich;
  const L: string[] = ['"use strict";', 'return function tubeRhs(x, y, out) {', '  const s = state;'];
  if (gas) {
    const sum = Array.from({ length: nS }, (_, j) => `y[${j}]`).join(' + ');
    L.push(`  const FT = ${nS > 0 ? sum : '0'};`);
    L.push(`  const f = FT > 0 ? (s.cT0 * y[${nS}]) / FT : 0;`);
    for (let j = 0; j < nS; j++) L.push(`  C[${j}] = f * y[${j}];`);
  } else {
    L.push('  const iv = s.invV0;');
    for (let j = 0; j < nS; j++) L.push(`  C[${j}] = y[${j}] * iv;`);
  }
  L.push('  kin.rates(C, s.T, s.theta, r);');
  L.push('  const w = s.weights;');
  const used = new Set<number>();
  for (let i = 0; i < nR; i++) for (let j = 0; j < nS; j++) if (nu[i * nS + j] !== 0) used.add(i);
  for (const i of used) L.push(`  const a${i} = w[${i}] * r[${i}];`);
  for (let j = 0; j < nS; j++) {
    let e = '';
    for (let i = 0; i < nR; i++) {
      const c = nu[i * nS + j];
      if (c === 0) continue;
      const term = c === 1 ? `a${i}` : `${lit(c)} * a${i}`;
      if (e === '') e = c === -1 ? `-a${i}` : term;
      else e += c === -1 ? ` - a${i}` : ` + ${term}`;
    }
    L.push(`  out[${j}] = ${e === '' ? '0' : e};`);
  }
  if (membrane) {
    L.push('  const pm = s.perm;', '  const sw = s.sweep;');
    for (let j = 0; j < nS; j++) L.push(`  out[${j}] -= pm[${j}] * (C[${j}] - sw[${j}]);`);
  }
  if (gas) {
    L.push(`  const yp = y[${nS}];`, '  const p = yp > 1e-12 ? yp : 1e-12;', '  const alpha = s.alpha;');
    L.push(`  out[${nS}] = alpha === 0 ? 0 : (-alpha / (2 * p)) * (FT / s.FT0);`);
  }
  L.push('};');
  return L.join('\n');
}

/**
 * The specialised right-hand side for `kinetics`: reads the run from `state` on every call and
 * uses `C` (nS) and `r` (nR) as its work buffers; allocates nothing per call.
 */
export function makeTubeRhs(
  kinetics: CompiledKinetics,
  gas: boolean,
  membrane: boolean,
  state: TubeRhsState,
  C: Float64Array,
  r: Float64Array,
): OdeRhs {
  const factory = new Function('state', 'kin', 'C', 'r', tubeRhsSource(kinetics, gas, membrane)) as (
    state: TubeRhsState,
    kin: CompiledKinetics,
    C: Float64Array,
    r: Float64Array,
  ) => OdeRhs;
  return factory(state, kinetics, C, r);
}
