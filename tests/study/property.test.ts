/**
 * Property tests: random input gives a result or a RateloomError with a location, never an
 * uncaught exception of another kind.
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { RateloomError } from '../../src/core/errors';
import { readCsv } from '../../src/data/csv';
import { loadStudy } from '../../src/study';
import { baseStudy, load } from '../data/helpers';

const csvChar = fc.constantFrom('a', 'b', 'R', '1', '2', '.', '-', 'e', ',', ',', '"', '\n', '\r\n', '#', ' ', '\uFEFF', 'x');
const csvText = fc.array(csvChar, { maxLength: 120 }).map((a) => a.join(''));

function expectTyped(f: () => unknown): 'ok' | 'error' {
  try {
    f();
    return 'ok';
  } catch (e) {
    expect(e).toBeInstanceOf(RateloomError);
    expect((e as RateloomError).location, (e as Error).message).toBeDefined();
    return 'error';
  }
}

describe('property: CSV reader', () => {
  it('random text -> table or E_CSV with a location', () => {
    let tried = 0;
    const seen = { ok: 0, error: 0 };
    fc.assert(
      fc.property(csvText, (text) => {
        tried++;
        seen[expectTyped(() => readCsv(text, 'p.csv'))]++;
      }),
      { numRuns: 2000 },
    );
    console.log(`CSV reader property: ${tried} cases tried (${seen.ok} read, ${seen.error} typed errors)`);
    expect(tried).toBe(2000);
  });
});

/** Random JSON values to plant into the study. */
const jsonValue = fc.oneof(
  fc.constant(null),
  fc.boolean(),
  fc.double({ noNaN: false }),
  fc.integer(),
  fc.string({ maxLength: 8 }),
  fc.constantFrom('degC', 'barg', 'mmol/min', 'g', 'R1', 'A', 'per-run', 'long', 'packed-bed', 'batch', 'liquid'),
  fc.array(fc.integer(), { maxLength: 2 }),
  fc.dictionary(fc.constantFrom('column', 'value', 'unit', 'x'), fc.oneof(fc.string({ maxLength: 4 }), fc.integer())),
);

function paths(v: unknown, prefix: (string | number)[] = [], out: (string | number)[][] = []): (string | number)[][] {
  out.push(prefix);
  if (v && typeof v === 'object') for (const [k, c] of Object.entries(v)) paths(c, [...prefix, Array.isArray(v) ? Number(k) : k], out);
  return out;
}

function setAt(root: any, path: (string | number)[], value: unknown, del: boolean): any {
  if (path.length === 0) return value;
  const copy = structuredClone(root);
  let cur = copy;
  for (const seg of path.slice(0, -1)) cur = cur[seg];
  if (del) {
    if (Array.isArray(cur)) cur.splice(Number(path[path.length - 1]), 1);
    else delete cur[path[path.length - 1]];
  } else cur[path[path.length - 1]] = value;
  return copy;
}

describe('property: study loader', () => {
  const base = baseStudy();
  const allPaths = paths(base);
  it('random mutations of a valid study and random CSV -> study or typed error with location', () => {
    let tried = 0;
    const seen = { ok: 0, error: 0 };
    fc.assert(
      fc.property(
        fc.array(fc.tuple(fc.nat(allPaths.length - 1), jsonValue, fc.boolean()), { minLength: 1, maxLength: 3 }),
        fc.oneof(
          { weight: 3, arbitrary: fc.constant(undefined) },
          { weight: 3, arbitrary: csvText.map((t) => `run,W_g,species,value,sd\nR2,0.25,A,1.9,0.02\n${t}`) },
          { weight: 1, arbitrary: csvText },
        ),
        (edits, csv) => {
          tried++;
          let s: any = base;
          for (const [i, v, del] of edits) {
            try {
              s = setAt(s, allPaths[i], v, del);
            } catch {
              /* path vanished after an earlier edit */
            }
          }
          const files: Record<string, string> = csv !== undefined ? { 'profile.csv': csv } : {};
          seen[expectTyped(() => load(s, files))]++;
        },
      ),
      { numRuns: 1500 },
    );
    console.log(`study loader property: ${tried} cases tried (${seen.ok} loaded, ${seen.error} typed errors)`);
    expect(seen.ok).toBeGreaterThan(0);
  });
  it('random text as a study file -> typed error with location', () => {
    let tried = 0;
    fc.assert(
      fc.property(fc.oneof(fc.string({ maxLength: 60 }), fc.json({ maxDepth: 3 }), csvText), (text) => {
        tried++;
        expectTyped(() => loadStudy(text, '/tmp/none/study.json', () => ''));
      }),
      { numRuns: 1000 },
    );
    console.log(`study text property: ${tried} cases tried`);
  });
});
