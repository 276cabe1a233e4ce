/**
 * What `npm pack` would publish (`npm pack --dry-run --json --ignore-scripts`, on the dist/ this
 * checkout built): the compiled library with its declarations, the bundled CLI, the schemas, the
 * demo data and the README; no tests, bench, TypeScript sources, scripts or fixtures; and every
 * path package.json points at (bin, main, types, exports) is in it.
 */
import { spawnSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { describe, expect, it } from 'vitest';

const root = resolve(import.meta.dirname, '../..');
const pkg = JSON.parse(readFileSync(join(root, 'package.json'), 'utf8')) as {
  bin: Record<string, string>; main: string; types: string; engines: { node: string };
  exports: Record<string, string | Record<string, string>>;
};

describe('npm pack contents', () => {
  const r = spawnSync('npm', ['pack', '--dry-run', '--json', '--ignore-scripts'], { cwd: root, encoding: 'utf8', timeout: 120_000 });
  const files = r.status === 0 ? (JSON.parse(r.stdout) as { files: { path: string }[] }[])[0].files.map((f) => f.path) : [];

  it('npm pack --dry-run succeeds', () => {
    expect(r.status, r.stderr).toBe(0);
  });

  it('ships no tests, bench, sources, scripts or fixtures', () => {
    const banned = files.filter((f) => /^(tests|bench|src|cli|scripts|reports|\.ci|node_modules)\//.test(f) || /fixture/i.test(f) || (f.endsWith('.ts') && !f.endsWith('.d.ts')));
    expect(banned).toEqual([]);
  });

  it('ships the library with declarations, the bundled CLI, the schemas and the demo data', () => {
    for (const f of ['dist/src/index.js', 'dist/src/index.d.ts', 'dist/bundle/main.js', 'bin/rateloom.js', 'cjs/index.cjs', 'schema/study.schema.json', 'datasets-demo/truth.json', 'datasets-demo/pbr/pbr.study.json', 'README.md', 'package.json']) {
      expect(files, f).toContain(f);
    }
    // the worker threads load the bundled job modules; the unbundled ones stay for the library's own imports
    for (const f of ['dist/bundle/parallel/worker.js', 'dist/bundle/parallel/study-jobs.js', 'dist/bundle/parallel/mc-jobs.js']) expect(files, f).toContain(f);
    expect(files.filter((f) => f.startsWith('dist/src/parallel/') && f.endsWith('.js')).length).toBeGreaterThan(3);
  });

  it('every path package.json points at is shipped; Node >= 20 is declared', () => {
    const targets = [...Object.values(pkg.bin), pkg.main, pkg.types, ...Object.values(pkg.exports).flatMap((e) => (typeof e === 'string' ? [e] : Object.values(e)))];
    for (const t of targets) expect(files, t).toContain(t.replace(/^\.\//, ''));
    expect(pkg.engines.node).toBe('>=20');
  });
});
