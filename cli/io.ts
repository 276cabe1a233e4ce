/**
 * File input and output for the commands. Outputs are written atomically (a temporary file in the
 * same folder, then rename) and never replace an existing file unless --force is given.
 */
import { existsSync, mkdirSync, readFileSync, renameSync, writeFileSync, unlinkSync } from 'node:fs';
import { dirname, resolve } from 'node:path';
import { RateloomError } from '../src/core/errors';
import { parseJsonText } from '../src/core/json-text';

/** Read a text file, turning a missing or unreadable file into a typed error. */
export function readText(path: string, what = 'file'): string {
  try {
    return readFileSync(path, 'utf8');
  } catch (e) {
    const reason = (e as NodeJS.ErrnoException).code === 'ENOENT' ? 'does not exist' : `cannot be read (${(e as Error).message})`;
    throw new RateloomError('E_FILE', `${what} '${path}' ${reason}`, {
      location: { file: path },
      fix: `Check the path of the ${what}; relative paths are taken from the current folder.`,
    });
  }
}

/** Read and parse a JSON file, naming line and column of a syntax error. */
export function readJson(path: string, what = 'JSON file'): unknown {
  return parseJsonText(readText(path, what), path, what);
}

export interface WriteOptions {
  /** Replace an existing file; default false. */
  force?: boolean;
}

/** Files written by the current command, for the closing list. */
export const written: string[] = [];

/**
 * Write `content` to `path` atomically. Refuses to replace an existing file without force.
 * Returns the absolute path written.
 */
export function writeAtomic(path: string, content: string | Uint8Array, opts: WriteOptions = {}): string {
  const abs = resolve(path);
  if (existsSync(abs) && !opts.force) {
    throw new RateloomError('E_EXISTS', `output '${path}' already exists`, {
      location: { file: path },
      fix: 'Pass --force to overwrite it, or choose another output path with --out.',
    });
  }
  mkdirSync(dirname(abs), { recursive: true });
  const tmp = `${abs}.${process.pid}.${Date.now()}.tmp`;
  try {
    writeFileSync(tmp, content);
    renameSync(tmp, abs);
  } catch (e) {
    try {
      unlinkSync(tmp);
    } catch {
      /* temporary file may not exist */
    }
    throw new RateloomError('E_FILE', `cannot write '${path}' (${(e as Error).message})`, {
      location: { file: path },
      fix: 'Check that the folder is writable and the disk is not full.',
    });
  }
  written.push(abs);
  return abs;
}
