import { spawn } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';

/** One CLI run (node + tsx, as the other CLI tests); stdout and exit code. */
const run = (args: string[]) =>
  new Promise<{ out: string; code: number | null }>((resolve) => {
    const p = spawn(process.execPath, ['--import', 'tsx', 'cli/main.ts', ...args], { stdio: ['ignore', 'pipe', 'ignore'] });
    let out = '';
    p.stdout.on('data', (b) => (out += b));
    p.on('close', (code) => resolve({ out, code }));
  });

const dir = mkdtempSync(join(tmpdir(), 'rateloom-workers-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('--workers 1 and --workers 2 print the same JSON', () => {
  it('fit (multistart and profiles on the workers) and size (Monte Carlo passes on the workers)', async () => {
    const fit = (w: string) =>
      run(['fit', 'datasets-demo/cstr/cstr.study.json', '--starts', '3', '--no-report', '--out', dir, '--name', 'cstr', '--force', '--json', '--workers', w]);
    const size = (w: string) =>
      run(['size', 'tests/design/fixtures/bed.kinetics.json', 'tests/design/fixtures/bed.case.json', '--draws', '300', '--json', '--workers', w]);
    // one spawn each; the two settings run side by side
    const [f1, f2, s1, s2] = await Promise.all([fit('1'), fit('2'), size('1'), size('2')]);
    expect(f1.code).toBe(0);
    expect(JSON.parse(f1.out).fit.profiles.length).toBeGreaterThan(0);
    expect(f2.out).toBe(f1.out);
    expect(s1.code).toBe(0);
    expect(JSON.parse(s1.out).uncertainty.draws).toBe(300);
    expect(s2.out).toBe(s1.out);
  }, 60000);

  it('refuses a bad --workers value with a usage error', async () => {
    const r = await run(['size', 'tests/design/fixtures/bed.kinetics.json', 'tests/design/fixtures/bed.case.json', '--json', '--workers', 'two']);
    expect(r.code).toBe(2);
    expect(JSON.parse(r.out).error.code).toBe('E_USAGE');
  }, 30000);
});
