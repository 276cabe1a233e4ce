/**
 * Study-level regressions for the verdict (issue "Honest verdicts"), on the invented liquid batch
 * demo study (datasets-demo/batch, generated from datasets-demo/truth.json with a stated titration
 * error): a wild start, a wrong rate law with a stated error, and an error model whose size is only
 * relative.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { loadStudy } from '../../src/study';
import { fitStudy } from '../../src/workflow/fit-study';
import { fitReportData } from '../../src/workflow/fit-report-data';

const DIR = join(import.meta.dirname, '..', '..', 'datasets-demo', 'batch');
const PATH = join(DIR, 'batch.study.json');
const raw = () => JSON.parse(readFileSync(PATH, 'utf8'));
const load = (s: unknown) => loadStudy(JSON.stringify(s), PATH, (p) => readFileSync(p, 'utf8')).study;

describe('verdicts on a batch study', () => {
  it('an activation-energy start of 1e12 J/mol does not end "converged" (exit 1)', () => {
    const s = raw();
    const E = s.parameters.find((p: any) => p.name === 'EE');
    E.value = 1e9; // kJ/mol
    delete E.upper;
    const sf = fitStudy(load(s), { profile: false });
    expect(sf.fit.verdict.trustworthy).toBe(false);
    expect(sf.fit.status).not.toMatch(/^converged/);
    expect(['model-failure', 'no-search', 'degenerate', 'singular']).toContain(sf.fit.verdict.status);
  });

  it('an irreversible law fitted to reversible data with a stated error is a misfit naming runs and responses', () => {
    const s = raw();
    s.reactions[0].equation = 'AcOH + EtOH -> EtOAc + H2O';
    s.reactions[0].rate = { form: 'power-law', basis: 'volume', rateConstant: { k: 'kE', activationEnergy: 'EE' }, orders: { AcOH: 1, EtOH: 1 } };
    s.parameters = s.parameters.filter((p: any) => p.name !== 'KE');
    const study = load(s);
    const sf = fitStudy(study, { profile: false });
    expect(sf.fit.statistics.solverStatus).toMatch(/^converged/);
    expect(sf.fit.verdict.status).toBe('misfit');
    expect(sf.fit.success).toBe(false);
    const reason = sf.fit.verdict.reasons[0];
    expect(reason.message).toMatch(/chi-square .* on 82 degrees of freedom/);
    expect(reason.message).toMatch(/worst responses (AcOH|EtOH|EtOAc|H2O) outlet-concentration \(rms [\d.]+ sigma\)/);
    expect(reason.message).toMatch(/worst runs B\d+ \(rms/);
    expect(sf.fit.warnings.map((w) => w.code)).toContain('misfit');
    // The report's badge is red: its data say the fit is not trustworthy.
    const rd = fitReportData(study, sf);
    expect(rd.success).toBe(false);
    expect(rd.status).toBe('misfit');
  });

  it("an error model with size 'weights' scales the covariance by the residual variance; 'known' does not", () => {
    const known = fitStudy(load(raw()), { profile: false });
    const s = raw();
    s.errorModels.titration.size = 'weights';
    const study = load(s);
    const weights = fitStudy(study, { profile: false });
    expect(known.data.sigmaKnown).toBe(true);
    expect(known.fit.statistics.covarianceBasis).toBe('known-sigma');
    expect(known.fit.statistics.chiSquarePValue).not.toBeNull();
    expect(weights.data.sigmaKnown).toBe(false);
    expect(weights.data.weightsOnly).toEqual(['titration']);
    expect(weights.fit.statistics.covarianceBasis).toBe('s2-scaled');
    expect(weights.fit.statistics.chiSquarePValue).toBeNull();
    // Same weights, same optimum; the standard errors differ by exactly the residual std dev s:
    // s^2 (J'J)^-1 against (J'J)^-1 (Bates & Watts 1988, section 2.3).
    const s2 = weights.fit.statistics.residualStdDev!;
    known.fit.parameters.forEach((p, i) => {
      const w = weights.fit.parameters[i];
      expect(Math.abs(w.value - p.value) / Math.abs(p.value)).toBeLessThan(1e-8);
      expect(w.stdError! / p.stdError!).toBeCloseTo(s2, 6);
    });
    expect(fitReportData(study, weights).statistics.covarianceBasis).toMatch(/relative weights/);
  });
});
