/**
 * The production case file (rateloom's own JSON format) and its loader. The file states units per
 * field; the loader converts everything to SI and checks names against the hand-off species.
 * Every error names the field and a fix; a misspelt field name gets the closest valid name.
 *
 * Example (gas packed bed, conversion target):
 * {
 *   "name": "Plant A, line 2",
 *   "reactor": { "kind": "packed-bed", "phase": "gas" },
 *   "feed": { "totalFlow": "120 mol/s", "moleFractions": { "A": 0.3, "B": 0.6, "N2": 0.1 } },
 *   "temperature": "520 K",
 *   "pressure": "12 bar",
 *   "target": { "conversion": 0.8, "species": "A" },
 *   "tubes": { "innerDiameter": "32 mm", "particleDiameter": "4 mm", "voidFraction": 0.42,
 *              "bulkDensity": "900 kg/m3", "particleDensity": "1550 kg/m3",
 *              "viscosity": "2.4e-5 Pa s", "allowedPressureDrop": "1.5 bar" },
 *   "heat": { "reactionEnthalpy": { "r1": "-95 kJ/mol" }, "heatCapacity": "38 J/(mol K)" },
 *   "uncertainty": { "draws": 10000, "seed": 12345, "levels": [0.9, 0.95], "designLevel": 0.95 }
 * }
 *
 * uncertainty.designLevel (fraction, default 0.95): the percentile of the required size that the
 * tube bundle is designed for. The tube count is raised until the catalyst mass of that percentile
 * (the catalyst to install) keeps the pressure drop within tubes.allowedPressureDrop, so only the
 * parameter sets beyond the percentile may need more.
 */
import { caseDisplaySpec, type CaseDisplaySpec } from './shown-sizing.js';
import { loadCasePellet, type CasePellet } from './case-pellet.js';
import { RateloomError, closestName, type FieldPath } from '../core/errors.js';
import { OPTION_RANGES } from '../core/option-ranges.js';
import { quantityToSI, SI_UNIT, type QuantityKind } from './case-units.js';
import { cpAt } from '../reactors/thermal/heat-capacity.js';
import { loadReactionEnthalpies, loadThermalCase, THERMAL_FIELDS, type ThermalCase } from './heat-case.js';
import { GAS_CONSTANT } from '../core/constants.js';
import { checkArgs, is } from '../core/args.js';

export type DesignReactorKind = 'packed-bed' | 'plug-flow' | 'stirred-tank' | 'batch';

/** What the size is chosen for. */
export type DesignTarget =
  | { kind: 'conversion'; species: string; /** Fractional conversion, 0..1. */ value: number }
  | { kind: 'production'; species: string; /** Net production rate, mol/s (flow) or final mol/m3 made (batch). */ value: number }
  | { kind: 'size'; /** Given size: kg (packed bed), m3 (plug flow, stirred tank), s (batch). */ value: number };

/** Packed-bed tube bundle inputs, SI. */
export interface TubeSpec {
  /** Tube inner diameter, m. */
  innerDiameter: number;
  /** Catalyst particle diameter, m. */
  particleDiameter: number;
  /** Bed void fraction, dimensionless. */
  voidFraction: number;
  /** Catalyst bulk density of the bed, kg/m3. */
  bulkDensity: number;
  /** Density of the catalyst particles, kg/m3. */
  particleDensity: number;
  /** Gas viscosity, Pa s. */
  viscosity: number;
  /** Largest allowed pressure drop over the bed, Pa. */
  allowedPressureDrop: number;
}

/** A loaded production case, all SI. */
export interface DesignCase {
  name: string;
  /** The case's displayUnits and the units it wrote, for showing the sizing (shown-sizing.ts). */
  display?: CaseDisplaySpec;
  reactor: { kind: DesignReactorKind; phase: 'gas' | 'liquid' };
  /** Feed molar flows per species (mol/s), for flow reactors; indexed as `species`. */
  feed: Float64Array;
  /** Species order of `feed` and `concentrations` (the hand-off species order). */
  species: string[];
  /** Liquid inlet volumetric flow, m3/s (liquid flow reactors). */
  volumetricFlow?: number;
  /** Initial concentrations, mol/m3 (batch). */
  concentrations?: Float64Array;
  /** Temperature, K. */
  temperature: number;
  /** Inlet pressure, Pa (gas). */
  pressure?: number;
  target: DesignTarget;
  tubes?: TubeSpec;
  /** Pressure-drop parameter alpha given directly: 1/kg (packed bed) or 1/m3 (plug flow). */
  alpha?: number;
  /** Bulk density of catalyst, kg/m3, to convert between mass- and volume-based rates. */
  bulkDensity?: number;
  /** Catalyst loading of a batch or stirred tank with mass-based rates, kg/m3 of fluid. */
  catalystLoading?: number;
  heat?: {
    /** Heat of reaction per reaction id, J/mol of reaction extent as written. */
    reactionEnthalpy: Record<string, number>;
    /** Mean molar heat capacity of the feed, J/(mol K). */
    heatCapacity: number;
    /** Adiabatic rise above which a warning is given, K; default 10. */
    warnAbove: number;
    /** Energy-balance inputs when heat.mode is given (heat-case.ts); absent: isothermal sizing. */
    thermal?: ThermalCase;
  };
  uncertainty: {
    /** Monte Carlo draws; default 10000. */
    draws: number;
    /** PRNG seed; default 20261201. */
    seed: number;
    /** Confidence levels reported, fractions; default [0.9, 0.95]. */
    levels: number[];
    /**
     * Percentile of the required size (fraction) the tube bundle is designed for; default 0.95
     * (DEFAULT_DESIGN_LEVEL). Optional so hand-built cases stay valid; the loader always sets it.
     */
    designLevel?: number;
  };
  /** The plant pellet (packed bed): rates along the bed are multiplied by its effectiveness factor. */
  pellet?: CasePellet;
}

export const DEFAULT_DRAWS = 10000;
export const DEFAULT_SEED = 20261201;
export const DEFAULT_LEVELS = [0.9, 0.95];
/** Percentile of the size the tubes are designed for, when the case does not say. */
export const DEFAULT_DESIGN_LEVEL = 0.95;

type Obj = Record<string, unknown>;

function isObj(v: unknown): v is Obj {
  return !!v && typeof v === 'object' && !Array.isArray(v);
}

function checkFields(o: Obj, allowed: readonly string[], path: FieldPath): void {
  for (const k of Object.keys(o)) {
    if (!allowed.includes(k)) {
      const near = closestName(k, allowed);
      throw new RateloomError('E_UNKNOWN_FIELD', `unknown field '${k}'`, {
        path: [...path, k],
        fix: near ? `Did you mean '${near}'?` : `Allowed fields here: ${allowed.join(', ')}.`,
        ...(near ? { details: { closest: near } } : {}),
      });
    }
  }
}

function obj(v: unknown, path: FieldPath, what: string): Obj {
  if (!isObj(v)) throw new RateloomError('E_TYPE', `${what} must be an object`, { path });
  return v;
}

function need(o: Obj, key: string, path: FieldPath, fix: string): unknown {
  if (o[key] === undefined) throw new RateloomError('E_MISSING_FIELD', `missing field '${key}'`, { path: [...path, key], fix });
  return o[key];
}

function num(v: unknown, path: FieldPath, lo: number, hi: number, what: string): number {
  if (typeof v !== 'number' || !Number.isFinite(v)) throw new RateloomError('E_TYPE', `${what} must be a number`, { path });
  if (!(v >= lo && v <= hi)) {
    throw new RateloomError('E_VALUE', `${what} ${v} lies outside [${lo}, ${hi}]`, { path, fix: `Give ${what} between ${lo} and ${hi}.` });
  }
  return v;
}

function positive(raw: unknown, kind: QuantityKind, path: FieldPath, what: string): number {
  const v = quantityToSI(raw, kind, path);
  if (!(v > 0)) throw new RateloomError('E_VALUE', `${what} must be positive (got ${v} ${SI_UNIT[kind]})`, { path, fix: `Give ${what} above zero.` });
  return v;
}

function speciesIndex(name: unknown, species: readonly string[], path: FieldPath): number {
  if (typeof name !== 'string') throw new RateloomError('E_TYPE', 'species name must be a string', { path });
  const i = species.indexOf(name);
  if (i < 0) {
    const near = closestName(name, species);
    throw new RateloomError('E_UNKNOWN_SPECIES', `species '${name}' is not in the fitted kinetics`, {
      path,
      fix: near ? `Did you mean '${near}'? Species: ${species.join(', ')}.` : `Use one of: ${species.join(', ')}.`,
      ...(near ? { details: { closest: near } } : {}),
    });
  }
  return i;
}

const TOP = ['name', 'reactor', 'feed', 'temperature', 'pressure', 'target', 'tubes', 'pressureDrop', 'bulkDensity', 'catalystLoading', 'heat', 'uncertainty', 'description', 'pellet', 'displayUnits'] as const;

type Reactor = DesignCase['reactor'];

/** Inlet composition: molar flows (flow reactors) or initial concentrations (batch), SI. */
interface CaseFeed {
  feed: Float64Array;
  concentrations?: Float64Array;
  volumetricFlow?: number;
}

/**
 * Validate a parsed case file against the hand-off species and reaction ids; return the case in SI.
 * @param raw parsed JSON
 * @param species species names of the fitted kinetics, in order
 * @param reactionIds reaction ids of the fitted kinetics
 */
export function loadCase(raw: unknown, species: readonly string[], reactionIds: readonly string[]): DesignCase {
  checkArgs('loadCase', [raw, species, reactionIds], [{ name: 'raw', check: is.json }, { name: 'species', check: is.stringList }, { name: 'reactionIds', check: is.stringList }]);
  const top = obj(raw, [], 'the case file');
  checkFields(top, TOP, []);
  const name = caseName(top);
  const reactor = caseReactor(top);
  const temperature = positive(need(top, 'temperature', [], 'Add "temperature": "520 K".'), 'temperature', ['temperature'], 'temperature');
  const pressure = inletPressure(top, reactor.phase);
  const inlet = caseFeed(top, species, reactor, temperature, pressure);
  const target = caseTarget(top, species, reactor.kind, inlet);

  const out: DesignCase = {
    name,
    reactor,
    feed: inlet.feed,
    species: [...species],
    temperature,
    target,
    uncertainty: { draws: DEFAULT_DRAWS, seed: DEFAULT_SEED, levels: [...DEFAULT_LEVELS], designLevel: DEFAULT_DESIGN_LEVEL },
    display: caseDisplaySpec(top),
  };
  if (pressure !== undefined) out.pressure = pressure;
  if (inlet.volumetricFlow !== undefined) out.volumetricFlow = inlet.volumetricFlow;
  if (inlet.concentrations) out.concentrations = inlet.concentrations;

  if (top.tubes !== undefined) {
    out.tubes = caseTubes(top.tubes, reactor, pressure);
    out.bulkDensity = out.tubes.bulkDensity;
  }
  if (top.pressureDrop !== undefined) out.alpha = caseAlpha(top, reactor);
  if (top.bulkDensity !== undefined) {
    if (top.tubes !== undefined) throw new RateloomError('E_SCHEMA', 'bulk density is given in "tubes"; remove the top-level "bulkDensity"', { path: ['bulkDensity'] });
    out.bulkDensity = positive(top.bulkDensity, 'density', ['bulkDensity'], 'bulk density');
  }
  if (top.catalystLoading !== undefined) out.catalystLoading = positive(top.catalystLoading, 'density', ['catalystLoading'], 'catalyst loading');
  if (top.heat !== undefined) out.heat = loadHeat(obj(top.heat, ['heat'], 'heat'), out, reactionIds);
  if (top.uncertainty !== undefined) readUncertainty(obj(top.uncertainty, ['uncertainty'], 'uncertainty'), out.uncertainty);
  if (top.pellet !== undefined) {
    if (reactor.kind !== 'packed-bed') throw new RateloomError('E_SCHEMA', 'a pellet applies only to a packed bed', { path: ['pellet'], fix: 'Remove "pellet" or size a packed bed.' });
    out.pellet = loadCasePellet(top.pellet, species, out.tubes?.innerDiameter);
  }
  return out;
}

/** The case's label, trimmed. */
function caseName(top: Obj): string {
  const name = need(top, 'name', [], 'Add "name": "a short label for the case".');
  if (typeof name !== 'string' || !name.trim()) {
    throw new RateloomError('E_TYPE', 'name must be a non-empty string', { path: ['name'], fix: 'Give "name" a short label such as "Plant A, line 2".' });
  }
  return name.trim();
}

/** Reactor kind (one of the sizable kinds) and phase. */
function caseReactor(top: Obj): Reactor {
  const r = obj(need(top, 'reactor', [], 'Add "reactor": { "kind": "packed-bed", "phase": "gas" }.'), ['reactor'], 'reactor');
  checkFields(r, ['kind', 'phase'], ['reactor']);
  const kinds: DesignReactorKind[] = ['packed-bed', 'plug-flow', 'stirred-tank', 'batch'];
  const kind = need(r, 'kind', ['reactor'], `Give one of: ${kinds.join(', ')}.`) as DesignReactorKind;
  if (!kinds.includes(kind)) {
    const near = closestName(String(kind), kinds);
    throw new RateloomError('E_VALUE', `reactor kind '${String(kind)}' is not supported for sizing`, {
      path: ['reactor', 'kind'],
      fix: `Use one of: ${kinds.join(', ')}${near ? ` (did you mean '${near}'?)` : ''}.`,
    });
  }
  const phase = need(r, 'phase', ['reactor'], 'Give "gas" or "liquid".');
  if (phase !== 'gas' && phase !== 'liquid') {
    throw new RateloomError('E_VALUE', `phase '${String(phase)}' must be 'gas' or 'liquid'`, { path: ['reactor', 'phase'], fix: 'Give "gas" or "liquid".' });
  }
  return { kind, phase };
}

/** Inlet pressure, Pa: required for a gas, optional for a liquid. */
function inletPressure(top: Obj, phase: Reactor['phase']): number | undefined {
  const pressure = top.pressure !== undefined ? positive(top.pressure, 'pressure', ['pressure'], 'pressure') : undefined;
  if (phase === 'gas' && pressure === undefined) {
    throw new RateloomError('E_MISSING_FIELD', 'a gas-phase case needs the inlet pressure', { path: ['pressure'], fix: 'Add "pressure": "10 bar".' });
  }
  return pressure;
}

/** The `feed` block: initial concentrations for a batch, molar flows (and liquid volumetric flow) otherwise. */
function caseFeed(top: Obj, species: readonly string[], reactor: Reactor, temperature: number, pressure: number | undefined): CaseFeed {
  const f = obj(need(top, 'feed', [], 'Add "feed" with "totalFlow" and "moleFractions", or "flows".'), ['feed'], 'feed');
  checkFields(f, ['totalFlow', 'moleFractions', 'flows', 'volumetricFlow', 'concentrations'], ['feed']);
  const feed = new Float64Array(species.length);
  if (reactor.kind === 'batch') return { feed, concentrations: batchConcentrations(f, species, reactor.phase, temperature, pressure) };
  feedFlows(f, species, feed);
  if (reactor.phase !== 'liquid') return { feed };
  const volumetricFlow = positive(
    need(f, 'volumetricFlow', ['feed'], 'A liquid flow reactor needs "volumetricFlow": "2 m3/h".'),
    'volumetricFlow',
    ['feed', 'volumetricFlow'],
    'volumetric flow',
  );
  return { feed, volumetricFlow };
}

/** Initial concentrations of a batch, mol/m3: given, or from gas mole fractions by the ideal-gas law. */
function batchConcentrations(f: Obj, species: readonly string[], phase: Reactor['phase'], temperature: number, pressure: number | undefined): Float64Array {
  if (f.concentrations !== undefined) {
    const concentrations = new Float64Array(species.length);
    const c = obj(f.concentrations, ['feed', 'concentrations'], 'concentrations');
    for (const [s, q] of Object.entries(c)) {
      const i = speciesIndex(s, species, ['feed', 'concentrations', s]);
      concentrations[i] = quantityToSI(q, 'concentration', ['feed', 'concentrations', s]);
      if (concentrations[i] < 0) throw new RateloomError('E_VALUE', 'concentration must not be negative', { path: ['feed', 'concentrations', s], fix: `Give the concentration of '${s}' as zero or above.` });
    }
    return concentrations;
  }
  if (f.moleFractions !== undefined && phase === 'gas') {
    const y = moleFractions(f.moleFractions, species);
    // A gas case always has its pressure (inletPressure).
    const cT = (pressure as number) / (GAS_CONSTANT * temperature);
    return Float64Array.from(y, (v) => v * cT);
  }
  throw new RateloomError('E_MISSING_FIELD', 'a batch case needs the initial composition', {
    path: ['feed', 'concentrations'],
    fix: 'Add "concentrations": { "A": "2 mol/L" } (or, for gas, "moleFractions" with temperature and pressure).',
  });
}

/** Feed molar flows of a flow reactor into `feed`, mol/s: per species, or total flow times mole fractions. */
function feedFlows(f: Obj, species: readonly string[], feed: Float64Array): void {
  if (f.flows !== undefined) {
    if (f.totalFlow !== undefined || f.moleFractions !== undefined) {
      throw new RateloomError('E_SCHEMA', 'give either "flows" or "totalFlow" with "moleFractions", not both', { path: ['feed'] });
    }
    const fl = obj(f.flows, ['feed', 'flows'], 'flows');
    for (const [s, q] of Object.entries(fl)) {
      const i = speciesIndex(s, species, ['feed', 'flows', s]);
      feed[i] = quantityToSI(q, 'molarFlow', ['feed', 'flows', s]);
      if (feed[i] < 0) throw new RateloomError('E_VALUE', 'a feed flow must not be negative', { path: ['feed', 'flows', s], fix: `Give the flow of '${s}' as zero or above.` });
    }
  } else {
    const total = positive(need(f, 'totalFlow', ['feed'], 'Add "totalFlow": "100 mol/s" and "moleFractions", or use "flows".'), 'molarFlow', ['feed', 'totalFlow'], 'total flow');
    const y = moleFractions(need(f, 'moleFractions', ['feed'], 'Add "moleFractions": { "A": 0.5, ... }.'), species);
    for (let i = 0; i < species.length; i++) feed[i] = y[i] * total;
  }
  if (!(feed.reduce((a, b) => a + b, 0) > 0)) throw new RateloomError('E_VALUE', 'the feed is empty', { path: ['feed'], fix: 'Give at least one species a flow above zero.' });
}

/** Mole fractions in species order; they must add up to 1. */
function moleFractions(v: unknown, sp: readonly string[]): number[] {
  const mf = obj(v, ['feed', 'moleFractions'], 'moleFractions');
  const y = new Array<number>(sp.length).fill(0);
  let sum = 0;
  for (const [s, q] of Object.entries(mf)) {
    const i = speciesIndex(s, sp, ['feed', 'moleFractions', s]);
    y[i] = num(q, ['feed', 'moleFractions', s], 0, 1, 'mole fraction');
    sum += y[i];
  }
  if (Math.abs(sum - 1) > 1e-6) {
    throw new RateloomError('E_VALUE', `mole fractions sum to ${sum}, not 1`, { path: ['feed', 'moleFractions'], fix: 'Make the mole fractions add up to 1.' });
  }
  return y;
}

/** The `target` block: exactly one of conversion, production and size. */
function caseTarget(top: Obj, species: readonly string[], kind: DesignReactorKind, inlet: CaseFeed): DesignTarget {
  const t = obj(need(top, 'target', [], 'Add "target": { "conversion": 0.8, "species": "A" }.'), ['target'], 'target');
  checkFields(t, ['conversion', 'production', 'size', 'species'], ['target']);
  const given = ['conversion', 'production', 'size'].filter((k) => t[k] !== undefined);
  if (given.length !== 1) {
    throw new RateloomError('E_SCHEMA', `the target needs exactly one of conversion, production, size (got ${given.length})`, {
      path: ['target'],
      fix: 'Give "conversion" (with "species"), "production" (with "species"), or "size".',
    });
  }
  if (t.conversion !== undefined) {
    const sp = need(t, 'species', ['target'], 'Name the key reactant: "species": "A".') as string;
    const i = speciesIndex(sp, species, ['target', 'species']);
    const X = num(t.conversion, ['target', 'conversion'], 0, 1, 'target conversion');
    if (!(X > 0 && X < 1)) throw new RateloomError('E_VALUE', 'target conversion must lie strictly between 0 and 1', { path: ['target', 'conversion'], fix: 'Give a conversion such as 0.8.' });
    // A batch always has its concentrations (batchConcentrations).
    const amount = kind === 'batch' ? (inlet.concentrations as Float64Array)[i] : inlet.feed[i];
    if (!(amount > 0)) throw new RateloomError('E_VALUE', `the key reactant '${sp}' is not in the feed`, { path: ['target', 'species'], fix: 'Choose a species present in the feed.' });
    return { kind: 'conversion', species: sp, value: X };
  }
  if (t.production !== undefined) {
    const sp = need(t, 'species', ['target'], 'Name the product: "species": "C".') as string;
    speciesIndex(sp, species, ['target', 'species']);
    const kindQ: QuantityKind = kind === 'batch' ? 'concentration' : 'molarFlow';
    return { kind: 'production', species: sp, value: positive(t.production, kindQ, ['target', 'production'], 'production target') };
  }
  const kq: QuantityKind = kind === 'packed-bed' ? 'mass' : kind === 'batch' ? 'time' : 'volume';
  return { kind: 'size', value: positive(t.size, kq, ['target', 'size'], 'size') };
}

/** The `tubes` block of a gas packed bed, SI. */
function caseTubes(raw: unknown, reactor: Reactor, pressure: number | undefined): TubeSpec {
  if (reactor.kind !== 'packed-bed' || reactor.phase !== 'gas') {
    throw new RateloomError('E_SCHEMA', 'tubes apply only to a gas-phase packed bed', { path: ['tubes'], fix: 'Remove "tubes" or use a gas packed-bed reactor.' });
  }
  const tb = obj(raw, ['tubes'], 'tubes');
  const names = ['innerDiameter', 'particleDiameter', 'voidFraction', 'bulkDensity', 'particleDensity', 'viscosity', 'allowedPressureDrop'] as const;
  checkFields(tb, names, ['tubes']);
  const p = (k: (typeof names)[number], q: QuantityKind) => positive(need(tb, k, ['tubes'], `Add "${k}".`), q, ['tubes', k], k);
  const tubes: TubeSpec = {
    innerDiameter: p('innerDiameter', 'length'),
    particleDiameter: p('particleDiameter', 'length'),
    voidFraction: num(need(tb, 'voidFraction', ['tubes'], 'Add "voidFraction": 0.4.'), ['tubes', 'voidFraction'], 0.05, 0.95, 'void fraction'),
    bulkDensity: p('bulkDensity', 'density'),
    particleDensity: p('particleDensity', 'density'),
    viscosity: p('viscosity', 'viscosity'),
    allowedPressureDrop: p('allowedPressureDrop', 'pressure'),
  };
  if (tubes.particleDiameter >= tubes.innerDiameter) {
    throw new RateloomError('E_VALUE', `the particle diameter (${tubes.particleDiameter} m) is not smaller than the tube diameter (${tubes.innerDiameter} m)`, {
      path: ['tubes', 'particleDiameter'],
      fix: 'Give a particle diameter well below the tube inner diameter.',
    });
  }
  // A gas case always has its pressure (inletPressure).
  const inlet = pressure as number;
  if (tubes.allowedPressureDrop >= inlet) {
    throw new RateloomError('E_VALUE', `the allowed pressure drop (${tubes.allowedPressureDrop} Pa) is not below the inlet pressure (${inlet} Pa)`, {
      path: ['tubes', 'allowedPressureDrop'],
      fix: 'Give an allowed pressure drop below the inlet pressure.',
    });
  }
  return tubes;
}

/** The pressure-drop parameter alpha given directly: 1/kg (packed bed) or 1/m3 (plug flow). */
function caseAlpha(top: Obj, reactor: Reactor): number {
  if (top.tubes !== undefined) throw new RateloomError('E_SCHEMA', 'give "tubes" or "pressureDrop", not both', { path: ['pressureDrop'], fix: 'With tubes, alpha is computed from the Ergun equation; remove "pressureDrop".' });
  if (reactor.phase !== 'gas' || (reactor.kind !== 'packed-bed' && reactor.kind !== 'plug-flow')) {
    throw new RateloomError('E_SCHEMA', 'pressure drop applies only to gas packed beds and plug-flow reactors', { path: ['pressureDrop'], fix: 'Remove "pressureDrop" for this reactor.' });
  }
  const pd = obj(top.pressureDrop, ['pressureDrop'], 'pressureDrop');
  checkFields(pd, ['alpha'], ['pressureDrop']);
  const a = quantityToSI(need(pd, 'alpha', ['pressureDrop'], 'Add "alpha": "0.002 1/kg".'), reactor.kind === 'packed-bed' ? 'alphaMass' : 'alphaVolume', ['pressureDrop', 'alpha']);
  if (!(a >= 0)) throw new RateloomError('E_VALUE', 'alpha must not be negative', { path: ['pressureDrop', 'alpha'], fix: 'Give alpha as zero or above.' });
  return a;
}

/** The `uncertainty` block, written over the defaults in `u`. */
function readUncertainty(raw: Obj, u: DesignCase['uncertainty']): void {
  checkFields(raw, ['draws', 'seed', 'levels', 'designLevel'], ['uncertainty']);
  if (raw.draws !== undefined) u.draws = wholeNumber(raw.draws, 'draws', OPTION_RANGES.draws.max);
  if (raw.seed !== undefined) u.seed = wholeNumber(raw.seed, 'seed', OPTION_RANGES.seed.max);
  if (raw.levels !== undefined) {
    if (!Array.isArray(raw.levels) || raw.levels.length === 0) throw new RateloomError('E_TYPE', 'levels must be a non-empty list such as [0.9, 0.95]', { path: ['uncertainty', 'levels'] });
    u.levels = raw.levels.map((l, i) => {
      const v = num(l, ['uncertainty', 'levels', i], 0, 1, 'level');
      if (!(v > 0.5 && v < 1)) throw new RateloomError('E_VALUE', `level ${v} must lie between 0.5 and 1 (for example 0.9 for P90)`, { path: ['uncertainty', 'levels', i] });
      return v;
    });
  }
  if (raw.designLevel !== undefined) {
    const v = num(raw.designLevel, ['uncertainty', 'designLevel'], 0, 1, 'design level');
    if (!(v >= 0.5 && v < 1)) {
      throw new RateloomError('E_VALUE', `design level ${v} must lie in [0.5, 1)`, {
        path: ['uncertainty', 'designLevel'],
        fix: 'Give the percentile the tubes are designed for as a fraction, for example 0.95 for P95 (0.5 designs for the median).',
      });
    }
    u.designLevel = v;
  }
}

/** A whole number in [0, max] at uncertainty.<key>. */
function wholeNumber(raw: unknown, key: 'draws' | 'seed', max: number): number {
  const v = num(raw, ['uncertainty', key], 0, max, key);
  if (!Number.isInteger(v)) throw new RateloomError('E_VALUE', `${key} must be a whole number`, { path: ['uncertainty', key], fix: `Give ${key} without a fractional part.` });
  return v;
}

/** The `heat` block: enthalpies, the mean heat capacity and, with `mode`, the energy-balance inputs. */
function loadHeat(h: Obj, kase: DesignCase, reactionIds: readonly string[]): NonNullable<DesignCase['heat']> {
  checkFields(h, ['reactionEnthalpy', 'heatCapacity', 'warnAbove', ...THERMAL_FIELDS], ['heat']);
  const thermal = h.mode !== undefined && h.mode !== 'isothermal' ? loadThermalCase(h, kase.species) : undefined;
  const re = h.reactionEnthalpy === undefined && thermal ? {} : obj(need(h, 'reactionEnthalpy', ['heat'], 'Add "reactionEnthalpy": { "r1": "-90 kJ/mol" }.'), ['heat', 'reactionEnthalpy'], 'reactionEnthalpy');
  const reactionEnthalpy = loadReactionEnthalpies(re, reactionIds);
  const heatCapacity = h.heatCapacity === undefined && thermal
    ? meanHeatCapacity(kase, thermal)
    : positive(need(h, 'heatCapacity', ['heat'], 'Add "heatCapacity": "35 J/(mol K)".'), 'molarHeatCapacity', ['heat', 'heatCapacity'], 'heat capacity');
  return {
    reactionEnthalpy,
    heatCapacity,
    warnAbove: h.warnAbove !== undefined ? positive(h.warnAbove, 'temperatureDifference', ['heat', 'warnAbove'], 'warning limit') : 10,
    ...(thermal ? { thermal } : {}),
  };
}

/** Mean molar heat capacity of the feed at its temperature from the per-species values, J/(mol K). */
function meanHeatCapacity(kase: DesignCase, th: ThermalCase): number {
  const amounts = kase.reactor.kind === 'batch' ? kase.concentrations ?? kase.feed : kase.feed;
  let total = 0;
  let sum = 0;
  amounts.forEach((a, j) => {
    const h = th.heatCapacities[j];
    total += a;
    if (h) sum += a * (h.form === 'constant' ? h.cp : cpAt(h, kase.temperature));
  });
  return total > 0 && sum > 0 ? sum / total : NaN;
}
