/**
 * When the worker pool pays off. Starting the pool costs 1-2 s (tsx and the modules load in each
 * worker, then the model is rebuilt there), so 'auto' uses it only for work that takes several
 * seconds serially. Thresholds set from bench/parallel-bench.ts and the demo data on a 2-core machine
 * (common practice, no source): a multistart of 8 starts (50 runs) ran 1.9x faster and 10000
 * Monte Carlo draws 1.9x faster, while the profiles of 4-6 parameters with 50-55 runs (about 2-3 s
 * of work) and 4000 draws (about 1 s) ran slower than serially, the pool start outweighing the gain:
 *   profiles     >= 3 free parameters and >= 100 runs
 *   multistart   >= 8 Latin-hypercube starts
 *   Monte Carlo  >= 8000 draws
 * and only when the machine has at least 2 cores (os.availableParallelism()). The results never
 * depend on this choice: every parallel path gives the serial result, byte for byte.
 */
import { availableParallelism } from 'node:os';
import { RateloomError } from '../core/errors.js';

/** Worker threads requested: a count (1 = serial, in this thread) or 'auto' (see the header). */
export type WorkersSetting = number | 'auto';

/** Thresholds of the 'auto' rule. */
export const AUTO_RULE = {
  /** Free parameters for profiles to count as large work. */
  profileParameters: 3,
  /** Runs (lab experiments) for profiles to count as large work. */
  profileRuns: 100,
  /** Multistart starts (in addition to the given start). */
  starts: 8,
  /** Monte Carlo draws. */
  draws: 8000,
  /** Workers used by 'auto' when the work is large. */
  workers: 2,
} as const;

/** The amount of work of one command (absent fields: none of that kind). */
export interface WorkSize {
  /** Free parameters to profile (0 when profiles are off). */
  profileParameters?: number;
  /** Runs of the study. */
  runs?: number;
  /** Multistart starts in addition to the given start. */
  starts?: number;
  /** Monte Carlo draws. */
  draws?: number;
}

/** True when the work is large enough for the pool under the 'auto' rule. */
export function largeWork(w: WorkSize): boolean {
  const profiles = (w.profileParameters ?? 0) >= AUTO_RULE.profileParameters && (w.runs ?? 0) >= AUTO_RULE.profileRuns;
  return profiles || (w.starts ?? 0) >= AUTO_RULE.starts || (w.draws ?? 0) >= AUTO_RULE.draws;
}

/**
 * Worker threads to use: a given count as is, or for 'auto' 2 when the machine has 2 or more cores
 * and the work is large, else 1 (serial). A count that is not a whole number >= 1 is bad input.
 * @param cores cores available; default os.availableParallelism()
 */
export function chooseWorkers(setting: WorkersSetting | undefined, work: WorkSize, cores = availableParallelism()): number {
  if (setting === undefined || setting === 'auto') return cores >= 2 && largeWork(work) ? AUTO_RULE.workers : 1;
  if (!(Number.isInteger(setting) && setting >= 1)) {
    throw new RateloomError('E_VALUE', `workers is ${setting}; it must be a whole number >= 1 or 'auto'`, {
      path: ['workers'],
      fix: "Give 'auto' or a whole number of worker threads >= 1 (1 = serial).",
    });
  }
  return setting;
}

/** One-line statement of the rule, for --help texts. */
export const AUTO_RULE_TEXT =
  `--workers auto (the default) uses ${AUTO_RULE.workers} worker threads when the machine has 2 or more cores and the work is large: ` +
  `profiles of >= ${AUTO_RULE.profileParameters} free parameters with >= ${AUTO_RULE.profileRuns} runs, a multistart of >= ${AUTO_RULE.starts} starts, ` +
  `or >= ${AUTO_RULE.draws} Monte Carlo draws; otherwise it runs serially (starting the workers costs 1-2 s). ` +
  '--workers 1 is serial; the results are identical whatever the number of workers.';
