/**
 * Reading a lab spreadsheet's column header: the unit written into it (`T [degC]`,
 * `F_A,out (mol/min)`, `W / g`, a unit suffix such as `T_C` or `P_bar`) and the role of the
 * column (run id, replicate mark, species column, temperature, pressure, catalyst mass, volume,
 * time, volumetric flow, or a per-species molar flow, concentration or mole fraction going in or
 * coming out). The patterns are the usual habits of lab exports (common practice); anything not
 * recognised is reported, never guessed silently.
 */
import { unitFor, type Quantity } from '../units/index.js';
import { checkArgs, is } from '../core/args.js';

/** What a column holds. */
export type ColumnRole =
  | 'run'
  | 'replicate'
  | 'species'
  | 'temperature'
  | 'pressure'
  | 'catalystMass'
  | 'volume'
  | 'time'
  | 'volumetricFlow'
  | 'amount';

/** A per-species (or, in a stacked file, per-row) amount: flow, concentration or mole fraction. */
export type AmountKind = 'molar-flow' | 'concentration' | 'fraction';

/** One recognised column. */
export interface RecognisedColumn {
  /** The header cell exactly as written. */
  header: string;
  role: ColumnRole;
  /** Unit found in the header (or its suffix), checked against the role's quantity. */
  unit?: string;
  /** Amount columns: what kind, which species (absent in a stacked file) and which side. */
  amount?: { kind: AmountKind; species?: string; side: 'in' | 'out' };
}

/** The quantity each non-amount role's unit must be. */
export const ROLE_QUANTITY: Partial<Record<ColumnRole, Quantity>> = {
  temperature: 'temperature',
  pressure: 'pressure',
  catalystMass: 'mass',
  volume: 'volume',
  time: 'time',
  volumetricFlow: 'volumetric-flow',
};

const AMOUNT_QUANTITY: Record<AmountKind, Quantity> = { 'molar-flow': 'molar-flow', concentration: 'concentration', fraction: 'dimensionless' };

/** Unit suffixes written without their separators (`C_molL`, `Q_mL_min`), as unit text. */
const SUFFIX_UNITS: Record<string, string> = {
  C: 'degC', degC: 'degC', K: 'K', F: 'degF', bar: 'bar', barg: 'barg', kPa: 'kPa', MPa: 'MPa', Pa: 'Pa', atm: 'atm', psi: 'psi', psia: 'psia',
  g: 'g', kg: 'kg', mg: 'mg', s: 's', min: 'min', h: 'h', L: 'L', mL: 'mL', m3: 'm3',
  molL: 'mol/L', mmolL: 'mmol/L', mol_L: 'mol/L', mLmin: 'mL/min', mL_min: 'mL/min', Lmin: 'L/min', L_min: 'L/min', Lh: 'L/h', L_h: 'L/h',
  molmin: 'mol/min', mol_min: 'mol/min', mmolmin: 'mmol/min', mmol_min: 'mmol/min', mols: 'mol/s', mol_s: 'mol/s', molh: 'mol/h', mol_h: 'mol/h',
};

/** The quantity a unit text measures, among `candidates`; undefined when it is none of them. */
export function unitQuantity(unit: string, candidates: readonly Quantity[]): Quantity | undefined {
  for (const q of candidates) {
    try {
      unitFor(q, unit);
      return q;
    } catch {
      /* not this one */
    }
  }
  return undefined;
}

/** Unit text as rateloom spells it (degree signs, 'l' for litre). */
function normaliseUnit(u: string): string {
  return u.trim().replace(/°\s*C/g, 'degC').replace(/°\s*F/g, 'degF').replace(/^oC$/, 'degC').replace(/\bl\b/g, 'L');
}

/**
 * Split a header into its name and the unit written into it: `name [unit]`, `name (unit)`,
 * `name / unit` or `name in unit`. The unit is returned as written (normalised), unchecked.
 */
export function splitHeader(header: string): { name: string; unit?: string } {
  checkArgs('splitHeader', [header], [{ name: 'header', check: is.text }]);
  const h = header.trim();
  const bracket = /^(.*?)\s*[[(]\s*([^\])]+?)\s*[\])]\s*$/.exec(h);
  if (bracket && bracket[1] !== '') return { name: bracket[1].trim(), unit: normaliseUnit(bracket[2]) };
  const slash = /^(.*?\S)\s+\/\s+(\S.*)$/.exec(h);
  if (slash) return { name: slash[1].trim(), unit: normaliseUnit(slash[2]) };
  const words = /^(.*?\S)\s+in\s+(\S+)$/.exec(h);
  if (words) return { name: words[1].trim(), unit: normaliseUnit(words[2]) };
  return { name: h };
}

const NAME_PATTERNS: [ColumnRole, RegExp][] = [
  ['run', /^(run|run[ _-]?(id|no|nr|number|#)|exp(eriment)?([ _-]?(id|no))?|id|sample[ _-]?id)$/i],
  ['replicate', /^(rep|reps|replicate|repeat|repl|rep[ _-]?(id|no|group)|replicate[ _-]?(id|no|group))$/i],
  ['species', /^(species|component|compound|substance)$/i],
  ['temperature', /^(T|temp|temperature|T[ _-]?(reactor|bed|rxn))$/],
  ['temperature', /^(temp|temperature)$/i],
  ['time', /^(t|time|t[ _-]?(rxn|reaction|sample)|reaction[ _-]?time|residence[ _-]?time)$/i],
  ['pressure', /^(P|p|press|pressure|P[ _-]?(tot|total|in|inlet|abs))$/i],
  ['catalystMass', /^(W|W[ _-]?cat|m[ _-]?cat|mcat|cat|catalyst|catalyst[ _-]?mass|cat[ _-]?mass|mass)$/i],
  ['volumetricFlow', /^(Q|Q[ _-]?(in|0)|v0|v_0|vdot|v[ _-]?dot|flow|flow[ _-]?rate|vol(umetric)?[ _-]?flow)$/i],
  ['volume', /^(V|V[ _-]?R|vol|volume|reactor[ _-]?volume)$/i],
];

const SIDE_IN = /^(in|inlet|feed|0|init|initial|i)$/i;
const SIDE_OUT = /^(out|outlet|exit|e|o)$/i;
const PREFIX_KIND: Record<string, AmountKind> = { F: 'molar-flow', n: 'molar-flow', C: 'concentration', c: 'concentration', y: 'fraction', x: 'fraction' };

/** An amount name such as `F_A,out`, `F_C2H4_in`, `C_AcOH_0`, `CA0`, `[A]`, `F_in`, `C_out`. */
function amountOf(name: string, bare = false): RecognisedColumn['amount'] | undefined {
  const sq = /^\[([A-Za-z][A-Za-z0-9]*)\]\s*[_, ]?\s*(\w+)?$/.exec(name);
  if (sq) return sided('concentration', sq[1], sq[2]);
  const plain = /^(F|n|C|c|y|x)(?:[ _,.]+(in|inlet|feed|0|out|outlet|exit))?$/.exec(name);
  if (plain) return plain[2] !== undefined || bare ? sided(PREFIX_KIND[plain[1]], undefined, plain[2]) : undefined;
  const m = /^(F|n|C|c|y|x)(?:[_ ]([A-Za-z][A-Za-z0-9]*?)|([A-Z]))(?:[ _,.]+(in|inlet|feed|init|initial|out|outlet|exit)|_?(0))?$/.exec(name);
  if (!m) return undefined;
  return sided(PREFIX_KIND[m[1]], m[2] ?? m[3], m[4] ?? m[5]);
}

function sided(kind: AmountKind, species: string | undefined, side: string | undefined): RecognisedColumn['amount'] | undefined {
  if (side !== undefined && !SIDE_IN.test(side) && !SIDE_OUT.test(side)) return undefined;
  return { kind, ...(species !== undefined ? { species } : {}), side: side !== undefined && SIDE_IN.test(side) ? 'in' : 'out' };
}

/** A unit suffix of the name (`T_C`, `P_bar`, `Q_mL_min`) that measures `q`: the name without it and the unit. */
function suffixUnit(name: string, q: Quantity): { name: string; unit: string } | undefined {
  const parts = name.split('_');
  for (let k = 1; k < parts.length; k++) {
    const suffix = parts.slice(k).join('_');
    const unit = SUFFIX_UNITS[suffix] ?? suffix;
    if (q === 'temperature' && suffix === 'F') continue; // F_A: a flow, not degrees Fahrenheit
    if (unitQuantity(unit, [q])) return { name: parts.slice(0, k).join('_'), unit };
  }
  return undefined;
}

/** The role of a named condition column, trying the name as written and without a unit suffix. */
function conditionRole(name: string, unit: string | undefined): { role: ColumnRole; unit?: string } | undefined {
  for (const [role, re] of NAME_PATTERNS) {
    if (re.test(name)) return { role, ...(unit !== undefined ? { unit } : {}) };
  }
  if (unit !== undefined) return undefined;
  for (const [role, re] of NAME_PATTERNS) {
    const q = ROLE_QUANTITY[role];
    const s = q ? suffixUnit(name, q) : undefined;
    if (s && re.test(s.name)) return { role, unit: s.unit };
  }
  return undefined;
}

/** Recognise one header cell; undefined when it matches no pattern. */
export function recogniseColumn(header: string): RecognisedColumn | undefined {
  checkArgs('recogniseColumn', [header], [{ name: 'header', check: is.text }]);
  const { name, unit } = splitHeader(header);
  const cond = conditionRole(name, unit);
  if (cond) return { header, ...cond };
  let amount: RecognisedColumn['amount'];
  let u = unit;
  if (unit === undefined) {
    // A unit suffix after the amount name: C_A_molL, F_A_in_mmolmin.
    for (const kind of ['molar-flow', 'concentration'] as const) {
      const s = suffixUnit(name, AMOUNT_QUANTITY[kind]);
      const a = s ? amountOf(s.name, true) : undefined;
      if (s && a && a.kind === kind) {
        amount = a;
        u = s.unit;
        break;
      }
    }
  }
  amount ??= amountOf(name, unit !== undefined);
  if (!amount) return undefined;
  if (u !== undefined) {
    const q = unitQuantity(u, ['molar-flow', 'concentration', 'dimensionless']);
    if (q === 'molar-flow' || q === 'concentration') amount = { ...amount, kind: q };
  }
  return { header, role: 'amount', amount, ...(u !== undefined ? { unit: u } : {}) };
}

/**
 * Units named in the comment lines above the header ('# flows in mmol/min, pressure in bar'), by
 * the quantity each measures; the first one found for a quantity wins.
 */
export function unitHints(commentLines: readonly string[]): Map<Quantity, string> {
  const hints = new Map<Quantity, string>();
  const all: Quantity[] = ['temperature', 'pressure', 'mass', 'volume', 'time', 'molar-flow', 'concentration', 'volumetric-flow'];
  for (const line of commentLines) {
    for (const m of line.matchAll(/\bin\s+([A-Za-z°][A-Za-z0-9/^().°]*)/g)) {
      const unit = normaliseUnit(m[1].replace(/[.)]+$/, ''));
      const q = unitQuantity(unit, all);
      if (q && !hints.has(q)) hints.set(q, unit);
    }
  }
  return hints;
}
