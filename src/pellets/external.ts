/**
 * Fluid-to-pellet mass and heat transfer coefficients in a packed bed.
 *
 *   Sh = k_c d_p / D_m = 2 + 1.1 Sc^(1/3) Re^0.6      (3 < Re < 10000)
 *   Nu = h d_p / k_f   = 2 + 1.1 Pr^(1/3) Re^0.6      (15 < Re < 8500)
 *   Re = rho u d_p / mu (u superficial velocity), Sc = mu / (rho D_m), Pr = c_p mu / k_f.
 *
 * Sources: N. Wakao, T. Funazkri, "Effect of fluid dispersion coefficients on particle-to-fluid
 * mass transfer coefficients in packed beds", Chem. Eng. Sci. 33 (1978) 1375-1384; N. Wakao,
 * S. Kaguei, T. Funazkri, "Effect of fluid dispersion coefficients on particle-to-fluid heat
 * transfer coefficients in packed beds", Chem. Eng. Sci. 34 (1979) 325-336. The Reynolds ranges are
 * those of the data the correlations were fitted to (from memory); outside them a warning names the
 * range and the value is still computed.
 */
import type { Warning } from '../core/outcome.js';

/** A correlation's name and the Reynolds range of its data. */
export interface CorrelationInfo {
  name: string;
  reynoldsRange: [number, number];
}

export const MASS_TRANSFER: CorrelationInfo = { name: 'Wakao-Funazkri (1978): Sh = 2 + 1.1 Sc^(1/3) Re^0.6', reynoldsRange: [3, 10000] };
export const HEAT_TRANSFER: CorrelationInfo = { name: 'Wakao-Kaguei-Funazkri (1979): Nu = 2 + 1.1 Pr^(1/3) Re^0.6', reynoldsRange: [15, 8500] };

/** The flow past the pellets (SI). */
export interface BedFlow {
  /** Particle diameter used by the correlations (6 Vp/Sp), m. */
  particleDiameter: number;
  /** Superficial mass flux G = rho u, kg/(m2 s). */
  massFlux: number;
  /** Fluid density, kg/m3. */
  density: number;
  /** Fluid viscosity, Pa s. */
  viscosity: number;
}

export interface MassTransfer {
  Re: number;
  Sc: number;
  Sh: number;
  /** Mass-transfer coefficient, m/s. */
  kc: number;
}

export interface HeatTransfer {
  Re: number;
  Pr: number;
  Nu: number;
  /** Heat-transfer coefficient, W/(m2 K). */
  h: number;
}

export function reynolds(f: BedFlow): number {
  return (f.massFlux * f.particleDiameter) / f.viscosity;
}

/** A warning when Re lies outside the correlation's range, else none. */
export function rangeWarning(c: CorrelationInfo, Re: number, where: string): Warning[] {
  const [lo, hi] = c.reynoldsRange;
  if (Re >= lo && Re <= hi) return [];
  return [{
    code: 'correlation-range',
    message: `${where}: Re = ${Re.toPrecision(3)} lies outside ${lo} < Re < ${hi}, the range of ${c.name}; the transfer coefficient is an extrapolation`,
  }];
}

/** Mass-transfer coefficient for a species of molecular diffusivity Dm (m2/s). */
export function massTransfer(f: BedFlow, Dm: number): MassTransfer {
  const Re = reynolds(f);
  const Sc = f.viscosity / (f.density * Dm);
  const Sh = 2 + 1.1 * Math.cbrt(Sc) * Re ** 0.6;
  return { Re, Sc, Sh, kc: (Sh * Dm) / f.particleDiameter };
}

/** Heat-transfer coefficient for fluid conductivity kf (W/(m K)) and heat capacity cp (J/(kg K)). */
export function heatTransfer(f: BedFlow, kf: number, cp: number): HeatTransfer {
  const Re = reynolds(f);
  const Pr = (cp * f.viscosity) / kf;
  const Nu = 2 + 1.1 * Math.cbrt(Pr) * Re ** 0.6;
  return { Re, Pr, Nu, h: (Nu * kf) / f.particleDiameter };
}
