/**
 * File input and output for the commands. Outputs are written atomically (a temporary file in the
 * same folder, then rename) and never replace an existing file unless --force is given.
 */
import { existsSync, mkdirSync, readFileSync, renameSync, writeFileSync, unlinkSync } from 'node:fs';
import { dirname, relative, resolve } from 'node:path';
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
 * Write `content` to `path` atomically (a temporary file in the same folder, then rename), so a
 * reader never sees a half-written file. Refuses to replace an existing file without force.
 * Returns the path written, relative to the current folder.
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
  const shown = displayPath(abs);
  written.push(shown);
  return shown;
}
