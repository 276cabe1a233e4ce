/**
 * Parameters are plain objects: name, value, unit, bounds, fixed flag and transform. The estimator
 * works in the transformed space (log for positive quantities by default); these helpers map
 * between the two. Functions here return new objects and never mutate their inputs.
 */
import { RateloomError } from './errors.js';

/** How the estimator sees a parameter: as is, or as its natural logarithm (value must be > 0). */
export type Transform = 'none' | 'log';

export interface Parameter {
  /** Unique name, referenced by rate laws (for example 'k1', 'E1', 'K_A'). */
  readonly name: string;
  /** Value in SI units (see `unit`). */
  readonly value: number;
  /** SI unit shown with the value, for example 'mol/(kg s Pa^1.5)' or 'J/mol'. */
  readonly unit: string;
  /** Lower bound in SI units; default -Infinity (0 for log-transformed). */
  readonly lower: number;
  /** Upper bound in SI units; default +Infinity. */
  readonly upper: number;
  /** Held at `value` during fitting when true; default false. */
  readonly fixed: boolean;
  /** Estimation space; default 'log' for positive rate and equilibrium constants, 'none' otherwise. */
  readonly transform: Transform;
  /** Optional human description. */
  readonly description?: string;
}

export type ParameterInit = Pick<Parameter, 'name' | 'value'> & Partial<Omit<Parameter, 'name' | 'value'>>;

/** Make a parameter with defaults filled in, checking value, bounds and transform. */
export function makeParameter(init: ParameterInit, path: ReadonlyArray<string | number> = []): Parameter {
  const transform = init.transform ?? 'none';
  const lower = init.lower ?? (transform === 'log' ? 0 : -Infinity);
  const upper = init.upper ?? Infinity;
  if (!Number.isFinite(init.value)) {
    throw new RateloomError('E_VALUE', `parameter '${init.name}' has a non-finite value`, {
      path: [...path, 'value'],
      fix: 'Give a finite number.',
    });
  }
  if (!(lower < upper) && !(init.fixed && lower === upper)) {
    throw new RateloomError('E_VALUE', `parameter '${init.name}' has lower bound ${lower} not below upper bound ${upper}`, {
      path: [...path, 'lower'],
      fix: 'Make the lower bound smaller than the upper bound.',
    });
  }
  if (transform === 'log' && !(init.value > 0)) {
    throw new RateloomError('E_VALUE', `parameter '${init.name}' is fitted in log space but its value ${init.value} is not positive`, {
      path: [...path, 'value'],
      fix: "Give a positive starting value or set transform to 'none'.",
    });
  }
  if (init.value < lower || init.value > upper) {
    throw new RateloomError('E_VALUE', `parameter '${init.name}' value ${init.value} lies outside its bounds [${lower}, ${upper}]`, {
      path: [...path, 'value'],
      fix: 'Move the starting value inside the bounds or widen them.',
    });
  }
  return {
    name: init.name,
    value: init.value,
    unit: init.unit ?? '1',
    lower,
    upper,
    fixed: init.fixed ?? false,
    transform,
    ...(init.description !== undefined ? { description: init.description } : {}),
  };
}

/** Map a physical value to the estimation space. */
export function toInternal(p: Pick<Parameter, 'transform'>, value: number): number {
  return p.transform === 'log' ? Math.log(value) : value;
}

/** Map an estimation-space value back to the physical value. */
export function toExternal(p: Pick<Parameter, 'transform'>, internal: number): number {
  return p.transform === 'log' ? Math.exp(internal) : internal;
}

/** d(external)/d(internal) at an internal value, used to carry covariances between spaces. */
export function externalDerivative(p: Pick<Parameter, 'transform'>, internal: number): number {
  return p.transform === 'log' ? Math.exp(internal) : 1;
}

