import { describe, expect, it } from 'vitest';
import { SeededRandom, cholesky, normalQuantile } from '../../src/design/random';
import { quantileSorted } from '../../src/design/uncertainty';

describe('seeded random numbers', () => {
  it('repeats for a seed and differs between seeds', () => {
    const a = new SeededRandom(42);
    const b = new SeededRandom(42);
    const c = new SeededRandom(43);
    const xa = Array.from({ length: 5 }, () => a.uniform());
    expect(Array.from({ length: 5 }, () => b.uniform())).toEqual(xa);
    expect(Array.from({ length: 5 }, () => c.uniform())).not.toEqual(xa);
  });
  it('normal draws have mean 0 and variance 1', () => {
    const r = new SeededRandom(1);
    let s = 0;
    let s2 = 0;
    const n = 200000;
    for (let i = 0; i < n; i++) {
      const z = r.normal();
      s += z;
      s2 += z * z;
    }
    // Common practice, no source: sampling error of the mean ~ 1/sqrt(n) = 0.0022.
    expect(Math.abs(s / n)).toBeLessThan(0.01);
    expect(Math.abs(s2 / n - 1)).toBeLessThan(0.01);
  });
  it('normal quantiles', () => {
    // Source: standard normal table values (value from memory): z_0.95 = 1.6448536, z_0.975 = 1.9599640.
    expect(normalQuantile(0.95)).toBeCloseTo(1.6448536, 6);
    expect(normalQuantile(0.975)).toBeCloseTo(1.959964, 6);
    expect(normalQuantile(0.5)).toBeCloseTo(0, 12);
    expect(normalQuantile(0.01)).toBeCloseTo(-normalQuantile(0.99), 9);
  });
  it('Cholesky reproduces the matrix and flags an indefinite one', () => {
    const A = [4, 2, 0.4, 2, 5, 1, 0.4, 1, 3];
    const L = cholesky(A, 3)!;
    for (let i = 0; i < 3; i++)
      for (let j = 0; j < 3; j++) {
        let s = 0;
        for (let k = 0; k < 3; k++) s += L[i * 3 + k] * L[j * 3 + k];
        expect(s).toBeCloseTo(A[i * 3 + j], 12);
      }
    expect(cholesky([1, 2, 2, 1], 2)).toBeNull();
  });
  it('type-7 quantiles', () => {
    expect(quantileSorted([1, 2, 3, 4], 0.5)).toBe(2.5);
    expect(quantileSorted([1, 2, 3, 4], 0.9)).toBeCloseTo(3.7, 12);
  });
});
