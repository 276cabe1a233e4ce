/**
 * Same inputs and seed, same bytes: `fit --json` (with profiles and a multistart) and `size --json`
 * run twice give byte-identical documents, the hand-off file is byte-identical, and neither leaks
 * the absolute working folder or a time stamp.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runCli, runMany, workspace, type CliRun } from './cli-helpers';

let ws: ReturnType<typeof workspace>;
let fitA: CliRun;
let fitB: CliRun;
let sizeA: CliRun;
let sizeB: CliRun;
let handoffA = '';
let handoffB = '';
const FIT = ['fit', 'study.json', '--out', 'out', '--no-report', '--starts', '2', '--seed', '4', '--json'];
const SIZE = ['size', 'kinetics.json', 'plant.case.json', '--draws', '300', '--seed', '9', '--json'];

beforeAll(async () => {
  ws = workspace();
  [fitA, sizeA, sizeB] = await runMany([FIT, SIZE, SIZE], ws.dir, 3);
  handoffA = readFileSync(join(ws.dir, 'out', 'study-kinetics.json'), 'utf8');
  fitB = await runCli([...FIT, '--force'], ws.dir);
  handoffB = readFileSync(join(ws.dir, 'out', 'study-kinetics.json'), 'utf8');
  console.log('determinism: 4 command lines spawned (fit twice, size twice)');
}, 60_000);
afterAll(() => ws?.cleanup());

describe('deterministic output', () => {
  it('fit --json twice: identical bytes, identical hand-off file', () => {
    expect(fitA.code, fitA.stderr).toBe(0);
    expect(fitB.code, fitB.stderr).toBe(0);
    expect(fitB.stdout).toBe(fitA.stdout);
    expect(handoffB).toBe(handoffA);
  });
  it('size --json twice with the same seed: identical bytes', () => {
    expect(sizeA.code, sizeA.stderr).toBe(0);
    expect(sizeB.stdout).toBe(sizeA.stdout);
  });
  it('no absolute working folder, no time stamp, no NaN in the documents', () => {
    for (const text of [fitA.stdout, sizeA.stdout, handoffA]) {
      expect(text).not.toContain(ws.dir);
      expect(text).not.toMatch(/\d{4}-\d\d-\d\dT\d\d:\d\d/);
      expect(text).not.toMatch(/NaN|Infinity/);
    }
  });
});
