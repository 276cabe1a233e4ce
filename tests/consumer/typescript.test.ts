/**
 * Using rateloom from TypeScript as a consumer does: the README's "Use from TypeScript" example,
 * taken verbatim from README.md, compiled by tsc with `module`/`moduleResolution: NodeNext` against
 * the package's own declarations (dist/src/index.d.ts through "exports"), then run with plain node.
 * Also: require('rateloom') from CommonJS stops with the documented ESM-only error.
 */
import { spawnSync } from 'node:child_process';
import { mkdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { join, resolve } from 'node:path';
import { describe, expect, it } from 'vitest';

const root = resolve(import.meta.dirname, '../..');
const work = join(root, 'tests/consumer/.generated');
const tsc = createRequire(import.meta.url).resolve('typescript/bin/tsc');
const run = (args: string[]) => spawnSync(process.execPath, args, { cwd: root, encoding: 'utf8', timeout: 120_000 });

/** The first ```ts block after the heading "## Use from TypeScript" in README.md. */
function readmeExample(): string {
  const readme = readFileSync(join(root, 'README.md'), 'utf8');
  const section = readme.slice(readme.indexOf('## Use from TypeScript'));
  const m = /```ts\n([\s\S]*?)```/.exec(section);
  if (!m || !readme.includes('## Use from TypeScript')) throw new Error('README.md has no "Use from TypeScript" section with a ```ts block');
  return m[1];
}

describe('TypeScript and CommonJS consumers', () => {
  it('the README example compiles under NodeNext with the shipped types and runs with plain node', () => {
    rmSync(work, { recursive: true, force: true });
    mkdirSync(work, { recursive: true });
    // A type error that only a typed import can catch: if the declarations did not resolve, the
    // imports would be `any`, this expect-error would be unused, and tsc would fail.
    const probe = "\nimport type { StudyFit as Probe } from 'rateloom';\n// @ts-expect-error status is a string union, not a number\nexport const probe: Probe['fit']['status'] = 1;\n";
    writeFileSync(join(work, 'example.mts'), readmeExample() + probe);
    const tsconfig = { compilerOptions: { module: 'NodeNext', moduleResolution: 'NodeNext', target: 'ES2022', strict: true, outDir: 'out', rootDir: '.', skipLibCheck: true, types: [] }, files: ['example.mts'] };
    writeFileSync(join(work, 'tsconfig.json'), JSON.stringify(tsconfig));
    const compiled = run([tsc, '-p', join(work, 'tsconfig.json')]);
    expect(compiled.stdout + compiled.stderr).toBe('');
    const r = run([join(work, 'out', 'example.mjs')]);
    expect(r.stderr).toBe('');
    expect(r.status).toBe(0);
    expect(r.stdout).toMatch(/rows used/);
    expect(r.stdout).toMatch(/fit: converged/);
    expect(r.stdout).toMatch(/catalyst mass [\d.e+]+ kg/);
    expect(r.stdout.toLowerCase()).toMatch(/preliminary/);
  });

  it('require("rateloom") from CommonJS gives the documented ESM-only error, not a crash in a dependency', () => {
    const r = run(['-e', "require('rateloom')"]);
    expect(r.status).not.toBe(0);
    expect(r.stderr).toMatch(/rateloom is ESM-only/);
    expect(r.stderr).toMatch(/await import\('rateloom'\)/);
    expect(r.stderr).not.toMatch(/vega|top-level await/i);
  });
});
