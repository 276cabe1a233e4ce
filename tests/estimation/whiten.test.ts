/**
 * Block-correlated errors (src/estimation/whiten.ts): the Cholesky factor and its inverse, and a
 * straight-line fit with block-correlated errors against generalised least squares computed by
 * SciPy (tests/reference/scipy/gls_blocks.py, scipy.linalg.inv on the full covariance, GLS normal
 * equations of Aitken 1935; output gls_blocks.json).
 */
import { describe, expect, it } from 'vitest';
import { makeParameter } from '../../src/core/parameter';
import { fitModel } from '../../src/estimation/fit';
import type { RegressionModel } from '../../src/estimation/model';
import { applyWhitening, unwhiten, whitenBlock } from '../../src/estimation/whiten';
import ref from '../reference/scipy/gls_blocks.json' with { type: 'json' };

const line = (xs: number[], exact: boolean): RegressionModel => ({
  nObservations: xs.length,
  parameterNames: ['a', 'b'],
  predict(theta, out) {
    for (let i = 0; i < xs.length; i++) out[i] = theta[0] + theta[1] * xs[i];
    return true;
  },
  ...(exact
    ? {
        jacobian(theta: Float64Array, pred: Float64Array, J: Float64Array) {
          for (let i = 0; i < xs.length; i++) {
            pred[i] = theta[0] + theta[1] * xs[i];
            J[2 * i] = 1;
            J[2 * i + 1] = xs[i];
          }
          return true;
        },
      }
    : {}),
});

const blocks = () => ref.blocks.map((b) => whitenBlock(b.index, Float64Array.from(b.R.flat()))!);

describe('whitening blocks', () => {
  it('L L\' = R, L^-1 L = I, and unwhiten undoes applyWhitening (analytic identities)', () => {
    const R = ref.blocks[0].R;
    const b = whitenBlock([0, 1, 2], Float64Array.from(R.flat()))!;
    for (let i = 0; i < 3; i++) {
      for (let j = 0; j < 3; j++) {
        let llt = 0;
        let id = 0;
        for (let q = 0; q < 3; q++) {
          llt += b.factor[i * 3 + q] * b.factor[j * 3 + q];
          id += b.inverse[i * 3 + q] * b.factor[q * 3 + j];
        }
        expect(llt).toBeCloseTo(R[i][j], 14);
        expect(id).toBeCloseTo(i === j ? 1 : 0, 14);
      }
    }
    const v = Float64Array.from([0.3, -1.2, 2.5, 7, 0.1, -0.4, 9]);
    const w = Float64Array.from(v);
    applyWhitening(blocks(), w);
    expect(w[3]).toBe(7); // outside every block: unchanged
    expect(w[6]).toBe(9);
    unwhiten(blocks(), w);
    for (let i = 0; i < v.length; i++) expect(w[i]).toBeCloseTo(v[i], 13);
  });
  it('a singular correlation matrix gives no block (the same measurement twice)', () => {
    expect(whitenBlock([0, 1], Float64Array.from([1, 1, 1, 1]))).toBeUndefined();
  });
});

describe('least squares with block-correlated errors', () => {
  for (const exact of [true, false]) {
    it(`matches SciPy's generalised least squares (${exact ? 'exact' : 'finite-difference'} Jacobian)`, () => {
      const fit = fitModel(
        line(ref.x, exact),
        [makeParameter({ name: 'a', value: 0 }), makeParameter({ name: 'b', value: 1 })],
        { measured: Float64Array.from(ref.y), sigma: Float64Array.from(ref.sigma), sigmaKnown: true, whiten: blocks() },
        { profile: false },
      );
      expect(fit.verdict.trustworthy).toBe(true);
      // SciPy gls_blocks.json: beta, covariance (X'S^-1X)^-1 and the GLS sum of squares.
      expect(fit.parameters[0].value).toBeCloseTo(ref.beta[0], 8);
      expect(fit.parameters[1].value).toBeCloseTo(ref.beta[1], 8);
      const digits = exact ? 7 : 5; // forward differences carry about sqrt(eps) relative error
      expect(fit.parameters[0].stdError! / Math.sqrt(ref.covariance[0][0])).toBeCloseTo(1, digits);
      expect(fit.parameters[1].stdError! / Math.sqrt(ref.covariance[1][1])).toBeCloseTo(1, digits);
      expect(fit.covariance.internal![0][1] / ref.covariance[0][1]).toBeCloseTo(1, digits);
      expect(fit.statistics.ssr / ref.gls_ssr).toBeCloseTo(1, 8);
    });
  }
  it('ignoring the correlation gives a different answer (the check can fail)', () => {
    const fit = fitModel(line(ref.x, true), [makeParameter({ name: 'a', value: 0 }), makeParameter({ name: 'b', value: 1 })], { measured: Float64Array.from(ref.y), sigma: Float64Array.from(ref.sigma), sigmaKnown: true }, { profile: false });
    expect(Math.abs(fit.parameters[1].value - ref.beta[1])).toBeGreaterThan(1e-4);
  });
});
