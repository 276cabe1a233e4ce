import { describe, expect, it } from 'vitest';
import { makeParameter } from '../../src/core/parameter';
import { chiSquareQuantile, fQuantile } from '../../src/estimation/distributions';
import { fitModel } from '../../src/estimation/fit';
import type { RegressionModel } from '../../src/estimation/model';
import { PROFILE_REFIT_FTOL, profileParameter } from '../../src/estimation/profile';
import { prepareFit } from '../../src/estimation/solve';

const xs = [1, 2, 3, 5, 7, 10];
const y = Float64Array.from([120, 160, 178, 172, 190, 181]);
// Invented saturation data (about a = 180, b = 1 plus noise; early saturation makes b poorly determined); y = a (1 - exp(-b x)).
const model: RegressionModel = {
  nObservations: xs.length,
  parameterNames: ['a', 'b'],
  predict(theta, out) {
    for (let i = 0; i < xs.length; i++) out[i] = theta[0] * (1 - Math.exp(-theta[1] * xs[i]));
    return true;
  },
};

function ssrWithFixed(name: 'a' | 'b', value: number, start: { a: number; b: number }, sigmaKnown: boolean, sigma: number) {
  const fit = fitModel(
    model,
    [
      makeParameter({ name: 'a', value: name === 'a' ? value : start.a, fixed: name === 'a' }),
      makeParameter({ name: 'b', value: name === 'b' ? value : start.b, fixed: name === 'b' }),
    ],
    { measured: y, sigma: new Float64Array(6).fill(sigma), sigmaKnown },
    { profile: false },
  );
  return fit.statistics.ssr;
}

describe('profile-likelihood intervals', () => {
  it('sigma estimated: the refitted SSR at each end equals SSR_min (1 + F(1, n-p)/(n-p))', () => {
    const fit = fitModel(model, [makeParameter({ name: 'a', value: 200 }), makeParameter({ name: 'b', value: 0.5 })], {
      measured: y,
      sigma: new Float64Array(6).fill(1),
      sigmaKnown: false,
    });
    expect(fit.success).toBe(true);
    const ssrMin = fit.statistics.ssr;
    // Source: Bates & Watts 1988, section 6.1 (F-based profile threshold).
    const threshold = ssrMin * (1 + fQuantile(0.95, 1, 4) / 4);
    const est = { a: fit.parameters[0].value, b: fit.parameters[1].value };
    for (const pr of fit.profiles) {
      expect(pr.threshold).toBeCloseTo(threshold, 8);
      const [lo, hi] = pr.interval;
      for (const end of [lo, hi]) {
        if (end === null) continue;
        expect(ssrWithFixed(pr.name as 'a' | 'b', end, est, false, 1) / threshold).toBeCloseTo(1, 6);
      }
      expect(pr.points.length).toBeGreaterThan(4);
    }
    // This curved problem: profile and linear intervals differ, and the fit says so.
    expect(fit.profiles.some((p) => p.disagreesWithLinear)).toBe(true);
    expect(fit.warnings.some((w) => w.code === 'profile-disagrees' || w.code === 'profile-open')).toBe(true);
  });

  it('sigma known: the threshold is SSR_min + chi2(1; 0.95)', () => {
    const sigma = 15;
    const fit = fitModel(model, [makeParameter({ name: 'a', value: 200 }), makeParameter({ name: 'b', value: 0.5 })], {
      measured: y,
      sigma: new Float64Array(6).fill(sigma),
      sigmaKnown: true,
    });
    // Source: Bates & Watts 1988, section 6.1, with known variance the chi-square(1) threshold.
    const threshold = fit.statistics.ssr + chiSquareQuantile(0.95, 1);
    const pr = fit.profiles.find((p) => p.name === 'a')!;
    expect(pr.threshold).toBeCloseTo(threshold, 10);
    const est = { a: fit.parameters[0].value, b: fit.parameters[1].value };
    if (pr.interval[0] !== null) expect(ssrWithFixed('a', pr.interval[0], est, true, sigma) / threshold).toBeCloseTo(1, 6);
  });
});

describe('open profile ends', () => {
  it('an end blocked by a bound is null with the reason, and the fit warns', () => {
    // Few, flat data: the lower profile end of b runs into its bound 0.9 (the unbounded profile end is about 0.84).
    const fit = fitModel(
      model,
      [makeParameter({ name: 'a', value: 180 }), makeParameter({ name: 'b', value: 1, lower: 0.9 })],
      { measured: Float64Array.from([120, 160, 178, 172, 190, 181]), sigma: new Float64Array(6).fill(1), sigmaKnown: false },
    );
    const pb = fit.profiles.find((p) => p.name === 'b')!;
    expect(pb.interval[0]).toBeNull();
    expect(pb.ends[0]).toBe('bound');
    expect(pb.ends[1]).toBe('crossed');
    expect(fit.warnings.find((w) => w.code === 'profile-open')?.message).toMatch(/bound/);
    expect(JSON.stringify(fit)).not.toMatch(/NaN/);
  });
});

describe('profile warm starts and refit tolerance', () => {
  it('the predicted warm starts and ftol 1e-8 refits give the intervals of cold ftol 1e-14 refits', () => {
    // The same profile computed two ways: as fitModel does (tangent from the covariance, secant
    // predictors, refits at PROFILE_REFIT_FTOL) and the plain way (each refit from the last solution
    // at ftol 1e-14). The ends must agree far below the 4 significant digits the reports show.
    const data = { measured: y, sigma: new Float64Array(6).fill(1), sigmaKnown: false };
    const fit = fitModel(model, [makeParameter({ name: 'a', value: 200 }), makeParameter({ name: 'b', value: 0.5 })], data);
    expect(fit.success).toBe(true);
    const prep = prepareFit(model, fit.parameters.map((p) => makeParameter({ name: p.name, value: p.value })), data);
    const cov = fit.covariance.internal!;
    for (const [k, pr] of fit.profiles.entries()) {
      const plain = profileParameter({ prep, thetaHat: prep.thetaFull, index: k, ssrMin: fit.statistics.ssr, internalStdError: Math.sqrt(cov[k][k]), linear: fit.parameters[k].ci.linear, refitFtol: 1e-14 });
      expect(pr.ends).toEqual(plain.ends);
      pr.interval.forEach((end, i) => {
        const ref = plain.interval[i];
        if (end === null || ref === null) return expect(end).toBe(ref);
        expect(Math.abs(end - ref) / Math.abs(ref)).toBeLessThan(1e-7);
      });
    }
    expect(PROFILE_REFIT_FTOL).toBe(1e-8);
  });
});
