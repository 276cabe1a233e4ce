/**
 * Job module (see pool.ts) for Monte Carlo sizing draws: every worker rebuilds the design case
 * once (setup: hand-off, compiled kinetics, case, sizer and, for a tube bundle, the tube search of
 * sizeReactor, or the tube count given), then evaluates a chunk of parameter vectors z (estimation
 * space, drawn by the caller in the order of design/uncertainty.ts propagate) with drawEvaluator of
 * design/size.ts, the evaluation sizeReactor's own draws use: the size and pressure drop for a sizing
 * target, the conversion for a rating. A job may name the tube count of its pass (the bundle's alpha
 * is then set for it), so one pool serves every pass of the percentile tube design.
 */
import { RateloomError } from '../core/errors.js';
import { drawEvaluator, type DrawEval } from '../design/size.js';
import { loadCase } from '../design/case.js';
import { applyInternal, parameterMap, parseHandoff, type ParameterMap } from '../design/handoff-load.js';
import { kineticsFromHandoff } from '../design/kinetics.js';
import { Sizer } from '../design/sizer.js';
import { buildSystem } from '../design/system.js';
import { systemWithPellet } from '../design/pellet-sizing.js';
import { bundleAlpha, designTubes } from '../design/tubes.js';

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
  /** Tube count of the bundle for these draws; default the context's (or the nominal search's). */
  tubeCount?: number;
}

export interface McJobResult {
  /** Propagated quantity per draw (size in kg, m3 or s; conversion for a rating); NaN when the draw failed. */
  values: Float64Array;
  /** Status per draw ('sized' or the failure). */
  statuses: string[];
  /** Size each draw needs (NaN failed, Infinity pressure exhausted; NaN for a rating). */
  sizes: Float64Array;
  /** Pressure drop at that size, Pa (same conventions). */
  drops: Float64Array;
}

interface McState {
  sizer: Sizer;
  map: ParameterMap;
  evaluate: (s: Sizer) => DrawEval;
  molarMasses?: ArrayLike<number>;
  tubeCount?: number;
}

export function setup(ctx: McContext): McState {
  const h = parseHandoff(ctx.handoff);
  const dk = kineticsFromHandoff(h);
  const kase = loadCase(ctx.case, dk.kinetics.speciesNames, dk.kinetics.reactionIds);
  const map = parameterMap(h, dk.kinetics.parameterNames);
  const sizer = new Sizer(kase.pellet ? systemWithPellet(dk.kinetics, kase, map.theta, kase.pellet, h.species).sys : buildSystem(dk.kinetics, kase, map.theta));
  // as sizeReactor: a bundle is designed for sizing targets only (a rating keeps the case's bed)
  if (kase.tubes && kase.target.kind !== 'size') {
    if (!dk.molarMasses) throw new RateloomError('E_VALUE', 'the tube design needs the molar masses of all species', { path: ['species'] });
    if (ctx.tubeCount !== undefined) sizer.sys.alpha = bundleAlpha(sizer.sys, dk.molarMasses, ctx.tubeCount).alpha;
    else designTubes(sizer, dk.molarMasses);
  }
  return {
    sizer,
    map,
    evaluate: drawEvaluator(sizer),
    ...(dk.molarMasses ? { molarMasses: dk.molarMasses } : {}),
    ...(ctx.tubeCount !== undefined ? { tubeCount: ctx.tubeCount } : {}),
  };
}

export function runJob(state: McState, job: McJob): McJobResult {
  const { sizer, map, evaluate } = state;
  if (job.tubeCount !== undefined && job.tubeCount !== state.tubeCount) {
    if (!state.molarMasses) throw new RateloomError('E_VALUE', 'the tube design needs the molar masses of all species', { path: ['species'] });
    sizer.sys.alpha = bundleAlpha(sizer.sys, state.molarMasses, job.tubeCount).alpha;
    state.tubeCount = job.tubeCount;
  }
  const n = map.free.length;
  const values = new Float64Array(job.count);
  const sizes = new Float64Array(job.count);
  const drops = new Float64Array(job.count);
  const statuses: string[] = [];
  for (let d = 0; d < job.count; d++) {
    applyInternal(map, job.z.subarray(d * n, (d + 1) * n), sizer.sys.theta);
    const e = evaluate(sizer);
    values[d] = e.value;
    sizes[d] = e.size;
    drops[d] = e.drop;
    statuses.push(e.status);
  }
  return { values, statuses, sizes, drops };
}
