/**
 * The catalyst activity model of a study (the `activity` section): a(t) multiplies every rate.
 *   linear       a = 1 - b t              (parameter activity_b, 1/s or 1/run)
 *   exponential  a = exp(-kd t)           (parameter activity_kd, 1/s or 1/run)
 *   piecewise    a = a_g per run group    (parameters activity@<group>; the first group is the reference, a = 1)
 * t is the run's time on stream (labData.timeOnStream) or its sequence number (labData.sequence).
 * Fitted rate constants are those of the fresh catalyst (a = 1). See docs/lab-data.md.
 */
import { RateloomError } from '../core/errors.js';
import { makeParameter, type Parameter } from '../core/parameter.js';
import { unitFor } from '../units/index.js';
import type { Activity, ActivitySpec } from './lab-types.js';
import type { Study } from './types.js';

const PATH = ['activity'];

function checkReactor(study: Study): void {
  const r = study.reactor;
  if (r.kind === 'membrane' || r.kind === 'semibatch' || r.pressureDrop) {
    const what = r.pressureDrop ? 'a reactor with pressure drop' : `a ${r.kind} reactor`;
    throw new RateloomError('E_VALUE', `an activity model is not available for ${what}: rateloom applies it as the equivalent contact size a W (or a V, a t), which holds only when nothing but the rates depends on the size`, { path: PATH, fix: "Use 'none', or fit each catalyst charge with per-run-group parameters." });
  }
}

function decayParameter(study: Study, spec: ActivitySpec, timeUnit: 's' | 'run'): Parameter {
  const name = spec.model === 'linear' ? 'activity_b' : 'activity_kd';
  let value = 0;
  if (spec.start) {
    value = timeUnit === 's' ? unitFor('frequency', spec.start.unit, { path: [...PATH, 'start', 'unit'] }).toSI(spec.start.value) : spec.start.value;
  }
  const missing = study.runs.find((r) => r.timeOnStream === undefined);
  if (missing) {
    throw new RateloomError('E_DATA', `run '${missing.id}' has no time on stream, which the ${spec.model} activity model needs`, { path: ['labData', 'timeOnStream'], location: missing.location, fix: "Give every run a time on stream (labData.timeOnStream) or a sequence number (labData.sequence)." });
  }
  return makeParameter({ name, value, unit: timeUnit === 's' ? '1/s' : '1', description: `catalyst ${spec.model === 'linear' ? 'linear' : 'exponential'} decay rate` }, [...PATH, 'start']);
}

function pieceParameters(study: Study): Parameter[] {
  const groups = [...new Set(study.runs.map((r) => r.group).filter((g): g is string => g !== undefined))];
  if (groups.length < 2) throw new RateloomError('E_DATA', 'the piecewise activity model needs runs in at least two groups (catalyst charges)', { path: PATH, fix: "Add a 'group' column naming the catalyst charge of each run." });
  return groups.slice(1).map((g) => makeParameter({ name: `activity@${g}`, value: 1, unit: '1', transform: 'log', description: `activity of charge ${g} relative to ${groups[0]}` }));
}

/** The study with the activity model's parameters added to its own and every candidate's list. */
export function activityParameters(study: Study, spec: ActivitySpec): Study {
  if (spec.model === 'none') return study;
  checkReactor(study);
  const timeUnit: 's' | 'run' = study.lab?.timeUnit ?? 's';
  const extra = spec.model === 'piecewise' ? pieceParameters(study) : [decayParameter(study, spec, timeUnit)];
  for (const p of extra) {
    if (study.parameters.some((q) => q.name === p.name)) throw new RateloomError('E_VALUE', `parameter name '${p.name}' is reserved for the activity model`, { path: ['parameters'] });
  }
  const activity: Activity = { model: spec.model, parameters: extra.map((p) => p.name), timeUnit };
  return {
    ...study,
    parameters: [...study.parameters, ...extra],
    candidates: study.candidates.map((c) => ({ ...c, parameters: [...c.parameters, ...extra] })),
    activity,
  };
}

/** Activity of a run at the external (SI) values of the activity parameters, in the order of study.activity.parameters. */
export function activityOf(activity: Activity, run: { timeOnStream?: number; group?: string }, values: ArrayLike<number>): number {
  switch (activity.model) {
    case 'linear':
      return 1 - values[0] * (run.timeOnStream ?? 0);
    case 'exponential':
      return Math.exp(-values[0] * (run.timeOnStream ?? 0));
    case 'piecewise': {
      const k = activity.parameters.indexOf(`activity@${run.group}`);
      return k < 0 ? 1 : values[k];
    }
    default:
      return 1;
  }
}
