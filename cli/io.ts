/**
 * File input and output for the commands. Outputs are written atomically (a temporary file in the
 * same folder, then rename) and never replace an existing file unless --force is given.
 */
import { closeSync, existsSync, openSync, readSync } from 'node:fs';
import { relative, resolve } from 'node:path';
import { RateloomError, isRateloomError, DEFAULT_MAX_INPUT_BYTES, decodeInput, nulError, sniffBom, tooLargeError, parseJsonText } from '../src/index.js';
import { commitOutputs, type OutputFile } from './output.js';

/** The input size limit: RATELOOM_MAX_INPUT_MB (MiB) when set to a positive number, else the default. */
export function maxInputBytes(): number {
  const env = process.env.RATELOOM_MAX_INPUT_MB;
  if (env === undefined || env === '') return DEFAULT_MAX_INPUT_BYTES;
  const mb = Number(env);
  if (!(mb > 0) || !Number.isFinite(mb)) {
    throw new RateloomError('E_USAGE', `RATELOOM_MAX_INPUT_MB is '${env}', expected a positive number of MiB`, { fix: 'Set RATELOOM_MAX_INPUT_MB to a positive number, for example 1024, or unset it.' });
  }
  return Math.floor(mb * 1048576);
}

/**
 * The bytes of a file, read in chunks so that a device without end (a zero-filled one) stops at
 * the size limit, and a NUL byte in the first chunk of a file without a UTF-16 byte-order mark is
 * refused at once.
 */
function readBytes(path: string, limit: number): Uint8Array {
  const fd = openSync(path, 'r');
  try {
    const chunks: Buffer[] = [];
    let total = 0;
    for (;;) {
      const chunk = Buffer.allocUnsafe(1 << 20);
      const n = readSync(fd, chunk, 0, chunk.length, null);
      if (n === 0) break;
      const part = chunk.subarray(0, n);
      if (total === 0 && !sniffBom(part)?.encoding.startsWith('UTF-16') && part.indexOf(0) >= 0) {
        throw nulError(path, part.subarray(0, part.indexOf(0)).toString('latin1').split('\n').length);
      }
      total += n;
      if (total > limit) throw tooLargeError(path, limit);
      chunks.push(part);
    }
    return chunks.length === 1 ? chunks[0] : Buffer.concat(chunks, total);
  } finally {
    closeSync(fd);
  }
}

/**
 * Read a text file (encoding detected, see src/data/decode.ts), turning a missing, unreadable,
 * binary or oversized file into a typed error.
 */
export function readText(path: string, what = 'file'): string {
  let bytes: Uint8Array;
  try {
    bytes = readBytes(path, maxInputBytes());
  } catch (e) {
    if (isRateloomError(e)) throw e;
    const code = (e as NodeJS.ErrnoException).code;
    const reason = code === 'ENOENT' ? 'does not exist' : code === 'EISDIR' ? 'is a folder, not a file' : `cannot be read (${code ?? (e as Error).message})`;
    throw new RateloomError('E_FILE', `${what} '${path}' ${reason}`, {
      location: { file: path },
      fix: `Check the path of the ${what}; relative paths are taken from the current folder.`,
    });
  }
  return decodeInput(bytes, path, Number.POSITIVE_INFINITY).text;
}

/** Read and parse a JSON file, naming line and column of a syntax error. */
export function readJson(path: string, what = 'JSON file'): unknown {
  return parseJsonText(readText(path, what), path, what);
}

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
