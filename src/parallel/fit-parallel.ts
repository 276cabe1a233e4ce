/**
 * Study fits on worker threads: the fit's own steps (workflow/fit-study.ts studyFitSteps: the
 * multistart starts and the profiles as batches of jobs) driven by a worker-pool runner
 * (runner.ts + study-jobs.ts) instead of in this thread. The control flow is the serial one, so
 * the result equals fitStudy's for the same options, byte for byte, whatever the number of workers;
 * a job whose worker fails is run again here (never dropped). The workers start (1-2 s) while this
 * thread plans the fit.
 */
import { runSteps, runStepsHere } from '../core/jobs.js';
import type { Study } from '../study/types.js';
import { rankStudyFits, type StudyCompareOptions, type StudyComparison } from '../workflow/compare-study.js';
import { planStudyFit, studyFitSteps, studyVariants, type StudyFit, type StudyFitOptions } from '../workflow/fit-study.js';
import { chooseWorkers, type WorkersSetting } from './auto.js';
import { siblingModule } from './pool.js';
import { workerRunner, type JobModuleRef } from './runner.js';
import type { StudyJobContext } from './study-jobs.js';

const STUDY_JOBS = siblingModule('study-jobs', import.meta.url);
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

/**
 * fitStudy with the multistart starts and the profiles on worker threads; the same result as
 * fitStudy(study, options) (see the file header). Bad input throws as fitStudy does.
 */
export async function fitStudyParallel(study: Study, options: ParallelFitOptions = {}): Promise<StudyFit> {
  checkArgs('fitStudyParallel', [study, options], PARALLEL_FIT_ARGS);
  const { workers: setting, ...fitOptions } = options;
  const plan = planStudyFit(study, fitOptions);
  const nFree = plan.variant.parameters.filter((p) => !p.fixed).length;
  const workers = chooseWorkers(setting, { profileParameters: fitOptions.profile ?? true ? nFree : 0, runs: study.runs.length, starts: plan.starts });
  const steps = studyFitSteps(study, plan, fitOptions);
  if (workers <= 1) return runStepsHere(steps);
  const context: StudyJobContext = {
    study,
    variant: plan.variant.name,
    parameters: plan.variant.parameters,
    fit: cloneable(fitOptions),
    ...(fitOptions.model ? { model: fitOptions.model } : {}),
  };
  const ref: JobModuleRef = { moduleUrl: STUDY_JOBS, context };
  const runner = workerRunner({ 'fit-start': ref, 'fit-profile': ref }, workers);
  runner.prestart('fit-start');
  try {
    return await runSteps(steps, runner);
  } finally {
    await runner.close();
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
