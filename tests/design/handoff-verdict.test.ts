/**
 * The hand-off's verdict and the gate in front of sizing (src/design/handoff-verdict.ts,
 * size-gate.ts): a hand-off from a trustworthy fit sizes as before; one whose fit was not
 * trustworthy, whose content changed after it was written, or whose covariance is singular is
 * refused unless the user accepts it, and then every output says so. A singular covariance never
 * gives a P95 equal to the nominal size silently.
 */
import { describe, expect, it } from 'vitest';
import { isRateloomError } from '../../src/core/errors';
import { loadCase } from '../../src/design/case';
import { CAUTIONS } from '../../src/design/cautions';
import type { FittedKinetics } from '../../src/design/handoff';
import { handoffHash } from '../../src/design/handoff-hash';
import { parseHandoff } from '../../src/design/handoff-load';
import { handoffVerdict, positiveDefinite } from '../../src/design/handoff-verdict';
import { kineticsFromHandoff } from '../../src/design/kinetics';
import { sizeReactor, type SizingResult } from '../../src/design/size';
import { buildHandoff, fitStudy } from '../../src/workflow/fit-study';
import { sizingReportData } from '../../src/workflow/sizing-report-data';
import { baseStudy, load } from '../data/helpers';
import { seal, tubeBundleCase, tubeBundleHandoff } from './handoff-fixture';

const size = (h: FittedKinetics, acceptUntrustworthy = false): SizingResult => {
  const dk = kineticsFromHandoff(h);
  const kase = loadCase(tubeBundleCase('gate', '470 K', { uncertainty: { draws: 200, seed: 3 } }), ['A', 'B', 'C', 'N2'], ['r1']);
  return sizeReactor({ handoff: h, kinetics: dk.kinetics, kase, molarMasses: dk.molarMasses!, options: { acceptUntrustworthy } });
};
const refused = (f: () => unknown): string => {
  try {
    f();
  } catch (e) {
    if (isRateloomError(e)) return `${e.code}: ${e.message}`;
    throw e;
  }
  return 'not refused';
};

describe('hand-off written by fit', () => {
  it('records the verdict, the covariance status and a content hash that survives a JSON round trip', () => {
    const { study } = load(baseStudy());
    const sf = fitStudy(study, { profile: false });
    const h = buildHandoff(study, sf);
    expect(h.formatVersion).toBe(2);
    expect(h.verdict.trustworthy).toBe(sf.fit.verdict.trustworthy);
    expect(h.covarianceStatus).toBe('positive-definite');
    expect(h.contentHash).toMatch(/^sha256:[0-9a-f]{64}$/);
    const reread = parseHandoff(JSON.parse(JSON.stringify(h, null, 1)));
    expect(handoffHash(reread)).toBe(h.contentHash);
    expect(handoffVerdict(reread).trustworthy).toBe(true);
  });

  it('a fit with a singular covariance writes covarianceStatus singular and an untrustworthy verdict', () => {
    const s = baseStudy();
    s.reactions[0].rate = { form: 'expression', basis: 'mass', expression: 'k1*kx*exp(-E1/R*(1/T-1/T_ref))*C_A*C_H2^0.5' };
    s.parameters.push({ name: 'kx', value: 1, unit: '1' });
    const { study } = load(s);
    const h = buildHandoff(study, fitStudy(study, { profile: false }));
    expect(h.covarianceStatus).toBe('singular');
    expect(h.verdict.trustworthy).toBe(false);
    expect(h.verdict.status).toBe('singular');
    const v = handoffVerdict(h);
    expect(v.reasons.map((r) => r.code)).toEqual(['fit-untrustworthy', 'covariance-singular']);
  });
});

describe('size gate', () => {
  it('sizes a sealed trustworthy hand-off with the plain cautions and a trustworthy verdict', () => {
    const r = size(tubeBundleHandoff());
    expect(r.verdict.trustworthy).toBe(true);
    expect(r.cautions).toEqual([...CAUTIONS]);
  });

  it('refuses a hand-off edited by hand (hash mismatch); accepted, every output says so and it is not trustworthy', () => {
    const h = tubeBundleHandoff();
    h.parameters[0].value *= 1000;
    h.parameters[0].internalValue = Math.log(h.parameters[0].value);
    expect(refused(() => size(h))).toMatch(/^E_HANDOFF_UNTRUSTED: .*changed after rateloom wrote it/);
    const r = size(h, true);
    expect(r.verdict.trustworthy).toBe(false);
    expect(r.verdict.status).toBe('hash-mismatch');
    expect(r.cautions[0]).toMatch(/^NOT TRUSTWORTHY KINETICS, sized only because --accept-untrustworthy was given: .*changed/);
    expect(r.cautions.slice(1)).toEqual([...CAUTIONS]);
    const report = sizingReportData(r);
    expect(report.success).toBe(false);
    expect(report.cautions[0]).toBe(r.cautions[0]);
  });

  it('refuses the hand-off of an untrustworthy fit even when its hash matches', () => {
    const h = tubeBundleHandoff();
    h.verdict = { trustworthy: false, status: 'misfit', message: 'Not trustworthy: misfit', reasons: [{ code: 'misfit', message: 'the residuals are larger than the stated measurement error allows' }] };
    h.contentHash = handoffHash(h);
    expect(refused(() => size(h))).toMatch(/fit that wrote it is not trustworthy \(misfit: the residuals are larger/);
    expect(size(h, true).verdict.status).toBe('fit-untrustworthy');
  });

  it('a singular covariance gives no percentiles and a warning, never P95 = nominal in silence', () => {
    const h = tubeBundleHandoff();
    h.covariance.matrix = [[0, 0], [0, 0]];
    seal(h);
    h.covarianceStatus = 'singular';
    h.verdict = { trustworthy: false, status: 'singular', message: 'Not trustworthy: singular', reasons: [] };
    h.contentHash = handoffHash(h);
    expect(refused(() => size(h))).toMatch(/not positive definite/);
    const r = size(h, true);
    expect(r.size?.value).toBeGreaterThan(0);
    expect(r.uncertainty).toBeUndefined();
    expect(r.warnings.map((w) => w.code)).toContain('W_NO_UNCERTAINTY');
    expect(r.cautions[0]).toMatch(/not positive definite/);
    const report = sizingReportData(r);
    expect(Number.isNaN(report.size.p95)).toBe(true);
    expect(report.size.p95).not.toBe(report.size.nominal);
  });

  it('positiveDefinite: Cholesky accepts a positive-definite matrix and rejects singular and indefinite ones', () => {
    expect(positiveDefinite([[4, 2], [2, 3]])).toBe(true);
    expect(positiveDefinite([[1, 1], [1, 1]])).toBe(false);
    expect(positiveDefinite([[1, 2], [2, 1]])).toBe(false);
    expect(positiveDefinite([[0, 0], [0, 0]])).toBe(false);
  });
});
