/**
 * Regression tests for fits that used to be reported as fine (issue "Honest verdicts"): each must
 * now end with a verdict that says why it cannot be trusted, or with the right answer.
 */
import { describe, expect, it } from 'vitest';
import { makeParameter } from '../../src/core/parameter';
import { fitModel } from '../../src/estimation/fit';
import type { RegressionModel } from '../../src/estimation/model';
import { multistartFit } from '../../src/estimation/multistart';
import { mulberry32 } from '../../src/estimation/random';
import { readNist } from '../reference/nist-strd-data';

const boxBod = readNist('BoxBOD');
const boxModel: RegressionModel = {
  nObservations: boxBod.x.length,
  parameterNames: ['b1', 'b2'],
  predict(b, out) {
    for (let i = 0; i < boxBod.x.length; i++) out[i] = b[0] * (1 - Math.exp(-b[1] * boxBod.x[i]));
    return true;
  },
};
const boxData = { measured: Float64Array.from(boxBod.y), sigma: new Float64Array(boxBod.y.length).fill(1), sigmaKnown: false };
const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

describe('multistart on a certified set (NIST StRD BoxBOD, --starts 20)', () => {
  for (const s of [0, 1]) {
    it(`start ${s + 1}: the certified optimum with exit 0, the given start listed, degenerate ends never chosen`, () => {
      const params = boxBod.starts[s].map((v, i) => makeParameter({ name: `b${i + 1}`, value: v }));
      const ms = multistartFit(boxModel, params, boxData, { starts: 20, seed: 1, profile: false });
      // Every start is listed with its end point, SSR and status; start 0 is the user's own.
      expect(ms.runs).toHaveLength(21);
      expect(ms.runs[0].start.map((p) => p.value)).toEqual(boxBod.starts[s]);
      for (const r of ms.runs) expect(r.end).toHaveLength(2);
      const best = ms.best;
      if (best.verdict.trustworthy) {
        // Source: NIST StRD BoxBOD certified values (estimates to 6 significant digits, RSS).
        best.parameters.forEach((p, i) => expect(rel(p.value, boxBod.certified[i])).toBeLessThan(5e-6));
        expect(rel(best.statistics.ssr, boxBod.rss)).toBeLessThan(1e-6);
      } else {
        expect(best.status).not.toMatch(/^converged/);
      }
      // No chosen end is degenerate: the model is not identically zero and the SSR is below the
      // sum of the squared data.
      const sumSq = boxBod.y.reduce((a, y) => a + y * y, 0);
      expect(best.statistics.ssr).toBeLessThan(sumSq);
      for (const r of ms.runs.filter((x) => x.status === 'degenerate' || x.status === 'singular')) expect(r.candidate).toBe(false);
    });
  }
});

describe('fits that must not be trusted', () => {
  it('pure noise (outlet = inlet + noise, the rate law has nothing to fit) with no error model is never trustworthy', () => {
    // An isothermal-bed style model F = F0 exp(-k' W) with k' = k exp(-E/R (1/T - 1/T_ref)); the
    // "measured" outlet flows are the inlet flows plus noise, so the data do not depend on k or E.
    const n = 20;
    const W = Array.from({ length: n }, (_, i) => 0.5 + (i % 5) * 0.5);
    const T = Array.from({ length: n }, (_, i) => 450 + 10 * Math.floor(i / 5));
    const F0 = Array.from({ length: n }, (_, i) => 2 + 0.1 * (i % 3));
    const model: RegressionModel = {
      nObservations: n,
      parameterNames: ['k', 'E'],
      predict(t, out) {
        const k = Math.exp(t[0]);
        for (let i = 0; i < n; i++) out[i] = F0[i] * Math.exp(-k * Math.exp((-t[1] / 8.314) * (1 / T[i] - 1 / 470)) * W[i]);
        return true;
      },
    };
    for (let seed = 1; seed <= 10; seed++) {
      const rng = mulberry32(seed);
      const y = Float64Array.from(F0, (f) => f + 0.01 * rng.normal());
      const fit = fitModel(model, [makeParameter({ name: 'k', value: 0.1, transform: 'log' }), makeParameter({ name: 'E', value: 50000 })], { measured: y, sigma: new Float64Array(n).fill(1), sigmaKnown: false });
      expect(fit.verdict.trustworthy, `seed ${seed}: ${fit.message}`).toBe(false);
      expect(fit.success).toBe(false);
    }
  });

  it('a start on a plateau (rate constant 1e12, the model flat in it) is not trustworthy', () => {
    // The model is exactly flat in k beyond k = 50 (a saturated exponential written with a cut-off,
    // as a stiff kinetic model behaves when its rate constant is enormous): from k = 1e12 every
    // trial step leaves the sum of squares unchanged, so only the step-size test can end the search.
    const ts = [0.5, 1, 2, 4, 8];
    const y = Float64Array.from(ts, (t) => 2 * (1 - Math.exp(-0.4 * t)) + 0.01 * Math.sin(7 * t));
    const model: RegressionModel = {
      nObservations: ts.length,
      parameterNames: ['A', 'k'],
      predict(t, out) {
        const k = Math.exp(t[1]);
        for (let i = 0; i < ts.length; i++) out[i] = t[0] * (k * ts[i] > 50 ? 1 : 1 - Math.exp(-k * ts[i]));
        return true;
      },
    };
    const fit = fitModel(model, [makeParameter({ name: 'A', value: 2 }), makeParameter({ name: 'k', value: 1e12, transform: 'log' })], { measured: y, sigma: new Float64Array(ts.length).fill(0.01), sigmaKnown: true }, { profile: false });
    expect(fit.verdict.trustworthy).toBe(false);
    expect(fit.status).not.toMatch(/^converged/);
  });
});
