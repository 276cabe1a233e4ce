/**
 * Error structure of lab responses (src/workflow/fit-data.ts, correlated-errors.ts): ratios of one
 * run to the same standard share the standard's error, so their correlation is
 *   corr(R_a, R_b) = (s_s / y_s)^2 / sqrt(((s_a/y_a)^2 + (s_s/y_s)^2) ((s_b/y_b)^2 + (s_s/y_s)^2))
 * (delta method on R = y_i / y_s, first order; common practice), computed by hand below for the
 * worked example of lab-arithmetic.test.ts; the fit whitens each run's block with it. Error models
 * of the fractions follow the size rule of every error model ("size": "weights" estimates the scale).
 */
import { describe, expect, it } from 'vitest';
import { studyFitData } from '../../src/workflow/fit-data';
import { fitStudy } from '../../src/workflow/fit-study';
import { RUNS_HEADER, labStudy, loadLab } from './lab-fixture';

const dry = { C2H6: 7 / 97.5, O2: 7 / 97.5, C2H4: 2.5 / 97.5, CO2: 1 / 97.5, N2: 80 / 97.5 };
const row = (id: string, T = 800) => `${id},${T},1.0,10,10,80,${dry.C2H6},${dry.O2},${dry.C2H4},${dry.CO2},${dry.N2}`;
const files = { 'runs.csv': `${RUNS_HEADER}\n${row('R1')}\n${row('R2', 780)}\n${row('R3', 820)}\n` };

describe('lab responses: correlated errors and the size rule', () => {
  it('ratios to the standard: one whitening block per run with the hand-computed correlation', () => {
    const { study } = loadLab(labStudy(), files);
    const data = studyFitData(study);
    expect(data.whiten?.length).toBe(3); // one block per run
    const b = data.whiten![0];
    expect(b.index.length).toBe(4); // C2H6, O2, C2H4, CO2 over N2
    // Hand: s(y) = sqrt(0.0002^2 + (0.01 y)^2); relative variances u = (s/y)^2.
    const u = (y: number) => (Math.hypot(0.0002, 0.01 * y) / y) ** 2;
    const r01 = u(dry.N2) / Math.sqrt((u(dry.C2H6) + u(dry.N2)) * (u(dry.O2) + u(dry.N2)));
    // R = L L': R[1][0] = L[1][0] L[0][0] = L[1][0] (L[0][0] = 1).
    expect(b.factor[0]).toBeCloseTo(1, 12);
    expect(b.factor[4]).toBeCloseTo(r01, 6);
    expect(data.sigmaKnown).toBe(true);
    expect(data.sigmaSource.every((s) => s === 'error-model')).toBe(true);
  });
  it('fractions as measured carry their own errors: no block', () => {
    const { study } = loadLab(labStudy({}, { fit: ['outlet-fraction'] }), files);
    expect(studyFitData(study).whiten).toBeUndefined();
  });
  it('an error model of size "weights" makes the fit estimate the scale', () => {
    const s = labStudy();
    s.errorModels.gc.size = 'weights';
    const { study } = loadLab(s, files);
    const data = studyFitData(study);
    expect(data.sigmaKnown).toBe(false);
    expect(data.weightsOnly).toEqual(['gc']);
  });
  it('a ratio and the conversion derived from it are the same measurement: named, and the fit warns', () => {
    const { study } = loadLab(labStudy({}, { fit: ['fraction-ratio', 'conversion'] }), files);
    const data = studyFitData(study);
    expect(data.dependentRuns).toEqual(['R1', 'R2', 'R3']);
    const fit = fitStudy(study, { profile: false });
    expect(fit.fit.warnings.map((w) => w.code)).toContain('lab-responses-dependent');
  });
});
