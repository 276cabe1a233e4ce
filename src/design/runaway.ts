/**
 * Runaway margin of a cooled tube by the generalized parametric-sensitivity criterion
 * (M. Morbidelli, A. Varma, "A generalized criterion for parametric sensitivity: application to
 * thermal explosion theory", Chem. Eng. Sci. 43 (1988) 91-102; for tubular reactors, Morbidelli and
 * Varma, AIChE J. 28 (1982) 705-713; references from memory). The normalized sensitivity of the hot
 * spot T_hs to a parameter phi is
 *   S(T_hs; phi) = (phi / T_hs) dT_hs/dphi,
 * and the reactor is parametrically sensitive (at the runaway boundary) where S is largest as phi
 * varies. Here phi is the coolant temperature Ta: T_hs(Ta) is computed on a grid of coolant
 * temperatures for the designed tube (same size, same everything else), S by central differences
 * on the grid, and the critical coolant temperature is the maximum of S refined by a parabola
 * through the three best grid points. The margin is Ta,crit - Ta,design. The sensitivity to the
 * inlet temperature at the design point, (T0/T_hs) dT_hs/dT0, is reported beside it.
 * A march that passes the runaway cap counts with T_hs = the cap.
 */
import type { CompiledKinetics } from '../kinetics/compiled.js';
import { ThermalTube } from '../reactors/thermal/thermal-tube.js';
import type { ThermalTubeSpec } from '../reactors/thermal/tube-balances.js';

export interface RunawayMargin {
  criterion: string;
  /** Design coolant temperature, K. */
  coolantTemperature: number;
  /** Coolant temperature of largest normalized sensitivity, K (null: the maximum lies at the scan's edge). */
  criticalCoolantTemperature: number | null;
  /** Critical minus design coolant temperature, K (null when not located). */
  margin: number | null;
  /** Normalized sensitivity of the hot spot to the coolant temperature at the design point. */
  sensitivityCoolant: number;
  /** Normalized sensitivity of the hot spot to the inlet temperature at the design point. */
  sensitivityInlet: number;
  /** The scan: coolant temperature (K), hot spot (K) and normalized sensitivity per point. */
  scan: { coolant: number[]; hotSpot: number[]; sensitivity: (number | null)[] };
}

export interface RunawayOptions {
  /** Scan from Ta - below to Ta + above, K; defaults 40 and 60. */
  below?: number;
  above?: number;
  /** Scan from this coolant temperature instead (K; with `to`); default Ta - below. */
  from?: number;
  /** Scan up to this coolant temperature (K; with `from`); default Ta + above. */
  to?: number;
  /** Grid step, K; default 1. */
  step?: number;
  /** Compute the design-point sensitivities to Ta and T0 (five more tube solves); default true. */
  sensitivities?: boolean;
}

/** Hot spot (K) of `spec` at size W with coolant temperature Ta and inlet T0 (cap on runaway). */
export function hotSpotAt(spec: ThermalTubeSpec, kinetics: CompiledKinetics, theta: Float64Array, W: number, Ta: number, T0 = spec.T0): number {
  const s = { ...spec, coolantTemperature: Ta, T0 };
  const sol = new ThermalTube(s, kinetics, theta).solve(W, { rtol: 1e-8 });
  if (sol.status === 'runaway') return T0 + 1000;
  return sol.success ? sol.hotSpot.temperature : NaN;
}

/** Index of the largest non-null value, -1 when there is none. */
function largestAt(values: readonly (number | null)[]): number {
  let best = -1;
  values.forEach((v, i) => {
    if (v !== null && (best < 0 || v > (values[best] as number))) best = i;
  });
  return best;
}

/**
 * Normalised sensitivities S = (x / T_hs) dT_hs/dx of the hot spot at the design point to the
 * coolant temperature and the inlet temperature (central differences of 0.5 K; five tube solves).
 */
function designSensitivities(spec: ThermalTubeSpec, kinetics: CompiledKinetics, theta: Float64Array, W: number): { coolant: number; inlet: number } {
  const d = 0.5;
  const Ta0 = spec.coolantTemperature;
  const T0 = spec.T0;
  const hot0 = hotSpotAt(spec, kinetics, theta, W, Ta0);
  return {
    coolant: (Ta0 / hot0) * ((hotSpotAt(spec, kinetics, theta, W, Ta0 + d) - hotSpotAt(spec, kinetics, theta, W, Ta0 - d)) / (2 * d)),
    inlet: (T0 / hot0) * ((hotSpotAt(spec, kinetics, theta, W, Ta0, T0 + d) - hotSpotAt(spec, kinetics, theta, W, Ta0, T0 - d)) / (2 * d)),
  };
}

/** The runaway margin of a designed tube (see the file header). */
export function runawayMargin(spec: ThermalTubeSpec, kinetics: CompiledKinetics, theta: Float64Array, W: number, options: RunawayOptions = {}): RunawayMargin {
  const Ta0 = spec.coolantTemperature;
  const step = options.step ?? 1;
  const lo = options.from ?? Ta0 - (options.below ?? 40);
  const hi = options.to ?? Ta0 + (options.above ?? 60);
  const n = Math.round((hi - lo) / step);
  const coolant = Array.from({ length: n + 1 }, (_, i) => lo + i * step);
  const hot = coolant.map((Ta) => hotSpotAt(spec, kinetics, theta, W, Ta));
  const sens: (number | null)[] = coolant.map((Ta, i) => {
    if (i === 0 || i === n || !Number.isFinite(hot[i - 1] + hot[i + 1] + hot[i])) return null;
    return (Ta / hot[i]) * ((hot[i + 1] - hot[i - 1]) / (2 * step));
  });
  const best = largestAt(sens);
  let crit: number | null = null;
  if (best > 1 && best < n - 1 && sens[best - 1] !== null && sens[best + 1] !== null) {
    const [a, b, c] = [sens[best - 1] as number, sens[best] as number, sens[best + 1] as number];
    const den = a - 2 * b + c;
    crit = coolant[best] + (den < 0 ? (0.5 * step * (a - c)) / den : 0);
  }
  const { coolant: sCoolant, inlet: sInlet } = options.sensitivities === false ? { coolant: NaN, inlet: NaN } : designSensitivities(spec, kinetics, theta, W);
  return {
    criterion: 'generalized parametric sensitivity (Morbidelli and Varma, Chem. Eng. Sci. 43 (1988) 91): runaway where S = (Ta/T_hs) dT_hs/dTa is largest',
    coolantTemperature: Ta0,
    criticalCoolantTemperature: crit,
    margin: crit === null ? null : crit - Ta0,
    sensitivityCoolant: sCoolant,
    sensitivityInlet: sInlet,
    scan: { coolant, hotSpot: hot, sensitivity: sens },
  };
}

/**
 * The critical coolant temperature near a guess (K), for Monte Carlo draws: the scan of
 * runawayMargin on guess +- halfWidth only; when the largest sensitivity lies at the window's edge
 * the window moves that way (up to three times). Null when no interior maximum is found.
 */
export function criticalNear(spec: ThermalTubeSpec, kinetics: CompiledKinetics, theta: Float64Array, W: number, guess: number, halfWidth = 8, step = 2): number | null {
  let centre = guess;
  for (let k = 0; k < 4; k++) {
    const m = runawayMargin(spec, kinetics, theta, W, { from: centre - halfWidth, to: centre + halfWidth, step, sensitivities: false });
    if (m.criticalCoolantTemperature !== null) return m.criticalCoolantTemperature;
    const best = largestAt(m.scan.sensitivity);
    if (best < 0) return null;
    centre += (best < m.scan.sensitivity.length / 2 ? -1 : 1) * 1.5 * halfWidth;
  }
  return null;
}
