/**
 * Input checks and the solver call shared by fitModel, the profiles and the multistart driver:
 * parameters are matched by name to the model's theta, mapped to the estimation space (log for
 * 'log' parameters, with bounds mapped too), fixed parameters are held, and the free ones go to the
 * chosen solver.
 *
 * Default solver: the own trust-region Levenberg-Marquardt (lm.ts). The card package
 * ml-levenberg-marquardt (card-lm.ts) is kept as `solver: 'card'`. Wrapped (pre-weighted residuals,
 * our relative-step Jacobian, rounds with an error-change test) it does reach the NIST StRD
 * certified values wherever it converges (tests/reference/nist-strd.test.ts), but measured on the
 * four NIST problems it needs 257-308 model evaluations against 10-38 for lm.ts, and it cannot treat
 * a failed prediction as a rejected step: a non-finite error ends its run (BoxBOD from start 1 ends
 * in 'model-failure' after its first step). Kinetic models fail routinely at extreme parameters
 * (ODE step failure), so the trust-region solver, which shrinks its radius on a failure, is the
 * default.
 */
import { RateloomError } from '../core/errors.js';
import { toInternal, type Parameter } from '../core/parameter.js';
import { cardLevenbergMarquardt } from './card-lm.js';
import type { FitData, FitOptions } from './fit-types.js';
import { levenbergMarquardt, type LmResult } from './lm.js';
import type { RegressionModel } from './model.js';
import { ResidualProblem } from './residuals.js';

export interface PreparedFit {
  model: RegressionModel;
  data: FitData;
  options: FitOptions;
  /** Parameters in the model's theta order. */
  parameters: Parameter[];
  /** Full theta in the estimation space (starting values). */
  thetaFull: Float64Array;
  /** Indices of free parameters in theta. */
  freeIndex: number[];
  /** Estimation-space bounds of every theta entry. */
  lowerFull: Float64Array;
  upperFull: Float64Array;
}

function internalBound(p: Parameter, v: number, side: 'lower' | 'upper'): number {
  if (p.transform !== 'log') return v;
  if (side === 'lower') return v > 0 ? Math.log(v) : -Infinity;
  return Number.isFinite(v) ? Math.log(v) : Infinity;
}

/** Check the inputs (throws RateloomError on bad input) and set up the estimation space. */
export function prepareFit(
  model: RegressionModel,
  parameters: readonly Parameter[],
  data: FitData,
  options: FitOptions = {},
): PreparedFit {
  const n = model.nObservations;
  if (data.measured.length !== n) {
    throw new RateloomError('E_DATA', `measured has ${data.measured.length} values but the model predicts ${n} observations`, {
      path: ['measured'],
    });
  }
  if (data.sigma.length !== n) {
    throw new RateloomError('E_DATA', `sigma has ${data.sigma.length} values but there are ${n} observations`, { path: ['sigma'] });
  }
  for (let i = 0; i < n; i++) {
    if (!Number.isFinite(data.measured[i])) {
      throw new RateloomError('E_DATA', `measured value ${i} is not a finite number`, { path: ['measured', i] });
    }
    if (!(data.sigma[i] > 0) || !Number.isFinite(data.sigma[i])) {
      throw new RateloomError('E_DATA', `sigma ${i} must be a positive finite number, got ${data.sigma[i]}`, { path: ['sigma', i] });
    }
  }
  if (data.groups && data.groups.length !== n) {
    throw new RateloomError('E_DATA', `groups has ${data.groups.length} labels but there are ${n} observations`, { path: ['groups'] });
  }
  const level = options.level ?? 0.95;
  if (!(level > 0 && level < 1)) {
    throw new RateloomError('E_VALUE', `confidence level must lie between 0 and 1, got ${level}`, { path: ['level'] });
  }
  const byName = new Map<string, Parameter>();
  for (const p of parameters) {
    if (byName.has(p.name)) throw new RateloomError('E_VALUE', `parameter '${p.name}' is given twice`, { path: ['parameters', p.name] });
    byName.set(p.name, p);
  }
  const ordered: Parameter[] = model.parameterNames.map((name, j) => {
    const p = byName.get(name);
    if (!p) {
      throw new RateloomError('E_UNKNOWN_PARAMETER', `the model needs parameter '${name}' but none was given`, {
        path: ['parameters', j],
      });
    }
    return p;
  });
  const used = new Set(model.parameterNames);
  for (const p of parameters) {
    if (!p.fixed && !used.has(p.name)) {
      throw new RateloomError('E_UNKNOWN_PARAMETER', `parameter '${p.name}' is free but the model does not use it`, {
        path: ['parameters', p.name],
        fix: 'Remove the parameter, mark it fixed, or correct its name.',
      });
    }
  }
  const nt = ordered.length;
  const thetaFull = new Float64Array(nt);
  const lowerFull = new Float64Array(nt);
  const upperFull = new Float64Array(nt);
  const freeIndex: number[] = [];
  ordered.forEach((p, j) => {
    thetaFull[j] = toInternal(p, p.value);
    lowerFull[j] = internalBound(p, p.lower, 'lower');
    upperFull[j] = internalBound(p, p.upper, 'upper');
    if (!p.fixed) freeIndex.push(j);
  });
  return { model, data, options, parameters: ordered, thetaFull, freeIndex, lowerFull, upperFull };
}

/** Residual problem over the given free indices with the other theta entries held at `thetaFull`. */
export function makeProblem(prep: PreparedFit, thetaFull: Float64Array, freeIndex: readonly number[]): ResidualProblem {
  return new ResidualProblem({
    model: prep.model,
    measured: prep.data.measured,
    sigma: prep.data.sigma,
    thetaFull,
    freeIndex,
    lower: Float64Array.from(freeIndex, (j) => prep.lowerFull[j]),
    upper: Float64Array.from(freeIndex, (j) => prep.upperFull[j]),
    differences: prep.options.differences ?? 'forward',
    ...(prep.data.whiten?.length ? { whiten: prep.data.whiten } : {}),
  });
}

/** Run the chosen solver on the free parameters from the starting theta `thetaFull`. */
export function solveFree(
  prep: PreparedFit,
  thetaFull: Float64Array,
  freeIndex: readonly number[] = prep.freeIndex,
): { result: LmResult; problem: ResidualProblem } {
  const problem = makeProblem(prep, thetaFull, freeIndex);
  const x0 = Float64Array.from(freeIndex, (j) => thetaFull[j]);
  const lower = Float64Array.from(freeIndex, (j) => prep.lowerFull[j]);
  const upper = Float64Array.from(freeIndex, (j) => prep.upperFull[j]);
  const o = prep.options;
  const common = {
    lower,
    upper,
    ...(o.ftol !== undefined ? { ftol: o.ftol } : {}),
    ...(o.xtol !== undefined ? { xtol: o.xtol } : {}),
    ...(o.gtol !== undefined ? { gtol: o.gtol } : {}),
    ...(o.maxIterations !== undefined ? { maxIterations: o.maxIterations } : {}),
    ...(o.maxEvaluations !== undefined ? { maxEvaluations: o.maxEvaluations } : {}),
  };
  const result = (o.solver ?? 'trust-region') === 'card'
    ? cardLevenbergMarquardt(problem, x0, common)
    : levenbergMarquardt(problem, x0, common);
  // Runs that failed at trial points are named on the result (the steps themselves were rejected).
  const failed = problem.failureWarning();
  return { result: failed ? { ...result, warnings: [...result.warnings, failed] } : result, problem };
}
