import { describe, expect, it } from 'vitest';
import { makeParameter } from '../../src/core/parameter';
import { fitModel } from '../../src/estimation/fit';
import type { RegressionModel } from '../../src/estimation/model';
import { mulberry32 } from '../../src/estimation/random';
import { studentTQuantile } from '../../src/estimation/distributions';

/** y = A exp(-k t), theta = (A, ln k) with k log-transformed. */
function decayModel(ts: number[]): RegressionModel {
  return {
    nObservations: ts.length,
    parameterNames: ['A', 'k'],
    predict(theta, out) {
      const k = Math.exp(theta[1]);
      for (let i = 0; i < ts.length; i++) out[i] = theta[0] * Math.exp(-k * ts[i]);
      return true;
    },
  };
}

/** y = a + b x (linear in the parameters). */
function lineModel(xs: number[]): RegressionModel {
  return {
    nObservations: xs.length,
    parameterNames: ['a', 'b'],
    predict(theta, out) {
      for (let i = 0; i < xs.length; i++) out[i] = theta[0] + theta[1] * xs[i];
      return true;
    },
  };
}

const ones = (n: number) => new Float64Array(n).fill(1);

describe('fitModel', () => {
  it('95% linear intervals cover the true values in 92-98% of 400 simulated data sets', () => {
    // Source: common practice, no source (Monte-Carlo coverage of Wald intervals; the model is
    // mildly nonlinear with 14 well-spread points, so nominal coverage is expected).
    const ts = Array.from({ length: 14 }, (_, i) => i * 0.5);
    const model = decayModel(ts);
    const truth = { A: 10, k: 0.4 };
    const sd = 0.3;
    const rng = mulberry32(4242);
    const covered = { A: 0, k: 0 };
    const N = 400;
    let converged = 0;
    for (let rep = 0; rep < N; rep++) {
      const y = Float64Array.from(ts, (t) => truth.A * Math.exp(-truth.k * t) + sd * rng.normal());
      const fit = fitModel(
        model,
        [makeParameter({ name: 'A', value: 8 }), makeParameter({ name: 'k', value: 0.3, transform: 'log' })],
        { measured: y, sigma: ones(ts.length), sigmaKnown: false },
        { profile: false },
      );
      if (!fit.success) continue;
      converged++;
      const [A, k] = fit.parameters;
      if (A.ci.linear![0] <= truth.A && truth.A <= A.ci.linear![1]) covered.A++;
      if (k.ci.linear![0] <= truth.k && truth.k <= k.ci.linear![1]) covered.k++;
    }
    expect(converged).toBe(N);
    // Measured with seed 4242: A 380/400, k 376/400.
    expect(covered.A / N).toBeGreaterThanOrEqual(0.92);
    expect(covered.A / N).toBeLessThanOrEqual(0.98);
    expect(covered.k / N).toBeGreaterThanOrEqual(0.92);
    expect(covered.k / N).toBeLessThanOrEqual(0.98);
  });

  it('a non-identifiable product y = a b x is flagged, not reported with silent numbers', () => {
    const xs = [1, 2, 3, 4, 5, 6];
    const model: RegressionModel = {
      nObservations: xs.length,
      parameterNames: ['a', 'b'],
      predict(theta, out) {
        for (let i = 0; i < xs.length; i++) out[i] = theta[0] * theta[1] * xs[i];
        return true;
      },
    };
    const y = Float64Array.from([2.1, 3.9, 6.2, 7.9, 10.1, 11.8]);
    const fit = fitModel(model, [makeParameter({ name: 'a', value: 1 }), makeParameter({ name: 'b', value: 1.5 })], {
      measured: y,
      sigma: ones(6),
      sigmaKnown: false,
    });
    expect(fit.success).toBe(false);
    expect(fit.status).toBe('singular');
    const w = fit.warnings.find((x) => x.code === 'not-identifiable');
    expect(w?.message).toMatch(/a, b/);
    expect(fit.parameters.every((p) => p.stdError === null && p.ci.linear === null)).toBe(true);
    expect(fit.correlation.matrix).toBeNull();
    expect(JSON.stringify(fit)).not.toMatch(/NaN|null,null,null,null/);
  });

  it('a nearly non-identifiable pair is warned about: high correlation and ill-conditioning', () => {
    // y = a exp(-b x) observed only over a tiny x range: a and b are almost confounded.
    const xs = [0.0, 0.001, 0.002, 0.003, 0.004, 0.005];
    const model: RegressionModel = {
      nObservations: xs.length,
      parameterNames: ['a', 'b'],
      predict(theta, out) {
        for (let i = 0; i < xs.length; i++) out[i] = theta[0] * Math.exp(-theta[1] * (xs[i] + 10));
        return true;
      },
    };
    const rng = mulberry32(7);
    const y = Float64Array.from(xs, (x) => 5 * Math.exp(-0.1 * (x + 10)) + 0.001 * rng.normal());
    const fit = fitModel(model, [makeParameter({ name: 'a', value: 4 }), makeParameter({ name: 'b', value: 0.08 })], {
      measured: y,
      sigma: ones(6),
      sigmaKnown: false,
    }, { profile: false });
    const codes = fit.warnings.map((w) => w.code);
    expect(codes).toContain('high-correlation');
    expect(codes).toContain('ill-conditioned');
    expect(fit.warnings.find((w) => w.code === 'high-correlation')?.message).toMatch(/a and b/);
  });

  it('profile intervals of a linear model equal its linear intervals', () => {
    const xs = [0, 1, 2, 3, 4, 5, 6, 7, 8];
    const y = Float64Array.from([0.8, 3.1, 4.9, 7.2, 8.8, 11.3, 12.9, 15.2, 16.7]);
    const fit = fitModel(lineModel(xs), [makeParameter({ name: 'a', value: 0 }), makeParameter({ name: 'b', value: 1 })], {
      measured: y,
      sigma: ones(9),
      sigmaKnown: false,
    });
    expect(fit.success).toBe(true);
    for (const p of fit.parameters) {
      const [lo, hi] = p.ci.linear!;
      const [plo, phi] = p.ci.profile!;
      // Source: analytic; for a linear model SSR(theta_j) is exactly quadratic, so the F(1, n-p)
      // threshold gives theta_hat +- t(n-p) se (Bates & Watts 1988, section 6.1).
      expect(Math.abs(plo! - lo) / (hi - lo)).toBeLessThan(1e-6);
      expect(Math.abs(phi! - hi) / (hi - lo)).toBeLessThan(1e-6);
      // Linear interval is theta +- t se. Source: analytic.
      expect((hi - lo) / 2).toBeCloseTo(studentTQuantile(0.975, 7) * p.stdError!, 10);
    }
    expect(fit.profiles).toHaveLength(2);
    expect(fit.profiles.every((pr) => !pr.disagreesWithLinear && pr.points.length > 5)).toBe(true);
    expect(fit.profiles.every((pr) => pr.ends[0] === 'crossed' && pr.ends[1] === 'crossed')).toBe(true);
    expect(fit.warnings.map((w) => w.code)).not.toContain('profile-disagrees');
  });

  it('known sigma: covariance (J\'J)^-1 and normal-quantile intervals; straight line closed form', () => {
    const xs = [0, 1, 2, 3, 4];
    const y = Float64Array.from([1.0, 2.9, 5.2, 6.9, 9.1]);
    const sig = Float64Array.from([0.1, 0.2, 0.1, 0.3, 0.2]);
    const fit = fitModel(lineModel(xs), [makeParameter({ name: 'a', value: 0 }), makeParameter({ name: 'b', value: 0 })], {
      measured: y,
      sigma: sig,
      sigmaKnown: true,
    });
    // Source: analytic weighted least squares, Var(b) = S / (S Sxx - Sx^2) with weights 1/sigma^2.
    let S = 0, Sx = 0, Sxx = 0;
    xs.forEach((x, i) => {
      const w = 1 / sig[i] ** 2;
      S += w; Sx += w * x; Sxx += w * x * x;
    });
    const det = S * Sxx - Sx * Sx;
    expect(fit.parameters[1].stdError! / Math.sqrt(S / det)).toBeCloseTo(1, 7);
    expect(fit.parameters[0].stdError! / Math.sqrt(Sxx / det)).toBeCloseTo(1, 7);
    expect(fit.statistics.covarianceBasis).toBe('known-sigma');
    expect(fit.statistics.chiSquarePValue).not.toBeNull();
    const b = fit.parameters[1];
    // Source: standard normal 97.5% quantile 1.959963984540054 (value from memory).
    expect((b.ci.linear![1] - b.ci.linear![0]) / 2).toBeCloseTo(1.959963984540054 * b.stdError!, 8);
  });

  it('leverages sum to p, and replicate groups give a lack-of-fit test that detects curvature', () => {
    // Quadratic truth fitted by a straight line, with triplicates at each x.
    const xs = [0, 0, 0, 1, 1, 1, 2, 2, 2, 3, 3, 3, 4, 4, 4];
    const rng = mulberry32(99);
    const y = Float64Array.from(xs, (x) => 1 + 0.5 * x + 0.6 * x * x + 0.1 * rng.normal());
    const fit = fitModel(lineModel(xs), [makeParameter({ name: 'a', value: 0 }), makeParameter({ name: 'b', value: 1 })], {
      measured: y,
      sigma: ones(xs.length),
      sigmaKnown: false,
      groups: xs,
    }, { profile: false });
    const lof = fit.statistics.lackOfFit!;
    expect(lof.dofPure).toBe(10);
    expect(lof.dofLack).toBe(3);
    expect(lof.pureErrorSS + lof.lackSS).toBeCloseTo(fit.statistics.ssr, 10);
    expect(lof.pValue).toBeLessThan(1e-6);
    expect(fit.warnings.map((w) => w.code)).toContain('lack-of-fit');
    // Source: analytic, trace of the hat matrix equals p.
    expect(fit.observations.reduce((s, o) => s + o.leverage, 0)).toBeCloseTo(2, 10);
  });

  it('holds fixed parameters, returns new objects, flags an estimate on its bound', () => {
    const ts = [0, 1, 2, 3, 4, 5];
    const y = Float64Array.from(ts, (t) => 10 * Math.exp(-0.5 * t));
    const params = [
      makeParameter({ name: 'A', value: 10, fixed: true }),
      makeParameter({ name: 'k', value: 0.2, transform: 'log', upper: 0.3 }),
    ];
    const fit = fitModel(decayModel(ts), params, { measured: y, sigma: ones(6), sigmaKnown: false }, { profile: false });
    expect(fit.parameters[0].value).toBe(10);
    expect(fit.parameters[0].stdError).toBeNull();
    expect(fit.parameters[1].value).toBeCloseTo(0.3, 12);
    expect(fit.parameters[1].atBound).toBe(true);
    expect(fit.warnings.map((w) => w.code)).toContain('at-bound');
    expect(params[1].value).toBe(0.2);
    expect(fit.parameters[1]).not.toBe(params[1]);
  });

  it('a model that fails in part of the space: failed steps are rejected, fit still converges', () => {
    const ts = [0, 1, 2, 3, 4, 5, 6];
    const base = decayModel(ts);
    let failures = 0;
    const model: RegressionModel = {
      ...base,
      predict(theta, out, fails) {
        if (Math.exp(theta[1]) > 0.7) {
          failures++;
          fails?.push({ run: 'r1', message: 'integration failed' });
          return false;
        }
        return base.predict(theta, out);
      },
    };
    const y = Float64Array.from(ts, (t) => 10 * Math.exp(-0.6 * t));
    const fit = fitModel(model, [makeParameter({ name: 'A', value: 1 }), makeParameter({ name: 'k', value: 0.05, transform: 'log' })], {
      measured: y,
      sigma: ones(7),
      sigmaKnown: false,
    }, { profile: false });
    expect(fit.success, fit.message).toBe(true);
    expect(fit.parameters[1].value).toBeCloseTo(0.6, 8);
    expect(failures).toBeGreaterThan(0);
    expect(fit.warnings.map((w) => w.code)).toContain('model-failed-at-trial-points');
  });

  it('a model that fails at the start gives model-failure with the run named', () => {
    const model: RegressionModel = {
      nObservations: 3,
      parameterNames: ['a'],
      predict(_t, _o, fails) {
        fails?.push({ run: 'run-7', message: 'negative concentration' });
        return false;
      },
    };
    const fit = fitModel(model, [makeParameter({ name: 'a', value: 1 })], { measured: ones(3), sigma: ones(3), sigmaKnown: false });
    expect(fit.status).toBe('model-failure');
    expect(fit.success).toBe(false);
    expect(fit.message).toMatch(/run-7/);
  });

  it('bad input throws a RateloomError naming the field', () => {
    const model = lineModel([1, 2, 3]);
    const params = [makeParameter({ name: 'a', value: 0 }), makeParameter({ name: 'b', value: 0 })];
    expect(() => fitModel(model, params, { measured: ones(2), sigma: ones(3), sigmaKnown: false })).toThrow(/measured/);
    expect(() => fitModel(model, params, { measured: ones(3), sigma: Float64Array.from([1, 0, 1]), sigmaKnown: false })).toThrow(/sigma 1/);
    expect(() => fitModel(model, [params[0]], { measured: ones(3), sigma: ones(3), sigmaKnown: false })).toThrow(/'b'/);
    const extra = [...params, makeParameter({ name: 'c', value: 1 })];
    expect(() => fitModel(model, extra, { measured: ones(3), sigma: ones(3), sigmaKnown: false })).toThrow(/'c' is free but the model does not use it/);
    // A fixed parameter the model does not use is allowed (the model may hold it itself).
    const fixedExtra = [...params, makeParameter({ name: 'c', value: 1, fixed: true })];
    expect(fitModel(model, fixedExtra, { measured: ones(3), sigma: ones(3), sigmaKnown: false }, { profile: false }).parameters).toHaveLength(2);
  });
});
