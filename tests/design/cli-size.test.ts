import { describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { CAUTIONS } from '../../src/design/cautions';

const KIN = 'tests/design/fixtures/bed.kinetics.json';
const CASE = 'tests/design/fixtures/bed.case.json';
const run = (...args: string[]) => spawnSync(process.execPath, ['--import', 'tsx', 'cli/main.ts', 'size', ...args], { encoding: 'utf8', timeout: 60000 });

describe('rateloom size', () => {
  it('prints one JSON document with the cautions and writes --out', () => {
    const dir = mkdtempSync(join(tmpdir(), 'rl-size-'));
    const out = join(dir, 'sizing.json');
    const r = run(KIN, CASE, '--json', '--draws', '300', '--out', out);
    expect(r.status).toBe(0);
    const doc = JSON.parse(r.stdout);
    expect(doc.status).toBe('sized');
    expect(doc.cautions).toEqual([...CAUTIONS]);
    expect(doc.tubes.count).toBeGreaterThan(1);
    expect(JSON.parse(readFileSync(out, 'utf8')).size.value).toBe(doc.size.value);
    // Refuses to overwrite without --force (bad input, exit 2).
    expect(run(KIN, CASE, '--json', '--draws', '0', '--out', out).status).toBe(2);
  }, 60000);

  it('exits 1 with the cautions when the target is unreachable', () => {
    const dir = mkdtempSync(join(tmpdir(), 'rl-size-'));
    const c = JSON.parse(readFileSync(CASE, 'utf8'));
    c.feed.moleFractions = { A: 0.5, B: 0.3, N2: 0.2 };
    const p = join(dir, 'case.json');
    writeFileSync(p, JSON.stringify(c));
    const r = run(KIN, p, '--draws', '0');
    expect(r.status).toBe(1);
    expect(r.stdout).toContain('target-unreachable');
    expect(r.stdout).toContain('0.6');
    for (const caution of CAUTIONS) expect(r.stdout).toContain(caution);
  }, 60000);

  it('exits 2 naming the closest field for a misspelt case field', () => {
    const dir = mkdtempSync(join(tmpdir(), 'rl-size-'));
    const c = JSON.parse(readFileSync(CASE, 'utf8'));
    c.temperatur = c.temperature;
    delete c.temperature;
    const p = join(dir, 'case.json');
    writeFileSync(p, JSON.stringify(c));
    const r = run(KIN, p, '--json');
    expect(r.status).toBe(2);
    const doc = JSON.parse(r.stdout);
    expect(doc.error.code).toBe('E_UNKNOWN_FIELD');
    expect(doc.error.fix).toContain("'temperature'");
    expect(doc.error.location.file).toBe(p);
  }, 60000);

  it('refuses a hand-off edited by hand (exit 2); with --accept-untrustworthy it sizes, exits 1 and every output says why', () => {
    const dir = mkdtempSync(join(tmpdir(), 'rl-size-'));
    const h = JSON.parse(readFileSync(KIN, 'utf8'));
    h.parameters[0].value *= 10;
    h.parameters[0].internalValue += Math.log(10);
    const p = join(dir, 'edited.kinetics.json');
    writeFileSync(p, JSON.stringify(h, null, 2));
    const refused = run(p, CASE, '--json', '--draws', '0');
    expect(refused.status).toBe(2);
    const err = JSON.parse(refused.stdout).error;
    expect(err.code).toBe('E_HANDOFF_UNTRUSTED');
    expect(err.message).toContain('content hash does not match');
    expect(err.fix).toContain('--accept-untrustworthy');
    const json = run(p, CASE, '--json', '--draws', '0', '--accept-untrustworthy');
    expect(json.status).toBe(1);
    const doc = JSON.parse(json.stdout);
    expect(doc.verdict.trustworthy).toBe(false);
    expect(doc.verdict.status).toBe('hash-mismatch');
    expect(doc.cautions[0]).toMatch(/^NOT TRUSTWORTHY KINETICS/);
    const text = run(p, CASE, '--draws', '0', '--accept-untrustworthy', '--report', dir);
    expect(text.status).toBe(1);
    expect(text.stdout).toContain('NOT TRUSTWORTHY KINETICS');
    for (const f of ['bed-sizing.html', 'bed-sizing.md']) expect(readFileSync(join(dir, f), 'utf8')).toContain('NOT TRUSTWORTHY KINETICS');
  }, 60000);
});
