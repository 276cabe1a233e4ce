import { describe, expect, it } from 'vitest';
import { makeParameter } from '../../src/core/parameter';
import type { RegressionModel } from '../../src/estimation/model';
import { latinHypercube, multistartFit } from '../../src/estimation/multistart';
import { mulberry32 } from '../../src/estimation/random';

describe('seeded generator', () => {
  it('mulberry32 is reproducible, uniform in [0, 1) and gives unit-variance normals', () => {
    const a = mulberry32(123);
    const b = mulberry32(123);
    const xs = Array.from({ length: 20000 }, () => a.next());
    expect(xs.slice(0, 5)).toEqual(Array.from({ length: 5 }, () => b.next()));
    expect(Math.min(...xs)).toBeGreaterThanOrEqual(0);
    expect(Math.max(...xs)).toBeLessThan(1);
    // Source: common practice, no source (mean 1/2, sample noise ~ 0.002).
    expect(xs.reduce((s, x) => s + x, 0) / xs.length).toBeCloseTo(0.5, 2);
    const g = mulberry32(5);
    const zs = Array.from({ length: 20000 }, () => g.normal());
    const m = zs.reduce((s, z) => s + z, 0) / zs.length;
    const v = zs.reduce((s, z) => s + (z - m) ** 2, 0) / (zs.length - 1);
    expect(Math.abs(m)).toBeLessThan(0.03);
    expect(Math.abs(v - 1)).toBeLessThan(0.04);
  });

  it('a Latin hypercube puts exactly one point in each stratum of each coordinate', () => {
    const pts = latinHypercube([0, -5], [1, 5], 10, 9);
    for (let j = 0; j < 2; j++) {
      const lo = [0, -5][j];
      const w = [1, 10][j] / 10;
      const strata = pts.map((p) => Math.floor((p[j] - lo) / w)).sort((x, y) => x - y);
      expect(strata).toEqual([0, 1, 2, 3, 4, 5, 6, 7, 8, 9]);
    }
  });
});

describe('multistartFit', () => {
  // y = sin(w t) sampled sparsely: SSR in w has many local minima.
  const ts = Array.from({ length: 25 }, (_, i) => i * 0.4);
  const model: RegressionModel = {
    nObservations: ts.length,
    parameterNames: ['amp', 'w'],
    predict(theta, out) {
      for (let i = 0; i < ts.length; i++) out[i] = theta[0] * Math.sin(theta[1] * ts[i]);
      return true;
    },
  };
  const rng = mulberry32(3);
  const y = Float64Array.from(ts, (t) => 2 * Math.sin(1.7 * t) + 0.05 * rng.normal());
  const data = { measured: y, sigma: new Float64Array(ts.length).fill(1), sigmaKnown: false };
  const params = [
    makeParameter({ name: 'amp', value: 1, lower: 0.1, upper: 5 }),
    makeParameter({ name: 'w', value: 0.5, lower: 0.2, upper: 3 }),
  ];

  it('finds the global minimum that a single start misses and lists distinct minima, best first', () => {
    const calls: number[] = [];
    const res = multistartFit(model, params, data, { starts: 24, seed: 11, profile: false, progress: (d) => calls.push(d) });
    expect(calls).toHaveLength(25);
    expect(calls[24]).toBe(25);
    expect(res.success).toBe(true);
    const w = res.best.parameters[1].value;
    expect(w).toBeCloseTo(1.7, 2);
    expect(res.minima.length).toBeGreaterThan(1);
    for (let i = 1; i < res.minima.length; i++) expect(res.minima[i].ssr).toBeGreaterThan(res.minima[i - 1].ssr);
    // The given start (index 0) ends in a worse local minimum.
    expect(res.minima[0].startIndices).not.toContain(0);
    expect(res.warnings.map((x) => x.code)).toContain('multiple-minima');
    // Same seed, same design.
    const again = multistartFit(model, params, data, { starts: 24, seed: 11, profile: false });
    expect(again.design).toEqual(res.design);
  });
});
