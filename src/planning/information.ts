/**
 * Fisher information of runs from the study model's exact sensitivities (Bard 1974, "Nonlinear
 * Parameter Estimation", Academic Press, ch. 10: M = J' W J with W = diag(1/sigma^2) under
 * independent normal errors). J is d prediction / d theta in the estimation space (ln value for
 * log-transformed parameters), free parameters only, from StudyModel.jacobian (reactor forward
 * sensitivities chained through the parameter mapping). sigma follows the study's error model on
 * the predicted value; when the fit estimated the scale (unweighted responses), the information is
 * divided by s^2 as the fit's covariance s^2 (J'WJ)^-1 is.
 */
import type { Study } from '../study/types.js';
import { sigmaFromModel } from '../study/types.js';
import { StudyModel, type ModelVariant } from '../workflow/study-model.js';

export interface RunInformation {
  /** Per run of the study: its information (p x p, free parameters), or null when it failed to solve. */
  infos: (Float64Array | null)[];
  /** Predictions of every observation (SI). */
  predictions: Float64Array;
  /** sigma of every observation used in the information (SI). */
  sigma: Float64Array;
  /** Run ids whose reactor could not be solved, with why. */
  failures: { run: string; message: string }[];
}

/** Where the parameters stand: the rate-law set, estimation-space values, free indices and scale. */
export interface InformationPoint {
  variant: ModelVariant;
  /** Every parameter of the variant in the estimation space (the model's theta). */
  theta: Float64Array;
  /** Indices into theta of the free parameters. */
  free: readonly number[];
  /** Factor on J'WJ: 1 when sigma is known, 1 / s^2 when the fit estimated the scale. */
  scale: number;
}

/** sigma of a planned observation under its error model at the predicted value (1 when unweighted). */
export function plannedSigma(study: Study, errorModel: string, predicted: number): number {
  const m = study.errorModels[errorModel];
  const s = m ? sigmaFromModel(m, Math.abs(predicted)) : undefined;
  return s !== undefined && s > 0 ? s : 1;
}

/** Predictions and free-parameter sensitivities of every observation of a study at a point. */
export interface RunSensitivities {
  /** Predictions of every observation (SI). */
  predictions: Float64Array;
  /** d prediction / d theta_free, row-major (observations x free parameters). */
  J: Float64Array;
  /** Number of free parameters (columns of J). */
  p: number;
  /** Run ids whose reactor could not be solved, with why. */
  failures: { run: string; message: string }[];
}

/** Predictions and exact sensitivities (free parameters only) of every observation of `study` at `at`. */
export function runSensitivities(study: Study, at: InformationPoint): RunSensitivities {
  const model = new StudyModel(study, at.variant);
  const n = model.nObservations;
  const nAll = model.parameterNames.length;
  const predictions = new Float64Array(n);
  const Jall = new Float64Array(n * nAll);
  const failures: { run: string; message: string }[] = [];
  (model.jacobian as NonNullable<StudyModel['jacobian']>)(at.theta, predictions, Jall, failures);
  const p = at.free.length;
  const J = new Float64Array(n * p);
  for (let o = 0; o < n; o++) for (let a = 0; a < p; a++) J[o * p + a] = Jall[o * nAll + at.free[a]];
  return { predictions, J, p, failures };
}

/**
 * Information of each run of `study` at `at`. `sigmaOf(index, predicted)` gives the sigma of an
 * observation (default: the error model at the prediction).
 */
export function runInformation(study: Study, at: InformationPoint, sigmaOf?: (index: number, predicted: number) => number): RunInformation {
  const { predictions: pred, J, p, failures } = runSensitivities(study, at);
  const failed = new Set(failures.map((f) => f.run));
  const sigma = new Float64Array(pred.length);
  const infos: (Float64Array | null)[] = study.runs.map((r) => (failed.has(r.id) ? null : new Float64Array(p * p)));
  for (const o of study.observations) {
    const s = sigmaOf ? sigmaOf(o.index, pred[o.index]) : plannedSigma(study, o.errorModel, pred[o.index]);
    sigma[o.index] = s;
    const M = infos[o.runIndex];
    if (!M) continue;
    const w = at.scale / (s * s);
    const row = o.index * p;
    for (let a = 0; a < p; a++) {
      const ga = J[row + a];
      if (ga === 0) continue;
      for (let b = 0; b < p; b++) M[a * p + b] += w * ga * J[row + b];
    }
  }
  for (let r = 0; r < infos.length; r++) {
    const M = infos[r];
    if (M && !M.every(Number.isFinite)) {
      infos[r] = null;
      failures.push({ run: study.runs[r].id, message: 'sensitivities are not finite' });
    }
  }
  return { infos, predictions: pred, sigma, failures };
}

/** Sum of the information of all runs that solved (p x p). */
export function totalInformation(info: RunInformation, p: number): Float64Array {
  const F = new Float64Array(p * p);
  for (const M of info.infos) if (M) for (let i = 0; i < p * p; i++) F[i] += M[i];
  return F;
}
