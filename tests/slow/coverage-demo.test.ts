/**
 * Coverage of the 95 % linear intervals on the demo pilot packed bed (datasets-demo/pbr: gas
 * C2H4 + H2O <=> EtOH with 2 EtOH -> DEE + H2O, pressure drop, 50 runs with four outlet flows each,
 * six parameters: k1, E1, K1, dH1, k2, E2). 200 replicate data sets are simulated from the true
 * values recorded in datasets-demo/truth.json with the recorded noise (sigma^2 = a^2 + (r y_true)^2)
 * and fitted in process from the study's own starting values, as a user's fit would start. For
 * every parameter the linear interval must cover the truth in 92-98 % of the replicates (binomial
 * standard error at 95 % over 200 is 1.5 %); the verdict must call at least 98 % trustworthy (the
 * misfit rule rejects at p < 0.001) and the influence warning fire on at most 5 %.
 *
 * Profile intervals are checked for coverage on the fixture bed (coverage.test.ts); on this
 * six-parameter study a profile costs about 10 fits per parameter, which would take the slow suite
 * far beyond its budget. On the demo fit the two kinds of interval agree to 3 digits (rateloom fit
 * datasets-demo/pbr/pbr.study.json).
 *
 * Source: the coverage property (a 95 % interval covers the truth in 95 % of repeated experiments)
 * is the definition of a confidence interval; the simulation is the check, common practice.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { readTruth } from '../../datasets-demo/generate';
import { fitModel } from '../../src/estimation/fit';
import { mulberry32 } from '../../src/estimation/random';
import { loadStudy } from '../../src/study';
import { compoundToSI } from '../../src/units';
import { sigmaFromModel } from '../../src/study/types';
import { noiseSigma, truePredictions } from './true-predictions';

const STUDY = join(import.meta.dirname, '..', '..', 'datasets-demo', 'pbr', 'pbr.study.json');
const REPLICATES = 200;
const SEED = 20261206;

describe('interval coverage on the six-parameter demo packed bed', () => {
  it(`95% linear intervals cover the truth in 92-98% of ${REPLICATES} replicates for every parameter`, () => {
    const t0 = Date.now();
    const { study } = loadStudy(readFileSync(STUDY, 'utf8'), STUDY, (p) => readFileSync(p, 'utf8'));
    const truth = readTruth().pbr;
    const TRUTH = Object.fromEntries(Object.entries(truth.parameters).map(([n, q]) => [n, compoundToSI(q.value, q.unit).value]));
    const { model, params, truePred } = truePredictions(study, TRUTH);
    const abs = compoundToSI(truth.noise.absolute.value, truth.noise.absolute.unit).value;
    const sigmaTrue = noiseSigma(truePred, abs, truth.noise.relative);
    const em = study.errorModels.gc;
    const rng = mulberry32(SEED);
    const names = Object.keys(TRUTH);
    const covered = Object.fromEntries(names.map((n) => [n, 0]));
    let trustworthy = 0;
    let influenceWarned = 0;
    for (let rep = 0; rep < REPLICATES; rep++) {
      const measured = Float64Array.from(truePred, (y, i) => y + sigmaTrue[i] * rng.normal());
      // sigma from the study's error model on the measured value, as the study fit does (fit-data.ts)
      const sigma = Float64Array.from(measured, (y) => sigmaFromModel(em, y)!);
      const fit = fitModel(model, params, { measured, sigma, sigmaKnown: true }, { profile: false });
      if (fit.verdict.trustworthy) trustworthy++;
      if (fit.warnings.some((w) => w.code === 'influential-observations')) influenceWarned++;
      for (const p of fit.parameters) {
        const v = TRUTH[p.name];
        const lin = p.ci.linear;
        if (v !== undefined && lin && lin[0] <= v && v <= lin[1]) covered[p.name]++;
      }
    }
    const seconds = (Date.now() - t0) / 1000;
    console.log(`demo coverage: ${REPLICATES} replicates in ${seconds.toFixed(1)} s; trustworthy ${trustworthy}; influence warnings ${influenceWarned}; covered ${JSON.stringify(covered)}`);
    for (const n of names) {
      expect(covered[n] / REPLICATES, n).toBeGreaterThanOrEqual(0.92);
      expect(covered[n] / REPLICATES, n).toBeLessThanOrEqual(0.98);
    }
    expect(trustworthy / REPLICATES).toBeGreaterThanOrEqual(0.98);
    expect(influenceWarned / REPLICATES).toBeLessThanOrEqual(0.05);
  });
});
