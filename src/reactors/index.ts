/**
 * Reactor models behind one entry point: solveReactor dispatches by spec.kind after the input
 * checks (temperature, pressure, feed, size, membrane species), which throw RateloomError naming
 * the field (['runs', runId, 'temperature'], ...) and the fix. Numerical trouble is a status on the
 * returned ReactorSolution, never a throw.
 */
import { RateloomError } from '../core/errors.js';
import type { CompiledKinetics } from '../kinetics/compiled.js';
import { batchReactor } from './batch.js';
import { membraneReactor } from './membrane.js';
import { packedBed } from './packed-bed.js';
import { plugFlow } from './plug-flow.js';
import { semibatchReactor } from './semibatch.js';
import { stirredTank } from './stirred-tank.js';
import type { ReactorKind, ReactorModel, ReactorOptions, ReactorSolution, ReactorSpec, RunConditions } from './types.js';

export const REACTOR_MODELS: Readonly<Record<ReactorKind, ReactorModel>> = {
  'packed-bed': packedBed,
  'plug-flow': plugFlow,
  'stirred-tank': stirredTank,
  batch: batchReactor,
  membrane: membraneReactor,
  semibatch: semibatchReactor,
};

/**
 * Solve one reactor for one run.
 * @param spec reactor description (kind, phase, pressure drop, membrane, bulk density)
 * @param run run conditions (SI units)
 * @param kinetics compiled kinetics
 * @param theta parameter values (physical, in kinetics.parameterNames order)
 * @param options profile, sensitivities, tolerances (see ReactorOptions)
 * @throws RateloomError for bad input only
 */
export function solveReactor(
  spec: ReactorSpec,
  run: RunConditions,
  kinetics: CompiledKinetics,
  theta: Float64Array,
  options: ReactorOptions = {},
): ReactorSolution {
  const model = REACTOR_MODELS[spec?.kind];
  if (!model) {
    throw new RateloomError('E_VALUE', `unknown reactor kind '${String(spec?.kind)}'`, {
      path: ['reactor', 'kind'],
      fix: `Use one of: ${Object.keys(REACTOR_MODELS).join(', ')}.`,
    });
  }
  if (spec.phase !== 'gas' && spec.phase !== 'liquid') {
    throw new RateloomError('E_VALUE', `unknown phase '${String(spec.phase)}'`, {
      path: ['reactor', 'phase'],
      fix: "Use 'gas' or 'liquid'.",
    });
  }
  return model.solve(spec, run, kinetics, theta, options);
}

export { ergunAlpha, resolveAlpha } from './ergun.js';

export type * from './types.js';
