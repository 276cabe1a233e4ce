/**
 * Measured values, standard deviations and replicate labels of a study's observations, in the
 * order of study.observations: the FitData the estimator needs.
 *
 * sigma of an observation: its own sigma column when given, else its response's error model
 * (relative sigma is taken on the measured value, common practice: weights then stay fixed during
 * the fit). 'unweighted' responses get sigma = 1 and the scale is estimated from the residuals.
 * The scale is known (sigmaKnown: covariance (J'J)^-1, chi-square test) only when every
 * observation has a sigma column or an error model whose size is known; one 'unweighted' response
 * or one error model with size 'weights' makes the fit estimate one common scale factor; lab
 * responses, whose sigma is propagated from the error model of the fractions, follow the same rule.
 * Correlated lab responses of a run (ratios sharing the standard) become whitening blocks
 * (correlated-errors.ts). Under an activity model, runs at different times on stream are not
 * replicates (their activity differs), so the lack-of-fit groups include the time on stream.
 */
import type { FitData } from '../estimation/fit-types.js';
import { sigmaFromModel, type Study } from '../study/types.js';
import { correlatedLabErrors } from './correlated-errors.js';

export interface StudyFitData extends FitData {
  /** Per observation: how sigma was obtained. */
  sigmaSource: Array<'column' | 'error-model' | 'unweighted'>;
  /** Error models in use that give only relative weights (size 'weights'), by name. */
  weightsOnly: string[];
  /** Runs whose lab responses are linearly dependent (the same measurement fitted twice). */
  dependentRuns: string[];
}

export function studyFitData(study: Study): StudyFitData {
  const n = study.observations.length;
  const measured = new Float64Array(n);
  const sigma = new Float64Array(n);
  const sigmaSource: StudyFitData['sigmaSource'] = [];
  const repOf = new Map<string, string>();
  for (const g of study.replicateGroups) for (const r of g.runIds) repOf.set(r, g.id);
  const groups: string[] = [];
  let unweighted = 0;
  const weightsOnly = new Set<string>();
  for (const o of study.observations) {
    measured[o.index] = o.value;
    let s: number | undefined;
    if (o.sigma !== undefined && o.sigma > 0) {
      s = o.sigma;
      sigmaSource[o.index] = o.errorLoadings ? 'error-model' : 'column';
      const m = o.errorLoadings ? study.errorModels[o.errorModel] : undefined;
      if (m && m.kind !== 'unweighted' && !m.sizeKnown) weightsOnly.add(m.name);
    } else {
      const m = study.errorModels[o.errorModel];
      s = m ? sigmaFromModel(m, o.value) : undefined;
      sigmaSource[o.index] = s !== undefined && s > 0 ? 'error-model' : 'unweighted';
      if (m && m.kind !== 'unweighted' && !m.sizeKnown) weightsOnly.add(m.name);
    }
    if (s === undefined || !(s > 0)) {
      s = 1;
      unweighted++;
    }
    sigma[o.index] = s;
    // Same replicate group, same response, same species and same position: same conditions.
    const rep = repOf.get(o.runId) ?? `run:${o.runId}`;
    const tos = study.activity ? `|t${study.runs[o.runIndex].timeOnStream ?? ''}` : '';
    groups[o.index] = `${rep}${tos}|${o.response}|${o.species ?? ''}|${o.position ?? ''}`;
  }
  const { blocks, dependentRuns } = correlatedLabErrors(study);
  return {
    measured,
    sigma,
    sigmaKnown: unweighted === 0 && weightsOnly.size === 0,
    groups,
    sigmaSource,
    weightsOnly: [...weightsOnly],
    dependentRuns,
    ...(blocks.length ? { whiten: blocks } : {}),
  };
}
