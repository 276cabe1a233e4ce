import { describe, expect, it } from 'vitest';
import { brent, findAllRoots } from '../../src/numerics/roots';

describe('Brent root finder', () => {
  it('locates the root of cos x - x', () => {
    const f = (x: number) => Math.cos(x) - x;
    const r = brent(f, 0, 1);
    expect(r.status).toBe('converged');
    // residual check (common practice, no source)
    expect(Math.abs(f(r.x))).toBeLessThan(1e-14);
    expect(r.evaluations).toBeLessThan(15);
  });

  it('reports a missing bracket and non-finite values', () => {
    expect(brent((x) => x * x + 1, -1, 1).status).toBe('no-bracket');
    expect(brent((x) => (x > 0.5 ? NaN : x - 0.7), 0, 1).status).toBe('non-finite');
    expect(brent((x) => x, 1, 1).status).toBe('bad-input');
  });

  it('finds a root at an interval end', () => {
    expect(brent((x) => x - 2, 2, 3).x).toBe(2);
  });
});

describe('findAllRoots', () => {
  it('finds every root of sin on [0.5, 10]', () => {
    const r = findAllRoots(Math.sin, 0.5, 10);
    expect(r.status).toBe('ok');
    // Source: analytic roots k*pi
    expect(r.roots).toHaveLength(3);
    r.roots.forEach((x, i) => expect(Math.abs(x - (i + 1) * Math.PI)).toBeLessThan(1e-12));
  });

  it('finds three steady states of a cubic, including one on a grid point', () => {
    const f = (x: number) => (x - 1) * (x - 2) * (x - 3.3);
    const r = findAllRoots(f, 0, 4, { intervals: 40 });
    expect(r.roots).toHaveLength(3);
    // Source: analytic roots 1, 2, 3.3
    expect(r.roots[0]).toBeCloseTo(1, 12);
    expect(r.roots[1]).toBeCloseTo(2, 12);
    expect(r.roots[2]).toBeCloseTo(3.3, 12);
  });

  it('reports no roots and flags non-finite regions', () => {
    expect(findAllRoots((x) => x * x + 1, -2, 2).roots).toEqual([]);
    const r = findAllRoots((x) => (x < 0 ? NaN : x - 1), -1, 2);
    expect(r.status).toBe('incomplete');
    expect(r.success).toBe(false);
    expect(r.roots).toHaveLength(1);
    expect(r.warnings.some((w) => w.code === 'non-finite')).toBe(true);
  });
});
