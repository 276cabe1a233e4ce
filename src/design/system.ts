/**
 * The isothermal design model as an ODE in the size coordinate, built once per case and reused for
 * every parameter draw (the parameter vector is swapped, buffers are preallocated).
 *
 * Mole balances (SI):
 *   packed bed   dF_j/dW = sum_i nu_ij r'_i                       (r' per kg catalyst)
 *   plug flow    dF_j/dV = sum_i nu_ij r_i                        (r per m3)
 *   batch        dC_j/dt = sum_i nu_ij r_i                        (constant volume)
 * A mass-based rate in a volume coordinate is multiplied by the bulk density rho_b (or the batch
 * catalyst loading); a volume-based rate in a mass coordinate is divided by rho_b.
 * Gas concentrations: C_j = C_T0 (F_j/F_T) p with C_T0 = P0/(R T) (isothermal); liquid C_j = F_j/v0.
 * Pressure drop (Ergun, isothermal): dp/dW = -alpha/(2p) (F_T/F_T0). It is integrated as
 * u = p^2, du/dW = -alpha F_T/F_T0, which is smooth up to the point where the pressure runs out
 * (u = 0), so that point is located exactly as an event.
 */
import type { CompiledKinetics } from '../kinetics/compiled.js';
import type { DesignCase } from './case.js';
import { RateloomError } from '../core/errors.js';
import { GAS_CONSTANT } from '../core/constants.js';

/**
 * A multiplicative hook on the rate term: it may scale the intrinsic rates r (per reaction, in
 * place) at size coordinate t, state y, bulk concentrations C and temperature T; the pellet's
 * effectiveness factor enters this way (design/pellet-hook.ts). Kinetics stay intrinsic.
 */
export interface RateHook {
  apply(t: number, y: Float64Array, C: Float64Array, T: number, r: Float64Array): void;
}

export interface DesignSystem {
  readonly kinetics: CompiledKinetics;
  readonly kase: DesignCase;
  readonly nS: number;
  readonly nR: number;
  /** State length: nS (+1 for u = p^2 when the pressure drop is modelled). */
  readonly dim: number;
  readonly hasPressure: boolean;
  /** Size coordinate and unit. */
  readonly coordinate: 'W' | 'V' | 't';
  readonly unit: 'kg' | 'm3' | 's';
  /** Inlet state (flows mol/s or concentrations mol/m3, then u = 1). */
  readonly y0: Float64Array;
  /** Parameter vector (physical values, kinetics order); overwrite in place per draw. */
  readonly theta: Float64Array;
  /** Pressure-drop parameter in the size coordinate (1/kg or 1/m3); change for a tube count. */
  alpha: number;
  /** Right-hand side of the balances (no allocation). */
  rhs(t: number, y: Float64Array, out: Float64Array): void;
  /** Concentrations (mol/m3) for state y into out. */
  concentrations(y: Float64Array, out: Float64Array): void;
  /** Reaction rates at y in the size coordinate's basis (mol per kg s, per m3 s) into out. */
  ratesAt(y: Float64Array, out: Float64Array): void;
}

/**
 * Basis scale per reaction: rate in the size coordinate's basis = scale * compiled rate. Throws
 * E_CASE when a density needed for the conversion is missing.
 */
function basisScale(kinetics: CompiledKinetics, kase: DesignCase, coordinate: 'W' | 'V' | 't'): Float64Array {
  const nR = kinetics.reactionIds.length;
  const kind = kase.reactor.kind;
  const scale = new Float64Array(nR);
  for (let i = 0; i < nR; i++) {
    const b = kinetics.basis[i];
    if (coordinate === 'W') scale[i] = b === 'mass' ? 1 : 1 / (kase.bulkDensity ?? NaN);
    else if (kind === 'batch' || kind === 'stirred-tank') scale[i] = b === 'volume' ? 1 : (kase.catalystLoading ?? kase.bulkDensity ?? NaN);
    else scale[i] = b === 'volume' ? 1 : (kase.bulkDensity ?? NaN);
  }
  for (let i = 0; i < nR; i++) {
    if (!Number.isFinite(scale[i])) {
      const need = kind === 'batch' || kind === 'stirred-tank' ? 'catalystLoading' : 'bulkDensity';
      throw new RateloomError('E_CASE', `reaction '${kinetics.reactionIds[i]}' has a ${kinetics.basis[i]}-based rate but the ${kind} needs it per ${coordinate === 'W' ? 'kg catalyst' : 'm3'}`, {
        path: [need],
        fix: `Add "${need}": "900 kg/m3" (kg catalyst per m3) so the rate can be converted.`,
      });
    }
  }
  return scale;
}

/**
 * Build the design system for a case and compiled kinetics.
 * @param theta physical parameter values in `kinetics.parameterNames` order (copied)
 * @param hook scales the intrinsic rates (pellet effectiveness); default none
 */
export function buildSystem(kinetics: CompiledKinetics, kase: DesignCase, theta: ArrayLike<number>, hook?: RateHook): DesignSystem {
  const nS = kinetics.speciesNames.length;
  const nR = kinetics.reactionIds.length;
  const kind = kase.reactor.kind;
  const gas = kase.reactor.phase === 'gas';
  const coordinate: 'W' | 'V' | 't' = kind === 'packed-bed' ? 'W' : kind === 'batch' ? 't' : 'V';
  const unit = coordinate === 'W' ? 'kg' : coordinate === 'V' ? 'm3' : 's';
  const scale = basisScale(kinetics, kase, coordinate);
  const hasPressure = gas && (kind === 'packed-bed' || kind === 'plug-flow') && (kase.tubes !== undefined || (kase.alpha ?? 0) > 0);
  const dim = nS + (hasPressure ? 1 : 0);
  const y0 = new Float64Array(dim);
  if (kind === 'batch') y0.set(kase.concentrations!);
  else y0.set(kase.feed);
  if (hasPressure) y0[nS] = 1;
  let FT0 = 0;
  for (let j = 0; j < nS; j++) FT0 += kase.feed[j];
  const T = kase.temperature;
  const CT0 = gas ? (kase.pressure ?? NaN) / (GAS_CONSTANT * T) : NaN;
  const v0 = kase.volumetricFlow ?? NaN;
  const C = new Float64Array(nS);
  const r = new Float64Array(nR);
  const nu = kinetics.stoich;
  const th = Float64Array.from(theta);

  const concentrations = (y: Float64Array, out: Float64Array): void => {
    if (kind === 'batch') {
      for (let j = 0; j < nS; j++) out[j] = y[j] > 0 ? y[j] : 0;
      return;
    }
    if (gas) {
      let FT = 0;
      for (let j = 0; j < nS; j++) FT += y[j] > 0 ? y[j] : 0;
      const p = hasPressure ? Math.sqrt(y[nS] > 0 ? y[nS] : 0) : 1;
      const f = FT > 0 ? (CT0 * p) / FT : 0;
      for (let j = 0; j < nS; j++) out[j] = (y[j] > 0 ? y[j] : 0) * f;
    } else {
      for (let j = 0; j < nS; j++) out[j] = (y[j] > 0 ? y[j] : 0) / v0;
    }
  };
  const sys: DesignSystem = {
    kinetics,
    kase,
    nS,
    nR,
    dim,
    hasPressure,
    coordinate,
    unit,
    y0,
    theta: th,
    alpha: kase.alpha ?? 0,
    concentrations,
    ratesAt(y, out) {
      concentrations(y, C);
      kinetics.rates(C, T, th, out);
      if (hook) hook.apply(NaN, y, C, T, out);
      for (let i = 0; i < nR; i++) out[i] *= scale[i];
    },
    rhs(t, y, out) {
      concentrations(y, C);
      kinetics.rates(C, T, th, r);
      if (hook) hook.apply(t, y, C, T, r);
      for (let j = 0; j < nS; j++) out[j] = 0;
      for (let i = 0; i < nR; i++) {
        const ri = r[i] * scale[i];
        if (ri === 0) continue;
        const row = i * nS;
        for (let j = 0; j < nS; j++) out[j] += nu[row + j] * ri;
      }
      if (hasPressure) {
        let FT = 0;
        for (let j = 0; j < nS; j++) FT += y[j];
        out[nS] = -sys.alpha * (FT / FT0);
      }
    },
  };
  return sys;
}
