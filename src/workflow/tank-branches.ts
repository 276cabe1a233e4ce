/**
 * After a fit of stirred-tank data: which steady state each run was fitted on. A run whose tank
 * has several steady states at the fitted parameters gets a warning naming the branch used (the
 * one reached from the measured outlet, tank-start.ts), its stability and the others.
 */
import type { Warning } from '../core/outcome.js';
import type { Study } from '../study/types.js';
import type { StudyModel } from './study-model.js';

/** One warning per run with several steady states at the fitted (external, SI) values. */
export function tankBranchWarnings(study: Study, model: StudyModel, external: Float64Array): Warning[] {
  if (study.reactor.kind !== 'stirred-tank') return [];
  const out: Warning[] = [];
  const key = study.keyReactantIndex;
  const name = study.keyReactant;
  study.runs.forEach((run, i) => {
    let sol;
    try {
      sol = model.solveRun(i, external, { steadyStateSearch: 'always' });
    } catch {
      return;
    }
    const states = sol.steadyStates ?? [];
    if (states.length < 2) return;
    const used = states.find((s) => s.reported);
    const list = states.map((s) => `${name} ${s.outletAmounts[key].toPrecision(4)} mol/s (${s.stability})`).join('; ');
    const how = sol.steadyStateStart === 'given' ? 'the one nearest the measured outlet' : 'the one reached from the feed (no outlet measurement to choose by)';
    out.push({
      code: 'tank-branch',
      message: `run ${run.id}: the tank has ${states.length} steady states at the fitted values (${list}); the fit used ${how}${used ? `: ${name} ${used.outletAmounts[key].toPrecision(4)} mol/s, ${used.stability}` : ''}`,
      path: [run.id],
    });
  });
  return out;
}
