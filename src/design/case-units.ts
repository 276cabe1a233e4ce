/**
 * Unit conversion for the fields of the production case file: each quantity is written as
 * { "value": 10, "unit": "bar" } or as the string "10 bar" and converted to SI here. Only the
 * quantities a case file needs are listed; conversion goes through src/units (which checks the
 * dimensions, so a pressure field cannot be given in metres); two kinds src/units does not list
 * (temperature difference, molar heat capacity) use a small local table.
 */
import { RateloomError, closestName, type FieldPath } from '../core/errors.js';
import { acceptedUnits, toSI, type Quantity } from '../units/index.js';

export type QuantityKind =
  | 'molarFlow'
  | 'temperature'
  | 'pressure'
  | 'length'
  | 'density'
  | 'viscosity'
  | 'volumetricFlow'
  | 'mass'
  | 'volume'
  | 'time'
  | 'molarEnergy'
  | 'molarHeatCapacity'
  | 'concentration'
  | 'alphaMass'
  | 'alphaVolume'
  | 'temperatureDifference'
  | 'area'
  | 'heatTransferCoefficient'
  | 'thermalConductivity'
  | 'massFlow'
  | 'specificHeatCapacity';

/** The src/units quantity behind each kind (null: converted by the local table below). */
const QUANTITY: Record<QuantityKind, Quantity | null> = {
  molarFlow: 'molar-flow',
  temperature: 'temperature',
  temperatureDifference: null,
  pressure: 'pressure',
  length: 'length',
  density: 'density',
  viscosity: 'viscosity',
  volumetricFlow: 'volumetric-flow',
  mass: 'mass',
  volume: 'volume',
  time: 'time',
  molarEnergy: 'molar-energy',
  molarHeatCapacity: null,
  concentration: 'concentration',
  alphaMass: 'inverse-mass',
  alphaVolume: 'inverse-volume',
  area: 'area',
  heatTransferCoefficient: null,
  thermalConductivity: null,
  massFlow: null,
  specificHeatCapacity: null,
};

/** Kinds that src/units does not list: factor to SI per unit symbol. */
const LOCAL: Partial<Record<QuantityKind, Record<string, number>>> = {
  temperatureDifference: { K: 1, degC: 1 },
  molarHeatCapacity: { 'J/(mol K)': 1, 'J/mol/K': 1, 'kJ/(mol K)': 1000, 'kJ/mol/K': 1000 },
  heatTransferCoefficient: { 'W/(m2 K)': 1, 'W/m2/K': 1, 'kW/(m2 K)': 1000 },
  thermalConductivity: { 'W/(m K)': 1, 'W/m/K': 1 },
  // 1 h = 3600 s, 1 t = 1000 kg (SI Brochure, 9th ed., table 8)
  massFlow: { 'kg/s': 1, 'kg/h': 1 / 3600, 't/h': 1000 / 3600 },
  specificHeatCapacity: { 'J/(kg K)': 1, 'J/kg/K': 1, 'kJ/(kg K)': 1000, 'kJ/kg/K': 1000 },
};

/** The SI unit of each kind, as reported in results. */
export const SI_UNIT: Record<QuantityKind, string> = {
  molarFlow: 'mol/s',
  temperature: 'K',
  temperatureDifference: 'K',
  pressure: 'Pa',
  length: 'm',
  density: 'kg/m3',
  viscosity: 'Pa s',
  volumetricFlow: 'm3/s',
  mass: 'kg',
  volume: 'm3',
  time: 's',
  molarEnergy: 'J/mol',
  molarHeatCapacity: 'J/(mol K)',
  concentration: 'mol/m3',
  alphaMass: '1/kg',
  alphaVolume: '1/m3',
  area: 'm2',
  heatTransferCoefficient: 'W/(m2 K)',
  thermalConductivity: 'W/(m K)',
  massFlow: 'kg/s',
  specificHeatCapacity: 'J/(kg K)',
};

/** Units accepted for a kind (for messages and the --help text). */
export function unitsOf(kind: QuantityKind): string[] {
  const q = QUANTITY[kind];
  return q ? [...acceptedUnits(q)] : Object.keys(LOCAL[kind] ?? {});
}

/**
 * Convert a quantity written in the case file to SI. Accepts { value, unit } or "value unit".
 * Throws E_TYPE / E_UNIT naming the field.
 */
export function quantityToSI(raw: unknown, kind: QuantityKind, path: FieldPath): number {
  let value: unknown;
  let unit: unknown;
  if (typeof raw === 'string') {
    const m = /^\s*([-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?)\s*(.+?)\s*$/.exec(raw);
    if (!m) {
      throw new RateloomError('E_TYPE', `'${raw}' is not a number followed by a unit`, {
        path,
        fix: `Write it as "10 ${SI_UNIT[kind]}" or { "value": 10, "unit": "${SI_UNIT[kind]}" }.`,
      });
    }
    value = Number(m[1]);
    unit = m[2];
  } else if (raw && typeof raw === 'object' && !Array.isArray(raw)) {
    const o = raw as Record<string, unknown>;
    for (const k of Object.keys(o)) {
      if (k !== 'value' && k !== 'unit') {
        const near = closestName(k, ['value', 'unit']);
        throw new RateloomError('E_UNKNOWN_FIELD', `unknown field '${k}' in a quantity`, {
          path: [...path, k],
          fix: near ? `Did you mean '${near}'?` : 'A quantity has only "value" and "unit".',
          ...(near ? { details: { closest: near } } : {}),
        });
      }
    }
    value = o.value;
    unit = o.unit;
    if (unit === undefined) {
      throw new RateloomError('E_MISSING_FIELD', 'the quantity has no unit', {
        path: [...path, 'unit'],
        fix: `Add "unit", one of: ${unitsOf(kind).join(', ')}.`,
      });
    }
  } else {
    throw new RateloomError('E_TYPE', 'expected a quantity with a unit', {
      path,
      fix: `Write it as { "value": 10, "unit": "${SI_UNIT[kind]}" } or "10 ${SI_UNIT[kind]}".`,
    });
  }
  if (typeof value !== 'number' || !Number.isFinite(value)) {
    throw new RateloomError('E_TYPE', 'the quantity value is not a finite number', { path: [...path, 'value'] });
  }
  if (typeof unit !== 'string') {
    throw new RateloomError('E_TYPE', 'the unit is not a string', { path: [...path, 'unit'] });
  }
  const u = unit.trim();
  const q = QUANTITY[kind];
  if (q) return toSI(value, q, u, { path: [...path, 'unit'] });
  const factor = LOCAL[kind]?.[u];
  if (factor === undefined) {
    const near = closestName(u, unitsOf(kind));
    throw new RateloomError('E_UNIT', `unit '${u}' is not a supported ${kind} unit`, {
      path: [...path, 'unit'],
      fix: `Use one of: ${unitsOf(kind).join(', ')}${near ? ` (closest: '${near}')` : ''}.`,
    });
  }
  return value * factor;
}
