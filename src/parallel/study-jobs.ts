/**
 * Job module (see pool.ts) for a study fit: every worker rebuilds the study model and the prepared
 * fit once (setup), then runs
 *   { kind: 'start', x }        one multistart start: the solver from x (free parameters,
 *                               estimation space), as multistartFit does for each design point (runStart)
 *   { kind: 'profile', ... }    the profile-likelihood interval of one parameter, as fitModel does
 * The code path is the serial one (solveFree, profileParameter), so results are identical to a
 * serial run whatever the number of workers.
 */
import type { FitOptions, ParameterProfile } from '../estimation/fit-types.js';
import { profileParameter } from '../estimation/profile.js';
import type { LmResult } from '../estimation/lm.js';
import { runStart } from '../estimation/multistart.js';
import { prepareFit, type PreparedFit } from '../estimation/solve.js';
import type { Parameter } from '../core/parameter.js';
import type { Study } from '../study/types.js';
import { studyFitData } from '../workflow/fit-data.js';
import { findVariant } from '../workflow/fit-study.js';
import { StudyModel, type StudyModelOptions } from '../workflow/study-model.js';

export interface StudyJobContext {
  study: Study;
  /** Rate-law set; default 'base'. */
  variant?: string;
  /**
   * Parameters of the rate-law set as the caller fits them (with any estimated starting values,
   * see planStudyFit); default the set's own.
   */
  parameters?: Parameter[];
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
  /** The solver's full result (for grouping the starts and assembling the best fit). */
  lm: LmResult;
}

export type StudyJobResult = StartResult | { kind: 'profile'; profile: ParameterProfile };

export function setup(ctx: StudyJobContext): PreparedFit {
  const variant = findVariant(ctx.study, ctx.variant ?? 'base');
  const model = new StudyModel(ctx.study, variant, ctx.model);
  return prepareFit(model, ctx.parameters ?? variant.parameters, studyFitData(ctx.study), ctx.fit ?? {});
}

export function runJob(prep: PreparedFit, job: StudyJob): StudyJobResult {
  if (job.kind === 'start') {
    const result = runStart(prep, job.x);
    return {
      kind: 'start', status: result.status, success: result.success, ssr: result.ssr,
      x: Array.from(result.x), iterations: result.iterations, evaluations: result.evaluations, lm: result,
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
