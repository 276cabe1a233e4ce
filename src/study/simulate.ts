/**
 * Simulate every run of a study with given parameter values: compile the kinetics (compileKinetics)
 * and solve the lab reactor per run (solveReactor). Per-run-group parameters take the copy of the
 * run's group. Numerical trouble in a run is that run's status, never a throw.
 */
import { RateloomError } from '../core/errors';
import type { Parameter } from '../core/parameter';
import { compileKinetics } from '../kinetics/compile';
import { solveReactor } from '../reactors';
import type { ReactorProfile, ReactorStatus } from '../reactors/types';
import { compoundToSI } from '../units';
import { runParameterNames } from './parameters';
import { measuredConversions } from './summary';
import type { Study } from './types';

export interface SimulatedRun {
  runId: string;
  group?: string;
  status: ReactorStatus;
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
  warnings: string[];
}

export interface SimulationResult {
  keyReactant: string;
  referenceTemperature: number;
  parameters: { name: string; value: number; unit: string }[];
  runs: SimulatedRun[];
  /** True when every run solved. */
  success: boolean;
}

export interface SimulateOptions {
  /** Record profiles; default false. */
  profile?: boolean;
  /** Rate laws and parameters of a candidate set instead of the base model; default none. */
  candidate?: string;
}

/**
 * Parameter values from a document: { "k1": 0.3 } (SI), { "k1": { "value": 3, "unit": "L/(mol s)" } },
 * or { "parameters": [{ "name": "k1", "value": 0.3 }] } (SI, as written by a fit). Unknown names are
 * an error naming the closest parameter. Returns new parameters; the inputs are not changed.
 */
export function applyParameterValues(params: readonly Parameter[], doc: unknown, file: string): Parameter[] {
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
export function simulateStudy(study: Study, parameters: readonly Parameter[] = study.parameters, options: SimulateOptions = {}): SimulationResult {
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
  const names = study.chemistry.speciesNames;
  const j = study.keyReactantIndex;
  const measured = measuredConversions(study);
  const flow = study.reactor.kind !== 'batch' && study.reactor.kind !== 'semibatch';
  const runs: SimulatedRun[] = study.runs.map((run) => {
    const runNames = runParameterNames(baseNames, scopes, run.group);
    const theta = Float64Array.from(runNames.map((n) => {
      const v = byName.get(n);
      if (v === undefined) throw new RateloomError('E_UNKNOWN_PARAMETER', `no value for parameter '${n}'`, { path: ['parameters'] });
      return v;
    }));
    const sol = solveReactor(study.reactor, run, kinetics, theta, options.profile ? { profile: true } : {});
    const outlet: Record<string, number> = {};
    const conc: Record<string, number> = {};
    names.forEach((n, k) => {
      outlet[n] = sol.outletAmounts[k];
      conc[n] = sol.outletConcentrations[k];
    });
    let conversion: number | undefined;
    if (sol.success) {
      if (flow && run.feed && run.feed[j] > 0) conversion = 1 - sol.outletAmounts[j] / run.feed[j];
      else if (study.reactor.kind === 'batch' && run.initialConcentrations && run.initialConcentrations[j] > 0) conversion = 1 - sol.outletConcentrations[j] / run.initialConcentrations[j];
    }
    const m = measured.get(run.id);
    return {
      runId: run.id,
      ...(run.group !== undefined ? { group: run.group } : {}),
      status: sol.status,
      success: sol.success,
      message: sol.message,
      outlet,
      outletUnit: flow ? 'mol/s' : 'mol',
      concentrations: conc,
      ...(conversion !== undefined ? { conversion } : {}),
      ...(m !== undefined ? { measuredConversion: m } : {}),
      pressureRatio: sol.pressureRatio,
      ...(sol.profile ? { profile: sol.profile } : {}),
      warnings: sol.warnings.map((w) => w.message),
    };
  });
  return {
    keyReactant: study.keyReactant,
    referenceTemperature: study.referenceTemperature,
    parameters: parameters.map((p) => ({ name: p.name, value: p.value, unit: p.unit })),
    runs,
    success: runs.every((r) => r.success),
  };
}
