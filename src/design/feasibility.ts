/**
 * Feasibility of a target: the equilibrium conversion of the key reactant at the case's
 * temperature and inlet pressure.
 *
 * One reaction: the extent xi at which the net rate vanishes, r(C(F0 + nu xi)) = 0, found by
 * Brent's method on (0, xi_max) where xi_max uses up the limiting reactant. For a reversible rate
 * law r = k (prod C_reactants^a - prod C_products^b / K_eq) this is exactly
 * K_eq(T) = prod_j C_j^nu_j at equilibrium, with gas C_j = C_T0 (F_j/F_T) (no pressure drop) and
 * liquid C_j = F_j/v0. A rate that stays positive up to xi_max means no equilibrium limit (X_eq is
 * set by the limiting reactant).
 * Several reactions: the mole balances are integrated to very large sizes (1e4 and 1e5 times the
 * initial-rate estimate, no pressure drop) and the plateau conversion is taken.
 */
import type { CompiledKinetics } from '../kinetics/compiled.js';
import type { DesignCase } from './case.js';
import { buildSystem } from './system.js';
import { Sizer } from './sizer.js';
import { brentRoot } from './march.js';

export interface EquilibriumLimit {
  /** Key species whose conversion is limited. */
  species: string;
  /** Largest conversion reachable at the case's temperature and inlet pressure (0..1). */
  conversion: number;
  /** 'equilibrium' (rate root), 'limiting-reactant' (irreversible), 'plateau' (several reactions). */
  method: 'equilibrium' | 'limiting-reactant' | 'plateau';
  /** False when the plateau had not settled (conversion still rising at the largest size). */
  settled: boolean;
}

/**
 * Equilibrium (largest reachable) conversion of `species` for the case, with parameters theta
 * (physical values, kinetics order).
 */
export function equilibriumConversion(kinetics: CompiledKinetics, kase: DesignCase, theta: ArrayLike<number>, species: string): EquilibriumLimit {
  // Equilibrium refers to the inlet pressure: drop the pressure-drop description.
  const flat: DesignCase = { ...kase, target: { kind: 'size', value: 1 } };
  delete flat.tubes;
  delete flat.alpha;
  const sys = buildSystem(kinetics, flat, theta);
  const a = kase.species.indexOf(species);
  const nS = sys.nS;
  if (sys.nR === 1) {
    const nu = kinetics.stoich;
    let xiMax = Infinity;
    for (let j = 0; j < nS; j++) if (nu[j] < 0) xiMax = Math.min(xiMax, sys.y0[j] / -nu[j]);
    const y = new Float64Array(sys.dim);
    const r = new Float64Array(1);
    const f = (xi: number) => {
      for (let j = 0; j < nS; j++) y[j] = sys.y0[j] + nu[j] * xi;
      sys.ratesAt(y, r);
      return r[0];
    };
    const conv = (xi: number) => (-nu[a] * xi) / sys.y0[a];
    const hi = xiMax * (1 - 1e-13);
    const fHi = f(hi);
    const f0 = f(0);
    // A reactant absent from the feed: nothing reacts; the limit is the feed, not an equilibrium.
    if (!(f0 > 0) && Number.isFinite(xiMax) && xiMax <= 0) return { species, conversion: 0, method: 'limiting-reactant', settled: true };
    if (!(f0 > 0)) return { species, conversion: 0, method: 'equilibrium', settled: true };
    if (fHi > 0) return { species, conversion: Math.min(1, conv(xiMax)), method: 'limiting-reactant', settled: true };
    const root = brentRoot(f, 0, hi, f0, fHi, 1e-15 * xiMax, 300);
    return { species, conversion: conv(root.x), method: 'equilibrium', settled: root.converged };
  }
  const sizer = new Sizer(sys, { rtol: 1e-10 });
  const probe: DesignCase = { ...flat, target: { kind: 'conversion', species, value: 0.5 } };
  const est = new Sizer(buildSystem(kinetics, probe, theta)).initialEstimate();
  if (!Number.isFinite(est)) return { species, conversion: 0, method: 'plateau', settled: true };
  const x1 = sizer.conversion(sizer.rate(est * 1e4).y, a);
  const x2 = sizer.conversion(sizer.rate(est * 1e5).y, a);
  return { species, conversion: x2, method: 'plateau', settled: Math.abs(x2 - x1) < 1e-6 };
}
