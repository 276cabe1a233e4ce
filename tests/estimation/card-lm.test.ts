/**
 * How the card package ml-levenberg-marquardt uses `weights`, proven on a weighted straight line
 * whose weighted least-squares solutions are known in closed form, and the wrapper's behaviour.
 */
import { levenbergMarquardt as cardLm } from 'ml-levenberg-marquardt';
import { describe, expect, it } from 'vitest';
import { cardLevenbergMarquardt } from '../../src/estimation/card-lm';
import { ResidualProblem } from '../../src/estimation/residuals';

const x = [0, 1, 2, 3, 4, 5, 6, 7];
const y = [1.1, 2.9, 5.3, 6.8, 9.4, 10.7, 13.5, 14.6];
const w = [1, 4, 0.5, 2, 1, 8, 0.25, 3];

/** Closed-form weighted straight line: minimise sum W_i (y_i - a - b x_i)^2 (normal equations). */
function weightedLine(W: number[]): [number, number] {
  let S = 0, Sx = 0, Sy = 0, Sxx = 0, Sxy = 0;
  for (let i = 0; i < x.length; i++) {
    S += W[i]; Sx += W[i] * x[i]; Sy += W[i] * y[i]; Sxx += W[i] * x[i] ** 2; Sxy += W[i] * x[i] * y[i];
  }
  const det = S * Sxx - Sx * Sx;
  return [(Sxx * Sy - Sx * Sxy) / det, (S * Sxy - Sx * Sy) / det];
}

const line = ([a, b]: number[]) => (t: number) => a + b * t;

describe('ml-levenberg-marquardt weights', () => {
  const multiply = weightedLine(w.map((v) => v * v)); // w multiplies the residual: sum (w r)^2
  const divide = weightedLine(w.map((v) => 1 / (v * v))); // w acts as sigma: sum (r / w)^2
  const objective = (p: number[], W: number[]) => x.reduce((s, t, i) => s + W[i] * (y[i] - p[0] - p[1] * t) ** 2, 0);

  it('its reported error is sum (w_i r_i)^2: weights multiply the residuals there', () => {
    const out = cardLm({ x, y }, line, { initialValues: [1, 2], weights: w, maxIterations: 0 });
    // Source: analytic; with zero iterations the package reports the error at the start.
    expect(out.parameterError).toBeCloseTo(objective([1, 2], w.map((v) => v * v)), 10);
  });

  it('its iterations settle on the w^2-weighted solution: weights multiply the residuals (w = 1/sigma)', () => {
    const out = cardLm({ x, y }, line, {
      initialValues: [1, 2],
      weights: w,
      maxIterations: 1000,
      errorTolerance: 1e-14,
      jacobianFunction: () => (t: number) => [1, t],
    });
    const [a, b] = out.parameterValues;
    // Source: closed-form weighted least squares (normal equations) with W_i = w_i^2 and W_i = 1/w_i^2.
    expect(Math.abs(a - multiply[0]) + Math.abs(b - multiply[1])).toBeLessThan(1e-6);
    expect(Math.abs(a - divide[0]) + Math.abs(b - divide[1])).toBeGreaterThan(0.1);
  });

  it('but its step uses 1/w^2 in J\'WJ and w^2 in J\'Wr, so one undamped step is not the Gauss-Newton step', () => {
    const out = cardLm({ x, y }, line, {
      initialValues: [0, 0],
      weights: w,
      damping: 1e-12,
      maxIterations: 1,
      jacobianFunction: () => (t: number) => [1, t],
    });
    // The package returns the best point it saw; after one step from (0, 0) it has moved, but not to
    // the w^2 solution that a true Gauss-Newton step reaches exactly on a linear model.
    const [a, b] = out.parameterValues;
    // Source: closed form of its step, (A' diag(1/w^2) A)^-1 A' diag(w^2) y from theta = 0.
    let S = 0, Sx = 0, Sxx = 0, Ty = 0, Txy = 0;
    for (let i = 0; i < x.length; i++) {
      const h = 1 / w[i] ** 2;
      const g = w[i] ** 2;
      S += h; Sx += h * x[i]; Sxx += h * x[i] ** 2; Ty += g * y[i]; Txy += g * x[i] * y[i];
    }
    const det = S * Sxx - Sx * Sx;
    const stepA = (Sxx * Ty - Sx * Txy) / det;
    const stepB = (S * Txy - Sx * Ty) / det;
    const errAt = (p: number[]) => objective(p, w.map((v) => v * v));
    if (errAt([stepA, stepB]) < errAt([0, 0])) {
      expect(a).toBeCloseTo(stepA, 6);
      expect(b).toBeCloseTo(stepB, 6);
    } else {
      expect([a, b]).toEqual([0, 0]);
    }
    expect(Math.abs(stepA - multiply[0]) + Math.abs(stepB - multiply[1])).toBeGreaterThan(1);
  });

  it('the wrapper feeds pre-weighted residuals and reaches the 1/sigma^2 solution with sigma = w', () => {
    const model = {
      nObservations: x.length,
      parameterNames: ['a', 'b'],
      predict(theta: Float64Array, out: Float64Array) {
        for (let i = 0; i < x.length; i++) out[i] = theta[0] + theta[1] * x[i];
        return true;
      },
    };
    const problem = new ResidualProblem({
      model,
      measured: Float64Array.from(y),
      sigma: Float64Array.from(w),
      thetaFull: new Float64Array(2),
      freeIndex: [0, 1],
    });
    const res = cardLevenbergMarquardt(problem, new Float64Array([0, 0]), { maxIterations: 100, gtol: 1e-8 });
    // Source: closed-form weighted least squares with W_i = 1/sigma_i^2.
    expect(res.x[0]).toBeCloseTo(divide[0], 7);
    expect(res.x[1]).toBeCloseTo(divide[1], 7);
    expect(res.ssr).toBeCloseTo(objective(divide, w.map((v) => 1 / (v * v))), 9);
    expect(res.success).toBe(true);
    expect(res.status).toMatch(/^converged/);
  });
});
