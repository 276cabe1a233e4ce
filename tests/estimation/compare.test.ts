import { describe, expect, it } from 'vitest';
import { makeParameter } from '../../src/core/parameter';
import { compareModels } from '../../src/estimation/compare';
import { fSurvival } from '../../src/estimation/distributions';
import { fitModel } from '../../src/estimation/fit';
import type { RegressionModel } from '../../src/estimation/model';
import { mulberry32 } from '../../src/estimation/random';

/** Polynomial of degree d in x: theta = (c0..cd). */
function poly(xs: number[], d: number): RegressionModel {
  return {
    nObservations: xs.length,
    parameterNames: Array.from({ length: d + 1 }, (_, i) => `c${i}`),
    predict(theta, out) {
      for (let i = 0; i < xs.length; i++) {
        let s = 0;
        for (let k = d; k >= 0; k--) s = s * xs[i] + theta[k];
        out[i] = s;
      }
      return true;
    },
  };
}

const xs = Array.from({ length: 20 }, (_, i) => i / 2);
const rng = mulberry32(2024);
const y = Float64Array.from(xs, (x) => 1 + 0.8 * x + 0.15 * x * x + 0.2 * rng.normal());
const data = { measured: y, sigma: new Float64Array(xs.length).fill(1), sigmaKnown: false };
const fitPoly = (d: number) =>
  fitModel(poly(xs, d), Array.from({ length: d + 1 }, (_, i) => makeParameter({ name: `c${i}`, value: 0.1 })), data, { profile: false });

describe('compareModels', () => {
  const line = fitPoly(1);
  const quad = fitPoly(2);
  const cubic = fitPoly(3);

  it('ranks by AICc, weights sum to 1, and the F test for nested pairs matches the formula', () => {
    const c = compareModels(
      [
        { name: 'line', fit: line },
        { name: 'quadratic', fit: quad },
        { name: 'cubic', fit: cubic },
      ],
      { nested: [['line', 'quadratic'], ['quadratic', 'cubic']] },
    );
    expect(c.criterion).toBe('aicc');
    expect(c.ranking[0].name).toBe('quadratic');
    expect(c.ranking.reduce((s, m) => s + (m.akaikeWeight ?? 0), 0)).toBeCloseTo(1, 12);
    const lineRow = c.ranking.find((m) => m.name === 'line')!;
    expect(lineRow.delta!).toBeGreaterThan(10);
    const t1 = c.nestedTests[0];
    // Source: analytic extra-sum-of-squares F statistic (Bates & Watts 1988, 3.10).
    const F = (line.statistics.ssr - quad.statistics.ssr) / 1 / (quad.statistics.ssr / 17);
    expect(t1.statistic).toBeCloseTo(F, 10);
    expect(t1.pValue).toBeCloseTo(fSurvival(F, 1, 17), 14);
    expect(t1.largerSignificantlyBetter).toBe(true);
    expect(c.nestedTests[1].largerSignificantlyBetter).toBe(false);
    expect(c.verdict).toMatch(/quadratic/);
    expect(c.verdict).toMatch(/cubic does not fit significantly better than the nested quadratic/);
  });

  it('says when the data cannot tell two models apart (delta AICc < 2)', () => {
    const c = compareModels([
      { name: 'quadratic', fit: quad },
      { name: 'quadratic-copy', fit: quad },
    ]);
    expect(c.indistinguishable).toEqual(['quadratic', 'quadratic-copy']);
    expect(c.verdict).toMatch(/cannot tell apart/);
  });

  it('refuses rivals fitted to different data', () => {
    const other = fitModel(poly(xs.slice(0, 10), 1), [makeParameter({ name: 'c0', value: 0 }), makeParameter({ name: 'c1', value: 0 })], {
      measured: y.slice(0, 10),
      sigma: new Float64Array(10).fill(1),
      sigmaKnown: false,
    }, { profile: false });
    expect(() => compareModels([{ name: 'a', fit: line }, { name: 'b', fit: other }])).toThrow(/share the data/);
  });
});
