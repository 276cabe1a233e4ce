/**
 * Run-level parameters in the study model: before each reactor solve, the current values of the
 * parameters that hold a run's feed flows or initial concentrations (src/data/run-parameters.ts)
 * are written into that solve's own copy of the run. Per-run-group copies ('<name>@<group>') are
 * matched to the run's group as for kinetics parameters. The reactors' sensitivities cover the
 * kinetics parameters only, so a study with run-level parameters is fitted with the estimation
 * layer's finite-difference Jacobian (the StudyModel then offers no exact Jacobian).
 */
import type { RunConditions } from '../reactors/types.js';
import type { StudyRun } from '../study/types.js';

interface Entry {
  target: 'feed' | 'initialConcentration';
  speciesIndex: number;
  /** Index into the model's external parameter vector. */
  index: number;
}

export class RunValues {
  private constructor(
    private readonly entries: (Entry[] | undefined)[],
    private readonly copies: (RunConditions | undefined)[],
  ) {}

  /** Undefined when no run has run-level parameters. */
  static build(runs: readonly StudyRun[], parameterNames: readonly string[]): RunValues | undefined {
    if (!runs.some((r) => r.runParameters?.length)) return undefined;
    const index = new Map(parameterNames.map((n, i) => [n, i]));
    const entries = runs.map((run) =>
      run.runParameters?.map((ref) => {
        const i = (run.group !== undefined ? index.get(`${ref.parameter}@${run.group}`) : undefined) ?? index.get(ref.parameter) ?? -1;
        return { target: ref.target, speciesIndex: ref.speciesIndex, index: i };
      }),
    );
    return new RunValues(entries, runs.map((r) => (r.runParameters?.length ? ownCopy(r) : undefined)));
  }

  /** True when this run has a run-level parameter. */
  has(runIndex: number): boolean {
    return this.entries[runIndex] !== undefined;
  }

  /** A copy of `run` with its own feed and initial arrays, for one solve task to fill. */
  copyFor(run: RunConditions): RunConditions {
    return ownCopy(run);
  }

  /** Write the current external (SI) values into `run` (a copy made by copyFor); returns it. */
  fill(runIndex: number, run: RunConditions, external: Float64Array): RunConditions {
    const list = this.entries[runIndex];
    if (!list) return run;
    for (const e of list) {
      if (e.index < 0) continue;
      const v = external[e.index];
      if (e.target === 'feed' && run.feed) run.feed[e.speciesIndex] = v;
      else if (e.target === 'initialConcentration' && run.initialConcentrations) run.initialConcentrations[e.speciesIndex] = v;
    }
    return run;
  }

  /** The run (study order) with current values, from a copy kept for rate predictions and reports. */
  run(runIndex: number, base: RunConditions, external: Float64Array): RunConditions {
    const c = this.copies[runIndex];
    return c ? this.fill(runIndex, c, external) : base;
  }
}

function ownCopy<T extends RunConditions>(run: T): T {
  const c = { ...run };
  if (run.feed) c.feed = run.feed.slice();
  if (run.initialConcentrations) c.initialConcentrations = run.initialConcentrations.slice();
  return c;
}
