import { describe, expect, it } from 'vitest';
import { criterionValue, inverseSpd, logDetSpd } from '../../src/planning/criteria';
import { greedyExchange } from '../../src/planning/exchange';

/** Information of one rate measurement r = V x / (K + x) with constant sigma. */
function mmInfo(x: number, V: number, K: number, sigma: number): Float64Array {
  const g = [x / (K + x), (-V * x) / (K + x) ** 2];
  return Float64Array.from([g[0] * g[0], g[0] * g[1], g[1] * g[0], g[1] * g[1]].map((v) => v / sigma ** 2));
}

describe('criteria', () => {
  it('log det, inverse and the Ds and A criteria of a 2 x 2 matrix agree with hand algebra', () => {
    const F = Float64Array.from([4, 1, 1, 3]);
    expect(logDetSpd(F, 2)).toBeCloseTo(Math.log(11), 12);
    const inv = inverseSpd(F, 2)!;
    expect(Array.from(inv)).toEqual([3 / 11, -1 / 11, -1 / 11, 4 / 11].map((v) => expect.closeTo(v, 14)));
    expect(criterionValue(F, 2, { kind: 'Ds', subset: [1] })).toBeCloseTo(-Math.log(4 / 11), 12);
    expect(criterionValue(F, 2, { kind: 'A', weights: Float64Array.from([1, 2]) })).toBeCloseTo(-(3 / 11 + 8 / 11), 12);
    expect(logDetSpd(Float64Array.from([1, 1, 1, 1]), 2)).toBe(-Infinity);
  });
});

describe('greedy + Fedorov exchange', () => {
  it('finds the locally D-optimal two-point Michaelis-Menten design x_max and K x_max / (2K + x_max)', () => {
    // Duggleby 1979 (J. theor. Biol. 81, 671-684), from memory: with constant error the locally
    // D-optimal two-point design on [0, x_max] is {K x_max / (2K + x_max), x_max}.
    const V = 2;
    const K = 0.7;
    const xMax = 5;
    const m = 4001;
    const xs = Array.from({ length: m }, (_, i) => (xMax * i) / (m - 1));
    const infos = xs.map((x) => mmInfo(x, V, K, 0.05));
    const res = greedyExchange({ p: 2, priors: [new Float64Array(4)], infos: [infos], points: xs.map((x) => Float64Array.of(x / xMax)), n: 2, minSpacing: 0, criterion: { kind: 'D' } });
    const found = res.chosen.map((i) => xs[i]).sort((a, b) => a - b);
    const expected = (K * xMax) / (2 * K + xMax);
    expect(Math.abs(found[0] - expected) / expected).toBeLessThan(0.01);
    expect(found[1]).toBeCloseTo(xMax, 12);
    // Independent brute force: det F over every pair of grid points (coarser grid, all pairs).
    const coarse = Array.from({ length: 501 }, (_, i) => (xMax * i) / 500);
    let best = { det: -Infinity, a: 0, b: 0 };
    for (let i = 0; i < coarse.length; i++) {
      for (let j = i + 1; j < coarse.length; j++) {
        const A = mmInfo(coarse[i], V, K, 0.05);
        const B = mmInfo(coarse[j], V, K, 0.05);
        const det = (A[0] + B[0]) * (A[3] + B[3]) - (A[1] + B[1]) ** 2;
        if (det > best.det) best = { det, a: coarse[i], b: coarse[j] };
      }
    }
    expect(Math.abs(best.a - expected) / expected).toBeLessThan(0.01);
    expect(best.b).toBe(xMax);
  });

  it('honours the spacing rule and returns fewer runs when the space is exhausted', () => {
    const xs = Array.from({ length: 11 }, (_, i) => i / 10);
    const infos = xs.map((x) => mmInfo(x, 1, 0.3, 0.1));
    const res = greedyExchange({ p: 2, priors: [new Float64Array(4)], infos: [infos], points: xs.map((x) => Float64Array.of(x)), n: 5, minSpacing: 0.45, criterion: { kind: 'D' } });
    expect(res.chosen.length).toBeGreaterThanOrEqual(2);
    expect(res.chosen.length).toBeLessThanOrEqual(3);
    const pts = res.chosen.map((i) => xs[i]).sort((a, b) => a - b);
    for (let k = 1; k < pts.length; k++) expect(pts[k] - pts[k - 1]).toBeGreaterThanOrEqual(0.45 - 1e-12);
  });
});
