/**
 * Job module (see pool.ts) for a study fit: every worker rebuilds the study model and the prepared
 * fit once (setup), then runs
 *   { kind: 'start', x }        one multistart start: the solver from x (free parameters,
 *                               estimation space), as multistartFit does for each design point
 *   { kind: 'profile', ... }    the profile-likelihood interval of one parameter, as fitModel does
 * The code path is the serial one (solveFree, profileParameter), so results are identical to a
 * serial run whatever the number of workers.
 */
import type { FitOptions, ParameterProfile } from '../estimation/fit-types';
import { profileParameter } from '../estimation/profile';
import { prepareFit, solveFree, type PreparedFit } from '../estimation/solve';
import type { Study } from '../study/types';
import { studyFitData } from '../workflow/fit-data';
import { findVariant } from '../workflow/fit-study';
import { StudyModel, type StudyModelOptions } from '../workflow/study-model';

export interface StudyJobContext {
  study: Study;
  /** Rate-law set; default 'base'. */
  variant?: string;
  model?: StudyModelOptions;
  fit?: FitOptions;
}

export interface StartJob {
  kind: 'start';
  /** Start of the free parameters, estimation space, in the prepared fit's free order. */
  x: number[];
}

export interface ProfileJob {
  kind: 'profile';
  /** Index into theta of the profiled parameter. */
  index: number;
  /** Full theta at the optimum (estimation space). */
  thetaHat: number[];
  ssrMin: number;
  internalStdError: number;
  linear: [number, number] | null;
}

export type StudyJob = StartJob | ProfileJob;

export interface StartResult {
  kind: 'start';
  status: string;
  success: boolean;
  ssr: number;
  x: number[];
  iterations: number;
  evaluations: number;
}

export type StudyJobResult = StartResult | { kind: 'profile'; profile: ParameterProfile };

export function setup(ctx: StudyJobContext): PreparedFit {
  const variant = findVariant(ctx.study, ctx.variant ?? 'base');
  const model = new StudyModel(ctx.study, variant, ctx.model);
  return prepareFit(model, variant.parameters, studyFitData(ctx.study), ctx.fit ?? {});
}

export function runJob(prep: PreparedFit, job: StudyJob): StudyJobResult {
  if (job.kind === 'start') {
    const theta = Float64Array.from(prep.thetaFull);
    prep.freeIndex.forEach((j, k) => (theta[j] = job.x[k]));
    const { result } = solveFree(prep, theta);
    return {
      kind: 'start', status: result.status, success: result.success, ssr: result.ssr,
      x: Array.from(result.x), iterations: result.iterations, evaluations: result.evaluations,
    };
  }
  const profile = profileParameter({
    prep,
    thetaHat: Float64Array.from(job.thetaHat),
    index: job.index,
    ssrMin: job.ssrMin,
    internalStdError: job.internalStdError,
    linear: job.linear,
  });
  return { kind: 'profile', profile };
}
