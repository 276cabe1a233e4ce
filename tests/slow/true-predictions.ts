/**
 * Shared step of the coverage studies: the study model's predictions at the true parameter values
 * (the values of `truth`, SI, where given; the study's own values elsewhere), from which the
 * replicate data sets are simulated, and the noise sigma = sqrt(a^2 + (r y_true)^2) they carry.
 */
import { expect } from 'vitest';
import type { Study } from '../../src/study/types';
import { StudyModel } from '../../src/workflow/study-model';

/** The model of `study` and its predictions at the truth (estimation space: log parameters as logs). */
export function truePredictions(study: Study, truth: Record<string, number>) {
  const model = new StudyModel(study);
  const params = study.parameters;
  const theta = Float64Array.from(model.parameterNames, (n) => {
    const p = params.find((q) => q.name === n)!;
    const v = truth[n] ?? p.value;
    return p.transform === 'log' ? Math.log(v) : v;
  });
  const truePred = new Float64Array(model.nObservations);
  expect(model.predict(theta, truePred)).toBe(true);
  return { model, params, truePred };
}

/** sigma_i = sqrt(a^2 + (r y_i)^2) of absolute part a (unit of y) and relative part r. */
export function noiseSigma(y: Float64Array, absolute: number, relative: number): Float64Array {
  return Float64Array.from(y, (v) => Math.hypot(absolute, relative * v));
}
