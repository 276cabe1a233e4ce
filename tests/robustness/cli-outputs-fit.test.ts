/**
 * `rateloom fit` outputs: written atomically (no temporary file left), never overwritten without
 * --force, overwritten with it, listed (stderr in text mode, "outputs" under --json, paths relative
 * to the current folder), and a refused run writes nothing at all (not even its other outputs).
 */
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { oneJson, runCli, runMany, tmpLeftovers, workspace, type CliRun } from './cli-helpers';

let ws: ReturnType<typeof workspace>;
let first: CliRun;
let again: CliRun;
let partial: CliRun;
let forced: CliRun;
const before: Record<string, string> = {};
const afterRefusal: Record<string, string> = {};
const outs = ['out/study-kinetics.json', 'out/study-fit.html', 'out/study-fit.md'];

beforeAll(async () => {
  ws = workspace();
  first = await runCli(['fit', 'study.json', '--out', 'out', '--no-profile', '--json'], ws.dir);
  for (const f of outs) before[f] = existsSync(join(ws.dir, f)) ? readFileSync(join(ws.dir, f), 'utf8') : '';
  mkdirSync(join(ws.dir, 'out2'));
  writeFileSync(join(ws.dir, 'out2', 'x-fit.md'), 'my notes\n');
  [again, partial] = await runMany(
    [
      ['fit', 'study.json', '--out', 'out', '--no-profile', '--json'],
      ['fit', 'study.json', '--out', 'out2', '--name', 'x', '--no-profile', '--json'],
    ],
    ws.dir,
  );
  for (const f of outs) afterRefusal[f] = readFileSync(join(ws.dir, f), 'utf8');
  forced = await runCli(['fit', 'study.json', '--out', 'out', '--no-profile', '--no-report', '--force'], ws.dir);
  console.log('fit output cases: 4 command lines spawned');
}, 60_000);
afterAll(() => ws?.cleanup());

describe('fit outputs', () => {
  it('a first run writes the hand-off and the report and lists them, relative to the current folder', () => {
    expect(first.code, first.stderr).toBe(0);
    const doc = oneJson(first);
    expect(doc.outputs).toEqual({ handoff: outs[0], html: outs[1], markdown: outs[2] });
    for (const f of outs) expect(before[f].length, f).toBeGreaterThan(100);
    expect(first.stdout).not.toContain(ws.dir);
  });

  it('a second run without --force is refused (exit 2, E_EXISTS) and leaves the files as they were', () => {
    expect(again.code).toBe(2);
    const doc = oneJson(again);
    expect(doc.error.code).toBe('E_EXISTS');
    expect(doc.error.message).toContain('Fix:');
    expect(doc.error.message).toContain('--force');
    for (const f of outs) expect(afterRefusal[f], f).toBe(before[f]);
  });

  it('a refused run writes none of its outputs (the hand-off is not written when the report exists)', () => {
    expect(partial.code).toBe(2);
    expect(oneJson(partial).error.problem).toContain('out2/x-fit.md');
    expect(existsSync(join(ws.dir, 'out2', 'x-kinetics.json'))).toBe(false);
    expect(existsSync(join(ws.dir, 'out2', 'x-fit.html'))).toBe(false);
    expect(readFileSync(join(ws.dir, 'out2', 'x-fit.md'), 'utf8')).toBe('my notes\n');
  });

  it('--force overwrites, and text mode lists what it wrote on stderr', () => {
    expect(forced.code, forced.stderr).toBe(0);
    expect(forced.stderr).toContain('wrote:\n  out/study-kinetics.json\n');
    expect(forced.stdout).toContain('Status: converged');
    // Same inputs: the hand-off is byte-identical after the overwrite.
    expect(readFileSync(join(ws.dir, outs[0]), 'utf8')).toBe(before[outs[0]]);
  });

  it('leaves no temporary files behind', () => {
    expect(tmpLeftovers(ws.dir)).toEqual([]);
  });
});
