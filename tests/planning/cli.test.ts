/**
 * `rateloom plan` on the real command line: a plan of the demo packed bed under --json (exit 0,
 * one JSON document, the CSV written in the study's layout), and bad input (exit 2).
 */
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { ROOT, oneJson, runCli } from '../robustness/cli-helpers';

const STUDY = join(ROOT, 'datasets-demo/pbr/pbr.study.json');

describe('rateloom plan', () => {
  it('plans runs under --json and writes the CSV in the study layout; bad input exits 2', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'rl-plan-'));
    const limits = join(dir, 'limits.json');
    writeFileSync(limits, JSON.stringify({ factors: { temperature: { min: 190, max: 260, unit: 'degC' }, catalystMass: { min: 5, max: 40, unit: 'g' } }, levels: 4, maxConversion: 0.6 }));
    const [good, zero, badUnit] = await Promise.all([
      runCli(['plan', STUDY, '--limits', limits, '--runs', '3', '--out', join(dir, 'plan.csv'), '--json'], dir),
      runCli(['plan', STUDY, '--limits', limits, '--runs', '0', '--json'], dir),
      (async () => {
        const bad = join(dir, 'bad.json');
        writeFileSync(bad, JSON.stringify({ factors: { temperature: { min: 190, max: 260, unit: 'kg' } } }));
        return runCli(['plan', STUDY, '--limits', bad, '--runs', '3', '--json'], dir);
      })(),
    ]);
    expect(good.code, good.stderr).toBe(0);
    const doc = oneJson(good);
    expect(doc.status).toBe('planned');
    expect(doc.runs).toHaveLength(3);
    const csv = readFileSync(join(dir, 'plan.csv'), 'utf8');
    expect(csv).toContain('run,T_C,P_bar,W_g,F_C2H4_in,F_H2O_in,F_N2_in,F_C2H4,F_H2O,F_EtOH,F_DEE');
    expect(csv.trim().split('\n').filter((l) => /^N\d,/.test(l))).toHaveLength(3);
    for (const r of [zero, badUnit]) {
      expect(r.code).toBe(2);
      const e = oneJson(r);
      expect(e.status).toBe('error');
      expect(e.error.message).toContain('Fix:');
    }
    expect(oneJson(badUnit).error.code).toBe('E_UNIT');
  }, 120_000);
});
