/**
 * Job module (see pool.ts) for Monte Carlo sizing draws: every worker rebuilds the design case
 * once (setup: hand-off, compiled kinetics, case, sizer and, for a tube bundle, the tube search of
 * sizeReactor, or the tube count given), then sizes a chunk of parameter vectors z (estimation space, drawn by the caller in
 * the order of design/uncertainty.ts propagate). Sizing targets (conversion) only; a rating case
 * (target kind 'size') is refused by setup.
 */
import { RateloomError } from '../core/errors';
import { loadCase } from '../design/case';
import { applyInternal, parameterMap, parseHandoff, type ParameterMap } from '../design/handoff-load';
import { kineticsFromHandoff } from '../design/kinetics';
import { Sizer } from '../design/sizer';
import { buildSystem } from '../design/system';
import { bundleAlpha, designTubes } from '../design/tubes';

export interface McContext {
  /** The fitted-kinetics hand-off as read from its JSON file. */
  handoff: unknown;
  /** The design case as read from its JSON file. */
  case: unknown;
  /**
   * Tube count of the bundle to size the draws with (the count sizeReactor settled on, which may
   * be raised for a design percentile); default: the nominal tube search (designTubes).
   */
  tubeCount?: number;
}

export interface McJob {
  /** count x n parameter vectors, row-major (estimation space, hand-off free-parameter order). */
  z: Float64Array;
  count: number;
}

export interface McJobResult {
  /** Size per draw (kg, m3 or s); NaN when the draw failed. */
  values: Float64Array;
  /** Status per draw ('sized' or the failure). */
  statuses: string[];
}

interface McState {
  sizer: Sizer;
  map: ParameterMap;
}

export function setup(ctx: McContext): McState {
  const h = parseHandoff(ctx.handoff);
  const dk = kineticsFromHandoff(h);
  const kase = loadCase(ctx.case, dk.kinetics.speciesNames, dk.kinetics.reactionIds);
  if (kase.target.kind === 'size') {
    throw new RateloomError('E_VALUE', 'parallel Monte Carlo covers sizing targets only, not rating a given size', { path: ['target'] });
  }
  const map = parameterMap(h, dk.kinetics.parameterNames);
  const sizer = new Sizer(buildSystem(dk.kinetics, kase, map.theta));
  if (kase.tubes) {
    if (!dk.molarMasses) throw new RateloomError('E_VALUE', 'the tube design needs the molar masses of all species', { path: ['species'] });
    if (ctx.tubeCount !== undefined) sizer.sys.alpha = bundleAlpha(sizer.sys, dk.molarMasses, ctx.tubeCount).alpha;
    else designTubes(sizer, dk.molarMasses);
  }
  return { sizer, map };
}

export function runJob(state: McState, job: McJob): McJobResult {
  const { sizer, map } = state;
  const n = map.free.length;
  const values = new Float64Array(job.count);
  const statuses: string[] = [];
  for (let d = 0; d < job.count; d++) {
    applyInternal(map, job.z.subarray(d * n, (d + 1) * n), sizer.sys.theta);
    const r = sizer.size();
    values[d] = r.status === 'sized' ? r.size : NaN;
    statuses.push(r.status);
  }
  return { values, statuses };
}
