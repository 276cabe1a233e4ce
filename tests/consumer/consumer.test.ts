/**
 * The package as its users get it: the compiled dist/ (built by `npm ci` through `prepare`), used
 * from a plain-node ES module script with no loader, and the `rateloom` command from bin/.
 */
import { spawnSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
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
});
