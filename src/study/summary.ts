/**
 * What a loaded study holds, for `rateloom check`: counts, ranges of the conditions (SI, with
 * units), space time (tau = W/F_A0 for a packed bed, V/v0 for volume reactors; v0 of a gas from
 * the ideal gas law at inlet T and P), measured conversion of the key reactant where computable,
 * and the degrees of freedom left for fitting (observations minus free parameters).
 */
import type { ValidationReport } from '../data/report.js';
import type { Study, StudyRun } from './types.js';
import { consistencyWarnings } from './consistency.js';
import { referenceTemperatureMatters } from './reference-temperature.js';
import { GAS_CONSTANT } from '../core/constants.js';
import { checkArgs, is } from '../core/args.js';

export interface Range {
  min: number;
  max: number;
  unit: string;
  /** Number of runs behind the range. */
  n: number;
}

export interface ResponseCount {
  response: string;
  species?: string;
  unit: string;
  count: number;
}

export interface StudySummary {
  title?: string;
  reactor: { kind: string; phase: string };
  species: string[];
  keyReactant: string;
  runs: number;
  groups: string[];
  observations: number;
  responses: ResponseCount[];
  ranges: {
    temperature?: Range;
    pressure?: Range;
    size?: Range & { quantity: 'catalyst mass' | 'volume' | 'time' };
    spaceTime?: Range & { definition: string };
    conversion?: Range & { species: string };
  };
  /** `applies`: false when no rate law depends on it (then nothing is said about it). */
  referenceTemperature: { value: number; unit: 'K'; source: 'study' | 'data'; applies: boolean };
  freeParameters: number;
  degreesOfFreedom: number;
  candidates: { name: string; freeParameters: number; degreesOfFreedom: number }[];
  rowsIn: number;
  rowsUsed: number;
  rowsRejected: number;
  /** Where measured rates are evaluated and how derived rates were formed (one sentence per source). */
  rateNotes?: string[];
  /** Constants of the study that disagree with its runs (consistency.ts), both numbers with units. */
  consistency: string[];
}

function range(values: number[], unit: string): Range | undefined {
  // A loop, not Math.min(...v): spreading a very large list of runs overflows the call stack.
  let min = Infinity;
  let max = -Infinity;
  let n = 0;
  for (const x of values) {
    if (!Number.isFinite(x)) continue;
    n++;
    if (x < min || (x === 0 && min === 0 && Object.is(x, -0))) min = x;
    if (x > max || (x === 0 && max === 0 && Object.is(max, -0))) max = x;
  }
  if (!n) return undefined;
  return { min, max, unit, n };
}

/** Space time of one run in SI, or undefined where it cannot be formed. */
export function spaceTime(study: Pick<Study, 'reactor' | 'keyReactantIndex'>, run: StudyRun): number | undefined {
  const kind = study.reactor.kind;
  if (kind === 'packed-bed') {
    const fa0 = run.feed?.[study.keyReactantIndex];
    return fa0 && fa0 > 0 ? run.size / fa0 : undefined;
  }
  if (kind === 'batch' || kind === 'semibatch') return undefined;
  let v0 = run.volumetricFlow;
  if (v0 === undefined && study.reactor.phase === 'gas' && run.feed && run.pressure) {
    const ft = run.feed.reduce((a, b) => a + b, 0);
    v0 = (ft * GAS_CONSTANT * run.temperature) / run.pressure;
  }
  return v0 && v0 > 0 ? run.size / v0 : undefined;
}

/**
 * Measured conversion of the key reactant per run (first outlet measurement found, else the one
 * derived from analyser fractions and the internal standard), where computable.
 */
export function measuredConversions(study: Study): Map<string, number> {
  const j = study.keyReactantIndex;
  const out = new Map<string, number>();
  const kind = study.reactor.kind;
  for (const o of study.observations) {
    if (o.position !== undefined || o.speciesIndex !== j || out.has(o.runId)) continue;
    const run = study.runs[o.runIndex];
    let x: number | undefined;
    if (o.response === 'conversion') x = o.value;
    else if (o.response === 'outlet-flow' && kind !== 'batch' && kind !== 'semibatch') {
      const f0 = run.feed?.[j];
      if (f0 && f0 > 0) x = 1 - o.value / f0;
    } else if (o.response === 'outlet-concentration') {
      if (kind === 'batch') {
        const c0 = run.initialConcentrations?.[j];
        if (c0 && c0 > 0) x = 1 - o.value / c0;
      } else if (study.reactor.phase === 'liquid' && kind !== 'semibatch' && run.feed && run.volumetricFlow) {
        const f0 = run.feed[j];
        if (f0 > 0) x = 1 - (o.value * run.volumetricFlow) / f0;
      }
    }
    if (x !== undefined) out.set(o.runId, x);
  }
  // Analyser fractions with an internal standard: the conversion derived from them (lab-load.ts).
  for (const d of study.lab?.derived ?? []) {
    const x = d.conversion?.[study.keyReactant];
    if (x !== undefined && Number.isFinite(x) && !out.has(d.runId)) out.set(d.runId, x);
  }
  return out;
}

export function summarizeStudy(study: Study, report: ValidationReport): StudySummary {
  checkArgs('summarizeStudy', [study, report], [{ name: 'study', check: is.study }, { name: 'report', check: is.object }]);
  const runs = study.runs;
  const kind = study.reactor.kind;
  const sizeQ = kind === 'packed-bed' ? 'catalyst mass' : kind === 'batch' || kind === 'semibatch' ? 'time' : 'volume';
  const sizeUnit = sizeQ === 'catalyst mass' ? 'kg' : sizeQ === 'time' ? 's' : 'm3';
  const counts = new Map<string, ResponseCount>();
  for (const o of study.observations) {
    const key = `${o.response}|${o.species ?? ''}|${o.unit}`;
    const c = counts.get(key) ?? { response: o.response, ...(o.species !== undefined ? { species: o.species } : {}), unit: o.unit, count: 0 };
    c.count++;
    counts.set(key, c);
  }
  const free = study.parameters.filter((p) => !p.fixed).length;
  const nObs = study.observations.length;
  const size = range(runs.map((r) => r.size), sizeUnit);
  const taus = runs.map((r) => spaceTime(study, r)).filter((x): x is number => x !== undefined);
  const tau = range(taus, kind === 'packed-bed' ? 'kg s/mol' : 's');
  const conv = range([...measuredConversions(study).values()], '1');
  return {
    ...(study.title !== undefined ? { title: study.title } : {}),
    reactor: { kind, phase: study.reactor.phase },
    species: [...study.chemistry.speciesNames],
    keyReactant: study.keyReactant,
    runs: runs.length,
    groups: [...new Set(runs.map((r) => r.group).filter((g): g is string => g !== undefined))],
    observations: nObs,
    responses: [...counts.values()],
    ranges: {
      ...(range(runs.map((r) => r.temperature), 'K') ? { temperature: range(runs.map((r) => r.temperature), 'K') } : {}),
      ...(range(runs.map((r) => r.pressure ?? NaN), 'Pa') ? { pressure: range(runs.map((r) => r.pressure ?? NaN), 'Pa') } : {}),
      ...(size ? { size: { ...size, quantity: sizeQ } } : {}),
      ...(tau ? { spaceTime: { ...tau, definition: kind === 'packed-bed' ? `W/F_${study.keyReactant},0` : 'V/v0' } } : {}),
      ...(conv ? { conversion: { ...conv, species: study.keyReactant } } : {}),
    },
    referenceTemperature: { value: study.referenceTemperature, unit: 'K', source: study.referenceTemperatureSource, applies: referenceTemperatureMatters(study) },
    freeParameters: free,
    degreesOfFreedom: nObs - free,
    candidates: study.candidates.map((c) => {
      const f = c.parameters.filter((p) => !p.fixed).length;
      return { name: c.name, freeParameters: f, degreesOfFreedom: nObs - f };
    }),
    rowsIn: report.rowsIn,
    rowsUsed: report.rowsUsed,
    rowsRejected: report.rowsRejected,
    ...(study.rateNotes ? { rateNotes: study.rateNotes } : {}),
    consistency: consistencyWarnings(study),
  };
}
