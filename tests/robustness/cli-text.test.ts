/**
 * Text mode on the real command line: an error goes to stderr with 'Fix:' and exit 2, nothing on
 * stdout; valid runs of check and simulate exit 0.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runMany, workspace, type CliRun } from './cli-helpers';

const ERRORS: string[][] = [
  ['check', 'none.json'],
  ['simulate', 'bad.json'],
  ['fit', 'study.json', '--starts', 'many'],
  ['compare', 'study.json', '--bogus'],
  ['size', 'kinetics.json'],
];
let ws: ReturnType<typeof workspace>;
let errors: CliRun[];
let valid: CliRun[];

beforeAll(async () => {
  ws = workspace();
  const all = await runMany([...ERRORS, ['check', 'study.json'], ['simulate', 'study.json']], ws.dir, 3);
  errors = all.slice(0, ERRORS.length);
  valid = all.slice(ERRORS.length);
  console.log(`text-mode cases: ${all.length} command lines spawned`);
}, 60_000);
afterAll(() => ws?.cleanup());

describe('CLI text mode', () => {
  it.each(ERRORS.map((a, i) => [a.join(' '), i] as const))('%s: exit 2, the error with a fix on stderr, stdout empty', (_a, i) => {
    const r = errors[i];
    expect(r.code).toBe(2);
    expect(r.stderr).toContain('Fix:');
    expect(r.stdout).toBe('');
  });

  it('valid runs of check and simulate exit 0 and print to stdout', () => {
    for (const r of valid) {
      expect(r.code, r.stderr).toBe(0);
      expect(r.stdout.length).toBeGreaterThan(100);
    }
  });
});
