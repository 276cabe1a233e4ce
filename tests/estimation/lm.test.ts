import { describe, expect, it } from 'vitest';
import { makeParameter } from '../../src/core/parameter';
import { fitModel } from '../../src/estimation/fit';
import { levenbergMarquardt } from '../../src/estimation/lm';
import type { RegressionModel } from '../../src/estimation/model';
import { ResidualProblem, type LeastSquaresProblem } from '../../src/estimation/residuals';

/** Rosenbrock as least squares: r = (10 (x2 - x1^2), 1 - x1). */
function rosenbrock(): LeastSquaresProblem & { evaluations: number } {
  const p = {
    m: 2,
    n: 2,
    evaluations: 0,
    residuals(x: Float64Array, out: Float64Array) {
      p.evaluations++;
      out[0] = 10 * (x[1] - x[0] * x[0]);
      out[1] = 1 - x[0];
      return true;
    },
    jacobian(x: Float64Array, _r: Float64Array, J: Float64Array) {
      J[0] = -20 * x[0];
      J[1] = 10;
      J[2] = -1;
      J[3] = 0;
      return true;
    },
  };
  return p;
}

describe('trust-region Levenberg-Marquardt', () => {
  it('solves Rosenbrock from (-1.2, 1)', () => {
    const res = levenbergMarquardt(rosenbrock(), new Float64Array([-1.2, 1]));
    expect(res.success).toBe(true);
    // Source: analytic minimum (1, 1) with zero residual.
    expect(res.x[0]).toBeCloseTo(1, 10);
    expect(res.x[1]).toBeCloseTo(1, 10);
    expect(res.ssr).toBeLessThan(1e-20);
  });

  it('respects bounds: with x1 <= 0.5 the minimum is (0.5, 0.25) on the bound', () => {
    const res = levenbergMarquardt(rosenbrock(), new Float64Array([-1.2, 1]), {
      lower: new Float64Array([-Infinity, -Infinity]),
      upper: new Float64Array([0.5, Infinity]),
    });
    expect(res.success).toBe(true);
    // Source: analytic; on x1 = 0.5 the best x2 is x1^2 and (1 - x1)^2 = 0.25 remains.
    expect(res.x[0]).toBe(0.5);
    expect(res.x[1]).toBeCloseTo(0.25, 10);
    expect(res.ssr).toBeCloseTo(0.25, 12);
    expect(res.atBound).toEqual([0]);
  });

  it('never calls an unfinished run converged: iteration and evaluation limits', () => {
    const a = levenbergMarquardt(rosenbrock(), new Float64Array([-1.2, 1]), { maxIterations: 3 });
    expect(a.status).toBe('max-iterations');
    expect(a.success).toBe(false);
    const b = levenbergMarquardt(rosenbrock(), new Float64Array([-1.2, 1]), { maxEvaluations: 5 });
    expect(b.status).toBe('max-evaluations');
    expect(b.success).toBe(false);
  });

  it('reports model-failure when every trial point near the estimate fails', () => {
    const base = rosenbrock();
    let calls = 0;
    const failing: LeastSquaresProblem = {
      m: 2,
      n: 2,
      get evaluations() {
        return calls;
      },
      residuals(x, out) {
        calls++;
        if (calls > 1) return false; // only the start can be evaluated
        return base.residuals(x, out);
      },
      jacobian: base.jacobian,
    };
    const res = levenbergMarquardt(failing, new Float64Array([-1.2, 1]));
    expect(res.status).toBe('model-failure');
    expect(res.success).toBe(false);
    expect(Array.from(res.x)).toEqual([-1.2, 1]);
  });

  it('a fit with every parameter fixed evaluates the model and reports no free parameters', () => {
    const model: RegressionModel = {
      nObservations: 3,
      parameterNames: ['a'],
      predict(theta, out) {
        out.fill(theta[0]);
        return true;
      },
    };
    const fit = fitModel(model, [makeParameter({ name: 'a', value: 2, fixed: true })], {
      measured: Float64Array.from([1, 2, 3]),
      sigma: Float64Array.from([1, 1, 1]),
      sigmaKnown: true,
    });
    expect(fit.statistics.p).toBe(0);
    expect(fit.statistics.ssr).toBeCloseTo(2, 14);
    expect(fit.parameters[0].stdError).toBeNull();
  });
});

describe('residuals', () => {
  const ts = [0.5, 1, 2, 4];
  const sigma = Float64Array.from([0.1, 0.2, 0.3, 0.4]);
  const measured = Float64Array.from([3, 2, 1, 0.5]);
  const model: RegressionModel = {
    nObservations: 4,
    parameterNames: ['A', 'k', 'c'],
    predict(theta, out) {
      for (let i = 0; i < 4; i++) out[i] = theta[0] * Math.exp(-theta[1] * ts[i]) + theta[2];
      return true;
    },
    jacobian(theta, pred, J) {
      for (let i = 0; i < 4; i++) {
        const e = Math.exp(-theta[1] * ts[i]);
        pred[i] = theta[0] * e + theta[2];
        J[i * 3] = e;
        J[i * 3 + 1] = -theta[0] * ts[i] * e;
        J[i * 3 + 2] = 1;
      }
      return true;
    },
  };
  const theta = Float64Array.from([4, 0.7, 0.1]);

  it('r = (measured - predicted)/sigma and J_res = -J_pred/sigma; finite differences agree', () => {
    const mk = (opts: object) =>
      new ResidualProblem({ model, measured, sigma, thetaFull: theta, freeIndex: [0, 1], ...opts });
    const exact = mk({});
    const r = new Float64Array(4);
    expect(exact.residuals(Float64Array.from([4, 0.7]), r)).toBe(true);
    for (let i = 0; i < 4; i++) {
      // Source: definition of the weighted residual.
      expect(r[i]).toBeCloseTo((measured[i] - (4 * Math.exp(-0.7 * ts[i]) + 0.1)) / sigma[i], 14);
    }
    const Je = new Float64Array(8);
    exact.jacobian(Float64Array.from([4, 0.7]), r, Je);
    // Source: analytic derivative of the residual.
    expect(Je[0]).toBeCloseTo(-Math.exp(-0.7 * 0.5) / 0.1, 12);
    for (const differences of ['forward', 'central'] as const) {
      const fd = mk({ forceFiniteDifferences: true, differences });
      const Jf = new Float64Array(8);
      fd.jacobian(Float64Array.from([4, 0.7]), r, Jf);
      const tol = differences === 'forward' ? 1e-6 : 1e-9;
      for (let k = 0; k < 8; k++) expect(Math.abs(Jf[k] - Je[k])).toBeLessThan(tol * Math.max(1, Math.abs(Je[k])));
    }
  });

  it('a finite-difference step that would leave a bound goes the other way', () => {
    const p = new ResidualProblem({
      model,
      measured,
      sigma,
      thetaFull: theta,
      freeIndex: [1],
      upper: Float64Array.from([0.7]),
      forceFiniteDifferences: true,
    });
    const seen: number[] = [];
    const spy: RegressionModel = { ...model, predict: (t, o) => (seen.push(t[1]), model.predict(t, o)) };
    const q = new ResidualProblem({ model: spy, measured, sigma, thetaFull: theta, freeIndex: [1], upper: Float64Array.from([0.7]), forceFiniteDifferences: true });
    const r = new Float64Array(4);
    q.residuals(Float64Array.from([0.7]), r);
    q.jacobian(Float64Array.from([0.7]), r, new Float64Array(4));
    expect(Math.max(...seen)).toBeLessThanOrEqual(0.7);
    expect(p.usesExactJacobian).toBe(false);
  });
});
