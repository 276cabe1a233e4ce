/**
 * File input and output for the commands. Outputs are written atomically (a temporary file in the
 * same folder, then rename) and never replace an existing file unless --force is given.
 */
import { existsSync } from 'node:fs';
import { relative, resolve } from 'node:path';
import { RateloomError } from '../src/index.js';
import { commitOutputs, type OutputFile } from './output.js';

// Reading input files is the library's (src/api/files.ts): one reader, one size limit
// (RATELOOM_MAX_INPUT_MB), one set of refusals for the commands and for loadStudy(path) & co.
export { readJson, readText } from '../src/index.js';

export interface WriteOptions {
  /** Replace an existing file; default false. */
  force?: boolean;
}

/** Files written by the current command (relative to the current folder), for the closing list. */
export const written: string[] = [];

/** A path as shown in messages and JSON: relative to the current folder, so output is reproducible. */
export function displayPath(path: string): string {
  return relative(process.cwd(), resolve(path)) || '.';
}

/**
 * Refuse, before any work is done, when one of the outputs of a command already exists and force
 * is not given, so that a command never writes some of its outputs and then stops at another.
 */
export function assertWritable(paths: readonly string[], opts: WriteOptions = {}): void {
  if (opts.force) return;
  const existing = paths.filter((p) => existsSync(resolve(p)));
  if (existing.length) {
    throw new RateloomError('E_EXISTS', `output${existing.length > 1 ? 's' : ''} ${existing.map((p) => `'${displayPath(p)}'`).join(', ')} already exist${existing.length > 1 ? '' : 's'}; nothing was written`, {
      location: { file: displayPath(existing[0]) },
      fix: 'Pass --force to overwrite, or choose another output folder or name (--out, --name).',
    });
  }
}

/**
 * Write several outputs as one transaction (cli/output.ts): temporary names, then each put in
 * place; without force a file is created exclusively, so a second run never replaces or mixes
 * with the first. Returns the paths written, relative to the current folder.
 */
export function writeAll(files: readonly OutputFile[], opts: WriteOptions = {}): string[] {
  if (!opts.force) assertWritable(files.map((f) => f.path));
  commitOutputs(files, !!opts.force, displayPath);
  const shown = files.map((f) => displayPath(f.path));
  written.push(...shown);
  return shown;
}

/** Write one output atomically (see writeAll). Returns the path written, relative to the current folder. */
export function writeAtomic(path: string, content: string | Uint8Array, opts: WriteOptions = {}): string {
  return writeAll([{ path, content }], opts)[0];
}

/**
 * A file-name stem given on the command line (--name): a plain name, so that outputs stay in
 * their folder. Refuses path separators, '..', a leading '.', control characters and empty names.
 */
export function checkStem(stem: string, flag = '--name'): string {
  if (stem === '' || /[/\\\u0000-\u001f]/.test(stem) || stem.startsWith('.') || stem.length > 120) {
    throw new RateloomError('E_USAGE', `${flag} '${stem.slice(0, 60)}' is not a plain file name`, {
      path: [flag],
      fix: `Give ${flag} a name without folders (no '/', '\\' or leading '.'), at most 120 characters; put the folder in --out.`,
    });
  }
  return stem;
}
