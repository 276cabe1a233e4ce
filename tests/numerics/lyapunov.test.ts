import { describe, expect, it } from 'vitest';
import { hurwitz } from '../../src/numerics/lyapunov';

describe('Hurwitz test by the Lyapunov equation', () => {
  it('agrees with eigenvalues known in closed form', () => {
    // Triangular matrices: eigenvalues are the diagonal entries.
    expect(hurwitz([-1, 2, 0, -3], 2)).toBe('stable');
    expect(hurwitz([1, 2, 0, -3], 2)).toBe('unstable');
    // [[a, b], [-b, a]] has eigenvalues a +- i b.
    expect(hurwitz([-0.1, 1, -1, -0.1], 2)).toBe('stable');
    expect(hurwitz([0.1, 1, -1, 0.1], 2)).toBe('unstable');
    // Companion matrix of (s + 1)(s + 2)(s + 3) = s^3 + 6 s^2 + 11 s + 6: roots -1, -2, -3.
    expect(hurwitz([0, 1, 0, 0, 0, 1, -6, -11, -6], 3)).toBe('stable');
    // (s - 1)(s + 2)(s + 3) = s^3 + 4 s^2 + s - 6: one root at +1.
    expect(hurwitz([0, 1, 0, 0, 0, 1, 6, -1, -4], 3)).toBe('unstable');
  });

  it('is undecided when two eigenvalues sum to zero (a zero eigenvalue)', () => {
    expect(hurwitz([0, 0, 0, -1], 2)).toBe('undecided');
  });
});
