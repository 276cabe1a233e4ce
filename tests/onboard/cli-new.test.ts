/**
 * `rateloom new` from the command line: a written skeleton passes `check` as written; an existing
 * study file is never overwritten without --force; a CSV with no recognisable columns exits 2,
 * lists what was found and what is missing, and writes nothing.
 */
import { spawnSync } from 'node:child_process';
import { copyFileSync, existsSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';

const cli = (...args: string[]) => spawnSync(process.execPath, ['--import', 'tsx', 'cli/main.ts', ...args], { encoding: 'utf8', timeout: 60000 });

describe('rateloom new', () => {
  it('writes a study that check accepts, and refuses to overwrite it without --force', () => {
    const dir = mkdtempSync(join(tmpdir(), 'rl-new-'));
    copyFileSync('datasets-demo/layouts/stacked/tank-runs.csv', join(dir, 'tank.csv'));
    const out = join(dir, 'tank.study.json');
    const r = cli('new', join(dir, 'tank.csv'), '--out', out, '--rate', 'A^2', '--yes');
    expect(r.status, r.stderr).toBe(0);
    expect(r.stdout).toMatch(/stacked layout, stirred-tank \(liquid\)/);
    expect(r.stdout).toMatch(/^\s+\d+: PLACEHOLDER reaction 'A -> B'/m);
    const text = readFileSync(out, 'utf8');
    const line = Number(/^\s+(\d+): PLACEHOLDER reaction/m.exec(r.stdout)?.[1]);
    expect(text.split('\n')[line - 1]).toContain('"equation": "A -> B"');
    const c = cli('check', out);
    expect(c.status, c.stderr).toBe(0);
    const again = cli('new', join(dir, 'tank.csv'), '--out', out, '--reaction', 'A -> B');
    expect(again.status).toBe(2);
    expect(again.stderr).toMatch(/E_EXISTS/);
    expect(readFileSync(out, 'utf8')).toBe(text);
    const forced = cli('new', join(dir, 'tank.csv'), '--out', out, '--reaction', 'A -> B', '--reactor', 'plug-flow', '--force', '--json');
    expect(forced.status, forced.stdout).toBe(0);
    const doc = JSON.parse(forced.stdout);
    expect(doc.status).toBe('written');
    expect(doc.reactor.kind).toBe('plug-flow');
    expect(JSON.parse(readFileSync(out, 'utf8')).reactor.kind).toBe('plug-flow');
  }, 60000);

  it('refuses a CSV without recognisable columns: found and missing listed, exit 2, nothing written', () => {
    const dir = mkdtempSync(join(tmpdir(), 'rl-new-'));
    writeFileSync(join(dir, 'export.csv'), 'operator,date,C_A [mol/L]\nme,2026-01-01,0.5\n');
    const out = join(dir, 'export.study.json');
    const r = cli('new', join(dir, 'export.csv'), '--out', out, '--json');
    expect(r.status).toBe(2);
    const err = JSON.parse(r.stdout).error;
    expect(err.code).toBe('E_COLUMNS');
    expect(err.message).toMatch(/Found: 'C_A \[mol\/L\]' \(concentration of A, out\)/);
    expect(err.message).toMatch(/not recognised: 'operator', 'date'/);
    expect(err.message).toMatch(/Missing: a temperature column/);
    expect(err.message).toMatch(/a run id column/);
    expect(existsSync(out)).toBe(false);
  }, 60000);
});
