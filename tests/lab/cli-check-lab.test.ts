/**
 * `rateloom check` on analyser data, as a user reads it: the demo campaign with one feed cell made
 * unreadable. The text shows the basis and standard, the conversion range computed from the
 * fractions, the derived table, the skipped lab row of the rejected run, and the balance line.
 * Hand check of run REF1 (internal standard, common practice; datasets-demo/gc/runs.csv):
 *   F_C2H6 = F_N2,0 y_C2H6 / y_N2 = 80 mmol/min * 7.4691 / 81.4099 = 7.3398 mmol/min = 1.2233e-4 mol/s
 *   X_C2H6 = 1 - 7.3398 / 10 = 26.60 %.
 */
import { cpSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { ROOT, runCli, workspace } from '../robustness/cli-helpers';

const ws = workspace();
afterAll(() => ws.cleanup());

describe('rateloom check: lab data text', () => {
  it('shows derived flows, conversion range, skipped rows of rejected runs and the balance closure', async () => {
    const dir = join(ws.dir, 'gc');
    cpSync(join(ROOT, 'datasets-demo', 'gc'), dir, { recursive: true });
    const csv = readFileSync(join(dir, 'runs.csv'), 'utf8').split('\n');
    const at = csv.findIndex((l) => l.startsWith('D2,'));
    csv[at] = csv[at].replace(',10.0,20.0,70.0,', ',ten,20.0,70.0,'); // an unreadable feed cell
    writeFileSync(join(dir, 'runs.csv'), csv.join('\n'));
    const r = await runCli(['check', 'gc.study.json'], dir);
    expect(r.code).toBe(0);
    const out = r.stdout;
    expect(out).toContain('Lab data (runs.csv): dry basis (removed before the analyser: H2O); fractions of C2H6, O2, C2H4, CO2, N2');
    expect(out).toContain('internal standard: N2');
    expect(out).toMatch(/conversion of C2H6 \(measured, 24 runs\): 0\.09181 to 0\.5725/);
    expect(out).not.toContain('not computable');
    const ref1 = out.split('\n').find((l) => /^\s+REF1\s/.test(l))!;
    expect(ref1).toMatch(/REF1\s+0\s+1\.223e-4\s/); // hand: 1.2233e-4 mol/s
    expect(ref1).toContain('26.6 %'); // hand: 26.60 %
    expect(out).toContain(`skipped (1 lab row(s) of runs rejected by the per-run sources, not fitted): D2 (runs.csv:${at + 1})`);
    expect(out).toContain('element balance closure tolerance: 100 +/- 3 %');
    expect(out).toContain('balance warnings: none');
    // The reference runs repeat the conditions at different times on stream: not replicates under drift.
    expect(out).toContain('Under the exponential activity model the runs of the replicate groups listed under Replicates differ in time on stream');
  }, 60000);
});
