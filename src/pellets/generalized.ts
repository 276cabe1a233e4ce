/**
 * The generalized Thiele modulus for any single rate law, and the effectiveness factor it predicts.
 *
 *   Phi = (Vp/Sp) R_s / sqrt(2 De_key int_{c_eq}^{c_s} R(c) dc)
 *
 * with R the consumption rate of the key reactant per m3 of pellet, followed along the diffusion
 * path on which every species moves in stoichiometric step with the key one
 * (C_q = C_q,s + nu_q De_key / (nu_key De_q) (c - c_s)), and c_eq the key concentration where the
 * rate vanishes (zero, or equilibrium for a reversible reaction). Normalisation: K.B. Bischoff,
 * "Effectiveness factors for general reaction rate forms", AIChE J. 11 (1965) 351-355, with Aris'
 * length Vp/Sp (R. Aris, Chem. Eng. Sci. 6 (1957) 262). With it, eta -> 1/Phi for large Phi for
 * every rate law and shape, and eta -> 1 for small Phi; for an n-th order rate
 * Phi = (Vp/Sp) sqrt((n+1) k C_s^(n-1) / (2 De)). The estimate used here is the first-order
 * closed form of the pellet's shape at its own modulus a Phi (exact for first order, exact in both
 * limits for any rate law, approximate in between). The integral is done by Gauss-Legendre
 * quadrature (64 points); c_eq of a reversible reaction by Brent's method.
 */
import type { CompiledKinetics } from '../kinetics/compiled.js';
import { brent } from '../numerics/roots.js';
import { etaFirstOrder, type ShapeExponent } from './analytic.js';
import { gaussLegendre01 } from './collocation.js';

export interface GeneralizedInput {
  kinetics: CompiledKinetics;
  theta: Float64Array;
  /** Surface concentrations, mol/m3, and temperature, K. */
  Cs: Float64Array;
  Ts: number;
  /** Effective diffusivities per species, m2/s. */
  De: Float64Array;
  /** Factor from the compiled rate of reaction i to mol/(m3 pellet s). */
  rateToPellet: Float64Array;
  /** Shape exponent and volume-to-surface ratio Vp/Sp (m). */
  a: ShapeExponent;
  volumeToSurface: number;
}

export interface GeneralizedResult {
  /** Bischoff's modulus per reaction (0 where the reaction does not run). */
  modulus: Float64Array;
  /** Effectiveness factor estimate per reaction. */
  eta: Float64Array;
  /** Key reactant per reaction (index into the species), -1 where none. */
  key: Int32Array;
}

const GL = gaussLegendre01(64);

/** The key reactant of reaction i: the one that runs out first along the diffusion path. */
export function keyReactant(kin: CompiledKinetics, i: number, Cs: Float64Array, De: Float64Array): number {
  const nS = kin.speciesNames.length;
  let best = -1;
  let bestV = Infinity;
  for (let q = 0; q < nS; q++) {
    const nu = kin.stoich[i * nS + q];
    if (nu >= 0) continue;
    const v = (Cs[q] * De[q]) / -nu;
    if (v < bestV) {
      bestV = v;
      best = q;
    }
  }
  return best;
}

/** Rate of reaction i (per m3 pellet) at key concentration c on the diffusion path. */
function pathRate(inp: GeneralizedInput, i: number, key: number, c: number, C: Float64Array, r: Float64Array): number {
  const { kinetics: kin, Cs, De } = inp;
  const nS = kin.speciesNames.length;
  const nuK = kin.stoich[i * nS + key];
  for (let q = 0; q < nS; q++) {
    const nu = kin.stoich[i * nS + q];
    C[q] = Math.max(0, Cs[q] + ((nu * De[key]) / (nuK * De[q])) * (c - Cs[key]));
  }
  kin.rates(C, inp.Ts, inp.theta, r);
  return r[i] * inp.rateToPellet[i];
}

/** Bischoff's modulus and the eta estimate for every reaction, each on its own path. */
export function generalizedModulus(inp: GeneralizedInput): GeneralizedResult {
  const { kinetics: kin, Cs, De, a, volumeToSurface } = inp;
  const nS = kin.speciesNames.length;
  const nR = kin.reactionIds.length;
  const C = new Float64Array(nS);
  const r = new Float64Array(nR);
  const modulus = new Float64Array(nR);
  const eta = new Float64Array(nR).fill(1);
  const keys = new Int32Array(nR).fill(-1);
  for (let i = 0; i < nR; i++) {
    const key = keyReactant(kin, i, Cs, De);
    keys[i] = key;
    if (key < 0) continue;
    const nuK = -kin.stoich[i * nS + key];
    const rs = pathRate(inp, i, key, Cs[key], C, r);
    if (!(rs > 0)) continue;
    const lo = lowerEnd(inp, i, key, C, r);
    let integral = 0;
    for (let g = 0; g < GL.x.length; g++) {
      const c = lo + (Cs[key] - lo) * GL.x[g];
      integral += GL.w[g] * nuK * Math.max(0, pathRate(inp, i, key, c, C, r));
    }
    integral *= Cs[key] - lo;
    if (!(integral > 0)) continue;
    const phi = (volumeToSurface * nuK * rs) / Math.sqrt(2 * De[key] * integral);
    modulus[i] = phi;
    eta[i] = etaFirstOrder(a, a * phi);
  }
  return { modulus, eta, key: keys };
}

/** Lower end of the integral: where a reactant runs out on the path, or where the rate changes sign. */
function lowerEnd(inp: GeneralizedInput, i: number, key: number, C: Float64Array, r: Float64Array): number {
  const { kinetics: kin, Cs, De } = inp;
  const nS = kin.speciesNames.length;
  const nuK = kin.stoich[i * nS + key];
  let lo = 0;
  for (let q = 0; q < nS; q++) {
    const nu = kin.stoich[i * nS + q];
    if (nu >= 0 || q === key) continue;
    // C_q = 0 where c = Cs_key - Cs_q nuK De_q / (nu De_key)
    lo = Math.max(lo, Cs[key] - (Cs[q] * nuK * De[q]) / (nu * De[key]));
  }
  if (pathRate(inp, i, key, lo, C, r) >= 0) return lo;
  const root = brent((c) => pathRate(inp, i, key, c, C, r), lo, Cs[key], { xtol: 1e-12 * Math.max(Cs[key], 1e-300) });
  return Number.isFinite(root.x) ? root.x : lo;
}
