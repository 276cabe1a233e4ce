/**
 * Quantities and conversion at the edges: every number read from a study or CSV passes through
 * `unitFor(quantity, unit)` once and is SI from then on. A unit is accepted for a quantity when it
 * parses (parse.ts) and has the quantity's dimensions; an unknown or mismatched unit is a
 * RateloomError('E_UNIT') that lists the common units of the quantity and the closest one.
 * Temperatures in degC/degF are affine; gauge pressures (barg, psig, kPa(g)) need the column to be
 * marked gauge and an ambient pressure.
 */
import { RateloomError, closestName, type ErrorLocation, type FieldPath } from '../core/errors.js';
import { formatSiUnit, parseCompoundUnit, sameDims, UnitSyntaxError, type ParsedUnit } from './parse.js';
import { AFFINE_TEMPERATURE, DIMS, TEMPERATURE_ALIASES, type Dims } from './table.js';
import { checkArgs, is } from '../core/args.js';

export type Quantity =
  | 'molar-flow'
  | 'mass'
  | 'volume'
  | 'volumetric-flow'
  | 'pressure'
  | 'temperature'
  | 'time'
  | 'concentration'
  | 'rate'
  | 'molar-energy'
  | 'mass-flux'
  | 'viscosity'
  | 'density'
  | 'length'
  | 'area'
  | 'dimensionless'
  | 'inverse-mass'
  | 'inverse-volume'
  | 'frequency';

interface QuantityDef {
  /** Allowed dimension vectors (rate data may be per kg catalyst or per m3). */
  dims: Dims[];
  si: string;
  /** The common units, listed in error messages (any unit of the right dimensions is accepted). */
  common: string[];
}

const RATE_MASS: Dims = [-1, 0, -1, 1, 0];
const RATE_VOLUME: Dims = [0, -3, -1, 1, 0];

export const QUANTITIES: Readonly<Record<Quantity, QuantityDef>> = {
  'molar-flow': { dims: [[0, 0, -1, 1, 0]], si: 'mol/s', common: ['mol/s', 'mmol/s', 'mmol/min', 'mol/min', 'mol/h', 'kmol/h'] },
  mass: { dims: [DIMS.mass], si: 'kg', common: ['kg', 'g', 'mg', 't', 'lb'] },
  volume: { dims: [DIMS.volume], si: 'm3', common: ['m3', 'L', 'mL', 'cm3'] },
  'volumetric-flow': { dims: [[0, 3, -1, 0, 0]], si: 'm3/s', common: ['m3/s', 'm3/h', 'L/min', 'L/h', 'mL/min'] },
  pressure: { dims: [DIMS.pressure], si: 'Pa', common: ['Pa', 'kPa', 'MPa', 'bar', 'mbar', 'atm', 'psi', 'psia', 'torr', 'mmHg'] },
  temperature: { dims: [DIMS.temp], si: 'K', common: ['K', 'degC', 'degF'] },
  time: { dims: [DIMS.time], si: 's', common: ['s', 'min', 'h'] },
  concentration: { dims: [DIMS.conc], si: 'mol/m3', common: ['mol/m3', 'mol/L', 'M', 'mmol/L'] },
  rate: {
    dims: [RATE_MASS, RATE_VOLUME],
    si: 'mol/(kg s) or mol/(m3 s)',
    common: ['mol/(kg s)', 'mol/(kg h)', 'mol/(g s)', 'mmol/(g min)', 'mol/(m3 s)', 'mol/(L s)', 'mol/(L min)'],
  },
  'molar-energy': { dims: [[1, 2, -2, -1, 0]], si: 'J/mol', common: ['J/mol', 'kJ/mol', 'kcal/mol'] },
  'mass-flux': { dims: [[1, -2, -1, 0, 0]], si: 'kg/(m2 s)', common: ['kg/(m2 s)', 'g/(cm2 s)', 'kg/(m2 h)'] },
  viscosity: { dims: [DIMS.viscosity], si: 'Pa s', common: ['Pa s', 'mPa s', 'cP'] },
  density: { dims: [[1, -3, 0, 0, 0]], si: 'kg/m3', common: ['kg/m3', 'g/cm3', 'g/mL', 'g/L', 'kg/L'] },
  length: { dims: [DIMS.length], si: 'm', common: ['m', 'cm', 'mm', 'um'] },
  area: { dims: [[0, 2, 0, 0, 0]], si: 'm2', common: ['m2', 'cm2', 'mm2'] },
  dimensionless: { dims: [DIMS.none], si: '1', common: ['1', 'fraction', '%', 'mol/mol', 'ppm'] },
  'inverse-mass': { dims: [[-1, 0, 0, 0, 0]], si: '1/kg', common: ['1/kg', '1/g'] },
  'inverse-volume': { dims: [[0, -3, 0, 0, 0]], si: '1/m3', common: ['1/m3', '1/L', '1/mL'] },
  frequency: { dims: [[0, 0, -1, 0, 0]], si: '1/s', common: ['1/s', '1/min', '1/h'] },
};

/** An affine map from a stated unit to SI: si = x * factor + shift. */
export interface UnitConversion {
  quantity: Quantity;
  /** The unit as written. */
  unit: string;
  /** The SI unit of the result. */
  si: string;
  factor: number;
  /** Added after multiplying, in SI (273.15 K for degC, the ambient pressure for gauge); 0 otherwise. */
  shift: number;
  /** For rate data: whether the unit is per kg catalyst or per m3. */
  basis?: 'mass' | 'volume';
  toSI(x: number): number;
  fromSI(x: number): number;
}

export interface UnitOptions {
  /** The value is a gauge pressure (column marked gauge); requires `ambientPressure`. Default false. */
  gauge?: boolean;
  /** Ambient pressure added to gauge readings, Pa. No default. */
  ambientPressure?: number;
  /** Field path for error messages. */
  path?: FieldPath;
  location?: ErrorLocation;
}

function makeConversion(quantity: Quantity, unit: string, si: string, factor: number, shift: number, basis?: 'mass' | 'volume'): UnitConversion {
  return {
    quantity,
    unit,
    si,
    factor,
    shift,
    ...(basis ? { basis } : {}),
    toSI: (x: number) => x * factor + shift,
    fromSI: (x: number) => (x - shift) / factor,
  };
}

/** A unit as shown in a message: cut after 40 characters. */
const shownUnit = (unit: string): string => (unit.length > 40 ? `${unit.slice(0, 40)}...` : unit);

function unitError(quantity: Quantity, unit: string, why: string, opts: UnitOptions): RateloomError {
  const def = QUANTITIES[quantity];
  const closest = unit.length > 40 ? undefined : closestName(unit, def.common);
  const hint = closest ? ` (closest: '${closest}')` : '';
  const shown = shownUnit(unit);
  return new RateloomError('E_UNIT', `unit '${shown}' is not a ${quantity} unit: ${why}${hint}`, {
    path: opts.path ?? [],
    ...(opts.location ? { location: opts.location } : {}),
    fix: `Use one of: ${def.common.join(', ')}${quantity === 'pressure' ? ' (gauge: barg, psig, kPa(g) with gauge: true and an ambient pressure)' : ''}.`,
    details: { quantity, accepted: def.common, ...(closest ? { closest } : {}) },
  });
}

const GAUGE_RE = /^(.*?)\s*(?:\(g\)|g)$/;

function parseTyped(quantity: Quantity, unit: string, opts: UnitOptions): ParsedUnit {
  let parsed: ParsedUnit;
  try {
    parsed = parseCompoundUnit(unit);
  } catch (e) {
    if (e instanceof UnitSyntaxError) throw unitError(quantity, unit, e.message, opts);
    throw e;
  }
  return parsed;
}

/**
 * The conversion of `unit` for `quantity`. Throws RateloomError('E_UNIT') for an unknown unit, a
 * unit of other dimensions, or a gauge pressure without `gauge: true` and `ambientPressure`.
 */
export function unitFor(quantity: Quantity, unit: string, opts: UnitOptions = {}): UnitConversion {
  checkArgs('unitFor', [quantity, unit, opts], [{ name: 'quantity', check: is.oneOf(QUANTITY_NAMES) }, { name: 'unit', check: is.text }, { name: 'options', check: is.optional(is.object) }]);
  const def = QUANTITIES[quantity];
  if (typeof unit !== 'string' || unit.trim() === '') throw unitError(quantity, String(unit), 'no unit given', opts);
  const u = unit.trim();
  if (quantity === 'temperature') {
    const key = AFFINE_TEMPERATURE[u] ? u : TEMPERATURE_ALIASES[u];
    const t = key ? AFFINE_TEMPERATURE[key] : undefined;
    if (!t) throw unitError(quantity, u, 'unknown temperature unit', opts);
    return makeConversion(quantity, u, 'K', t.factor, t.offset * t.factor);
  }
  if (quantity === 'pressure') {
    let base = u;
    let gaugeUnit = false;
    let ok = true;
    try {
      const p = parseCompoundUnit(u);
      ok = sameDims(p.dims, DIMS.pressure);
    } catch {
      ok = false;
    }
    if (!ok) {
      const m = GAUGE_RE.exec(u);
      if (m && m[1]) {
        base = m[1];
        gaugeUnit = true;
      }
    }
    const p = parseTyped(quantity, base, opts);
    if (!sameDims(p.dims, DIMS.pressure)) throw unitError(quantity, u, `it has dimensions ${formatSiUnit(p.dims)}`, opts);
    const gauge = gaugeUnit || opts.gauge === true;
    if (!gauge) return makeConversion(quantity, u, 'Pa', p.factor, 0);
    if (opts.gauge !== true || opts.ambientPressure === undefined || !Number.isFinite(opts.ambientPressure)) {
      throw new RateloomError('E_UNIT', `gauge pressure unit '${u}' needs the column marked gauge and an ambient pressure`, {
        path: opts.path ?? [],
        ...(opts.location ? { location: opts.location } : {}),
        fix: "Add \"gauge\": true to the column and give \"ambientPressure\" (for example {\"value\": 101.325, \"unit\": \"kPa\"}), or give absolute pressures.",
        details: { quantity, accepted: def.common },
      });
    }
    return makeConversion(quantity, u, 'Pa', p.factor, opts.ambientPressure);
  }
  const p = parseTyped(quantity, u, opts);
  const idx = def.dims.findIndex((d) => sameDims(d, p.dims));
  if (idx < 0) throw unitError(quantity, u, `it has dimensions ${formatSiUnit(p.dims)}, expected ${def.si}`, opts);
  if (quantity === 'rate') {
    const basis = idx === 0 ? 'mass' : 'volume';
    return makeConversion(quantity, u, basis === 'mass' ? 'mol/(kg s)' : 'mol/(m3 s)', p.factor, 0, basis);
  }
  return makeConversion(quantity, u, def.si, p.factor, 0);
}

/** The quantity names unitFor knows. */
const QUANTITY_NAMES = Object.keys(QUANTITIES);

/** Convert `value` in `unit` to SI for `quantity`. */
export function toSI(value: number, quantity: Quantity, unit: string, opts: UnitOptions = {}): number {
  checkArgs('toSI', [value, quantity], [{ name: 'value', check: is.number }, { name: 'quantity', check: is.oneOf(QUANTITY_NAMES) }]);
  return unitFor(quantity, unit, opts).toSI(value);
}

/** Convert an SI `value` of `quantity` to `unit`. */
export function fromSI(value: number, quantity: Quantity, unit: string, opts: UnitOptions = {}): number {
  checkArgs('fromSI', [value, quantity], [{ name: 'value', check: is.number }, { name: 'quantity', check: is.oneOf(QUANTITY_NAMES) }]);
  return unitFor(quantity, unit, opts).fromSI(value);
}

/** The common units of a quantity (those listed in error messages). */
export function acceptedUnits(quantity: Quantity): readonly string[] {
  checkArgs('acceptedUnits', [quantity], [{ name: 'quantity', check: is.oneOf(QUANTITY_NAMES) }]);
  return QUANTITIES[quantity].common;
}

/** The SI unit of a quantity. */
export function siUnit(quantity: Quantity): string {
  checkArgs('siUnit', [quantity], [{ name: 'quantity', check: is.oneOf(QUANTITY_NAMES) }]);
  return QUANTITIES[quantity].si;
}

/**
 * Convert a value in an arbitrary compound unit (a parameter such as 'L/(mol s)' or
 * 'mol/(g min bar)') to SI; returns the SI value and the SI unit text. Affine temperature units
 * are refused here (a parameter in degC is ambiguous).
 */
export function compoundToSI(value: number, unit: string, opts: Pick<UnitOptions, 'path' | 'location'> = {}): { value: number; unit: string } {
  checkArgs('compoundToSI', [value, unit, opts], [{ name: 'value', check: is.number }, { name: 'unit', check: is.text }, { name: 'options', check: is.optional(is.object) }]);
  let p: ParsedUnit;
  try {
    p = parseCompoundUnit(unit);
  } catch (e) {
    if (!(e instanceof UnitSyntaxError)) throw e;
    throw new RateloomError('E_UNIT', `unit '${shownUnit(unit)}' cannot be read: ${e.message}`, {
      path: opts.path ?? [],
      ...(opts.location ? { location: opts.location } : {}),
      fix: "Write the unit with symbols, '/', spaces for products and ^ for powers, for example 'mol/(kg s bar^2)' or 'kJ/mol'.",
    });
  }
  return { value: value * p.factor, unit: siUnitText(p.dims) };
}

/** SI unit text of a dimension vector: a quantity's own SI name when it has one (J/mol, Pa, mol/(kg s)), else generic. */
export function siUnitText(dims: Dims): string {
  for (const def of Object.values(QUANTITIES)) {
    if (def.dims.length === 1 && sameDims(def.dims[0], dims)) return def.si;
  }
  if (sameDims(dims, RATE_MASS)) return 'mol/(kg s)';
  if (sameDims(dims, RATE_VOLUME)) return 'mol/(m3 s)';
  return formatSiUnit(dims);
}
