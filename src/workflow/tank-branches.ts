/**
 * After a fit of stirred-tank data: every steady state of each run at the fitted values, as data
 * (outlet flows and concentrations as shown, src/reactors/round-off.ts; stability; which one the
 * fit used) and, for a run whose tank has several, a warning naming the branch used (the one
 * reached from the measured outlet, tank-start.ts), its stability and the others.
 */
import type { Warning } from '../core/outcome.js';
import { shownAmounts } from '../reactors/round-off.js';
import { amountsIn } from '../study/simulate.js';
import type { Study } from '../study/types.js';
import type { StudyModel } from './study-model.js';

/** One steady state of a run's tank at the fitted values. */
export interface TankState {
  /** Outlet flows by species, mol/s (round-off negatives shown as 0). */
  outletFlows: Record<string, number>;
  /** Outlet concentrations by species, mol/m3. */
  concentrations: Record<string, number>;
  stability: 'stable' | 'unstable' | 'not-assessed';
  /** True for the steady state the fit used for this run. */
  used: boolean;
}

/** The steady states of one stirred-tank run at the fitted values. */
export interface TankRunStates {
  runId: string;
  /** Where Newton started for the state used: the run's measured outlet, or the feed. */
  start: 'measured-outlet' | 'feed';
  states: TankState[];
}

/** Every stirred-tank run's steady states at the fitted (external, SI) values; [] for other reactors. */
export function tankSteadyStates(study: Study, model: StudyModel, external: Float64Array): TankRunStates[] {
  if (study.reactor.kind !== 'stirred-tank') return [];
  const names = study.chemistry.speciesNames;
  const record = (v: number[]) => Object.fromEntries(names.map((n, k) => [n, v[k]]));
  const out: TankRunStates[] = [];
  study.runs.forEach((run, i) => {
    let sol;
    try {
      sol = model.solveRun(i, external, { steadyStateSearch: 'always' });
    } catch {
      return;
    }
    const scale = amountsIn(study, run).reduce((a, b) => a + b, 0);
    const states = (sol.steadyStates ?? []).map((st) => {
      const sh = shownAmounts(st.outletAmounts, st.outletConcentrations, scale);
      return { outletFlows: record(sh.amounts), concentrations: record(sh.concentrations), stability: st.stability, used: st.reported };
    });
    if (states.length) out.push({ runId: run.id, start: sol.steadyStateStart === 'given' ? 'measured-outlet' : 'feed', states });
  });
  return out;
}

/** One warning per run with several steady states. */
export function tankBranchWarnings(study: Study, runs: readonly TankRunStates[]): Warning[] {
  const name = study.keyReactant;
  const flow = (s: TankState) => `${name} ${s.outletFlows[name].toPrecision(4)} mol/s`;
  return runs
    .filter((r) => r.states.length > 1)
    .map((r) => {
      const used = r.states.find((s) => s.used);
      const how = r.start === 'measured-outlet' ? 'the one nearest the measured outlet' : 'the one reached from the feed (no outlet measurement to choose by)';
      return {
        code: 'tank-branch',
        message: `run ${r.runId}: the tank has ${r.states.length} steady states at the fitted values (${r.states.map((s) => `${flow(s)} (${s.stability})`).join('; ')}); the fit used ${how}${used ? `: ${flow(used)}, ${used.stability}` : ''}`,
        path: [r.runId],
      };
    });
}
