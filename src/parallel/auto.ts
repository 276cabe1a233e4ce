/**
 * When the worker pool pays off. Thresholds set from bench/parallel-bench.ts and the demo data on a
 * 2-core machine (common practice, no source). Earlier measurements on a quiet machine (workers
 * loading TypeScript through tsx, 1-2 s of pool start): a multistart of 8 starts (50 runs) ran 1.9x
 * faster and 10000 Monte Carlo draws 1.9x faster, while the profiles of 4-6 parameters with 50-55
 * runs (about 2-3 s of work) and 4000 draws (about 1 s) ran slower than serially. Re-measured with
 * the compiled, bundled worker modules (dist/bundle/parallel/) on the same 2 cores shared with other
 * jobs (load average 7-9): 2 workers gave 0.49x on the profiles (4 parameters, 50 runs; CPU 1.21 s
 * serial, 1.89 s with the pool), 0.80x on the multistart (8 starts) and 0.65x on 10000 draws (CPU
 * 1.12 s vs 1.81 s): the pool adds about 0.7 s of CPU (two workers loading the modules, rebuilding
 * the model and warming up their own compiled code), and on a busy machine the second core is not
 * free. So 'auto' uses the pool only for
 *   profiles     >= 3 free parameters and >= 100 runs
 *   multistart   >= 8 Latin-hypercube starts
 *   Monte Carlo  >= 8000 draws
 * and only when at least 2 cores are idle: os.availableParallelism() minus the load not counting
 * this process (1-minute load average - 1, os.loadavg(); 0 where the system does not report it).
 * The results never depend on this choice: every parallel path gives the serial result, byte for
 * byte. `--workers N` overrides the rule.
 */
import { availableParallelism, loadavg } from 'node:os';
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
 * Cores idle for this process: os.availableParallelism() less the 1-minute load average of the other
 * processes (load - 1: this process is running), at most availableParallelism().
 */
export function idleCores(cores = availableParallelism(), load = loadavg()[0]): number {
  return Math.min(cores, cores - Math.max(0, load - 1));
}

/**
 * Worker threads to use: a given count as is, or for 'auto' 2 when 2 or more cores are idle and
 * the work is large, else 1 (serial). A count that is not a whole number >= 1 is bad input.
 * @param cores cores idle for this process; default idleCores()
 */
export function chooseWorkers(setting: WorkersSetting | undefined, work: WorkSize, cores = idleCores()): number {
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
  `--workers auto (the default) uses ${AUTO_RULE.workers} worker threads when 2 or more cores are idle (cores less the load average of other processes) and the work is large: ` +
  `profiles of >= ${AUTO_RULE.profileParameters} free parameters with >= ${AUTO_RULE.profileRuns} runs, a multistart of >= ${AUTO_RULE.starts} starts, ` +
  `or >= ${AUTO_RULE.draws} Monte Carlo draws; otherwise it runs serially (each worker must warm up, and a busy machine has no free core). ` +
  '--workers 1 is serial; the results are identical whatever the number of workers.';
