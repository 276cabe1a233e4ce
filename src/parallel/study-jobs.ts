/**
 * Job module (see pool.ts) for a study fit: every worker rebuilds the study model and the prepared
 * fit once (setup), then runs the jobs of the fit's steps (src/core/jobs.ts):
 *   'fit-start'     one multistart start: the solver from a design point (runStart)
 *   'fit-profile'   the profile-likelihood interval of one parameter (profileParameter)
 * exactly as the batch's runHere does in the main thread, so results are identical whatever the
 * runner and the number of workers.
 */
import type { FitOptions, ParameterProfile } from '../estimation/fit-types.js';
import type { ProfileJob } from '../estimation/fit.js';
import { profileParameter } from '../estimation/profile.js';
import type { LmResult } from '../estimation/lm.js';
import { runStart } from '../estimation/multistart.js';
import { prepareFit, type PreparedFit } from '../estimation/solve.js';
import type { Parameter } from '../core/parameter.js';
import { InternalError } from '../core/errors.js';
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

export function setup(ctx: StudyJobContext): PreparedFit {
  const variant = findVariant(ctx.study, ctx.variant ?? 'base');
  const model = new StudyModel(ctx.study, variant, ctx.model);
  return prepareFit(model, ctx.parameters ?? variant.parameters, studyFitData(ctx.study), ctx.fit ?? {});
}

export function runJob(prep: PreparedFit, job: unknown, kind?: string): LmResult | ParameterProfile {
  if (kind === 'fit-start') return runStart(prep, job as number[]);
  if (kind === 'fit-profile') return profileParameter({ prep, ...(job as ProfileJob) });
  throw new InternalError(`no '${kind}' jobs in the study job module`);
}
