/**
 * The package as its users get it: the compiled dist/ (built by `npm ci` through `prepare`), used
 * from a plain-node ES module script with no loader, and the `rateloom` command from bin/.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { describe, expect, it } from 'vitest';

const root = resolve(import.meta.dirname, '../..');
const node = (args: string[]) => spawnSync(process.execPath, args, { cwd: root, encoding: 'utf8', timeout: 60_000 });
const pkg = JSON.parse(readFileSync(join(root, 'package.json'), 'utf8')) as { version: string };

describe('compiled package', () => {
  it('a plain-node .mjs script imports rateloom by name and fits the demo stirred tank', () => {
    const r = node([join(root, 'tests/consumer/plain-node.mjs'), join(root, 'datasets-demo/cstr/cstr.study.json')]);
    expect(r.stderr).toBe('');
    expect(r.status).toBe(0);
    const out = JSON.parse(r.stdout) as { version: string; success: boolean; parameters: string[] };
    expect(out.version).toBe(pkg.version);
    expect(out.success).toBe(true);
    expect(out.parameters.length).toBeGreaterThan(0);
  });

  it('bin/rateloom.js runs the compiled CLI', () => {
    const r = node([join(root, 'bin/rateloom.js'), '--version']);
    expect(r.status).toBe(0);
    expect(r.stdout.trim()).toBe(pkg.version);
  });

  it('the compiled demo command finds datasets-demo/ (two levels above dist/cli/)', () => {
    const probe = "const { DEMO_DATA_DIR } = await import('./dist/cli/demo.js'); const fs = await import('node:fs'); console.log(fs.existsSync(DEMO_DATA_DIR + 'truth.json'));";
    const r = node(['--input-type=module', '-e', probe]);
    expect(r.stdout.trim()).toBe('true');
  });

  it('the bundled CLI (dist/bundle/) checks a study and finds its worker modules: 2 workers give the serial result', () => {
    const check = node([join(root, 'bin/rateloom.js'), 'check', join(root, 'datasets-demo/cstr/cstr.study.json'), '--json']);
    expect(check.stderr).toBe('');
    expect(check.status).toBe(0);
    const out = mkdtempSync(join(tmpdir(), 'rateloom-bundle-'));
    try {
      const profiles = join(out, 'cpu');
      const fit = (workers: string) => {
        const r = node(['--cpu-prof', '--cpu-prof-dir', profiles, join(root, 'bin/rateloom.js'), 'fit', join(root, 'datasets-demo/cstr/cstr.study.json'), '--no-report', '--json', '--force', '--out', out, '--workers', workers]);
        expect(r.status).toBe(0);
        const doc = JSON.parse(r.stdout) as { fit: { parameters: { name: string; value: number; ci: { profile: unknown } }[] } };
        return doc.fit.parameters.map((p) => [p.name, p.value, p.ci]);
      };
      const serial = fit('1');
      expect(serial.every(([, , ci]) => (ci as { profile: unknown }).profile !== null)).toBe(true);
      rmSync(profiles, { recursive: true, force: true });
      expect(fit('2')).toEqual(serial);
      // one CPU profile per thread: the worker threads ran the bundled job module of dist/bundle/parallel
      // (pool.ts, workerModule), not the ~250 modules of dist/src
      const threads = readdirSync(profiles).map((f) => readFileSync(join(profiles, f), 'utf8'));
      expect(threads.filter((t) => t.includes('dist/bundle/parallel/study-jobs.js')).length).toBe(2);
      expect(threads.filter((t) => t.includes('dist/src/parallel/study-jobs.js')).length).toBe(0);
    } finally {
      rmSync(out, { recursive: true, force: true });
    }
  }, 120_000);
});
