/**
 * Catalyst activity inside the study model: a(t) of each run from the activity parameters
 * (src/study/activity-params.ts) and its derivative with respect to them. The model applies a by
 * solving the reactor at the equivalent contact size a * size (exact for the isobaric reactors
 * the activity section admits: every balance term then scales with the rates alone).
 */
import { activityOf } from '../study/activity-params.js';
import type { Study } from '../study/types.js';

export class ActivityTerms {
  /** Index in the full parameter vector of each activity parameter. */
  readonly indices: Int32Array;
  private readonly values: Float64Array;

  constructor(
    private readonly study: Study,
    parameterNames: readonly string[],
  ) {
    const names = study.activity?.parameters ?? [];
    this.indices = Int32Array.from(names, (n) => parameterNames.indexOf(n));
    this.values = new Float64Array(names.length);
  }

  get active(): boolean {
    return this.indices.length > 0 && this.study.activity !== undefined;
  }

  /** Activity of run r at external parameter values `ext`. */
  value(r: number, ext: Float64Array): number {
    if (!this.active) return 1;
    for (let k = 0; k < this.indices.length; k++) this.values[k] = ext[this.indices[k]];
    return activityOf(this.study.activity!, this.study.runs[r], this.values);
  }

  /** d a / d (external parameter indices[k]) of run r, into out (length indices.length). */
  derivative(r: number, ext: Float64Array, out: Float64Array): void {
    out.fill(0);
    const act = this.study.activity;
    if (!act) return;
    const run = this.study.runs[r];
    const t = run.timeOnStream ?? 0;
    if (act.model === 'linear') out[0] = -t;
    else if (act.model === 'exponential') out[0] = -t * Math.exp(-ext[this.indices[0]] * t);
    else if (act.model === 'piecewise') {
      const k = act.parameters.indexOf(`activity@${run.group}`);
      if (k >= 0) out[k] = 1;
    }
  }
}
