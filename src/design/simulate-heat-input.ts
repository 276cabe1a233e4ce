/**
 * The heat inputs of `rateloom simulate --heat FILE`: the production case file's `heat` block (read
 * by the same loader, design/heat-case.ts) and, for a cooled tube, the tube inner diameter (and the
 * bulk density when the study's reactor does not give it). The lab reactor of each run is then
 * solved with its mole and energy balances; the run's temperature is the feed (inlet, initial)
 * temperature. Every refusal names the field and the fix; nothing falls back to isothermal.
 *
 * Example (a cooled liquid plug-flow reactor):
 *   { "heat": { "mode": "constant-coolant", "reactionEnthalpy": { "r1": "-150 kJ/mol" },
 *               "heatCapacities": { "A": "150 J/(mol K)", "B": "150 J/(mol K)", "S": "75 J/(mol K)" },
 *               "overallCoefficient": "500 W/(m2 K)", "coolant": { "temperature": "300 K" } },
 *     "tubes": { "innerDiameter": "50 mm" } }
 * A stirred tank or a batch vessel gives heat.exchangeArea (jacket or coil) in place of the tube.
 */
import { RateloomError, closestName, type FieldPath } from '../core/errors.js';
import { isObj, type Obj } from '../core/record.js';
import { quantityToSI } from './case-units.js';
import { loadReactionEnthalpies, loadThermalCase, THERMAL_FIELDS, type ThermalCase } from './heat-case.js';
import type { Study } from '../study/types.js';

/** Heat inputs of a simulation, SI. */
export interface SimulationHeat {
  thermal: ThermalCase;
  /** Reaction enthalpy per reaction (kinetics order) at thermal.referenceTemperature, J/mol. */
  enthalpies: Float64Array;
  /** Tube inner diameter, m (cooled tubes). */
  innerDiameter?: number;
  /** Bed bulk density, kg/m3 (cooled packed bed; default the study's reactor.bulkDensity). */
  bulkDensity?: number;
}

const TOP = ['heat', 'tubes', '$schema', 'description'];
const TANK_MODES: readonly string[] = ['adiabatic', 'constant-coolant'];

function refuseUnknown(o: Obj, allowed: readonly string[], path: FieldPath, file: string): void {
  for (const k of Object.keys(o)) {
    if (allowed.includes(k)) continue;
    const near = closestName(k, allowed);
    throw new RateloomError('E_UNKNOWN_FIELD', `unknown field '${k}'`, { path: [...path, k], location: { file }, fix: near ? `Did you mean '${near}'?` : `Allowed fields here: ${allowed.join(', ')}.` });
  }
}

function length(raw: unknown, kind: 'length' | 'density', path: FieldPath, fix: string): number {
  const v = quantityToSI(raw, kind, path);
  if (!(v > 0)) throw new RateloomError('E_VALUE', `${String(path[path.length - 1])} must be positive (got ${v} in SI)`, { path, fix });
  return v;
}

/** Read a heat document for a study (see the file header); errors carry the file. */
export function loadSimulationHeat(doc: unknown, study: Study, file: string): SimulationHeat {
  try {
    return readHeat(doc, study);
  } catch (e) {
    if (!(e instanceof RateloomError) || e.location) throw e;
    throw new RateloomError(e.code, e.problem, { path: e.path, fix: e.fix, location: { file }, ...(e.details ? { details: e.details } : {}) });
  }
}

function readHeat(doc: unknown, study: Study): SimulationHeat {
  if (!isObj(doc)) throw new RateloomError('E_TYPE', 'the heat file must be a JSON object with a "heat" block', { path: [], fix: 'Write { "heat": { "mode": "adiabatic", ... } }.' });
  refuseUnknown(doc, TOP, [], '');
  const h = doc.heat;
  if (!isObj(h)) throw new RateloomError('E_MISSING_FIELD', 'the heat file needs a "heat" block (the case-file heat schema)', { path: ['heat'], fix: 'Add "heat": { "mode": "constant-coolant", "reactionEnthalpy": {...}, "heatCapacities": {...}, ... }.' });
  refuseUnknown(h, ['reactionEnthalpy', ...THERMAL_FIELDS], ['heat'], '');
  if (h.mode === undefined || h.mode === 'isothermal') {
    throw new RateloomError('E_MISSING_FIELD', 'heat.mode is needed to solve the energy balance', { path: ['heat', 'mode'], fix: 'Give "mode": "adiabatic", "constant-coolant", "co-current" or "counter-current" (or drop --heat for the isothermal runs).' });
  }
  const kin = study.reactions.map((r) => r.id);
  const thermal = loadThermalCase(h, study.chemistry.speciesNames);
  if (thermal.wallCorrelation) throw new RateloomError('E_VALUE', 'a wall correlation needs the production tube data; simulate takes U as given', { path: ['heat', 'wallCorrelation'], fix: 'Give "overallCoefficient" in W/(m2 K).' });
  const stated = loadReactionEnthalpies(isObj(h.reactionEnthalpy) ? h.reactionEnthalpy : {}, kin);
  const enthalpies = Float64Array.from(kin, (id) => {
    const v = stated[id];
    if (v === undefined) throw new RateloomError('E_MISSING_FIELD', `reaction '${id}' has no reaction enthalpy`, { path: ['heat', 'reactionEnthalpy', id], fix: `Add "${id}": "-45 kJ/mol" to heat.reactionEnthalpy.` });
    return v;
  });
  const out: SimulationHeat = { thermal, enthalpies };
  readGeometry(doc, study, out);
  return out;
}

/** Tube diameter (and bulk density) for tubes, exchange area for vessels; modes each kind allows. */
function readGeometry(doc: Obj, study: Study, out: SimulationHeat): void {
  const kind = study.reactor.kind;
  const th = out.thermal;
  const tube = kind === 'packed-bed' || kind === 'plug-flow';
  if (!tube && kind !== 'stirred-tank' && kind !== 'batch' && kind !== 'semibatch') {
    throw new RateloomError('E_VALUE', `the energy balance is not available for a ${kind} reactor`, { path: ['reactor', 'kind'], fix: 'Drop --heat for this study.' });
  }
  if (!tube && !TANK_MODES.includes(th.mode)) {
    throw new RateloomError('E_VALUE', `heat mode '${th.mode}' applies to tubes; a ${kind} has a jacket at one temperature`, { path: ['heat', 'mode'], fix: 'Use "constant-coolant" (jacket or coil at the coolant temperature) or "adiabatic".' });
  }
  if (doc.tubes !== undefined) {
    if (!tube) throw new RateloomError('E_SCHEMA', `"tubes" applies to a packed bed or plug flow, not a ${kind}`, { path: ['tubes'], fix: 'Remove "tubes"; give heat.exchangeArea for a vessel.' });
    if (!isObj(doc.tubes)) throw new RateloomError('E_TYPE', 'tubes must be an object', { path: ['tubes'] });
    refuseUnknown(doc.tubes, ['innerDiameter', 'bulkDensity'], ['tubes'], '');
    if (doc.tubes.innerDiameter !== undefined) out.innerDiameter = length(doc.tubes.innerDiameter, 'length', ['tubes', 'innerDiameter'], 'Give the tube inner diameter, for example "25 mm".');
    if (doc.tubes.bulkDensity !== undefined) out.bulkDensity = length(doc.tubes.bulkDensity, 'density', ['tubes', 'bulkDensity'], 'Give the bed bulk density, for example "1200 kg/m3".');
  }
  if (th.mode === 'adiabatic') return;
  if (tube && out.innerDiameter === undefined) {
    throw new RateloomError('E_MISSING_FIELD', `a ${th.mode} tube needs its inner diameter (exchange area 4/D per m3)`, { path: ['tubes', 'innerDiameter'], fix: 'Add "tubes": { "innerDiameter": "25 mm" } beside "heat".' });
  }
  if (kind === 'packed-bed' && out.bulkDensity === undefined && study.reactor.bulkDensity === undefined) {
    throw new RateloomError('E_MISSING_FIELD', 'a cooled packed bed needs the bed bulk density (exchange area per kg of catalyst)', { path: ['tubes', 'bulkDensity'], fix: 'Add "bulkDensity": "1200 kg/m3" to "tubes" (or reactor.bulkDensity to the study).' });
  }
  if (!tube && th.exchangeArea === undefined) {
    throw new RateloomError('E_MISSING_FIELD', `a cooled ${kind} needs its heat-exchange area`, { path: ['heat', 'exchangeArea'], fix: 'Add "exchangeArea": "2 m2" (jacket or coil) to heat.' });
  }
}
