/**
 * Concentrations from molar flows (or moles) for gas and liquid phases, with their exact
 * derivatives for the chain rule of the reactor Jacobians.
 *
 * Method: ideal-gas relation C_j = C_T0 (F_j / F_T) p (T0 / T) with C_T0 = P0 / (R T0) and
 * p = P / P0 (isothermal here, so T = T0); liquid C_j = F_j / v0 (constant density).
 * Reference: ideal-gas law with the Mohr-Rayleigh form of R; CODATA 2018 value of R.
 * Inerts are ordinary species here: they are carried in the flows and count in F_T.
 */
import { GAS_CONSTANT } from '../core/constants.js';

/** Total inlet concentration C_T0 = P0 / (R T0), mol/m3, for pressure P0 (Pa) and temperature T0 (K). */
export function totalConcentration(pressure: number, temperature: number): number {
  return pressure / (GAS_CONSTANT * temperature);
}

/** Sum of the first n entries of a vector. */
export function sumFirst(y: Float64Array, n: number): number {
  let s = 0;
  for (let j = 0; j < n; j++) s += y[j];
  return s;
}

/**
 * Gas-phase concentrations C_j = cT0 * (F_j / F_T) * p (isothermal) into `out` (length nS).
 * Flows are read from F[0..nS-1]. A non-positive total flow gives zero concentrations.
 */
export function gasConcentrations(F: Float64Array, nS: number, p: number, cT0: number, out: Float64Array): void {
  const FT = sumFirst(F, nS);
  if (!(FT > 0)) {
    out.fill(0, 0, nS);
    return;
  }
  const f = (cT0 * p) / FT;
  for (let j = 0; j < nS; j++) out[j] = f * F[j];
}

/**
 * Derivatives of the gas-phase concentrations: dCdF (nS x nS row-major), dC_j/dF_k =
 * cT0 p (delta_jk / F_T - F_j / F_T^2); and dCdp (nS), dC_j/dp = cT0 F_j / F_T.
 */
export function gasConcentrationJacobian(
  F: Float64Array,
  nS: number,
  p: number,
  cT0: number,
  dCdF: Float64Array,
  dCdp: Float64Array,
): void {
  const FT = sumFirst(F, nS);
  if (!(FT > 0)) {
    dCdF.fill(0, 0, nS * nS);
    dCdp.fill(0, 0, nS);
    return;
  }
  const a = (cT0 * p) / FT;
  const b = a / FT;
  for (let j = 0; j < nS; j++) {
    const row = j * nS;
    const bj = b * F[j];
    for (let k = 0; k < nS; k++) dCdF[row + k] = -bj;
    dCdF[row + j] += a;
    dCdp[j] = (cT0 * F[j]) / FT;
  }
}

