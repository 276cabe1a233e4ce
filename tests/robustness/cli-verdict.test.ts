/**
 * The exit-code rule end to end (README "When to trust a result"): `rateloom fit` exits 0 for a
 * trustworthy fit and 1 for one that finished but must not be trusted, and says why; the hand-off
 * it writes records the verdict, and `size` refuses an untrustworthy one (exit 2); with
 * --accept-untrustworthy it sizes, exits 1 and says why in its cautions.
 */
import { cpSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { ROOT, oneJson, runMany, workspace } from './cli-helpers';

const ws = workspace();
afterAll(() => ws.cleanup());

describe('fit exit codes follow the verdict', () => {
  it('demo batch: exit 0; irreversible law with a stated error: exit 1 (misfit), and its hand-off records the verdict', async () => {
    const dir = join(ws.dir, 'batch');
    cpSync(join(ROOT, 'datasets-demo', 'batch'), dir, { recursive: true });
    const s = JSON.parse(readFileSync(join(dir, 'batch.study.json'), 'utf8'));
    delete s.$schema;
    s.reactions[0].equation = 'AcOH + EtOH -> EtOAc + H2O';
    s.reactions[0].rate = { form: 'power-law', basis: 'volume', rateConstant: { k: 'kE', activationEnergy: 'EE' }, orders: { AcOH: 1, EtOH: 1 } };
    s.parameters = s.parameters.filter((p: { name: string }) => p.name !== 'KE');
    writeFileSync(join(dir, 'irr.study.json'), JSON.stringify(s));
    const [good, bad] = await runMany(
      [
        ['fit', 'batch.study.json', '--no-profile', '--no-report', '--json', '--out', 'good'],
        ['fit', 'irr.study.json', '--no-profile', '--no-report', '--json', '--out', 'bad'],
      ],
      dir,
      2,
    );
    expect(good.code).toBe(0);
    expect(oneJson(good).verdict.status).toBe('converged');
    expect(bad.code).toBe(1);
    const doc = oneJson(bad);
    expect(doc.verdict.trustworthy).toBe(false);
    expect(doc.verdict.status).toBe('misfit');
    expect(doc.status).toBe('misfit');
    const handoff = JSON.parse(readFileSync(join(dir, 'bad', 'irr-kinetics.json'), 'utf8'));
    expect(handoff.verdict.status).toBe('misfit');
    expect(handoff.contentHash).toMatch(/^sha256:/);
  }, 120000);
});

describe('a non-identifiable fit cannot be sized silently', () => {
  it('demo packed bed with k2 written as k2*k3: fit exits 1 (singular), the hand-off records it, size refuses (exit 2) unless --accept-untrustworthy (exit 1, cautions, no percentiles)', async () => {
    const dir = join(ws.dir, 'singular');
    cpSync(join(ROOT, 'datasets-demo', 'pbr'), dir, { recursive: true });
    const s = JSON.parse(readFileSync(join(dir, 'pbr.study.json'), 'utf8'));
    delete s.$schema;
    delete s.candidates;
    // Only the product k2*k3 enters the model: the Jacobian columns of ln k2 and ln k3 are equal, so
    // the covariance is singular whatever the data (an analytic fact of the model, not a tolerance).
    s.reactions[1].rate = { form: 'expression', basis: 'mass', expression: 'k2 * k3 * exp(-E2 / R * (1 / T - 1 / 500)) * C_EtOH' };
    for (const p of s.parameters) if (p.name === 'k2') p.transform = 'log';
    for (const p of s.parameters) if (p.name === 'E2') Object.assign(p, { value: 80000, unit: 'J/mol', lower: 1e4, upper: 2.5e5 });
    s.parameters.push({ name: 'k3', value: 1, unit: '1', lower: 1e-3, upper: 1e3, transform: 'log' });
    writeFileSync(join(dir, 'sing.study.json'), JSON.stringify(s));
    const [fit] = await runMany([['fit', 'sing.study.json', '--no-profile', '--no-report', '--json', '--out', 'o']], dir, 1);
    expect(fit.code).toBe(1);
    const doc = oneJson(fit);
    expect(doc.verdict.trustworthy).toBe(false);
    expect(doc.verdict.status).toBe('singular');
    expect(doc.verdict.message).toContain('k2, k3');
    const handoff = JSON.parse(readFileSync(join(dir, 'o', 'sing-kinetics.json'), 'utf8'));
    expect(handoff.verdict.status).toBe('singular');
    expect(handoff.covarianceStatus).toBe('singular');
    const kin = join('o', 'sing-kinetics.json');
    const [refused, accepted] = await runMany(
      [
        ['size', kin, 'plant.case.json', '--json', '--draws', '0'],
        ['size', kin, 'plant.case.json', '--json', '--draws', '200', '--accept-untrustworthy'],
      ],
      dir,
      2,
    );
    expect(refused.code).toBe(2);
    const err = oneJson(refused).error;
    expect(err.code).toBe('E_HANDOFF_UNTRUSTED');
    expect(err.message).toContain('singular');
    expect(err.fix).toContain('--accept-untrustworthy');
    expect(accepted.code).toBe(1);
    const sized = oneJson(accepted);
    expect(sized.verdict.trustworthy).toBe(false);
    expect(sized.cautions[0]).toMatch(/^NOT TRUSTWORTHY KINETICS/);
    expect(sized.cautions[0]).toContain('k2, k3');
    expect(sized.warnings.map((w: { code: string }) => w.code)).toContain('W_NO_UNCERTAINTY');
    // No Monte Carlo without a positive-definite covariance: P95 is never reported equal to nominal.
    expect(sized.size.percentiles).toBeUndefined();
    expect(sized.uncertainty).toBeUndefined();
  }, 120000);
});
