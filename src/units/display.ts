/**
 * Display units: SI inside, the user's units at the edges. A study (or production case) may name
 * the unit it wants each kind of quantity shown in (`displayUnits`: kJ/mol, bar, degC, kg, m3, h,
 * ...); values are otherwise shown in the unit the user wrote for them. A composite unit (a rate
 * constant such as m^6/(mol kg s)) is rebuilt from the user's units atom by atom (each mass atom
 * becomes the display mass unit, each length or volume atom the display volume unit, and so on),
 * then simplified: atoms of one kind are merged into one (L m^3 -> L^2), and exponents that sum
 * to zero are dropped. Conversion itself goes through the one parser (parse.ts) and the affine
 * temperature table (table.ts); nothing here holds a factor of its own.
 */
import { RateloomError, closestName, type FieldPath } from '../core/errors.js';
import { parseCompoundUnit, sameDims, UnitSyntaxError, type ParsedUnit } from './parse.js';
import { QUANTITIES, siUnitText, unitFor, type Quantity } from './quantity.js';
import { ATOMS, AFFINE_TEMPERATURE, DIMS, TEMPERATURE_ALIASES, type Dims } from './table.js';

/** The keys of `displayUnits` and the quantity each one names ('amount' is the amount of substance). */
export const DISPLAY_KEYS = {
  temperature: 'temperature',
  pressure: 'pressure',
  energy: 'molar-energy',
  mass: 'mass',
  volume: 'volume',
  length: 'length',
  time: 'time',
  amount: 'amount',
  molarFlow: 'molar-flow',
  volumetricFlow: 'volumetric-flow',
  concentration: 'concentration',
} as const satisfies Record<string, Quantity | 'amount'>;

export type DisplayKey = keyof typeof DISPLAY_KEYS;

/**
 * The units a study or case wants its numbers shown in, one per kind of quantity; a kind left out
 * is shown in the unit the user wrote for each value (else SI).
 */
export type DisplayUnits = Partial<Record<DisplayKey, string>>;

const AMOUNT_DIMS: Dims = DIMS.amount;

function checkAmount(unit: string, path: FieldPath): void {
  let p: ParsedUnit | undefined;
  try {
    p = parseCompoundUnit(unit);
  } catch (e) {
    if (!(e instanceof UnitSyntaxError)) throw e;
  }
  if (!p || !sameDims(p.dims, AMOUNT_DIMS)) {
    throw new RateloomError('E_UNIT', `unit '${unit}' is not an amount-of-substance unit`, { path, fix: 'Use one of: mol, mmol, kmol.', details: { quantity: 'amount', accepted: ['mol', 'mmol', 'kmol'] } });
  }
}

/**
 * Check a `displayUnits` object: every key a known kind, every unit one of that kind (typed
 * E_UNKNOWN_FIELD and E_UNIT errors with the field path). Returns the checked copy.
 */
export function checkDisplayUnits(raw: unknown, path: FieldPath): DisplayUnits {
  if (raw === undefined) return {};
  if (typeof raw !== 'object' || raw === null || Array.isArray(raw)) {
    throw new RateloomError('E_SCHEMA', 'displayUnits must be an object such as {"energy": "kJ/mol", "pressure": "bar"}', { path, fix: `Give an object with some of the keys ${Object.keys(DISPLAY_KEYS).join(', ')}.` });
  }
  const out: DisplayUnits = {};
  for (const [key, unit] of Object.entries(raw)) {
    const at = [...path, key];
    if (!Object.hasOwn(DISPLAY_KEYS, key)) {
      const near = closestName(key, Object.keys(DISPLAY_KEYS));
      throw new RateloomError('E_UNKNOWN_FIELD', `displayUnits has no kind '${key}'${near ? ` (did you mean '${near}'?)` : ''}`, { path: at, fix: `Use one of: ${Object.keys(DISPLAY_KEYS).join(', ')}.`, ...(near ? { details: { closest: near } } : {}) });
    }
    if (typeof unit !== 'string') throw new RateloomError('E_SCHEMA', `displayUnits.${key} must be a unit text`, { path: at });
    const q = DISPLAY_KEYS[key as DisplayKey];
    if (q === 'amount') checkAmount(unit, at);
    else unitFor(q, unit, { path: at });
    out[key as DisplayKey] = unit.trim();
  }
  return out;
}

function temperatureKey(unit: string): string | undefined {
  const u = unit.trim();
  return AFFINE_TEMPERATURE[u] ? u : TEMPERATURE_ALIASES[u];
}

/** Dimension vector of a unit text (affine temperatures read as kelvin); undefined when it does not parse. */
export function unitDims(unit: string): Dims | undefined {
  if (temperatureKey(unit)) return DIMS.temp;
  try {
    return parseCompoundUnit(unit).dims;
  } catch (e) {
    if (e instanceof UnitSyntaxError) return undefined;
    throw e;
  }
}

/** The display unit named for the whole quantity of `dims`, when the display set has one. */
function wholeQuantityUnit(dims: Dims, d: DisplayUnits): string | undefined {
  for (const [key, q] of Object.entries(DISPLAY_KEYS) as [DisplayKey, Quantity | 'amount'][]) {
    const u = d[key];
    if (u === undefined) continue;
    const qd = q === 'amount' ? [AMOUNT_DIMS] : QUANTITIES[q].dims;
    if (qd.some((x) => sameDims(x, dims))) return u;
  }
  return undefined;
}

type Terms = ReadonlyArray<readonly [string, number]>;

/** Index of the one base dimension of an atom and its power (L: length, 3), or undefined for pressure, energy and the like. */
function baseOf(atomDims: Dims): { index: number; power: number } | undefined {
  const nz = atomDims.map((e, i) => [i, e] as const).filter(([, e]) => e !== 0);
  return nz.length === 1 ? { index: nz[0][0], power: nz[0][1] } : undefined;
}

const BASE_KEY: Readonly<Record<number, DisplayKey>> = { 0: 'mass', 2: 'time', 3: 'amount' };

/** The display terms replacing one written atom (raised to `e`), or the atom itself. */
function substitute(atom: string, e: number, d: DisplayUnits): Terms {
  const a = ATOMS[atom];
  const base = a ? baseOf(a.dims) : undefined;
  let unit: string | undefined;
  let scale = 1;
  if (base?.index === 1) {
    // length or volume: a display volume takes every length atom (m^6 -> L^2), a display length too
    if (d.volume !== undefined && (base.power === 3 || d.length === undefined)) [unit, scale] = [d.volume, base.power / 3];
    else if (d.length !== undefined) [unit, scale] = [d.length, base.power];
  } else if (base && BASE_KEY[base.index] !== undefined) {
    unit = d[BASE_KEY[base.index]];
  } else if (a && sameDims(a.dims, DIMS.pressure)) {
    unit = d.pressure;
  } else if (a && sameDims(a.dims, DIMS.conc)) {
    unit = d.concentration;
  }
  if (unit === undefined) return [[atom, e]];
  return parseCompoundUnit(unit).terms.map(([k, x]) => [k, x * e * scale] as const);
}

/** Atoms of one base dimension merged into the first one written (L and m^3 -> L^2); zero exponents dropped. */
function mergeKinds(terms: Terms): Terms {
  const out = new Map<string, number>();
  const firstOfBase = new Map<number, { atom: string; power: number }>();
  for (const [atom, e] of terms) {
    const a = ATOMS[atom];
    const base = a ? baseOf(a.dims) : undefined;
    if (!base) {
      out.set(atom, (out.get(atom) ?? 0) + e);
      continue;
    }
    const first = firstOfBase.get(base.index) ?? { atom, power: base.power };
    firstOfBase.set(base.index, first);
    out.set(first.atom, (out.get(first.atom) ?? 0) + (e * base.power) / first.power);
  }
  return [...out].filter(([, e]) => Math.abs(e) > 1e-9);
}

function fmtExponent(e: number): string {
  return String(Number(e.toFixed(6)));
}

function writeTerm(atom: string, e: number): string {
  const x = Math.abs(e);
  if (Math.abs(x - 1) < 1e-9) return atom;
  if (atom === 'm' && (Math.abs(x - 2) < 1e-9 || Math.abs(x - 3) < 1e-9)) return `m${fmtExponent(x)}`;
  return `${atom}^${fmtExponent(x)}`;
}

/** Terms written as 'num/(den)', for example 'L^2/(mol g min)'. */
export function writeTerms(terms: Terms): string {
  const num = terms.filter(([, e]) => e > 0).map(([a, e]) => writeTerm(a, e));
  const den = terms.filter(([, e]) => e < 0).map(([a, e]) => writeTerm(a, e));
  const top = num.length ? num.join(' ') : '1';
  if (!den.length) return top;
  return `${top}/${den.length > 1 ? `(${den.join(' ')})` : den[0]}`;
}

/** Terms of an SI dimension vector in the display base units (mass, volume or length, time, amount, K). */
function termsFromDims(dims: Dims): Terms {
  return (['kg', 'm', 's', 'mol', 'K'] as const).map((a, i) => [a, dims[i]] as const).filter(([, e]) => e !== 0);
}

function sameUnitDims(unit: string, dims: Dims): boolean {
  const u = unitDims(unit);
  return u !== undefined && sameDims(u, dims);
}

/**
 * The unit a value of SI dimensions `dims` is shown in: the display unit of its whole quantity
 * when the set names one (energy, pressure, temperature, ...); else the unit the user wrote,
 * rebuilt atom by atom from the display units and simplified; else, with nothing written, SI
 * rebuilt from the display units. With no display units a written unit is returned as written.
 */
export function displayUnitFor(dims: Dims, written: string | undefined, d: DisplayUnits = {}): string {
  const whole = wholeQuantityUnit(dims, d);
  if (whole !== undefined) return whole;
  const usable = written !== undefined && sameUnitDims(written, dims) ? written : undefined;
  if (usable !== undefined && temperatureKey(usable)) return usable;
  if (Object.keys(d).length === 0) return usable ?? siUnitText(dims);
  const terms = usable !== undefined ? parseCompoundUnit(usable).terms : termsFromDims(dims);
  const built = writeTerms(mergeKinds(terms.flatMap(([a, e]) => substitute(a, e, d))));
  return sameUnitDims(built, dims) ? built : (usable ?? siUnitText(dims));
}

/** How SI values map to a shown unit: x_shown = (x_SI - shift) / factor; differences use the factor alone. */
export interface DisplayConversion {
  unit: string;
  factor: number;
  shift: number;
}

/** The conversion from SI to `unit` (affine for degC and degF). Throws UnitSyntaxError for an unreadable unit. */
export function displayConversion(unit: string): DisplayConversion {
  const t = temperatureKey(unit);
  if (t) {
    const a = AFFINE_TEMPERATURE[t];
    return { unit, factor: a.factor, shift: a.offset * a.factor };
  }
  return { unit, factor: parseCompoundUnit(unit).factor, shift: 0 };
}

/** An SI value shown in a conversion's unit; null stays null. */
export function shownValue(c: DisplayConversion, si: number | null): number | null {
  return si === null || !Number.isFinite(si) ? si : (si - c.shift) / c.factor;
}

/** An SI difference (standard error, interval width) shown in a conversion's unit; null stays null. */
export function shownDifference(c: DisplayConversion, si: number | null): number | null {
  return si === null || !Number.isFinite(si) ? si : si / c.factor;
}

/** A value in the user's unit with its SI value beside it (the JSON shape of docs/display-units.md). */
export interface ShownQuantity {
  value: number | null;
  unit: string;
  valueSI: number | null;
  unitSI: string;
}

/** A quantity of SI value `si` and SI unit `unitSI` shown through `c`. */
export function shownQuantity(c: DisplayConversion, si: number | null, unitSI: string): ShownQuantity {
  return { value: shownValue(c, si), unit: c.unit, valueSI: si, unitSI };
}
