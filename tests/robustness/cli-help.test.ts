/** --help of every command shows an example and the exit codes, and exits 0. */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runMany, workspace, type CliRun } from './cli-helpers';

const COMMANDS = ['check', 'simulate', 'fit', 'compare', 'size', 'demo'];
let ws: ReturnType<typeof workspace>;
let help: CliRun[];

beforeAll(async () => {
  ws = workspace();
  const all = await runMany(COMMANDS.map((c) => [c, '--help']), ws.dir, 3);
  help = all;
  console.log(`--help cases: ${all.length} command lines spawned`);
}, 60_000);
afterAll(() => ws?.cleanup());

describe('CLI --help', () => {
  it.each(COMMANDS.map((c, i) => [c, i] as const))('%s --help shows an example and exits 0', (_c, i) => {
    expect(help[i].code).toBe(0);
    expect(help[i].stdout).toContain('Example');
    expect(help[i].stdout).toMatch(/Exit codes?:?.*0/i);
  });
});
