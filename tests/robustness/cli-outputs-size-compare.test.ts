/**
 * `rateloom compare`, `size` and `demo` outputs: never overwritten without --force, overwritten
 * with it, listed (stderr in text mode, "outputs" under --json), no temporary files left.
 */
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { oneJson, runMany, tmpLeftovers, workspace, type CliRun } from './cli-helpers';

let ws: ReturnType<typeof workspace>;
let compare1: CliRun;
let size1: CliRun;
let compare2: CliRun;
let size2: CliRun;
let demoRefused: CliRun;
let size3: CliRun;
let sizeBytes = '';

beforeAll(async () => {
  ws = workspace();
  [compare1, size1] = await runMany(
    [
      ['compare', 'study.json', '--out', 'out', '--json'],
      ['size', 'kinetics.json', 'plant.case.json', '--out', 'res/size.json', '--json'],
    ],
    ws.dir,
  );
  sizeBytes = existsSync(join(ws.dir, 'res/size.json')) ? readFileSync(join(ws.dir, 'res/size.json'), 'utf8') : '';
  mkdirSync(join(ws.dir, 'notdemo'));
  writeFileSync(join(ws.dir, 'notdemo', 'keep.txt'), 'mine\n');
  [compare2, size2, demoRefused] = await runMany(
    [
      ['compare', 'study.json', '--out', 'out', '--json'],
      ['size', 'kinetics.json', 'plant.case.json', '--out', 'res/size.json', '--json'],
      ['demo', '--out', 'notdemo', '--json'],
    ],
    ws.dir,
  );
  [size3] = await runMany([['size', 'kinetics.json', 'plant.case.json', '--out', 'res/size.json', '--force']], ws.dir);
  console.log('compare/size/demo output cases: 6 command lines spawned');
}, 60_000);
afterAll(() => ws?.cleanup());

describe('compare outputs', () => {
  it('writes its report and lists it under "outputs"', () => {
    expect([0, 1], compare1.stderr).toContain(compare1.code);
    expect(oneJson(compare1).outputs).toEqual({ html: 'out/study-compare.html', markdown: 'out/study-compare.md' });
  });
  it('refuses to overwrite without --force', () => {
    expect(compare2.code).toBe(2);
    expect(oneJson(compare2).error).toMatchObject({ code: 'E_EXISTS' });
  });
});

describe('size outputs', () => {
  it('writes the result file and lists it under "outputs"', () => {
    expect(size1.code, size1.stderr).toBe(0);
    const doc = oneJson(size1);
    expect(doc.outputs).toEqual({ result: 'res/size.json' });
    const { outputs: _o, ...result } = doc;
    expect(JSON.parse(sizeBytes)).toEqual(result);
  });
  it('refuses to overwrite without --force, leaving the file unchanged', () => {
    expect(size2.code).toBe(2);
    expect(oneJson(size2).error.code).toBe('E_EXISTS');
  });
  it('--force overwrites (same seed, same bytes) and text mode lists the file on stderr', () => {
    expect(size3.code, size3.stderr).toBe(0);
    expect(size3.stderr).toContain('wrote:\n  res/size.json');
    expect(readFileSync(join(ws.dir, 'res/size.json'), 'utf8')).toBe(sizeBytes);
  });
});

describe('demo outputs', () => {
  it('refuses a non-empty folder it did not create, touching nothing', () => {
    expect(demoRefused.code).toBe(2);
    const doc = oneJson(demoRefused);
    expect(doc.status).toBe('error');
    expect(doc.error.message).toContain('Fix:');
    expect(readFileSync(join(ws.dir, 'notdemo', 'keep.txt'), 'utf8')).toBe('mine\n');
  });
});

describe('atomic writes', () => {
  it('leave no temporary files behind', () => {
    expect(tmpLeftovers(ws.dir)).toEqual([]);
  });
});
