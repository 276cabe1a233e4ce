import { describe, expect, it } from 'vitest';
import { luDecompose, luFactor, luSolve, luSolveTranspose, norm1, luRcond, solveLinear } from '../../src/numerics/lu';

describe('LU with partial pivoting', () => {
  it('solves a 3x3 system with a known solution', () => {
    // A x = b built from x = (1, -2, 3) (common practice, no source)
    const A = [2, 1, -1, -3, -1, 2, -2, 1, 2];
    const x = [1, -2, 3];
    const b = [0, 0, 0].map((_, i) => A[3 * i] * x[0] + A[3 * i + 1] * x[1] + A[3 * i + 2] * x[2]);
    const r = solveLinear(A, b, 3);
    expect(r.status).toBe('ok');
    expect(r.success).toBe(true);
    for (let i = 0; i < 3; i++) expect(r.x[i]).toBeCloseTo(x[i], 13);
    expect(A).toEqual([2, 1, -1, -3, -1, 2, -2, 1, 2]); // input untouched
  });

  it('needs pivoting when the leading entry is zero', () => {
    const r = solveLinear([0, 1, 1, 0], [2, 3], 2);
    expect(r.success).toBe(true);
    expect(Array.from(r.x)).toEqual([3, 2]);
  });

  it('solves with the transpose', () => {
    const A = Float64Array.from([4, 1, 2, 0, 3, 1, 1, 2, 5]);
    const lu = Float64Array.from(A);
    const piv = new Int32Array(3);
    expect(luFactor(lu, 3, piv)).toBe(0);
    const want = [0.5, -1, 2];
    // b = A^T want
    const b = new Float64Array(3);
    for (let j = 0; j < 3; j++) for (let i = 0; i < 3; i++) b[j] += A[i * 3 + j] * want[i];
    luSolveTranspose(lu, 3, piv, b);
    for (let i = 0; i < 3; i++) expect(b[i]).toBeCloseTo(want[i], 13);
    const c = Float64Array.from([1, 2, 3]);
    luSolve(lu, 3, piv, c);
    // residual of A c = (1, 2, 3)
    for (let i = 0; i < 3; i++) expect(A[i * 3] * c[0] + A[i * 3 + 1] * c[1] + A[i * 3 + 2] * c[2]).toBeCloseTo(i + 1, 12);
  });

  it('reports a singular matrix as a status, not a throw', () => {
    const r = solveLinear([1, 2, 2, 4], [1, 2], 2);
    expect(r.status).toBe('singular');
    expect(r.success).toBe(false);
    expect(Array.from(r.x)).toEqual([0, 0]);
    const piv = new Int32Array(3);
    expect(luFactor(Float64Array.from([1, 2, 3, 2, 4, 6, 1, 1, 1]), 3, piv)).toBeGreaterThan(0);
  });

  it('reports non-finite entries', () => {
    expect(luDecompose([1, NaN, 0, 1], 2).status).toBe('non-finite');
  });

  it('estimates the condition number', () => {
    const I = [1, 0, 0, 0, 1, 0, 0, 0, 1];
    expect(luDecompose(I, 3).rcond).toBeCloseTo(1, 12);
    // Hilbert matrix of order 6: cond_1 = 2.9e7 (value from memory); the estimate is a lower bound
    // on the condition number, so rcond >= 1/cond, and Hager's estimate is usually within 3x.
    const n = 6;
    const H = new Float64Array(n * n);
    for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) H[i * n + j] = 1 / (i + j + 1);
    const d = luDecompose(H, n);
    expect(d.status).toBe('ok');
    expect(1 / d.rcond).toBeGreaterThan(1e7);
    expect(1 / d.rcond).toBeLessThan(1e8);
    // nearly singular: flagged but still usable
    const near = luDecompose([1, 1, 1, 1 + 1e-15], 2);
    expect(near.status).toBe('ill-conditioned');
    expect(near.success).toBe(true);
    expect(near.warnings.length).toBe(1);
    expect(luRcond(Float64Array.from([0, 0, 0, 0]), 2, new Int32Array(2), norm1([0, 0, 0, 0], 2))).toBe(0);
  });
});
