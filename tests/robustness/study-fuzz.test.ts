/**
 * The study loader against hostile input: every field of a valid study replaced by values of the
 * wrong type, huge and tiny numbers, NaN-like strings, empty arrays and objects, unicode and BOMs;
 * CSV cells replaced the same way. Every case gives a study or a RateloomError with a location
 * (file/line/column or field path), never another exception, and a loaded study holds no NaN.
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { RateloomError } from '../../src/core/errors';
import { loadStudy } from '../../src/study';
import { FIXTURES, STUDY_PATH, baseStudy, load } from '../data/helpers';

const NASTY: unknown[] = [
  null, true, false, 0, -1, 1e308, -1e308, 5e-324, 12345678901234567890, 'NaN', 'Infinity', '-Infinity', '1e999', '',
  ' ', '1,5', '0x10', '\u22121', '\u0663', '\uFEFF', '\uFEFF1', 'A\u0000B', '\u{1F4A5}', '\u65e5\u672c', 'constructor', '__proto__',
  [], {}, [null], { value: 'NaN', unit: 'K' }, { value: 1e308, unit: 'kJ/mol' }, 'x'.repeat(5000),
];

function paths(v: unknown, prefix: (string | number)[] = [], out: (string | number)[][] = []): (string | number)[][] {
  if (prefix.length) out.push(prefix);
  if (v && typeof v === 'object') for (const [k, c] of Object.entries(v)) paths(c, [...prefix, Array.isArray(v) ? Number(k) : k], out);
  return out;
}

function setAt(root: any, path: (string | number)[], value: unknown): any {
  const copy = structuredClone(root);
  let cur = copy;
  for (const seg of path.slice(0, -1)) cur = cur[seg];
  cur[path[path.length - 1]] = value;
  return copy;
}

/** Paths of NaN anywhere, and of Infinity outside parameter bounds. */
function badNumbers(v: unknown, path = '$', out: string[] = [], seen = new Set<unknown>()): string[] {
  if (typeof v === 'number') {
    const bound = /\.(lower|upper)$/.test(path) && Math.abs(v) === Infinity;
    if (Number.isNaN(v) || (!Number.isFinite(v) && !bound)) out.push(`${path} = ${v}`);
  } else if (ArrayBuffer.isView(v)) {
    Array.from(v as Float64Array).forEach((x, i) => badNumbers(x, `${path}[${i}]`, out, seen));
  } else if (v && typeof v === 'object' && !seen.has(v)) {
    seen.add(v);
    for (const [k, c] of Object.entries(v)) if (typeof c !== 'function') badNumbers(c, `${path}.${k}`, out, seen);
  }
  return out;
}

/** 'ok' with no bad numbers, or 'error' that is a RateloomError with a location or a path. */
function outcomeOf(f: () => { study: unknown }): 'ok' | 'error' {
  let r: { study: unknown };
  try {
    r = f();
  } catch (e) {
    if (!(e instanceof RateloomError)) throw e;
    const where = e.location?.file !== undefined || e.path.length > 0;
    if (!where) throw new Error(`error without location or path: ${e.message}`);
    expect(e.message).toContain('Fix:');
    return 'error';
  }
  expect(badNumbers(r.study)).toEqual([]);
  return 'ok';
}

describe('study fuzz', () => {
  const base = baseStudy();
  const all = paths(base);

  it('every field x every hostile value -> study or located typed error, never NaN', () => {
    const seen = { ok: 0, error: 0 };
    for (const p of all) {
      for (const v of NASTY) {
        try {
          seen[outcomeOf(() => load(setAt(base, p, v)))]++;
        } catch (e) {
          throw new Error(`field ${p.join('.')} = ${JSON.stringify(v)?.slice(0, 40)}: ${(e as Error).stack}`);
        }
      }
    }
    const tried = seen.ok + seen.error;
    console.log(`study field sweep: ${tried} cases tried (${all.length} fields x ${NASTY.length} values; ${seen.ok} loaded, ${seen.error} typed errors)`);
    expect(tried).toBe(all.length * NASTY.length);
    expect(seen.error).toBeGreaterThan(0);
  });

  it('random hostile CSV cells in the run table -> study or located typed error, never NaN', () => {
    const csv = readFileSync(join(FIXTURES, 'runs.csv'), 'utf8');
    const lines = csv.split('\n');
    const dataRows = lines.map((l, i) => [l, i] as const).filter(([l]) => /^R\d/.test(l)).map(([, i]) => i);
    const cell = fc.constantFrom('NaN', 'nan', 'Infinity', '-inf', '1e999', '-1e999', '', ' ', '1,5', '"1,5"', '0x10', '\u22121', '\u0663', '\uFEFF2', '1e-320', '9'.repeat(400), '\u{1F4A5}', '"', 'R1', '-0');
    let tried = 0;
    const seen = { ok: 0, error: 0 };
    fc.assert(
      fc.property(fc.array(fc.tuple(fc.constantFrom(...dataRows), fc.nat(10), cell), { minLength: 1, maxLength: 4 }), fc.boolean(), (edits, bom) => {
        tried++;
        const rows = lines.map((l) => l.split(','));
        for (const [r, c, v] of edits) rows[r][c] = v;
        const text = (bom ? '\uFEFF' : '') + rows.map((r) => r.join(',')).join('\n');
        seen[outcomeOf(() => load(base, { 'runs.csv': text }))]++;
      }),
      { numRuns: 600 },
    );
    console.log(`CSV cell fuzz: ${tried} cases tried (${seen.ok} loaded, ${seen.error} typed errors)`);
    expect(tried).toBe(600);
  });

  it('study text with BOM, unicode, deep nesting and huge numbers -> typed error with a location', () => {
    const text = readFileSync(STUDY_PATH, 'utf8');
    const reader = (p: string) => readFileSync(p, 'utf8');
    const variants = [
      '\uFEFF' + text,
      '\uFEFF\uFEFF' + text,
      text.replace('"title": "', '"title": "\u65e5\u672c\u{1F4A5} '),
      text.replace('"value": 2e-4', '"value": 1e999'),
      text.replace('"value": 2e-4', '"value": -0'),
      text.replace('"value": 2e-4', '"value": NaN'),
      '['.repeat(50_000) + ']'.repeat(50_000),
      '{"species": ' + '['.repeat(5000) + ']'.repeat(5000) + '}',
      '',
      'null',
      '"study"',
    ];
    let n = 0;
    for (const t of variants) {
      n++;
      outcomeOf(() => loadStudy(t, STUDY_PATH, reader));
    }
    console.log(`study text variants: ${n} cases tried`);
  });
});
