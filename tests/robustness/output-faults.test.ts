/**
 * Output faults: an --out that cannot be a folder, a --name that tries to leave --out, two runs
 * writing to the same place at once, and a lock or file another run holds. Each ends in one clear
 * line (no stack trace), nothing half-written, and the losing run says that it lost.
 */
import { existsSync, mkdirSync, readFileSync, readdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { caught } from './caught';
import { LOCK_NAME, commitOutputs, fileError } from '../../cli/output';
import { runCli, runMany, tmpLeftovers, workspace, type CliRun } from './cli-helpers';

let ws: ReturnType<typeof workspace>;
let outIsFile: CliRun;
let nameEscapes: CliRun;
let racers: CliRun[];

/** One line on stderr naming the code, no stack trace. */
function clearLine(r: CliRun, code: string): void {
  expect(r.code, r.stderr).toBe(2);
  expect(r.stderr).toContain(code);
  expect(r.stderr).not.toMatch(/\n\s+at /);
  expect(r.stderr.trim().split('\n')).toHaveLength(1);
}

beforeAll(async () => {
  ws = workspace();
  writeFileSync(join(ws.dir, 'taken.txt'), 'not a folder\n');
  mkdirSync(join(ws.dir, 'deep', 'er'), { recursive: true });
  outIsFile = await runCli(['size', 'kinetics.json', 'plant.case.json', '--report', 'taken.txt/reports'], ws.dir);
  nameEscapes = await runCli(['fit', 'study.json', '--out', 'deep/er', '--name', '../../escaped', '--no-profile', '--no-report'], ws.dir);
  racers = await runMany(
    [
      ['size', 'kinetics.json', 'plant.case.json', '--out', 'race/result.json', '--json'],
      ['size', 'kinetics.json', 'plant.case.json', '--out', 'race/result.json', '--json', '--seed', '9'],
    ],
    ws.dir,
    2,
  );
}, 120_000);
afterAll(() => ws?.cleanup());

describe('output paths', () => {
  it('an output folder whose path runs through a file is one clear E_FILE line', () => {
    clearLine(outIsFile, 'E_FILE');
    expect(outIsFile.stderr).toMatch(/not a folder|in the way/);
  });
  it('--name cannot leave --out', () => {
    clearLine(nameEscapes, 'E_USAGE');
    expect(existsSync(join(ws.dir, 'escaped-kinetics.json'))).toBe(false);
    expect(readdirSync(join(ws.dir, 'deep', 'er'))).toEqual([]);
  });
});

describe('two runs with the same --out', () => {
  it('exactly one wins; the other exits 2 saying nothing was written; the file is whole', () => {
    const codes = racers.map((r) => r.code).sort();
    expect(codes).toEqual([0, 2]);
    const loser = racers.find((r) => r.code === 2)!;
    const said = loser.stdout + loser.stderr; // under --json the error is the JSON document
    expect(said).toMatch(/E_EXISTS/);
    expect(said).toMatch(/lost and wrote nothing|already exists; nothing was written/);
    const winner = racers.find((r) => r.code === 0)!;
    const onDisk = JSON.parse(readFileSync(join(ws.dir, 'race', 'result.json'), 'utf8'));
    const { outputs, ...shown } = JSON.parse(winner.stdout);
    expect(outputs.result).toBe(join('race', 'result.json'));
    expect(onDisk).toEqual(shown);
    expect(tmpLeftovers(ws.dir)).toEqual([]);
    expect(existsSync(join(ws.dir, 'race', LOCK_NAME))).toBe(false);
  });
});

describe('the write transaction', () => {

  it('a lock held by a live process stops this run, which says it lost', () => {
    const dir = join(ws.dir, 'locked');
    mkdirSync(dir);
    writeFileSync(join(dir, LOCK_NAME), String(process.pid));
    const e = caught(() => commitOutputs([{ path: join(dir, 'a.json'), content: '{}' }], false, (p) => p));
    expect(e.problem).toMatch(/this run \(process \d+\) lost and wrote nothing/);
    expect(existsSync(join(dir, 'a.json'))).toBe(false);
  });
  it('a stale lock of a dead process is taken over', () => {
    const dir = join(ws.dir, 'stale');
    mkdirSync(dir);
    writeFileSync(join(dir, LOCK_NAME), '2147483646');
    commitOutputs([{ path: join(dir, 'a.json'), content: '{}' }], false, (p) => p);
    expect(readFileSync(join(dir, 'a.json'), 'utf8')).toBe('{}');
    expect(existsSync(join(dir, LOCK_NAME))).toBe(false);
  });
  it('a file created by another run meanwhile is never replaced, and this run removes its own', () => {
    const dir = join(ws.dir, 'meanwhile');
    mkdirSync(dir);
    writeFileSync(join(dir, 'b.md'), 'the other run\n');
    const e = caught(() => commitOutputs([{ path: join(dir, 'a.html'), content: 'mine' }, { path: join(dir, 'b.md'), content: 'mine' }], false, (p) => p));
    expect(e.problem).toMatch(/created by another run .* lost and wrote nothing/);
    expect(readFileSync(join(dir, 'b.md'), 'utf8')).toBe('the other run\n');
    expect(existsSync(join(dir, 'a.html'))).toBe(false);
    expect(tmpLeftovers(dir)).toEqual([]);
  });
  it('file-system errors name the cause in one line', () => {
    const full = fileError(Object.assign(new Error('ENOSPC: no space left on device'), { code: 'ENOSPC' }), 'out/x.json', 'write');
    expect(full.problem).toBe("cannot write 'out/x.json': the disk is full; nothing was written");
    const ro = fileError(Object.assign(new Error('x'), { code: 'EROFS' }), 'out', 'create the folder');
    expect(ro.problem).toMatch(/read-only/);
  });
});
