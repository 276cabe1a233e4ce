/**
 * Reading the user's files for the path-taking entry points of the public API (loadStudy(path),
 * fitStudy(path), sizeReactor(paths)...) and for the commands. The layers below do no file I/O:
 * they are handed text or parsed JSON. A missing or unreadable file is a typed RateloomError.
 */
import { readFileSync } from 'node:fs';
import { RateloomError } from '../core/errors.js';
import { parseJsonText } from '../core/json-text.js';
import { checkArgs, is } from '../core/args.js';

/** Read a UTF-8 text file, turning a missing or unreadable file into a typed error (E_FILE). */
export function readText(path: string, what = 'file'): string {
  checkArgs('readText', [path, what], [{ name: 'path', check: is.path }, { name: 'what', check: is.text }]);
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
