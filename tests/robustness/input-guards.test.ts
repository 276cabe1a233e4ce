/**
 * Regression tests, one per class of bad input found by trying rateloom as a new user would:
 * each must end in a typed RateloomError (or a rejected row) naming the field, never a crash,
 * a silent acceptance or a quadratic slowdown.
 */
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import { caught } from './caught';
import { parseJsonText } from '../../src/core/json-text';
import { readCsv } from '../../src/data/csv';
import { decodeInput } from '../../src/data/decode';
import { findReplicates, sameConditions } from '../../src/data/validation';
import type { MappedRun } from '../../src/data/mapping';
import { unitFor } from '../../src/units';
import { FIXTURES, baseStudy, load } from '../data/helpers';

const RUNS = readFileSync(`${FIXTURES}/runs.csv`, 'utf8');


/** The fixture study with only its per-run source, read from `file`. */
function perRunOnly(file = 'runs.csv'): any {
  const s = baseStudy();
  s.data = [{ ...s.data[0], file }];
  return s;
}

/** runs.csv with one cell of row R1 replaced. */
function withCell(header: string, value: string): string {
  const lines = RUNS.split('\n');
  const h = lines.findIndex((l) => l.startsWith('run,'));
  const col = lines[h].split(',').indexOf(header);
  const r = lines.findIndex((l) => l.startsWith('R1,'));
  const cells = lines[r].split(',');
  cells[col] = value;
  lines[r] = cells.join(',');
  return lines.join('\n');
}

describe('physical ranges of lab data', () => {
  it('a temperature far outside physics rejects its row and leaves the covered range alone', () => {
    const { study, report } = load(perRunOnly('hot.csv'), { 'hot.csv': withCell('T_C', '1e308') });
    const bad = report.rejections.find((r) => r.column === 'T_C');
    expect(bad?.reason).toBe('out-of-range');
    expect(bad?.message).toMatch(/outside the accepted range/);
    expect(Math.max(...study.runs.map((r) => r.temperature))).toBeLessThan(600);
  });
  it('a zero volumetric flow and an all-zero feed reject their rows', () => {
    const { report } = load(perRunOnly('zero.csv'), { 'zero.csv': withCell('FA0', '0').replace('R1,c1,200,1.0,0.5,0,4.0,1.0', 'R1,c1,200,1.0,0.5,0,0,0') });
    expect(report.rejections.some((r) => r.line === 4 && /feed is zero/.test(r.message))).toBe(true);
  });
  it('a negative pressure-drop parameter is refused', () => {
    const s = baseStudy();
    s.reactor.pressureDrop.alpha.value = -0.05;
    const e = caught(() => load(s));
    expect(e.code).toBe('E_VALUE');
    expect(e.path).toEqual(['reactor', 'pressureDrop', 'alpha', 'value']);
    expect(e.location?.line).toBeGreaterThan(0);
  });
});

describe('replicate grouping', () => {
  /** Plain pairwise union over all runs: the definition findReplicates must match. */
  function bruteForce(runs: MappedRun[], tol: number): string[][] {
    const parent = runs.map((_, i) => i);
    const find = (i: number): number => (parent[i] === i ? i : (parent[i] = find(parent[i])));
    for (let a = 0; a < runs.length; a++) for (let b = a + 1; b < runs.length; b++) if (sameConditions(runs[a], runs[b], tol)) parent[find(b)] = find(a);
    const by = new Map<number, string[]>();
    runs.forEach((r, i) => by.set(find(i), [...(by.get(find(i)) ?? []), r.id]));
    return [...by.values()].filter((g) => g.length > 1);
  }
  it('hashing exact repeats gives the same groups as comparing every pair', () => {
    const runs: MappedRun[] = [];
    for (let i = 0; i < 600; i++) {
      const c = i % 7;
      const T = 500 + 10 * c + (i % 50 === 0 ? 500 * 5e-7 : 0);
      runs.push({ id: `r${i}`, temperature: T, size: 1e-3, pressure: 1e5, feed: Float64Array.from([1e-4 * (1 + (c % 2)), 0]), location: { file: 'f', line: i + 2 } });
    }
    expect(findReplicates(runs, 1e-6).map((g) => g.runIds)).toEqual(bruteForce(runs, 1e-6));
  });
  it('200,000 runs in 24 condition groups are grouped (near-linear; the timing lives in the bench)', () => {
    const runs: MappedRun[] = [];
    for (let i = 0; i < 200_000; i++) runs.push({ id: `r${i}`, temperature: 450 + (i % 24), size: 1e-3, pressure: 1e5, location: { file: 'f', line: i + 2 } });
    const groups = findReplicates(runs, 1e-6);
    expect(groups).toHaveLength(24);
    expect(groups[0].runIds).toHaveLength(Math.ceil(200_000 / 24));
  });
});

describe('data sources named in a study', () => {
  it('the same CSV file listed twice is refused', () => {
    const s = perRunOnly();
    s.data.push({ ...s.data[0], file: './runs.csv' });
    const e = caught(() => load(s));
    expect(e.code).toBe('E_VALUE');
    expect(e.problem).toMatch(/listed twice/);
  });
  it('a data path leaving the study folder is refused unless allowed, and the resolved path is never shown', () => {
    const e = caught(() => load(perRunOnly('../../../etc/passwd')));
    expect(e.problem).toMatch(/outside the study's folder/);
    expect(e.message).not.toContain(resolve(FIXTURES, '../../../etc/passwd'));
    const missing = caught(() => load(perRunOnly('nope/missing.csv')));
    expect(missing.message).not.toContain(resolve(FIXTURES, 'nope'));
    expect(missing.message).toContain('nope/missing.csv');
    const allowed = caught(() => load(perRunOnly('../nowhere.csv'), {}, { allowDataOutside: true }));
    expect(allowed.problem).not.toMatch(/outside the study's folder/);
  });
});

describe('study JSON structure', () => {
  it('nesting 10,000 levels deep is E_JSON, not a stack overflow', () => {
    const deep = '{"a":'.repeat(10_000) + '1' + '}'.repeat(10_000);
    const e = caught(() => parseJsonText(deep, 'deep.json', 'study file'));
    expect(e.code).toBe('E_JSON');
    expect(e.location).toMatchObject({ file: 'deep.json', line: 1 });
    expect(caught(() => parseJsonText('['.repeat(10_000), 'a.json')).code).toBe('E_JSON');
  });
  it('names that shadow object built-ins are refused (keys and name fields)', () => {
    const s = baseStudy();
    s.species[0].name = 'constructor';
    expect(caught(() => load(s)).problem).toMatch(/built-in property/);
    const t = baseStudy();
    t.reactions[0].rate.orders = JSON.parse('{"__proto__": 1, "A": 1}');
    const e = caught(() => load(t));
    expect(e.path).toEqual(['reactions', 0, 'rate', 'orders', '__proto__']);
    const u = baseStudy();
    u.parameters[0].name = 'toString';
    expect(caught(() => load(u)).code).toBe('E_VALUE');
  });
  it('reaction orders naming a species outside the reaction are refused', () => {
    const s = baseStudy();
    s.reactions[0].rate.orders = { A: 1, H2: 0.5, N2: 1 };
    const e = caught(() => load(s));
    expect(e.code).toBe('E_UNKNOWN_SPECIES');
    expect(e.path).toEqual(['reactions', 0, 'rate', 'orders', 'N2']);
  });
  it("a parameter's unit must match the dimension its rate law needs", () => {
    const s = baseStudy();
    s.parameters[1].unit = 'bar';
    const e = caught(() => load(s));
    expect(e.code).toBe('E_UNIT');
    expect(e.path).toEqual(['parameters', 1, 'unit']);
    expect(e.problem).toMatch(/activation energy/);
  });
});

describe('unit strings', () => {
  it('20,000 nested parentheses are E_UNIT, not a stack overflow; long units are cut in messages', () => {
    const e = caught(() => unitFor('volume', '('.repeat(20_000) + 'm3' + ')'.repeat(20_000)));
    expect(e.code).toBe('E_UNIT');
    expect(e.message.length).toBeLessThan(600);
    expect(unitFor('volume', '((m3))').factor).toBe(1);
  });
});

describe('CSV bytes and text', () => {
  it('a NUL byte is refused at once with its line', () => {
    const e = caught(() => decodeInput(new Uint8Array([97, 10, 98, 0, 0]), 'z.csv'));
    expect(e.problem).toMatch(/NUL byte \(line 2\)/);
    expect(caught(() => readCsv('a,b\n1,\u0000', 'z.csv')).code).toBe('E_CSV');
  });
  it('a file above the size limit is refused', () => {
    expect(caught(() => decodeInput(new Uint8Array(11), 'big.csv', 10)).problem).toMatch(/larger than the input limit/);
  });
  it('encodings are detected and named as in the WHATWG Encoding Standard', () => {
    // Latin-1 bytes: 0xB0 is the degree sign, 0xB5 the micro sign (windows-1252 table, WHATWG).
    const latin = decodeInput(Uint8Array.from([0x54, 0x5f, 0xb0, 0x43, 0x2c, 0xb5, 0x6d, 0x6f, 0x6c]), 'l.csv');
    expect(latin).toEqual({ text: 'T_\u00b0C,\u00b5mol', encoding: 'windows-1252' });
    const le = decodeInput(Uint8Array.from([0xff, 0xfe, 0x61, 0, 0x2c, 0, 0xb0, 0]), 'u.csv');
    expect(le).toEqual({ text: 'a,\u00b0', encoding: 'UTF-16LE' });
    const be = decodeInput(Uint8Array.from([0xfe, 0xff, 0, 0x61, 0, 0x2c, 0, 0xb0]), 'u.csv');
    expect(be).toEqual({ text: 'a,\u00b0', encoding: 'UTF-16BE' });
    expect(decodeInput(Uint8Array.from([0xef, 0xbb, 0xbf, 0xc2, 0xb0]), 'u8.csv')).toEqual({ text: '\u00b0', encoding: 'UTF-8' });
  });
  it('semicolon-separated files with decimal commas load like the comma file', () => {
    const euro = RUNS.split('\n').map((l) => (l.startsWith('#') ? l : l.replace(/,/g, ';').replace(/(\d)\.(\d)/g, '$1,$2'))).join('\n');
    expect(readCsv(euro, 'e.csv').delimiter).toBe(';');
    const a = load(perRunOnly('euro.csv'), { 'euro.csv': euro }).study.runs;
    const b = load(perRunOnly()).study.runs;
    expect(a.map((r) => [r.temperature, r.pressure, r.size, ...(r.feed ?? [])])).toEqual(b.map((r) => [r.temperature, r.pressure, r.size, ...(r.feed ?? [])]));
  });
  it('a decimal comma in a comma-separated file is named as the likely cause', () => {
    const { report } = load(perRunOnly('dc.csv'), { 'dc.csv': withCell('W_g', '0,5') });
    expect(report.rejections.find((r) => r.line === 4)?.message).toMatch(/decimal commas split cells/);
  });
  it('a record longer than the limit is E_CSV with its line', () => {
    const e = caught(() => readCsv(`a,b\n1,${'9'.repeat((1 << 20) + 5)}\n`, 'h.csv'));
    expect(e.code).toBe('E_CSV');
    expect(e.location?.line).toBe(2);
  });
});
