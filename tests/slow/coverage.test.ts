/**
 * Coverage of the 95 % intervals on a packed-bed study with known truth: 200 replicate data sets
 * simulated from the fixture study's gas packed bed (A + H2 -> B, pressure drop, 7 runs with three
 * outlet flows each) at recorded true values, with Gaussian noise of the stated error model
 * (sigma = sqrt(a^2 + (r y_true)^2)). Each replicate is fitted in process (fitModel on the
 * StudyModel, profiles included). For every parameter, the linear and the profile-likelihood
 * intervals must cover the truth in 92-98 % of the replicates (binomial standard error at 95 % over
 * 200 is 1.5 %); the verdict must call almost every replicate trustworthy, and the influence
 * warning must fire on at most 5 % of them.
 *
 * Source: the coverage property itself (a 95 % interval covers the truth in 95 % of repeated
 * experiments) is the definition of a confidence interval; the simulation is the check, common
 * practice. Run time is logged (about a minute on the 2-core development machine).
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { fitModel } from '../../src/estimation/fit';
import { mulberry32 } from '../../src/estimation/random';
import { loadStudy } from '../../src/study';
import { noiseSigma, truePredictions } from './true-predictions';

const FIXTURES = join(import.meta.dirname, '..', 'data', 'fixtures');
const TRUTH: Record<string, number> = { k1: 2.2e-4, E1: 76000 };
const REPLICATES = 200;
const SEED = 20261205;

function packedBed() {
  const raw = JSON.parse(readFileSync(join(FIXTURES, 'study.json'), 'utf8'));
  raw.data = [raw.data[0]]; // the per-run outlet flows only
  const path = join(FIXTURES, 'study.json');
  return loadStudy(JSON.stringify(raw), path, (p) => readFileSync(p, 'utf8')).study;
}

describe('interval coverage over replicate packed-bed data sets', () => {
  it(`95% linear and profile intervals cover the truth in 92-98% of ${REPLICATES} replicates for every parameter`, () => {
    const t0 = Date.now();
    const study = packedBed();
    const { model, params, truePred } = truePredictions(study, TRUTH);
    const em = study.errorModels.flows;
    const sigma = noiseSigma(truePred, em.absolute, em.relative);
    const rng = mulberry32(SEED);
    const covered: Record<string, { linear: number; profile: number }> = { k1: { linear: 0, profile: 0 }, E1: { linear: 0, profile: 0 } };
    let trustworthy = 0;
    let influenceWarned = 0;
    for (let rep = 0; rep < REPLICATES; rep++) {
      const measured = Float64Array.from(truePred, (y, i) => y + sigma[i] * rng.normal());
      const fit = fitModel(model, params, { measured, sigma, sigmaKnown: true }, { profile: true });
      if (fit.verdict.trustworthy) trustworthy++;
      if (fit.warnings.some((w) => w.code === 'influential-observations')) influenceWarned++;
      for (const p of fit.parameters) {
        const v = TRUTH[p.name];
        if (v === undefined) continue;
        const lin = p.ci.linear;
        if (lin && lin[0] <= v && v <= lin[1]) covered[p.name].linear++;
        const pro = p.ci.profile;
        if (pro && (pro[0] === null || pro[0] <= v) && (pro[1] === null || v <= pro[1])) covered[p.name].profile++;
      }
    }
    const seconds = (Date.now() - t0) / 1000;
    console.log(`coverage study: ${REPLICATES} replicates in ${seconds.toFixed(1)} s; trustworthy ${trustworthy}; influence warnings ${influenceWarned}; covered ${JSON.stringify(covered)}`);
    for (const name of Object.keys(TRUTH)) {
      for (const kind of ['linear', 'profile'] as const) {
        const rate = covered[name][kind] / REPLICATES;
        expect(rate, `${name} ${kind}`).toBeGreaterThanOrEqual(0.92);
        expect(rate, `${name} ${kind}`).toBeLessThanOrEqual(0.98);
      }
    }
    // The misfit rule rejects at p < 0.001, so correct data are almost never called untrustworthy.
    expect(trustworthy / REPLICATES).toBeGreaterThanOrEqual(0.98);
    expect(influenceWarned / REPLICATES).toBeLessThanOrEqual(0.05);
  });
});
