/**
 * NIST StRD nonlinear regression: fitModel from both official starts must reproduce the certified
 * estimates to 6 significant digits and standard errors to 4, or report a non-converged status.
 * A wrong answer called converged fails the test.
 */
import { describe, expect, it } from 'vitest';
import { makeParameter } from '../../src/core/parameter';
import { fitModel } from '../../src/estimation/fit';
import { multistartFit } from '../../src/estimation/multistart';
import type { FitResult, SolverName } from '../../src/estimation/fit-types';
import { readNist, type NistDataset } from './nist-strd-data';
import { NIST_MODELS, nistModel } from './nist-strd-models';

const MODELS = NIST_MODELS;

function fitNist(d: NistDataset, start: number[], solver: SolverName) {
  const params = start.map((v, i) => makeParameter({ name: `b${i + 1}`, value: v }));
  return fitModel(
    nistModel(d, MODELS[d.name]),
    params,
    { measured: Float64Array.from(d.y), sigma: new Float64Array(d.y.length).fill(1), sigmaKnown: false },
    { solver, profile: false },
  );
}

const relErr = (a: number, b: number): number => Math.abs(a - b) / Math.abs(b);

/** True when every estimate matches NIST's certified value to 6 significant digits. */
const atCertified = (values: readonly number[], d: NistDataset): boolean => values.every((v, i) => relErr(v, d.certified[i]) < 5e-6);

/**
 * Floor on the right answers: of the 8 fits (4 datasets x 2 official starts), how many must end
 * trustworthy at the certified values. Measured: 7 of 8 for both solvers (BoxBOD from start 1 is
 * the one honest refusal), so a solver that failed on every first start could not pass.
 */
const SINGLE_FIT_FLOOR = 7;

/**
 * The right answer or an honest refusal: an untrustworthy verdict (success false, no converged
 * status), or the certified values with a trustworthy one. Never a wrong value called trustworthy.
 */
function expectCertifiedOrUntrusted(fit: FitResult, d: NistDataset): void {
  if (!fit.verdict.trustworthy) {
    expect(fit.success).toBe(false);
    expect(fit.status).not.toMatch(/^converged/);
    return;
  }
  fit.parameters.forEach((p, i) => {
    // Source: NIST StRD, <name>, certified values (estimates to 6 significant digits).
    expect(relErr(p.value, d.certified[i])).toBeLessThan(5e-6);
    // Source: NIST StRD, <name>, certified values (standard deviations to 4 significant digits).
    expect(relErr(p.stdError ?? NaN, d.certifiedStdDev[i])).toBeLessThan(5e-4);
  });
  // Source: NIST StRD, <name>, certified values (residual sum of squares, residual std dev).
  expect(relErr(fit.statistics.ssr, d.rss)).toBeLessThan(1e-6);
  expect(relErr(fit.statistics.residualStdDev ?? NaN, d.residualStdDev)).toBeLessThan(1e-6);
}

describe('NIST StRD nonlinear regression, own trust-region LM', () => {
  for (const name of Object.keys(MODELS)) {
    const d = readNist(name);
    d.starts.forEach((start, s) => {
      it(`${name} from start ${s + 1}`, () => {
        expectCertifiedOrUntrusted(fitNist(d, start, 'trust-region'), d);
      });
    });
  }

  it(`reaches the certified values, trustworthy, from at least ${SINGLE_FIT_FLOOR} of the 8 official starts`, () => {
    let reached = 0;
    for (const name of Object.keys(MODELS)) {
      const d = readNist(name);
      for (const start of d.starts) {
        const fit = fitNist(d, start, 'trust-region');
        // Source: NIST StRD, <name>, certified values.
        if (fit.verdict.trustworthy && atCertified(fit.parameters.map((p) => p.value), d)) reached++;
      }
    }
    expect(reached).toBeGreaterThanOrEqual(SINGLE_FIT_FLOOR);
  });

  it('converges from the start that lies near the solution on every dataset', () => {
    // Source: NIST StRD certified values; start 2 is the "closer" official start.
    for (const name of Object.keys(MODELS)) {
      const d = readNist(name);
      const fit = fitNist(d, d.starts[1], 'trust-region');
      expect(fit.success, `${name}: ${fit.message}`).toBe(true);
    }
  });
});

describe('NIST StRD nonlinear regression, card package ml-levenberg-marquardt (wrapped)', () => {
  for (const name of Object.keys(MODELS)) {
    const d = readNist(name);
    d.starts.forEach((start, s) => {
      it(`${name} from start ${s + 1}: right answer or honest non-convergence`, () => {
        const fit = fitNist(d, start, 'card');
        if (!fit.success) {
          expect(fit.status).not.toMatch(/^converged/);
          return;
        }
        fit.parameters.forEach((p, i) => {
          // Source: NIST StRD, <name>, certified values.
          expect(relErr(p.value, d.certified[i])).toBeLessThan(5e-6);
          // Source: NIST StRD, <name>, certified values.
          expect(relErr(p.stdError ?? NaN, d.certifiedStdDev[i])).toBeLessThan(5e-4);
        });
      });
    });
  }
});

describe('NIST StRD nonlinear regression, card package: floor on right answers', () => {
  it(`reaches the certified values from at least ${SINGLE_FIT_FLOOR} of the 8 official starts`, () => {
    let reached = 0;
    for (const name of Object.keys(MODELS)) {
      const d = readNist(name);
      for (const start of d.starts) {
        const fit = fitNist(d, start, 'card');
        // Source: NIST StRD, <name>, certified values.
        if (fit.success && atCertified(fit.parameters.map((p) => p.value), d)) reached++;
      }
    }
    expect(reached).toBeGreaterThanOrEqual(SINGLE_FIT_FLOOR);
  });
});

/**
 * Floor on the multistart: every one of the 8 multistarts must choose the certified minimum with a
 * trustworthy verdict, and at least MULTISTART_START_FLOOR of its 168 starts (8 x 21) must end at
 * the certified values. Measured with seed 1: 149 of 168 (every start on Misra1a, Chwirut2,
 * DanWood and on BoxBOD from start 2; 2 of 21 on BoxBOD from start 1).
 */
const MULTISTART_START_FLOOR = 140;

describe('NIST StRD nonlinear regression, multistart (--starts 20) from both official starts', () => {
  it(`every multistart picks the certified minimum, and at least ${MULTISTART_START_FLOOR} of 168 starts reach it`, () => {
    let reached = 0;
    for (const name of Object.keys(MODELS)) {
      const d = readNist(name);
      for (const start of d.starts) {
        const params = start.map((v, i) => makeParameter({ name: `b${i + 1}`, value: v }));
        const data = { measured: Float64Array.from(d.y), sigma: new Float64Array(d.y.length).fill(1), sigmaKnown: false };
        const ms = multistartFit(nistModel(d, MODELS[d.name]), params, data, { starts: 20, seed: 1, profile: false });
        // Source: NIST StRD, <name>, certified values.
        expect(ms.best.verdict.trustworthy, `${name}`).toBe(true);
        expect(atCertified(ms.best.parameters.map((p) => p.value), d), `${name}`).toBe(true);
        reached += ms.runs.filter((r) => atCertified(r.end.map((p) => p.value), d)).length;
      }
    }
    expect(reached).toBeGreaterThanOrEqual(MULTISTART_START_FLOOR);
  });

  for (const name of Object.keys(MODELS)) {
    const d = readNist(name);
    d.starts.forEach((start, s) => {
      it(`${name} from start ${s + 1}: the certified values with a trustworthy verdict, or an untrustworthy verdict`, () => {
        const params = start.map((v, i) => makeParameter({ name: `b${i + 1}`, value: v }));
        const data = { measured: Float64Array.from(d.y), sigma: new Float64Array(d.y.length).fill(1), sigmaKnown: false };
        const ms = multistartFit(nistModel(d, MODELS[d.name]), params, data, { starts: 20, seed: 1, profile: false });
        // The given start is start 0 and is listed with its end point.
        expect(ms.runs[0].start.map((p) => p.value)).toEqual(start);
        expectCertifiedOrUntrusted(ms.best, d);
      });
    });
  }
});
