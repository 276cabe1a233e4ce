/**
 * The exit-code rule end to end (README "When to trust a result"): `rateloom fit` exits 0 for a
 * trustworthy fit and 1 for one that finished but must not be trusted, and says why; the hand-off
 * it writes records the verdict, and `size` refuses an untrustworthy one (exit 2).
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
