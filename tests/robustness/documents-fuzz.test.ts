/**
 * Generated documents: random structural mutations of a study file and of a production case
 * (a field deleted, replaced by any JSON value, buried in deep nesting, a hostile key added, a list
 * item doubled), and random output names and paths. Property: the study loads (no NaN in it) or
 * the case sizes (with the cautions), or the run ends in one RateloomError line with a field path
 * or file location and a fix; an output is written whole or not at all, with no temporary file
 * left behind. The field-by-field sweep of hostile values is in study-fuzz.test.ts.
 */
import { mkdtempSync, readFileSync, readdirSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import fc from 'fast-check';
import { afterAll, describe, expect, it } from 'vitest';
import { isRateloomError, sizeReactor } from '../../src/index';
import { checkStem, writeAll } from '../../cli/io';
import { baseStudy, load } from '../data/helpers';

type Path = (string | number)[];

/** Every path into a JSON document. */
function paths(v: unknown, at: Path = []): Path[] {
  const here = at.length ? [at] : [];
  if (Array.isArray(v)) return [...here, ...v.flatMap((x, i) => paths(x, [...at, i]))];
  if (v && typeof v === 'object') return [...here, ...Object.entries(v).flatMap(([k, x]) => paths(x, [...at, k]))];
  return here;
}

const HOSTILE_KEYS = ['__proto__', 'constructor', 'toString', 'prototype', 'hasOwnProperty', 'valueOf'];

/** One structural edit of a JSON document. */
const edit = (docPaths: Path[]) =>
  fc.oneof(
    fc.record({ kind: fc.constant('delete' as const), path: fc.constantFrom(...docPaths) }),
    fc.record({ kind: fc.constant('replace' as const), path: fc.constantFrom(...docPaths), value: fc.jsonValue({ maxDepth: 3 }) }),
    fc.record({ kind: fc.constant('nest' as const), path: fc.constantFrom(...docPaths), depth: fc.integer({ min: 2, max: 400 }) }),
    fc.record({ kind: fc.constant('hostileKey' as const), path: fc.constantFrom(...docPaths), key: fc.constantFrom(...HOSTILE_KEYS), value: fc.jsonValue({ maxDepth: 1 }) }),
    fc.record({ kind: fc.constant('double' as const), path: fc.constantFrom(...docPaths) }),
  );
type Edit = { kind: 'delete' | 'replace' | 'nest' | 'hostileKey' | 'double'; path: Path; value?: unknown; depth?: number; key?: string };

/** The document as JSON text after the edits (text, so that '__proto__' is a real key). */
function applied(doc: unknown, edits: Edit[]): string {
  const root = structuredClone(doc) as any;
  const holes: [string, string][] = [];
  for (const e of edits) {
    let parent = root;
    for (const k of e.path.slice(0, -1)) parent = parent?.[k];
    if (!parent || typeof parent !== 'object') continue;
    const last = e.path[e.path.length - 1];
    if (e.kind === 'delete') Array.isArray(parent) ? parent.splice(Number(last), 1) : delete parent[last];
    else if (e.kind === 'replace') parent[last] = e.value;
    else if (e.kind === 'nest') parent[last] = JSON.parse('['.repeat(e.depth!) + JSON.stringify(parent[last] ?? null) + ']'.repeat(e.depth!));
    else if (e.kind === 'double' && Array.isArray(parent[last])) parent[last].push(structuredClone(parent[last][0] ?? null));
    else if (e.kind === 'hostileKey' && parent[last] && typeof parent[last] === 'object' && !Array.isArray(parent[last])) {
      const marker = `__hostile_${holes.length}__`;
      parent[last][marker] = e.value;
      holes.push([JSON.stringify(marker), JSON.stringify(e.key)]);
    }
  }
  let text = JSON.stringify(root);
  for (const [m, k] of holes) text = text.replace(m, k);
  return text;
}

/** A RateloomError of one line with a place (field path or file) and a fix; anything else fails. */
function typed(e: unknown): void {
  if (!isRateloomError(e)) throw e;
  expect(e.message.split('\n')).toHaveLength(1);
  expect(e.path.length > 0 || e.location?.file !== undefined).toBe(true);
  expect(e.message).toContain('Fix:');
}

/** True when a NaN hides anywhere in a loaded value. */
function hasNaN(v: unknown, seen = new Set<unknown>()): boolean {
  if (typeof v === 'number') return Number.isNaN(v);
  if (ArrayBuffer.isView(v)) return Array.from(v as Float64Array).some((x) => Number.isNaN(x));
  if (!v || typeof v !== 'object' || seen.has(v)) return false;
  seen.add(v);
  return Object.values(v).some((x) => typeof x !== 'function' && hasNaN(x, seen));
}

describe('generated study files', () => {
  const study = baseStudy();
  it('each loads without NaN or ends in one typed error line with a place and a fix', () => {
    const seen = { loaded: 0, refused: 0 };
    fc.assert(
      fc.property(fc.array(edit(paths(study)), { minLength: 1, maxLength: 3 }), (edits) => {
        const text = applied(study, edits as Edit[]);
        try {
          const r = load(JSON.parse(text));
          expect(hasNaN(r.study)).toBe(false);
          seen.loaded++;
        } catch (e) {
          typed(e);
          seen.refused++;
        }
      }),
      { numRuns: 300, seed: 7 },
    );
    console.log(`generated study files: ${seen.loaded} loaded, ${seen.refused} refused`);
    expect(seen.refused).toBeGreaterThan(0);
  });
});

describe('generated production cases', () => {
  const KIN = 'tests/design/fixtures/bed.kinetics.json';
  const kase = JSON.parse(readFileSync('tests/design/fixtures/bed.case.json', 'utf8'));
  it('each sizes with the cautions or ends in one typed error line', () => {
    const seen = { sized: 0, refused: 0 };
    fc.assert(
      fc.property(fc.array(edit(paths(kase)), { minLength: 1, maxLength: 3 }), (edits) => {
        const doc = JSON.parse(applied(kase, edits as Edit[]));
        try {
          const r = sizeReactor(KIN, doc, { draws: 0 });
          expect(r.cautions.length).toBeGreaterThan(0);
          seen.sized++;
        } catch (e) {
          typed(e);
          seen.refused++;
        }
      }),
      { numRuns: 150, seed: 8 },
    );
    console.log(`generated cases: ${seen.sized} sized, ${seen.refused} refused`);
    expect(seen.refused).toBeGreaterThan(0);
  });
});

describe('generated output names and paths', () => {
  const dir = mkdtempSync(join(tmpdir(), 'rateloom-outfuzz-'));
  afterAll(() => rmSync(dir, { recursive: true, force: true }));
  const name = fc.oneof(
    fc.string({ maxLength: 30 }),
    fc.constantFrom('..', '.', '../x', 'a/../../b', '/etc/passwd', 'a\\b', 'x\0y', 'nul', 'con', ' ', 'x'.repeat(300), '\u00e9t\u00e9', '\u{1F4A5}'),
  );
  it('--name is a plain file name or refused with E_USAGE', () => {
    fc.assert(
      fc.property(name, (n) => {
        try {
          const stem = checkStem(n);
          expect(stem).toBe(n);
          expect(stem).not.toMatch(/[/\\\0]/);
          expect(stem.startsWith('.')).toBe(false);
        } catch (e) {
          typed(e);
        }
      }),
      { numRuns: 500, seed: 20 },
    );
  });
  it('an output under any name is written whole or not at all; no temporary file stays', () => {
    let k = 0;
    fc.assert(
      fc.property(name, fc.boolean(), (n, force) => {
        const sub = join(dir, `case${k++}`);
        const path = join(sub, n);
        const content = `{"n": ${k}}\n`;
        try {
          const [shown] = writeAll([{ path, content }], { force });
          expect(readFileSync(path, 'utf8')).toBe(content);
          expect(shown.length).toBeGreaterThan(0);
        } catch (e) {
          typed(e);
        }
        const left = (d: string): string[] => {
          try {
            return readdirSync(d, { withFileTypes: true }).flatMap((x) => (x.isDirectory() ? left(join(d, x.name)) : /\.tmp$|\.rateloom-write\.lock$/.test(x.name) ? [x.name] : []));
          } catch {
            return [];
          }
        };
        expect(left(sub)).toEqual([]);
      }),
      { numRuns: 150, seed: 21 },
    );
  });
});
