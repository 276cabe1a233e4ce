import { describe, expect, it } from 'vitest';
import { conditionNumber, leverages, normalInverse, svd, svdRank } from '../../src/numerics/svd';
import { mulberry32 } from '../../src/estimation/random';

function reconstruct(U: Float64Array, s: Float64Array, V: Float64Array, m: number, n: number): Float64Array {
  const A = new Float64Array(m * n);
  for (let i = 0; i < m; i++) for (let j = 0; j < n; j++) {
    let v = 0;
    for (let k = 0; k < n; k++) v += U[i * n + k] * s[k] * V[j * n + k];
    A[i * n + j] = v;
  }
  return A;
}

describe('one-sided Jacobi SVD', () => {
  it('reconstructs random matrices with orthonormal factors and descending singular values', () => {
    const rng = mulberry32(17);
    for (const [m, n] of [[6, 3], [10, 5], [4, 4], [2, 3]]) {
      const A = Float64Array.from({ length: m * n }, () => rng.normal());
      const d = svd(A, m, n);
      const B = reconstruct(d.U, d.s, d.V, m, n);
      for (let k = 0; k < m * n; k++) expect(B[k]).toBeCloseTo(A[k], 12);
      for (let k = 1; k < n; k++) expect(d.s[k]).toBeLessThanOrEqual(d.s[k - 1]);
      for (let a = 0; a < n; a++) for (let b = 0; b < n; b++) {
        let vv = 0;
        for (let i = 0; i < n; i++) vv += d.V[i * n + a] * d.V[i * n + b];
        // Source: analytic, V'V = I.
        expect(vv).toBeCloseTo(a === b ? 1 : 0, 12);
      }
    }
  });

  it('(A\'A)^-1, condition number and leverages of a known matrix', () => {
    // A = [[1, 0], [0, 2], [0, 0]]: A'A = diag(1, 4), singular values 2 and 1.
    const d = svd(Float64Array.from([1, 0, 0, 2, 0, 0]), 3, 2);
    // Source: analytic.
    expect(Array.from(d.s)).toEqual([2, 1]);
    expect(conditionNumber(d)).toBe(2);
    const inv = normalInverse(d);
    expect(inv[0]).toBeCloseTo(1, 15);
    expect(inv[3]).toBeCloseTo(0.25, 15);
    expect(Array.from(leverages(d))).toEqual([1, 1, 0]);
  });

  it('detects rank deficiency', () => {
    const d = svd(Float64Array.from([1, 2, 2, 4, 3, 6]), 3, 2);
    expect(svdRank(d)).toBe(1);
    expect(conditionNumber(d)).toBeGreaterThan(1e14);
  });
});
