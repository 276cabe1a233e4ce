/**
 * The path-taking entry points of the public API (src/api/) give the same results as the layered
 * functions they wrap, and the CLI reaches the library only through src/index.ts.
 */
import { readdirSync, readFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import * as api from '../../src/index';
import { loadStudy as parseStudy } from '../../src/study/load';
import { fitStudy as fitLoaded } from '../../src/workflow/fit-study';

const root = resolve(import.meta.dirname, '../..');
const cstr = join(root, 'datasets-demo/cstr/cstr.study.json');
const read = (p: string) => readFileSync(p, 'utf8');

describe('public entry points', () => {
  it('loadStudy(path) equals loadStudy(text, path, reader); a missing file is E_FILE', () => {
    const a = api.loadStudy(cstr);
    const b = parseStudy(read(cstr), cstr, read);
    expect(a.study.runs.length).toBe(b.study.runs.length);
    expect(a.report).toEqual(b.report);
    expect(() => api.loadStudy(join(root, 'no-such.study.json'))).toThrow(expect.objectContaining({ code: 'E_FILE' }));
  });

  it('fitStudy(path) equals the workflow fit of the loaded study; simulate and compare run from a path', () => {
    const fromPath = api.fitStudy(cstr);
    const direct = fitLoaded(parseStudy(read(cstr), cstr, read).study);
    expect(fromPath.fit.status).toBe(direct.fit.status);
    expect(fromPath.fit.statistics.ssr).toBe(direct.fit.statistics.ssr);
    const sim = api.simulate(cstr, { parameters: Object.fromEntries(fromPath.fit.parameters.map((p) => [p.name, p.value])) });
    expect(sim.success).toBe(true);
    // A study without rival rate laws has nothing to compare: a typed error, not a crash.
    expect(() => api.compare(api.loadStudy(cstr))).toThrow(expect.objectContaining({ code: 'E_VALUE' }));
    const cmp = api.compare(join(root, 'tests/data/fixtures/study.json'));
    expect(cmp.fits.length).toBe(cmp.comparison.ranking.length);
    expect(cmp.fits.length).toBeGreaterThanOrEqual(2);
  });

  it('sizeReactor(handoff, case) sizes from parsed JSON or paths alike', () => {
    const h = join(root, 'tests/design/fixtures/bed.kinetics.json');
    const c = join(root, 'tests/design/fixtures/bed.case.json');
    const byPath = api.sizeReactor(h, c, { draws: 200 });
    const byJson = api.sizeReactor(JSON.parse(read(h)), JSON.parse(read(c)), { draws: 200 });
    expect(byPath.size?.value).toBeGreaterThan(0);
    expect(byJson.size?.value).toBe(byPath.size?.value);
    expect(byJson.uncertainty?.median).toBe(byPath.uncertainty?.median);
    expect(byPath.cautions.length).toBeGreaterThan(0);
  });
});

describe('the CLI uses the public API only', () => {
  it('no file in cli/ imports a library module other than src/index', () => {
    const offenders: string[] = [];
    for (const f of readdirSync(join(root, 'cli')).filter((n) => n.endsWith('.ts'))) {
      for (const m of read(join(root, 'cli', f)).matchAll(/(?:from\s*|import\s*\(\s*)'(\.\.\/src\/[^']*)'/g)) {
        if (m[1] !== '../src/index.js') offenders.push(`${f}: ${m[1]}`);
      }
    }
    expect(offenders).toEqual([]);
  });
});
