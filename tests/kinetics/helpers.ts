/** Shared test helpers: central finite differences and error capture. */
import { RateloomError } from '../../src/core/errors';

export function err(fn: () => unknown): RateloomError {
  try {
    fn();
  } catch (e) {
    if (e instanceof RateloomError) return e;
    throw e;
  }
  throw new Error('expected a RateloomError');
}

/** Central difference of f (vector-valued, length m) w.r.t. x[j]; step h = 1e-5 * max(|x_j|, floor). */
export function centralDiff(f: (x: Float64Array) => Float64Array, x: Float64Array, j: number, floor = 1e-3): Float64Array {
  const h = 1e-5 * Math.max(Math.abs(x[j]), floor);
  const xp = Float64Array.from(x);
  const xm = Float64Array.from(x);
  xp[j] += h;
  xm[j] -= h;
  const fp = f(xp);
  const fm = f(xm);
  return fp.map((v, i) => (v - fm[i]) / (xp[j] - xm[j]));
}

/** True when a and b agree within rtol relative (with a tiny absolute floor for zero entries). */
export function close(a: number, b: number, rtol = 1e-6, atol = 1e-14): boolean {
  return Math.abs(a - b) <= rtol * Math.max(Math.abs(a), Math.abs(b)) + atol;
}
