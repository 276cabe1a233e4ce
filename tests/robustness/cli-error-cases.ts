/**
 * Bad input on the real command line, under --json: every command exits 2 and prints exactly one
 * JSON document with status 'error', a code, and a message that says how to fix it ('Fix:');
 * a JSON syntax error names its line and column.
 */
/* Shared by cli-errors-*.test.ts (one file per pair of commands keeps each file fast). */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { oneJson, runMany, workspace, type CliRun } from './cli-helpers';

export const ERROR_CASES: { command: string; what: string; args: string[]; code: string }[] = [
  { command: 'check', what: 'missing file', args: ['check', 'none.json'], code: 'E_FILE' },
  { command: 'check', what: 'malformed JSON', args: ['check', 'bad.json'], code: 'E_JSON' },
  { command: 'check', what: 'unknown flag', args: ['check', 'study.json', '--bogus'], code: 'E_USAGE' },
  { command: 'check', what: 'missing argument', args: ['check'], code: 'E_USAGE' },
  { command: 'simulate', what: 'missing file', args: ['simulate', 'none.json'], code: 'E_FILE' },
  { command: 'simulate', what: 'malformed JSON', args: ['simulate', 'study.json', '--params', 'bad.json'], code: 'E_JSON' },
  { command: 'simulate', what: 'unknown flag', args: ['simulate', 'study.json', '--profiles'], code: 'E_USAGE' },
  { command: 'simulate', what: 'bad flag value', args: ['simulate', 'study.json', '--candidate', 'nope'], code: 'E_VALUE' },
  { command: 'fit', what: 'missing file', args: ['fit', 'none.json'], code: 'E_FILE' },
  { command: 'fit', what: 'malformed JSON', args: ['fit', 'bad.json'], code: 'E_JSON' },
  { command: 'fit', what: 'unknown flag', args: ['fit', 'study.json', '--start', '3'], code: 'E_USAGE' },
  { command: 'fit', what: 'bad flag value', args: ['fit', 'study.json', '--level', '2'], code: 'E_USAGE' },
  { command: 'compare', what: 'missing file', args: ['compare', 'none.json'], code: 'E_FILE' },
  { command: 'compare', what: 'malformed JSON', args: ['compare', 'bad.json'], code: 'E_JSON' },
  { command: 'compare', what: 'unknown flag', args: ['compare', 'study.json', '--model', 'x'], code: 'E_USAGE' },
  { command: 'compare', what: 'missing flag value', args: ['compare', 'study.json', '--name'], code: 'E_USAGE' },
  { command: 'size', what: 'missing file', args: ['size', 'none.json', 'plant.case.json'], code: 'E_FILE' },
  { command: 'size', what: 'malformed JSON', args: ['size', 'kinetics.json', 'bad.json'], code: 'E_JSON' },
  { command: 'size', what: 'unknown flag', args: ['size', 'kinetics.json', 'plant.case.json', '--drawz', '5'], code: 'E_USAGE' },
  { command: 'size', what: 'bad flag value', args: ['size', 'kinetics.json', 'plant.case.json', '--draws', '1.5'], code: 'E_USAGE' },
];

/** The error cases of `commands`, each spawned once with --json right after the command name. */
export function errorSuite(commands: string[]): void {
  const cases = ERROR_CASES.filter((c) => commands.includes(c.command));
  let ws: ReturnType<typeof workspace>;
  let runs: CliRun[];

  beforeAll(async () => {
    ws = workspace();
    runs = await runMany(cases.map((c) => [c.args[0], '--json', ...c.args.slice(1)]), ws.dir, 3);
    console.log(`CLI error cases under --json (${commands.join(', ')}): ${runs.length} command lines spawned`);
  }, 60_000);
  afterAll(() => ws?.cleanup());

  describe(`CLI errors under --json: ${commands.join(', ')}`, () => {
    it.each(cases.map((c, i) => [c.command, c.what, i] as const))('%s, %s: exit 2, one JSON error document with a fix', (_cmd, _what, i) => {
      const r = runs[i];
      const c = cases[i];
      expect(r.code, r.stderr).toBe(2);
      const doc = oneJson(r);
      expect(doc.status).toBe('error');
      expect(doc.error.code).toBe(c.code);
      expect(doc.error.message).toContain('Fix:');
      expect(doc.error.fix.length).toBeGreaterThan(10);
      if (c.code === 'E_JSON') {
        expect(doc.error.location).toMatchObject({ file: 'bad.json', line: 3, column: 8 });
        expect(doc.error.message).toContain('line 3, column 8');
      }
      if (c.code === 'E_FILE') expect(doc.error.location.file).toBe(c.args.find((a) => a.startsWith('none')));
    });
  });
}
