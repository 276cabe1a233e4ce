/**
 * Simulate every run of a study with given parameter values: compile the kinetics (compileKinetics)
 * and solve the lab reactor per run (solveReactor). Per-run-group parameters take the copy of the
 * run's group. Numerical trouble in a run is that run's status, never a throw.
 */
import { RateloomError } from '../core/errors.js';
import type { Parameter } from '../core/parameter.js';
import { compileKinetics } from '../kinetics/compile.js';
import { solveReactor } from '../reactors/index.js';
import type { ReactorProfile, ReactorSolution, ReactorStatus } from '../reactors/types.js';
import { DEFAULT_BATCH_VOLUME } from '../reactors/batch.js';
import { ROUND_OFF_NOTE, ROUND_OFF_TOLERANCE, shownAmounts } from '../reactors/round-off.js';
import { compoundToSI } from '../units/index.js';
import { activityOf } from './activity-params.js';
import { runParameterNames } from './parameters.js';
import { measuredConversions } from './summary.js';
import type { Study, StudyRun } from './types.js';
import { checkArgs, is } from '../core/args.js';
import type { SimulatedHeat } from './simulate-heat-types.js';
import type { CompiledKinetics } from '../kinetics/compiled.js';

export interface SimulatedRun {
  runId: string;
  group?: string;
  /** Reactor status; with heat inputs the non-isothermal solve's status (reactors/thermal). */
  status: ReactorStatus | 'target-reached' | 'runaway' | 'bvp-not-converged' | 'ok' | 'incomplete' | 'no-steady-state';
  success: boolean;
  message: string;
  /** Outlet molar flows (mol/s, flow reactors) or final moles (mol, batch and semibatch), per species. */
  outlet: Record<string, number>;
  outletUnit: 'mol/s' | 'mol';
  /** Outlet (final) concentrations per species, mol/m3. */
  concentrations: Record<string, number>;
  /** Conversion of the key reactant (fraction), where defined. */
  conversion?: number;
  /** Measured conversion of the key reactant, where the data give it. */
  measuredConversion?: number;
  /** Outlet p/p0. */
  pressureRatio: number;
  profile?: ReactorProfile;
  /**
   * Stirred tank: every steady state found, per species (outlet in outletUnit, concentrations in
   * mol/m3), its stability and whether it is the one reported above.
   */
  steadyStates?: { outlet: Record<string, number>; concentrations: Record<string, number>; stability: string; reported: boolean }[];
  /** With heat inputs: temperatures, hot spot, coolant, steady states with stability (design/simulate-heat.ts). */
  heat?: SimulatedHeat;
  warnings: string[];
}

export interface SimulationResult {
  keyReactant: string;
  referenceTemperature: number;
  /** False when no rate law depends on the reference temperature. */
  referenceTemperatureApplies: boolean;
  parameters: { name: string; value: number; unit: string }[];
  runs: SimulatedRun[];
  /** True when every run solved. */
  success: boolean;
  /** How round-off negatives are shown (src/reactors/round-off.ts). */
  roundOff: { tolerance: number; note: string };
}

export interface SimulateOptions {
  /** Record profiles; default false. */
  profile?: boolean;
  /** Rate laws and parameters of a candidate set instead of the base model; default none. */
  candidate?: string;
}

/**
 * Solves one run in place of the isothermal lab reactor (design/simulate-heat.ts with heat inputs):
 * `solved` carries the activity-scaled size, `run` the run as shown.
 */
export type RunSolver = (study: Study, run: StudyRun, solved: StudyRun, kinetics: CompiledKinetics, theta: Float64Array, measuredConversion: number | undefined) => SimulatedRun;

/**
 * Parameter values from a document: { "k1": 0.3 } (SI), { "k1": { "value": 3, "unit": "L/(mol s)" } },
 * or { "parameters": [{ "name": "k1", "value": 0.3 }] } (SI, as written by a fit). Unknown names are
 * an error naming the closest parameter. Returns new parameters; the inputs are not changed.
 */
export function applyParameterValues(params: readonly Parameter[], doc: unknown, file: string): Parameter[] {
  checkArgs('applyParameterValues', [params, doc, file], [{ name: 'params', check: is.list(is.object) }, { name: 'doc', check: is.json }, { name: 'file', check: is.text }]);
  const values = new Map<string, number>();
  const fail = (msg: string, path: (string | number)[]) => new RateloomError('E_VALUE', msg, { path, location: { file } });
  if (doc && typeof doc === 'object' && Array.isArray((doc as { parameters?: unknown }).parameters)) {
    (doc as { parameters: unknown[] }).parameters.forEach((p, i) => {
      const q = p as { name?: unknown; value?: unknown };
      if (typeof q?.name !== 'string' || typeof q.value !== 'number') throw fail('each entry needs a name and a numeric value (SI)', ['parameters', i]);
      values.set(q.name, q.value);
    });
  } else if (doc && typeof doc === 'object' && !Array.isArray(doc)) {
    for (const [name, v] of Object.entries(doc as Record<string, unknown>)) {
      if (name === '$schema') continue;
      if (typeof v === 'number') values.set(name, v);
      else if (v && typeof v === 'object' && typeof (v as { value?: unknown }).value === 'number' && typeof (v as { unit?: unknown }).unit === 'string') {
        const conv = compoundToSI((v as { value: number }).value, (v as { unit: string }).unit, { path: [name, 'unit'], location: { file } });
        const target = params.find((p) => p.name === name);
        if (target && target.unit !== conv.unit) throw new RateloomError('E_UNIT', `parameter '${name}' is in ${target.unit}, but the value given is in ${conv.unit}`, { path: [name, 'unit'], location: { file } });
        values.set(name, conv.value);
      } else throw fail(`value of '${name}' must be a number (SI) or {value, unit}`, [name]);
    }
  } else throw fail('expected a JSON object of parameter values', []);
  const known = new Set(params.map((p) => p.name));
  for (const name of values.keys()) {
    if (known.has(name)) continue;
    const base = params.filter((p) => p.name.startsWith(`${name}@`));
    if (base.length) continue;
    throw new RateloomError('E_UNKNOWN_PARAMETER', `unknown parameter '${name}'`, { path: [name], location: { file }, fix: `Use one of: ${[...known].join(', ')}.` });
  }
  return params.map((p) => {
    const v = values.get(p.name) ?? values.get(p.name.split('@')[0]);
    if (v === undefined) return p;
    if (!Number.isFinite(v)) throw fail(`value of '${p.name}' is not finite`, [p.name]);
    return { ...p, value: v };
  });
}

/** Solve every run of the study at the parameter values given (default: the study's). */
export function simulateStudy(study: Study, parameters: readonly Parameter[] = study?.parameters, options: SimulateOptions = {}, solver?: RunSolver): SimulationResult {
  checkArgs('simulateStudy', [study, parameters, options], [{ name: 'study', check: is.study }, { name: 'parameters', check: is.list(is.object) }, { name: 'options', check: is.optional(is.object) }]);
  let reactions = study.reactions;
  let scopes = study.scopes;
  if (options.candidate !== undefined) {
    const c = study.candidates.find((x) => x.name === options.candidate);
    if (!c) throw new RateloomError('E_VALUE', `no candidate named '${options.candidate}'`, { fix: `Use one of: ${study.candidates.map((x) => x.name).join(', ') || '(none defined)'}.` });
    reactions = c.reactions;
    scopes = c.scopes;
  }
  const baseNames = scopes.map((s) => s.base);
  const kinetics = compileKinetics({ chemistry: study.chemistry, rates: reactions.map((r) => r.rate), parameterNames: baseNames, referenceTemperature: study.referenceTemperature });
  const byName = new Map(parameters.map((p) => [p.name, p.value]));
  const measured = measuredConversions(study);
  const runs: SimulatedRun[] = study.runs.map((run) => {
    const runNames = runParameterNames(baseNames, scopes, run.group);
    const theta = Float64Array.from(runNames.map((n) => {
      const v = byName.get(n);
      if (v === undefined) throw new RateloomError('E_UNKNOWN_PARAMETER', `no value for parameter '${n}'`, { path: ['parameters'] });
      return v;
    }));
    const withValues = withRunValues(run, byName);
    const a = study.activity ? activityOf(study.activity, run, study.activity.parameters.map((n) => byName.get(n) ?? NaN)) : 1;
    const solved = a === 1 ? withValues : { ...withValues, size: a * withValues.size };
    if (solver) return solver(study, withValues, solved, kinetics, theta, measured.get(run.id));
    const sol = solveReactor(study.reactor, solved, kinetics, theta, options.profile ? { profile: true } : {});
    return simulatedRun(study, withValues, sol, measured.get(run.id));
  });
  return {
    keyReactant: study.keyReactant,
    referenceTemperature: study.referenceTemperature,
    referenceTemperatureApplies: study.referenceTemperatureApplies !== false,
    parameters: parameters.map((p) => ({ name: p.name, value: p.value, unit: p.unit })),
    runs,
    success: runs.every((r) => r.success),
    roundOff: { tolerance: ROUND_OFF_TOLERANCE, note: ROUND_OFF_NOTE },
  };
}

/** The run with its feed flows or initial concentrations held by parameters set to their values. */
function withRunValues(run: StudyRun, byName: ReadonlyMap<string, number>): StudyRun {
  if (!run.runParameters?.length) return run;
  const copy = { ...run, ...(run.feed ? { feed: run.feed.slice() } : {}), ...(run.initialConcentrations ? { initialConcentrations: run.initialConcentrations.slice() } : {}) };
  for (const ref of run.runParameters) {
    const v = (run.group !== undefined ? byName.get(`${ref.parameter}@${run.group}`) : undefined) ?? byName.get(ref.parameter);
    if (v === undefined) continue;
    const target = ref.target === 'feed' ? copy.feed : copy.initialConcentrations;
    if (target) target[ref.speciesIndex] = v;
  }
  return copy;
}

/**
 * Amount of each species that entered the run: the feed flows (mol/s) of a flow reactor, the
 * initial amounts (mol) of a batch, the initial amounts plus the amount fed (F_j0 t) of a semibatch.
 */
export function amountsIn(study: Study, run: StudyRun): Float64Array {
  const kind = study.reactor.kind;
  const nS = study.chemistry.speciesNames.length;
  if (kind !== 'batch' && kind !== 'semibatch') return run.feed ? Float64Array.from(run.feed) : new Float64Array(nS);
  const V0 = run.initialVolume ?? DEFAULT_BATCH_VOLUME;
  const out = Float64Array.from({ length: nS }, (_, j) => (run.initialConcentrations?.[j] ?? 0) * V0);
  if (kind === 'semibatch' && run.feed) for (let j = 0; j < nS; j++) out[j] += run.feed[j] * run.size;
  return out;
}

/** One run's simulation result: amounts as shown (round-off), conversion, steady states. */
export function simulatedRun(study: Study, run: StudyRun, sol: ReactorSolution, measuredConversion: number | undefined): SimulatedRun {
  const names = study.chemistry.speciesNames;
  const j = study.keyReactantIndex;
  const flow = study.reactor.kind !== 'batch' && study.reactor.kind !== 'semibatch';
  const entered = amountsIn(study, run);
  const scale = entered.reduce((a, b) => a + b, 0);
  const shown = shownAmounts(sol.outletAmounts, sol.outletConcentrations, scale);
  const record = (v: number[]) => Object.fromEntries(names.map((n, k) => [n, v[k]]));
  // Conversion on the amount that entered: feed (flow), charge (batch), charge plus feed (semibatch).
  const conversion = sol.success && entered[j] > 0 ? (entered[j] - sol.outletAmounts[j]) / entered[j] : undefined;
  const warnings = sol.warnings.map((w) => w.message);
  if (shown.negative) warnings.push(`${shown.negative} outlet value(s) are negative beyond the round-off tolerance (${ROUND_OFF_TOLERANCE} of the total ${flow ? 'feed in mol/s' : 'amount in mol'}); they are shown as computed`);
  const states = sol.steadyStates?.map((st) => {
    const sh = shownAmounts(st.outletAmounts, st.outletConcentrations, scale);
    return { outlet: record(sh.amounts), concentrations: record(sh.concentrations), stability: st.stability, reported: st.reported };
  });
  return {
    runId: run.id,
    ...(run.group !== undefined ? { group: run.group } : {}),
    status: sol.status,
    success: sol.success,
    message: sol.message,
    outlet: record(shown.amounts),
    outletUnit: flow ? 'mol/s' : 'mol',
    concentrations: record(shown.concentrations),
    ...(conversion !== undefined ? { conversion } : {}),
    ...(measuredConversion !== undefined ? { measuredConversion } : {}),
    pressureRatio: sol.pressureRatio,
    ...(sol.profile ? { profile: sol.profile } : {}),
    ...(states && states.length ? { steadyStates: states } : {}),
    warnings,
  };
}
