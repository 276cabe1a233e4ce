/**
 * Catalyst activity drift seen in repeated reference conditions: replicate groups (runs at equal
 * conditions, src/data/validation.ts) whose runs carry a time on stream, with the measured values
 * of one response followed over time. Their spread is compared with the measurement error by the
 * chi-square test of a common mean (known sigma):
 *   chi2 = sum_groups sum_runs ((y - mean_g) / sigma)^2,  dof = sum_groups (n_g - 1),
 * drift is flagged when P(chi2_dof > chi2) < 0.01: the chi-square test of a variance against a
 * known one (as in the NIST/SEMATECH e-Handbook of Statistical Methods, chi-square test for the
 * standard deviation; cited from memory), pooled over the groups. Without an activity model a flagged spread is a warning: the rate
 * constants absorb the decay.
 */
import type { Warning } from '../core/outcome.js';
import { chiSquareCdf } from '../estimation/distributions.js';
import type { Observation, Study } from '../study/types.js';

/** Significance level of the drift test. */
export const DRIFT_ALPHA = 0.01;

export interface ReferencePoint {
  runId: string;
  /** Time on stream (s) or sequence number. */
  time: number;
  measured: number;
  sigma?: number;
  /** Model prediction at the fitted parameters, when a fit is given. */
  predicted?: number;
}

export interface ReferenceSeries {
  group: string;
  /** Response followed: kind and species, e.g. 'conversion' of 'C2H6'. */
  response: string;
  species?: string;
  unit: string;
  points: ReferencePoint[];
}

export interface DriftCheck {
  /** 's' (time on stream) or 'run' (sequence number). */
  timeUnit: 's' | 'run';
  series: ReferenceSeries[];
  /** Chi-square of the spread about each group's mean, its degrees of freedom and upper-tail probability; null without known sigma. */
  chi2: number | null;
  dof: number;
  pValue: number | null;
  /** Spread beyond the measurement error at DRIFT_ALPHA. */
  exceeds: boolean;
  /** Activity model of the study ('none' when absent). */
  activityModel: string;
  warning?: Warning;
}

/** Preference of the followed response: conversion of the key reactant, then its ratio or fraction, then any. */
function rank(o: Observation, key: string): number {
  const order = ['conversion', 'fraction-ratio', 'outlet-fraction', 'outlet-flow', 'outlet-concentration'];
  const i = order.indexOf(o.response);
  return (o.species === key ? 0 : 10) + (i < 0 ? 9 : i);
}

function seriesOf(study: Study, group: { id: string; runIds: string[] }, predicted?: ArrayLike<number>): ReferenceSeries | undefined {
  const runs = new Set(group.runIds);
  const obs = study.observations.filter((o) => runs.has(o.runId) && o.position === undefined && study.runs[o.runIndex].timeOnStream !== undefined);
  if (!obs.length) return undefined;
  const best = obs.reduce((a, b) => (rank(b, study.keyReactant) < rank(a, study.keyReactant) ? b : a));
  const same = obs.filter((o) => o.response === best.response && o.species === best.species);
  if (same.length < 2) return undefined;
  const points = same.map((o) => ({
    runId: o.runId,
    time: study.runs[o.runIndex].timeOnStream as number,
    measured: o.value,
    ...(o.sigma !== undefined ? { sigma: o.sigma } : {}),
    ...(predicted ? { predicted: predicted[o.index] } : {}),
  }));
  points.sort((a, b) => a.time - b.time);
  return { group: group.id, response: best.response, ...(best.species !== undefined ? { species: best.species } : {}), unit: best.unit, points };
}

function chiSquare(series: ReferenceSeries[]): { chi2: number | null; dof: number } {
  let chi2 = 0;
  let dof = 0;
  for (const s of series) {
    if (s.points.some((p) => !(p.sigma !== undefined && p.sigma > 0))) return { chi2: null, dof: 0 };
    const w = s.points.map((p) => 1 / (p.sigma as number) ** 2);
    const mean = s.points.reduce((a, p, i) => a + w[i] * p.measured, 0) / w.reduce((a, b) => a + b, 0);
    s.points.forEach((p, i) => (chi2 += w[i] * (p.measured - mean) ** 2));
    dof += s.points.length - 1;
  }
  return { chi2, dof };
}

/**
 * The drift check of a study's repeated reference conditions; undefined when no replicate group
 * has runs with a time on stream. `predicted` (per observation) adds the fitted values to the points.
 */
export function driftCheck(study: Study, predicted?: ArrayLike<number>): DriftCheck | undefined {
  const series = study.replicateGroups.map((g) => seriesOf(study, g, predicted)).filter((s): s is ReferenceSeries => s !== undefined);
  if (!series.length) return undefined;
  const { chi2, dof } = chiSquare(series);
  const pValue = chi2 !== null && dof > 0 ? 1 - chiSquareCdf(chi2, dof) : null;
  const exceeds = pValue !== null && pValue < DRIFT_ALPHA;
  const activityModel = study.activity?.model ?? 'none';
  const out: DriftCheck = { timeUnit: study.lab?.timeUnit ?? 's', series, chi2, dof, pValue, exceeds, activityModel };
  if (exceeds && activityModel === 'none') {
    out.warning = {
      code: 'activity-drift',
      message: `repeated reference conditions (${series.map((s) => s.group).join(', ')}) spread more than the measurement error allows (chi-square ${chi2?.toFixed(1)} on ${dof} degrees of freedom, p = ${pValue?.toExponential(2)} < ${DRIFT_ALPHA}) and no activity model is used: the catalyst may be drifting, and the rate constants then absorb the decay. Add an 'activity' section (for example {"model": "exponential"}).`,
      path: ['activity'],
    };
  }
  return out;
}
