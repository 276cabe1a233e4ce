/**
 * The branch a stirred-tank run was measured on: a Newton start built from the run's measured
 * outlet, so that a tank with several steady states is fitted on the one the lab saw. With one
 * reaction the start lies on the reaction line F = F0 + nu xi, with the extent xi taken from the
 * first measured species that takes part; otherwise the measured species' flows replace the feed's.
 * Outlet flows are used as measured; conversions give F0 (1 - X); liquid concentrations F = C v0.
 */
import type { Observation, Study, StudyRun } from '../study/types.js';

/** Outlet flow of species j implied by an outlet observation, mol/s; undefined when not implied. */
function impliedFlow(o: Observation, run: StudyRun, study: Study): number | undefined {
  const j = o.speciesIndex;
  if (j === undefined || o.position !== undefined) return undefined;
  if (o.response === 'outlet-flow') return o.value;
  if (o.response === 'conversion' && run.feed) return run.feed[j] * (1 - o.value);
  if (o.response === 'outlet-concentration' && study.reactor.phase === 'liquid' && run.volumetricFlow !== undefined) return o.value * run.volumetricFlow;
  return undefined;
}

/** Newton start of each stirred-tank run from its measurements (undefined where none applies). */
export function measuredStarts(study: Study): (Float64Array | undefined)[] {
  const starts: (Float64Array | undefined)[] = study.runs.map(() => undefined);
  if (study.reactor.kind !== 'stirred-tank') return starts;
  const chem = study.chemistry;
  const nS = chem.speciesNames.length;
  const single = chem.reactionIds.length === 1;
  for (const o of study.observations) {
    const run = study.runs[o.runIndex];
    const F = impliedFlow(o, run, study);
    if (F === undefined || !run.feed || !(F >= 0)) continue;
    const j = o.speciesIndex as number;
    let s = starts[o.runIndex];
    if (single) {
      const nu = chem.stoich[j];
      if (s || nu === 0) continue;
      const xi = (F - run.feed[j]) / nu;
      s = Float64Array.from({ length: nS }, (_, k) => Math.max(run.feed![k] + chem.stoich[k] * xi, 0));
    } else {
      s ??= Float64Array.from(run.feed);
      s[j] = F;
    }
    starts[o.runIndex] = s;
  }
  return starts;
}
