/**
 * Reading the user's files, one piece of code for the path-taking entry points of the public API
 * (loadStudy(path), fitStudy(path), sizeReactor(paths)...) and for the commands (cli/io.ts
 * re-exports it). The layers below do no file I/O: they are handed text or parsed JSON.
 * A missing, unreadable, binary or oversized file is a typed RateloomError; the text's encoding is
 * detected (src/data/decode.ts).
 */
import { closeSync, openSync, readSync } from 'node:fs';
import { RateloomError, isRateloomError } from '../core/errors.js';
import { parseJsonText } from '../core/json-text.js';
import { checkArgs, is } from '../core/args.js';
import { DEFAULT_MAX_INPUT_BYTES, decodeInput, nulError, sniffBom, tooLargeError } from '../data/decode.js';

/** The input size limit: RATELOOM_MAX_INPUT_MB (MiB) when set to a positive number, else DEFAULT_MAX_INPUT_BYTES. */
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
 * Read a text file (encoding detected, size limit maxInputBytes()), turning a missing,
 * unreadable, binary or oversized file into a typed error.
 */
export function readText(path: string, what = 'file'): string {
  checkArgs('readText', [path, what], [{ name: 'path', check: is.path }, { name: 'what', check: is.text }]);
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

/** Run `f`; a RateloomError it throws without a file location gets `file` as its location. */
export function withFile<T>(file: string, f: () => T): T {
  try {
    return f();
  } catch (e) {
    if (e instanceof RateloomError && !e.location) {
      throw new RateloomError(e.code, e.problem, { path: e.path, fix: e.fix, location: { file }, ...(e.details ? { details: e.details } : {}) });
    }
    throw e;
  }
}
