/**
 * The layer rules of .dependency-cruiser.cjs (no upward arrows, numerics imports no chemistry,
 * cli/ imports only src/index.ts) hold for the code base, and they do fail on a deliberately
 * planted upward import (fixture in tests/house/fixtures/upward/).
 */
import { readdirSync } from 'node:fs';
import { createRequire } from 'node:module';
import { resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import { cruise, type ICruiseResult, type IConfiguration } from 'dependency-cruiser';
import extractTSConfig from 'dependency-cruiser/config-utl/extract-ts-config';

const ROOT = resolve(import.meta.dirname, '../..');
const config = createRequire(import.meta.url)(resolve(ROOT, '.dependency-cruiser.cjs')) as IConfiguration;

async function violations(baseDir: string): Promise<{ rule: string; from: string; to: string }[]> {
  const cwd = process.cwd();
  process.chdir(baseDir);
  try {
    const tsConfig = extractTSConfig(resolve(baseDir, 'tsconfig.json'));
    const out = await cruise(['src', 'cli'], { ...config.options, validate: true, ruleSet: { forbidden: config.forbidden }, tsConfig: { fileName: 'tsconfig.json' } }, undefined, { tsConfig });
    const result = out.output as ICruiseResult;
    return result.summary.violations.map((v) => ({ rule: v.rule.name, from: v.from, to: v.to }));
  } finally {
    process.chdir(cwd);
  }
}

describe('layer rules (dependency-cruiser)', () => {
  it('the code base has no violation', async () => {
    expect(await violations(ROOT)).toEqual([]);
  });

  it('every folder of src/ is a listed layer (a new folder must take its place in .dependency-cruiser.cjs)', () => {
    const listed = (config.forbidden ?? []).map((r) => r.name ?? '').filter((n) => n.startsWith('no-upward-from-')).map((n) => n.slice('no-upward-from-'.length));
    const folders = readdirSync(resolve(ROOT, 'src'), { withFileTypes: true }).filter((d) => d.isDirectory()).map((d) => d.name);
    expect(folders.filter((f) => !listed.includes(f))).toEqual([]);
  });

  it('a planted upward import and a cli import past the public API are caught', async () => {
    const found = await violations(resolve(import.meta.dirname, 'fixtures/upward'));
    expect(found).toContainEqual({ rule: 'no-upward-from-numerics', from: 'src/numerics/solve.ts', to: 'src/chemistry/formula.ts' });
    expect(found).toContainEqual({ rule: 'narrow-numerics', from: 'src/numerics/solve.ts', to: 'src/chemistry/formula.ts' });
    expect(found).toContainEqual({ rule: 'cli-only-public-api', from: 'cli/main.ts', to: 'src/study/load.ts' });
    // the downward imports of the fixture are allowed
    expect(found.filter((v) => v.from === 'src/study/load.ts' || v.to === 'src/index.ts')).toEqual([]);
  });
});
