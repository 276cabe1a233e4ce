/**
 * Multitubular packed bed: the number of tubes (and their length) for a chosen tube diameter and
 * particle size such that the pressure drop stays within the allowed value while the target is met.
 *
 * Method: with N identical tubes in parallel, each carries F0/N; the superficial mass flux is
 * G = sum_j F_j0 M_j / (N A_c) with A_c = pi D^2/4, and the Ergun parameter of one tube alpha_t(N)
 * follows from reactors/ergun.ts (S. Ergun, Chem. Eng. Prog. 48 (1952) 89-94). In the total
 * catalyst mass W = N W_t the pressure equation reads dp/dW = -(alpha_t/N)/(2p) (F_T/F_T0), so the
 * whole bundle is sized as one bed with alpha = alpha_t(N)/N. The pressure drop falls as N grows;
 * the smallest N meeting the limit is found by doubling then integer bisection. Tube length
 * L = W_t / (rho_b A_c).
 */
import type { DesignSystem } from './system.js';
import { Sizer, type SizeOnce } from './sizer.js';
import { ergunAlpha } from '../reactors/ergun.js';
import { GAS_CONSTANT } from '../core/constants.js';

export interface TubeDesign {
  /** Number of tubes. */
  count: number;
  /** Tube inner diameter, m. */
  innerDiameter: number;
  /** Bed length per tube, m. */
  length: number;
  /** Catalyst per tube, kg. */
  catalystPerTube: number;
  /** Total molar feed per tube, mol/s. */
  flowPerTube: number;
  /** Superficial mass flux, kg/(m2 s). */
  superficialMassFlux: number;
  /** Ergun alpha of one tube, 1/kg of that tube's catalyst. */
  alphaPerTube: number;
  /** Pressure drop over the bed. */
  pressureDrop: { pa: number; bar: number };
  /** Allowed pressure drop, Pa. */
  allowedPressureDrop: number;
  /**
   * What the count was chosen for: `level` is the percentile of the required size (0.95 = P95)
   * whose catalyst keeps the pressure drop within the allowed value, or null when only the nominal
   * fit was used (no Monte Carlo draws); `basis` says it in words.
   */
  designedFor: { level: number | null; basis: string };
  /** Smallest count for the nominal fit alone (equal to `count` unless the percentile needed more). */
  nominalCount: number;
  /**
   * Catalyst to install for the design percentile, with `count` tubes: total mass (the design
   * percentile of the size, never below the nominal mass), per tube, bed length per tube, and the
   * pressure drop over that bed with the nominal kinetics. Absent without Monte Carlo draws.
   */
  install?: { level: number; catalystMass: number; catalystPerTube: number; length: number; pressureDrop: { pa: number; bar: number } };
  /**
   * Monte Carlo draws (with `count` tubes) whose required size needs more than the allowed drop
   * (a draw whose pressure runs out counts), of the draws sized or pressure-limited; `dropAtLevel`
   * is the design percentile of the drops they need (absent when that draw's pressure runs out).
   */
  draws?: { overAllowed: number; of: number; dropAtLevel?: { pa: number; bar: number } };
}

export interface TubeSearch {
  /** 'sized' when a tube count meets the target within the allowed pressure drop. */
  status: 'sized' | 'target-unreachable' | 'pressure-exhausted' | 'integration-failed' | 'too-many-tubes';
  design?: TubeDesign;
  /** Sizing of the whole bundle at the chosen count (or the last tried). */
  sizing: SizeOnce;
  detail?: string;
}

/** Largest tube count tried. */
export const MAX_TUBES = 1_000_000;

/**
 * Alpha of the whole bundle (1/kg of total catalyst) for N tubes, and the per-tube quantities.
 * @param molarMasses kg/mol per species (kinetics order)
 */
export function bundleAlpha(sys: DesignSystem, molarMasses: ArrayLike<number>, N: number): { alpha: number; alphaPerTube: number; G: number } {
  const k = sys.kase;
  const t = k.tubes!;
  const Ac = (Math.PI * t.innerDiameter ** 2) / 4;
  let mdot = 0;
  let FT = 0;
  for (let j = 0; j < sys.nS; j++) {
    mdot += k.feed[j] * molarMasses[j];
    FT += k.feed[j];
  }
  const Mbar = mdot / FT;
  const rho0 = (k.pressure! * Mbar) / (GAS_CONSTANT * k.temperature);
  const G = mdot / (N * Ac);
  const alphaPerTube = ergunAlpha(
    {
      particleDiameter: t.particleDiameter,
      voidFraction: t.voidFraction,
      superficialMassFlux: G,
      viscosity: t.viscosity,
      inletDensity: rho0,
      crossSection: Ac,
      catalystDensity: t.particleDensity,
    },
    k.pressure!,
    ['tubes'],
  );
  return { alpha: alphaPerTube / N, alphaPerTube, G };
}

/**
 * Find the smallest tube count that reaches the target within the allowed pressure drop. The
 * sizer's system alpha is left set for the chosen count.
 */
export function designTubes(sizer: Sizer, molarMasses: ArrayLike<number>): TubeSearch {
  const sys = sizer.sys;
  const t = sys.kase.tubes!;
  const P0 = sys.kase.pressure!;
  const tryN = (N: number): { ok: boolean; res: SizeOnce; dp: number } => {
    sys.alpha = bundleAlpha(sys, molarMasses, N).alpha;
    const res = sizer.size();
    const p = res.status === 'sized' ? Math.sqrt(Math.max(res.y[sys.nS], 0)) : 0;
    const dp = P0 * (1 - p);
    return { ok: res.status === 'sized' && dp <= t.allowedPressureDrop, res, dp };
  };
  let hi = 1;
  let r = tryN(hi);
  while (!r.ok) {
    // A target that is unreachable without any pressure drop stays unreachable with more tubes.
    if (r.res.status === 'target-unreachable' || r.res.status === 'integration-failed') {
      return { status: r.res.status, sizing: r.res, ...(r.res.detail ? { detail: r.res.detail } : {}) };
    }
    if (hi >= MAX_TUBES) {
      return { status: 'too-many-tubes', sizing: r.res, detail: `even ${MAX_TUBES} tubes exceed the allowed pressure drop` };
    }
    hi = Math.min(hi * 2, MAX_TUBES);
    r = tryN(hi);
  }
  let lo = Math.floor(hi / 2);
  while (hi - lo > 1) {
    const mid = Math.floor((lo + hi) / 2);
    if (tryN(mid).ok) hi = mid;
    else lo = mid;
  }
  const fin = tryN(hi);
  return { status: 'sized', sizing: fin.res, design: { ...tubeLayout(sys, molarMasses, hi, fin.res.size, fin.dp), nominalCount: hi } };
}

/**
 * The layout of `N` tubes holding the nominal catalyst mass `W` (kg) with pressure drop `dp` (Pa),
 * designed for the nominal fit (callers that design for a percentile replace `designedFor`).
 */
export function tubeLayout(sys: DesignSystem, molarMasses: ArrayLike<number>, N: number, W: number, dp: number): TubeDesign {
  const t = sys.kase.tubes!;
  const ba = bundleAlpha(sys, molarMasses, N);
  let FT = 0;
  for (let j = 0; j < sys.nS; j++) FT += sys.kase.feed[j];
  return {
    count: N,
    innerDiameter: t.innerDiameter,
    length: tubeLength(sys, N, W),
    catalystPerTube: W / N,
    flowPerTube: FT / N,
    superficialMassFlux: ba.G,
    alphaPerTube: ba.alphaPerTube,
    pressureDrop: { pa: dp, bar: dp / 1e5 },
    allowedPressureDrop: t.allowedPressureDrop,
    designedFor: { level: null, basis: 'nominal fit' },
    nominalCount: N,
  };
}

/** Bed length per tube (m) for total catalyst W (kg) in N tubes: L = W / (N rho_b A_c). */
export function tubeLength(sys: DesignSystem, N: number, W: number): number {
  const t = sys.kase.tubes!;
  return W / N / (t.bulkDensity * ((Math.PI * t.innerDiameter ** 2) / 4));
}
