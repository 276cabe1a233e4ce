/**
 * A small, honest CompiledKinetics for tests: mass-action (power-law) rates with optional
 * reversibility, written by hand with exact derivatives. It is a real implementation of the
 * interface (used while src/kinetics/compile.ts is being written, and as an independent check of it).
 *   r_i = k_i prod_j C_j^a_ij  -  (k_i / K_i) prod_j C_j^b_ij     (negative C treated as 0)
 * Parameters: every k_i and K_i is one named entry of theta.
 */
import type { CompiledKinetics } from '../../src/kinetics/compiled';

export interface MaReaction {
  /** Stoichiometric coefficients by species name. */
  nu: Record<string, number>;
  /** Forward orders by species. */
  orders: Record<string, number>;
  /** Parameter name of k. */
  k: string;
  /** Reverse term: product orders and the parameter name of K. */
  reverse?: { orders: Record<string, number>; K: string };
  basis?: 'volume' | 'mass';
}

export function massAction(species: string[], reactions: MaReaction[], parameterNames: string[]): CompiledKinetics {
  const nS = species.length;
  const nR = reactions.length;
  const nP = parameterNames.length;
  const idx = (s: string): number => {
    const j = species.indexOf(s);
    if (j < 0) throw new Error(`unknown species ${s}`);
    return j;
  };
  const pidx = (s: string): number => {
    const j = parameterNames.indexOf(s);
    if (j < 0) throw new Error(`unknown parameter ${s}`);
    return j;
  };
  const stoich = new Float64Array(nR * nS);
  const a = new Float64Array(nR * nS);
  const b = new Float64Array(nR * nS);
  const kI = new Int32Array(nR);
  const KI = new Int32Array(nR).fill(-1);
  reactions.forEach((r, i) => {
    for (const [s, v] of Object.entries(r.nu)) stoich[i * nS + idx(s)] = v;
    for (const [s, v] of Object.entries(r.orders)) a[i * nS + idx(s)] = v;
    kI[i] = pidx(r.k);
    if (r.reverse) {
      for (const [s, v] of Object.entries(r.reverse.orders)) b[i * nS + idx(s)] = v;
      KI[i] = pidx(r.reverse.K);
    }
  });
  const prod = (C: Float64Array, e: Float64Array, i: number): number => {
    let p = 1;
    for (let j = 0; j < nS; j++) {
      const o = e[i * nS + j];
      if (o !== 0) p *= Math.max(C[j], 0) ** o;
    }
    return p;
  };
  const dprod = (C: Float64Array, e: Float64Array, i: number, j: number): number => {
    const o = e[i * nS + j];
    if (o === 0) return 0;
    let p = o * Math.max(C[j], 0) ** (o - 1);
    for (let m = 0; m < nS; m++) {
      const om = e[i * nS + m];
      if (m !== j && om !== 0) p *= Math.max(C[m], 0) ** om;
    }
    return p;
  };
  return {
    speciesNames: species,
    reactionIds: reactions.map((_, i) => `r${i + 1}`),
    parameterNames,
    stoich,
    basis: reactions.map((r) => r.basis ?? 'volume'),
    referenceTemperature: 298.15,
    rates(C, _T, theta, out) {
      for (let i = 0; i < nR; i++) {
        const k = theta[kI[i]];
        out[i] = k * prod(C, a, i) - (KI[i] >= 0 ? (k / theta[KI[i]]) * prod(C, b, i) : 0);
      }
    },
    ratesJacC(C, _T, theta, out) {
      for (let i = 0; i < nR; i++) {
        const k = theta[kI[i]];
        for (let j = 0; j < nS; j++) {
          out[i * nS + j] = k * dprod(C, a, i, j) - (KI[i] >= 0 ? (k / theta[KI[i]]) * dprod(C, b, i, j) : 0);
        }
      }
    },
    ratesJacP(C, _T, theta, out) {
      out.fill(0);
      for (let i = 0; i < nR; i++) {
        const k = theta[kI[i]];
        const f = prod(C, a, i);
        if (KI[i] >= 0) {
          const K = theta[KI[i]];
          const g = prod(C, b, i);
          out[i * nP + kI[i]] += f - g / K;
          out[i * nP + KI[i]] += (k * g) / (K * K);
        } else {
          out[i * nP + kI[i]] += f;
        }
      }
    },
  };
}
