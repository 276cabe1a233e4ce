/**
 * docs/model-reference.md points at code and tests: every path it names must exist, every reactor
 * kind and rate-law form of the schema must have its section, and the README must link it.
 */
import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { STUDY_SCHEMA } from '../../src/study/load';

const ROOT = join(import.meta.dirname, '..', '..');
const doc = readFileSync(join(ROOT, 'docs', 'model-reference.md'), 'utf8');

describe('docs/model-reference.md', () => {
  it('names only files that exist', () => {
    const paths = [...doc.matchAll(/`((?:src|tests)\/[^`*]+)`/g)].map((m) => m[1]);
    expect(paths.length).toBeGreaterThan(20);
    expect(paths.filter((p) => !existsSync(join(ROOT, p)))).toEqual([]);
  });

  it('covers every reactor kind and rate-law form of the schema', () => {
    const defs = (STUDY_SCHEMA as unknown as { $defs: Record<string, any> }).$defs;
    const kinds: string[] = defs.reactor.properties.kind.enum;
    const forms: string[] = defs.rateLaw.oneOf.map((f: any) => f.properties.form.const);
    for (const k of kinds) expect(doc).toContain(`| \`${k}\` |`);
    for (const f of forms) expect(doc).toContain(`| \`${f}\` |`);
  });

  it('is linked from the README and the schema', () => {
    expect(readFileSync(join(ROOT, 'README.md'), 'utf8')).toContain('(docs/model-reference.md)');
    expect(JSON.stringify(STUDY_SCHEMA)).toContain('docs/model-reference.md#custom-rate-expressions');
  });
});
