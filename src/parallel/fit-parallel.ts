/**
 * Study fits with the expensive parts on worker threads (pool.ts + study-jobs.ts): the multistart
 * starts and the profile-likelihood intervals. The rest (plan, design, grouping of the minima,
 * statistics of the best fit) runs here with the serial code (workflow/fit-study.ts,
 * estimation/multistart.ts, estimation/fit.ts applyProfiles), and every job runs the serial code
 * path on the same inputs, so the result equals fitStudy's for the same options, byte for byte,
 * whatever the number of workers. A job whose worker fails is rerun here (never dropped).
 * Overlap: the workers start (1-2 s) while this thread runs the main fit or the given start.
 */
import { applyProfiles, assembleFit, profilesApply } from '../estimation/fit.js';
import type { FitResult, ParameterProfile } from '../estimation/fit-types.js';
import type { LmResult } from '../estimation/lm.js';
import { groupStarts, multistartDesign, runStart, type MultistartOptions } from '../estimation/multistart.js';
import { profileParameter } from '../estimation/profile.js';
import { prepareFit, solveFree } from '../estimation/solve.js';
import type { Study } from '../study/types.js';
import { rankStudyFits, type StudyCompareOptions, type StudyComparison } from '../workflow/compare-study.js';
import { finishStudyFit, fitPlannedStudy, planStudyFit, studyVariants, type StudyFit, type StudyFitOptions } from '../workflow/fit-study.js';
import { chooseWorkers, type WorkersSetting } from './auto.js';
import type { JobPool } from './pool.js';
import { profileJobs, startJobs, startStudyPool } from './study-adapter.js';
import type { StartResult, StudyJob, StudyJobContext, StudyJobResult } from './study-jobs.js';
import { FIT_OPTIONS, checkArgs, is, options as optionsArg } from '../core/args.js';

/** The arguments of the parallel fit entry points. */
const PARALLEL_FIT_ARGS = [{ name: 'study', check: is.study }, optionsArg('options', [...FIT_OPTIONS, 'workers'])];

export interface ParallelFitOptions extends StudyFitOptions {
  /** Worker threads (1 = serial) or 'auto' (see auto.ts); default 'auto'. */
  workers?: WorkersSetting;
}

/** The options without functions (callbacks cannot go to a worker; the fit does not read them there). */
function cloneable<T extends object>(o: T): Partial<T> {
  return Object.fromEntries(Object.entries(o).filter(([, v]) => typeof v !== 'function' && v !== undefined)) as Partial<T>;
}

function workersForPlan(study: Study, nFree: number, starts: number, options: StudyFitOptions, setting: WorkersSetting | undefined): number {
  const profile = options.profile ?? true;
  return chooseWorkers(setting, { profileParameters: profile ? nFree : 0, runs: study.runs.length, starts });
}

/**
 * fitStudy with the multistart starts and the profiles on worker threads; the same result as
 * fitStudy(study, options) (see the file header). Bad input throws as fitStudy does.
 */
export async function fitStudyParallel(study: Study, options: ParallelFitOptions = {}): Promise<StudyFit> {
  checkArgs('fitStudyParallel', [study, options], PARALLEL_FIT_ARGS);
  const { workers: setting, ...fitOptions } = options;
  const plan = planStudyFit(study, fitOptions);
  const params = plan.variant.parameters;
  const workers = workersForPlan(study, params.filter((p) => !p.fixed).length, plan.starts, fitOptions, setting);
  if (workers <= 1) return fitPlannedStudy(study, plan, fitOptions);

  const msOptions: MultistartOptions = plan.starts > 0 ? { ...fitOptions, starts: plan.starts, seed: fitOptions.seed ?? 1 } : fitOptions;
  const prep = prepareFit(plan.model, params, plan.data, msOptions);
  const ctx: StudyJobContext = {
    study,
    variant: plan.variant.name,
    parameters: params,
    fit: cloneable(fitOptions),
    ...(fitOptions.model ? { model: fitOptions.model } : {}),
  };
  // the workers boot while this thread runs the first fit
  const poolP = startStudyPool(ctx, { workers });
  let pool: JobPool<StudyJob, StudyJobResult> | undefined;
  const getPool = async () => (pool ??= await poolP);
  try {
    let fit: FitResult;
    let minima: StudyFit['minima'];
    let runs: StudyFit['starts'];
    if (plan.starts > 0) {
      const design = multistartDesign(prep, msOptions);
      const total = design.length;
      const results: LmResult[] = [runStart(prep, design[0])];
      msOptions.progress?.(1, total);
      const rest = design.slice(1);
      const outs = await (await getPool()).run(startJobs(rest), (done) => msOptions.progress?.(1 + done, total));
      outs.forEach((o, i) => results.push(o.ok ? (o.value as StartResult).lm : runStart(prep, rest[i])));
      const groups = groupStarts(prep, design, results, msOptions);
      fit = assembleFit(prep, groups.bestLm, false);
      minima = groups.minima;
      runs = groups.runs;
    } else {
      fit = assembleFit(prep, solveFree(prep, prep.thetaFull).result, false);
    }
    if ((fitOptions.profile ?? true) && profilesApply(fit)) {
      const jobs = profileJobs(fit);
      const outs = await (await getPool()).run(jobs, (done) => fitOptions.profileProgress?.(done, jobs.length));
      const profiles: ParameterProfile[] = outs.map((o, i) => {
        if (o.ok && o.value.kind === 'profile') return o.value.profile;
        const j = jobs[i];
        return profileParameter({ prep, thetaHat: Float64Array.from(j.thetaHat), index: j.index, ssrMin: j.ssrMin, internalStdError: j.internalStdError, linear: j.linear });
      });
      fit = applyProfiles(fit, profiles, fitOptions.verdict);
    }
    return finishStudyFit(study, plan, fit, minima, runs);
  } finally {
    await (await poolP).close();
  }
}

/**
 * compareStudy with each rate-law set fitted by fitStudyParallel (the 'auto' rule applies per set);
 * the same result as compareStudy(study, options).
 */
export async function compareStudyParallel(study: Study, options: StudyCompareOptions & { workers?: WorkersSetting } = {}): Promise<StudyComparison> {
  checkArgs('compareStudyParallel', [study, options], PARALLEL_FIT_ARGS);
  const variants = studyVariants(study);
  const fits: StudyFit[] = [];
  for (let i = 0; i < variants.length; i++) {
    fits.push(await fitStudyParallel(study, { ...options, variant: variants[i].name }));
    options.progress?.(i + 1, variants.length);
  }
  return rankStudyFits(study, fits);
}
