/**
 * Shared command plumbing: exit codes, --json output and error printing, identical for every
 * command. Exit codes: 0 success, 1 ran but the result is not trustworthy, 2 bad input or usage.
 */
import type { Command, CommanderError } from 'commander';
import { ERROR_CODES, isRateloomError } from '../src/index.js';
import { written } from './io.js';
import { endOpenLine, type LineStream, writeLines, writePartial, writeWrittenList } from './stderr-lines.js';

export const EXIT_OK = 0;
export const EXIT_UNTRUSTWORTHY = 1;
export const EXIT_BAD_INPUT = 2;

export interface CommandOutput {
  /** The one JSON document printed under --json. */
  json: unknown;
  /** Human-readable text printed otherwise (to stdout). */
  text: string;
  /** True when the result can be trusted (exit 0), false for exit 1. */
  trustworthy: boolean;
}

/** Stable JSON: same input, same bytes (keys in insertion order, non-finite numbers as null). */
export function toJson(value: unknown): string {
  return JSON.stringify(
    value,
    (_k, v) => {
      if (typeof v === 'number' && !Number.isFinite(v)) return null;
      if (v instanceof Float64Array) return Array.from(v);
      return v;
    },
    2,
  );
}

/**
 * Run a command body, print its output in the chosen mode and set the exit code. Bad input
 * (RateloomError) exits 2 with the error; anything else is a bug and exits 2 with its message.
 */
export async function runCommand(json: boolean, body: () => Promise<CommandOutput> | CommandOutput): Promise<void> {
  try {
    const out = await body();
    if (json) process.stdout.write(toJson(out.json) + '\n');
    else {
      endOpenLine(process.stderr);
      if (out.text) process.stdout.write(out.text.endsWith('\n') ? out.text : out.text + '\n');
      writeWrittenList(process.stderr, written);
    }
    process.exitCode = out.trustworthy ? EXIT_OK : EXIT_UNTRUSTWORTHY;
  } catch (e) {
    printError(json, e);
    process.exitCode = EXIT_BAD_INPUT;
  }
}

/** Print an error as every command does: one JSON document under --json, else one line on stderr. */
export function printError(json: boolean, e: unknown): void {
  if (isRateloomError(e)) {
    if (json) process.stdout.write(toJson({ status: 'error', error: e.toJSON() }) + '\n');
    else writeLines(process.stderr, `error [${e.code}] ${e.message}`);
  } else {
    const err = e instanceof Error ? e : new Error(String(e));
    const fix = ERROR_CODES.E_INTERNAL;
    if (json) process.stdout.write(toJson({ status: 'error', error: { code: 'E_INTERNAL', message: `${err.message}. Fix: ${fix}`, problem: err.message, fix, path: '' } }) + '\n');
    else writeLines(process.stderr, `internal error: ${err.stack ?? err.message}\nFix: ${fix}`);
  }
}

/** Progress reporting on stderr (or `stream`), only when attached to a terminal and not in --json mode. */
export function progressReporter(json: boolean, label: string, stream: LineStream = process.stderr): ((done: number, total: number) => void) | undefined {
  if (json || !stream.isTTY) return undefined;
  let last = -1;
  return (done, total) => {
    const pct = Math.floor((100 * done) / Math.max(total, 1));
    if (pct === last) return;
    last = pct;
    const width = 30;
    const filled = Math.round((width * pct) / 100);
    writePartial(stream, `\r${label} [${'#'.repeat(filled)}${'.'.repeat(width - filled)}] ${pct}%`);
    if (done >= total) endOpenLine(stream);
  };
}

/**
 * Usage errors found by the flag parser (unknown flag, missing argument, ...) follow the same rules
 * as every other error: exit 2, a 'Fix:' telling what to do, and under --json exactly one JSON
 * document on stdout (the parser's own text is then kept off the output).
 * @param argv the raw command line (process.argv)
 */
export function configureUsageErrors(program: Command, argv: readonly string[] = process.argv): void {
  const json = argv.includes('--json');
  const command = argv.slice(2).find((a) => !a.startsWith('-'));
  const fix = `Check the command line; run 'rateloom ${command ?? '<command>'} --help' for the options and an example.`;
  program.showHelpAfterError(json ? false : `Fix: ${fix}`);
  program.configureOutput({
    writeErr: (s) => {
      if (!json) writeLines(process.stderr, s);
    },
  });
  program.exitOverride((err: CommanderError) => {
    if (err.code === 'commander.helpDisplayed' || err.code === 'commander.version' || err.code === 'commander.help') process.exit(EXIT_OK);
    if (json) {
      const problem = err.message.replace(/^error: /, '');
      process.stdout.write(toJson({ status: 'error', error: { code: 'E_USAGE', message: `${problem}. Fix: ${fix}`, problem, fix, path: '' } }) + '\n');
    }
    process.exit(EXIT_BAD_INPUT);
  });
}
