/** The RateloomError thrown by `f` (any other throw, or none, fails the test). */
import { isRateloomError, type RateloomError } from '../../src/core/errors';

export function caught(f: () => unknown): RateloomError {
  try {
    f();
  } catch (e) {
    if (isRateloomError(e)) return e;
    throw e;
  }
  throw new Error('expected a RateloomError');
}
