/**
 * The thermal part of the production case file (`heat`), read into SI: the cooling mode, reaction
 * enthalpies (stated, or the fitted van 't Hoff enthalpy by default), heat capacities per species
 * (constant or Shomate), the heat-transfer coefficient (given, or from a named packed-bed wall
 * correlation), the coolant, the hot-spot limit and the longest tube. Every refusal names the field
 * and the fix; a cooled or adiabatic mode is never replaced by an isothermal solve.
 *
 * Example (cooled multitubular packed bed):
 *   "heat": { "mode": "co-current",
 *             "reactionEnthalpy": { "hyd": "-45 kJ/mol" }, "referenceTemperature": "298.15 K",
 *             "heatCapacities": { "C2H4": "60 J/(mol K)", "H2O": "35 J/(mol K)",
 *                                 "N2": { "shomate": { "A": 19.5, "B": 19.9, "C": -8.6, "D": 1.37, "E": 0.53 } } },
 *             "overallCoefficient": "180 W/(m2 K)",
 *             "coolant": { "temperature": "215 degC", "flow": "40 kg/s", "heatCapacity": "2.3 kJ/(kg K)" },
 *             "maxTemperature": "260 degC", "maxTubeLength": "12 m" }
 */
import { RateloomError, closestName, type FieldPath } from '../core/errors.js';
import type { HeatCapacity } from '../reactors/thermal/heat-capacity.js';
import type { CoolingMode } from '../reactors/thermal/layout.js';
import { quantityToSI } from './case-units.js';
import { isObj, type Obj } from '../core/record.js';

/** Longest tube proposed when the case does not say, m (a common practical limit for fixed-bed tubes). */
export const DEFAULT_MAX_TUBE_LENGTH = 12;

/** A packed-bed wall correlation for the bed-side coefficient (see wall-coefficient.ts). */
export interface WallCorrelationInput {
  name: 'leva-cooling';
  /** Gas thermal conductivity, W/(m K). */
  gasConductivity: number;
}

/** The thermal inputs of a case, SI. */
export interface ThermalCase {
  mode: Exclude<CoolingMode, 'isothermal'>;
  /** Temperature at which the stated reaction enthalpies apply, K; default 298.15 K. */
  referenceTemperature: number;
  /** Heat capacity per species (case species order); undefined where not given. */
  heatCapacities: (HeatCapacity | undefined)[];
  /** Overall heat-transfer coefficient U, W/(m2 K), when given. */
  overallCoefficient?: number;
  /** Bed-side correlation to estimate U from, when U is not given. */
  wallCorrelation?: WallCorrelationInput;
  /** Exchange area of a stirred tank or batch vessel, m2. */
  exchangeArea?: number;
  coolant: {
    /** Coolant temperature (inlet for co-/counter-current), K. */
    temperature: number;
    /** Coolant mass flow for the whole reactor, kg/s. */
    flow?: number;
    /** Coolant specific heat capacity, J/(kg K). */
    heatCapacity?: number;
  };
  /** Highest allowed temperature anywhere (catalyst or material limit), K. */
  maxTemperature?: number;
  /** Longest tube proposed, m; default DEFAULT_MAX_TUBE_LENGTH. */
  maxTubeLength: number;
  /** Tube inner diameters to search (m) when the hot spot at tubes.innerDiameter is too high; default none. */
  searchDiameters?: number[];
}

const MODES: readonly ThermalCase['mode'][] = ['adiabatic', 'constant-coolant', 'co-current', 'counter-current'];
export const THERMAL_FIELDS = ['mode', 'referenceTemperature', 'heatCapacities', 'overallCoefficient', 'wallCorrelation', 'exchangeArea', 'coolant', 'maxTemperature', 'maxTubeLength', 'searchDiameters'] as const;

function positive(raw: unknown, kind: Parameters<typeof quantityToSI>[1], path: FieldPath, fix: string): number {
  const v = quantityToSI(raw, kind, path);
  if (!(v > 0)) throw new RateloomError('E_VALUE', `${String(path[path.length - 1])} must be positive (got ${v} in SI)`, { path, fix });
  return v;
}

function fields(o: Obj, allowed: readonly string[], path: FieldPath): void {
  for (const k of Object.keys(o)) {
    if (!allowed.includes(k)) {
      const near = closestName(k, allowed);
      throw new RateloomError('E_UNKNOWN_FIELD', `unknown field '${k}'`, { path: [...path, k], fix: near ? `Did you mean '${near}'?` : `Allowed fields here: ${allowed.join(', ')}.` });
    }
  }
}

/** One species heat capacity: a quantity string/object, or { "shomate": { A..E } }. */
function heatCapacity(raw: unknown, path: FieldPath): HeatCapacity {
  if (isObj(raw) && raw.shomate !== undefined) {
    fields(raw, ['shomate'], path);
    const s = raw.shomate;
    if (!isObj(s)) throw new RateloomError('E_TYPE', 'shomate must be an object of coefficients A..E', { path: [...path, 'shomate'] });
    fields(s, ['A', 'B', 'C', 'D', 'E'], [...path, 'shomate']);
    const c = (k: string): number => {
      const v = s[k] ?? 0;
      if (typeof v !== 'number' || !Number.isFinite(v)) throw new RateloomError('E_TYPE', `Shomate coefficient ${k} must be a number`, { path: [...path, 'shomate', k] });
      return v;
    };
    return { form: 'shomate', A: c('A'), B: c('B'), C: c('C'), D: c('D'), E: c('E') };
  }
  return { form: 'constant', cp: positive(raw, 'molarHeatCapacity', path, 'Give the molar heat capacity, for example "35 J/(mol K)".') };
}

function modeOf(raw: unknown): ThermalCase['mode'] {
  if (!MODES.includes(raw as ThermalCase['mode'])) {
    const near = closestName(String(raw), MODES);
    throw new RateloomError('E_VALUE', `heat mode '${String(raw)}' is not known`, { path: ['heat', 'mode'], fix: `Use one of: ${MODES.join(', ')}${near ? ` (did you mean '${near}'?)` : ''}.` });
  }
  return raw as ThermalCase['mode'];
}

/** Read the thermal fields of `heat` (the caller has checked that `mode` is present). */
export function loadThermalCase(h: Obj, species: readonly string[]): ThermalCase {
  const mode = modeOf(h.mode);
  const heatCapacities: (HeatCapacity | undefined)[] = species.map(() => undefined);
  if (h.heatCapacities !== undefined) {
    if (!isObj(h.heatCapacities)) throw new RateloomError('E_TYPE', 'heatCapacities must map species to heat capacities', { path: ['heat', 'heatCapacities'] });
    for (const [name, q] of Object.entries(h.heatCapacities)) {
      const j = species.indexOf(name);
      if (j < 0) {
        const near = closestName(name, species);
        throw new RateloomError('E_UNKNOWN_SPECIES', `species '${name}' is not in the fitted kinetics`, { path: ['heat', 'heatCapacities', name], fix: near ? `Did you mean '${near}'?` : `Use one of: ${species.join(', ')}.` });
      }
      heatCapacities[j] = heatCapacity(q, ['heat', 'heatCapacities', name]);
    }
  }
  const out: ThermalCase = {
    mode,
    referenceTemperature: h.referenceTemperature !== undefined ? positive(h.referenceTemperature, 'temperature', ['heat', 'referenceTemperature'], 'Give the temperature of the stated enthalpies, for example "298.15 K".') : 298.15,
    heatCapacities,
    coolant: { temperature: NaN },
    maxTubeLength: h.maxTubeLength !== undefined ? positive(h.maxTubeLength, 'length', ['heat', 'maxTubeLength'], 'Give the longest acceptable tube, for example "12 m".') : DEFAULT_MAX_TUBE_LENGTH,
  };
  if (h.maxTemperature !== undefined) out.maxTemperature = positive(h.maxTemperature, 'temperature', ['heat', 'maxTemperature'], 'Give the catalyst or material limit, for example "280 degC".');
  if (h.exchangeArea !== undefined) out.exchangeArea = positive(h.exchangeArea, 'area', ['heat', 'exchangeArea'], 'Give the jacket or coil area, for example "12 m2".');
  if (h.searchDiameters !== undefined) {
    if (!Array.isArray(h.searchDiameters) || h.searchDiameters.length === 0) {
      throw new RateloomError('E_TYPE', 'searchDiameters must be a non-empty list of lengths', { path: ['heat', 'searchDiameters'], fix: 'Write it as ["25 mm", "32 mm", "38 mm"].' });
    }
    out.searchDiameters = h.searchDiameters.map((d, i) => positive(d, 'length', ['heat', 'searchDiameters', i], 'Give each diameter as a positive length, for example "25 mm".'));
  }
  readExchange(h, out);
  return out;
}

/** U (given or by correlation) and the coolant; both required unless adiabatic. */
function readExchange(h: Obj, out: ThermalCase): void {
  const fixU = 'Give "overallCoefficient": "150 W/(m2 K)" (a positive number) or "wallCorrelation": { "name": "leva-cooling", "gasConductivity": "0.04 W/(m K)" }.';
  if (h.overallCoefficient !== undefined) out.overallCoefficient = positive(h.overallCoefficient, 'heatTransferCoefficient', ['heat', 'overallCoefficient'], fixU);
  if (h.wallCorrelation !== undefined) {
    if (out.overallCoefficient !== undefined) throw new RateloomError('E_SCHEMA', 'give overallCoefficient or wallCorrelation, not both', { path: ['heat', 'wallCorrelation'], fix: 'Remove one of them.' });
    const w = h.wallCorrelation;
    if (!isObj(w)) throw new RateloomError('E_TYPE', 'wallCorrelation must be an object', { path: ['heat', 'wallCorrelation'], fix: fixU });
    fields(w, ['name', 'gasConductivity'], ['heat', 'wallCorrelation']);
    if (w.name !== 'leva-cooling') throw new RateloomError('E_VALUE', `wall correlation '${String(w.name)}' is not known`, { path: ['heat', 'wallCorrelation', 'name'], fix: 'Use "leva-cooling".' });
    out.wallCorrelation = { name: 'leva-cooling', gasConductivity: positive(w.gasConductivity, 'thermalConductivity', ['heat', 'wallCorrelation', 'gasConductivity'], 'Give the gas thermal conductivity, for example "0.04 W/(m K)".') };
  }
  if (out.mode === 'adiabatic') return;
  if (out.overallCoefficient === undefined && out.wallCorrelation === undefined) {
    throw new RateloomError('E_MISSING_FIELD', `a ${out.mode} reactor needs its heat-transfer coefficient`, { path: ['heat', 'overallCoefficient'], fix: fixU });
  }
  if (!isObj(h.coolant)) {
    throw new RateloomError('E_MISSING_FIELD', `a ${out.mode} reactor needs the coolant`, { path: ['heat', 'coolant'], fix: 'Add "coolant": { "temperature": "215 degC", "flow": "40 kg/s", "heatCapacity": "2.3 kJ/(kg K)" }.' });
  }
  const c = h.coolant;
  fields(c, ['temperature', 'flow', 'heatCapacity'], ['heat', 'coolant']);
  out.coolant.temperature = positive(c.temperature ?? missing(['heat', 'coolant', 'temperature'], 'Add "temperature": "215 degC".'), 'temperature', ['heat', 'coolant', 'temperature'], 'Give the coolant temperature.');
  if (out.mode === 'co-current' || out.mode === 'counter-current') {
    out.coolant.flow = positive(c.flow ?? missing(['heat', 'coolant', 'flow'], 'Add "flow": "40 kg/s" (the whole reactor).'), 'massFlow', ['heat', 'coolant', 'flow'], 'Give the coolant mass flow, for example "40 kg/s".');
    out.coolant.heatCapacity = positive(c.heatCapacity ?? missing(['heat', 'coolant', 'heatCapacity'], 'Add "heatCapacity": "2.3 kJ/(kg K)".'), 'specificHeatCapacity', ['heat', 'coolant', 'heatCapacity'], 'Give the coolant heat capacity, for example "2.3 kJ/(kg K)".');
  }
  if (out.maxTemperature !== undefined && out.coolant.temperature >= out.maxTemperature) {
    throw new RateloomError('E_VALUE', `the coolant temperature ${out.coolant.temperature.toFixed(2)} K is not below the limit heat.maxTemperature ${out.maxTemperature.toFixed(2)} K`, {
      path: ['heat', 'coolant', 'temperature'], fix: 'Lower the coolant temperature below heat.maxTemperature (or correct the limit).',
    });
  }
}

/**
 * Reaction enthalpies of `heat.reactionEnthalpy` (J/mol, keyed by reaction id); an id that is not a
 * reaction of the kinetics is refused with the closest id.
 */
export function loadReactionEnthalpies(re: Obj, reactionIds: readonly string[]): Record<string, number> {
  const out: Record<string, number> = {};
  for (const [id, q] of Object.entries(re)) {
    if (!reactionIds.includes(id)) {
      const near = closestName(id, reactionIds);
      throw new RateloomError('E_VALUE', `reaction '${id}' is not in the fitted kinetics`, {
        path: ['heat', 'reactionEnthalpy', id],
        fix: near ? `Did you mean '${near}'?` : `Use one of: ${reactionIds.join(', ')}.`,
      });
    }
    out[id] = quantityToSI(q, 'molarEnergy', ['heat', 'reactionEnthalpy', id]);
  }
  return out;
}

function missing(path: FieldPath, fix: string): never {
  throw new RateloomError('E_MISSING_FIELD', `missing field '${String(path[path.length - 1])}'`, { path, fix });
}
