/**
 * Writing a command's outputs as one transaction, so that a kill, a full disk or a second run
 * writing to the same place never leaves a half-written file or a mix of two runs:
 *   1. create the folders (errors become RateloomError E_FILE, never a stack trace);
 *   2. take a lock file in the first output's folder (exclusive creation, 'wx'); a lock held by a
 *      live process means another run is writing there: this run stops and says it lost;
 *   3. write every file under a temporary name in its own folder;
 *   4. put each in place: without --force by exclusive creation (a hard link, which fails when
 *      the name exists, so a file another run created meanwhile is never replaced), with --force
 *      by rename (atomic replacement);
 *   5. remove the temporary files and the lock, whatever happened.
 */
import { closeSync, copyFileSync, constants, linkSync, mkdirSync, openSync, readFileSync, renameSync, unlinkSync, writeFileSync, writeSync } from 'node:fs';
import { dirname, resolve } from 'node:path';
import { RateloomError } from '../src/index.js';

/** One output file. */
export interface OutputFile {
  path: string;
  content: string | Uint8Array;
}

/** Name of the lock file taken in an output folder while a run puts its files in place. */
export const LOCK_NAME = '.rateloom-write.lock';

function removeQuietly(path: string): void {
  try {
    unlinkSync(path);
  } catch {
    /* already gone */
  }
}

/** A file-system error on `path` as a one-line E_FILE with the likely cause. */
export function fileError(e: unknown, path: string, doing: string): RateloomError {
  const code = (e as NodeJS.ErrnoException).code ?? '';
  const why: Record<string, string> = {
    ENOTDIR: 'a part of the path is a file, not a folder',
    EEXIST: 'a file is in the way of a folder',
    EACCES: 'permission denied',
    EPERM: 'permission denied',
    EROFS: 'the file system is read-only',
    ENOSPC: 'the disk is full',
    EDQUOT: 'the disk quota is exhausted',
    EISDIR: 'it is a folder',
  };
  return new RateloomError('E_FILE', `cannot ${doing} '${path}': ${why[code] ?? (code || (e as Error).message)}; nothing was written`, {
    location: { file: path },
    fix: 'Choose an output folder you can write to (--out), with free space, and whose path names folders only.',
  });
}

/** Create `dir` and its parents, as a typed error on failure. */
export function ensureFolder(dir: string, shown = dir): void {
  try {
    mkdirSync(dir, { recursive: true });
  } catch (e) {
    throw fileError(e, shown, 'create the folder');
  }
}

/** True when process `pid` is alive (signal 0 only checks). */
function alive(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch (e) {
    return (e as NodeJS.ErrnoException).code === 'EPERM';
  }
}

/** Take the lock in `dir` (a stale lock of a dead process is removed once); returns its path. */
function takeLock(dir: string, shownDir: string): string {
  const lock = resolve(dir, LOCK_NAME);
  for (let attempt = 0; attempt < 2; attempt++) {
    try {
      const fd = openSync(lock, 'wx');
      writeSync(fd, String(process.pid));
      closeSync(fd);
      return lock;
    } catch (e) {
      if ((e as NodeJS.ErrnoException).code !== 'EEXIST') throw fileError(e, shownDir, 'write into');
      const owner = Number(readFileSync(lock, 'utf8'));
      if (Number.isInteger(owner) && owner > 0 && alive(owner)) {
        throw new RateloomError('E_EXISTS', `another rateloom run (process ${owner}) is writing into '${shownDir}' at this moment; this run (process ${process.pid}) lost and wrote nothing`, {
          location: { file: shownDir },
          fix: 'Give each run its own --out folder or --name, or run them one after the other.',
        });
      }
      removeQuietly(lock);
    }
  }
  throw new RateloomError('E_EXISTS', `cannot take the write lock in '${shownDir}'`, { location: { file: shownDir } });
}

/** Put `tmp` in place at `abs`: rename with force, else exclusive creation. False when abs exists. */
function place(tmp: string, abs: string, force: boolean): boolean {
  if (force) {
    renameSync(tmp, abs);
    return true;
  }
  try {
    linkSync(tmp, abs);
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    if (code === 'EEXIST') return false;
    if (code !== 'EPERM' && code !== 'ENOTSUP' && code !== 'EOPNOTSUPP') throw e;
    try {
      copyFileSync(tmp, abs, constants.COPYFILE_EXCL); // file systems without hard links
    } catch (c) {
      if ((c as NodeJS.ErrnoException).code === 'EEXIST') return false;
      throw c;
    }
  }
  return true;
}

/** The error of a run that found one of its outputs created by another run meanwhile. */
function lostRace(shown: string): RateloomError {
  return new RateloomError('E_EXISTS', `output '${shown}' was created by another run while this one (process ${process.pid}) was working; this run lost and wrote nothing`, {
    location: { file: shown },
    fix: 'Give each run its own --out folder or --name, or pass --force to replace the other run\'s outputs.',
  });
}

/**
 * Write all `files` as one transaction (see the file comment). `shownOf` turns a path into the
 * form shown in messages. Returns nothing; throws RateloomError, after removing what this run
 * wrote, when any file cannot be put in place.
 */
export function commitOutputs(files: readonly OutputFile[], force: boolean, shownOf: (p: string) => string): void {
  if (!files.length) return;
  for (const f of files) ensureFolder(dirname(resolve(f.path)), shownOf(dirname(resolve(f.path))));
  const lock = takeLock(dirname(resolve(files[0].path)), shownOf(dirname(resolve(files[0].path))));
  const temps: string[] = [];
  const placed: string[] = [];
  try {
    for (const f of files) {
      const abs = resolve(f.path);
      const tmp = resolve(dirname(abs), `.${abs.slice(dirname(abs).length + 1)}.${process.pid}.tmp`);
      temps.push(tmp);
      try {
        writeFileSync(tmp, f.content, { flag: 'wx' });
      } catch (e) {
        throw fileError(e, shownOf(abs), 'write');
      }
    }
    files.forEach((f, i) => {
      const abs = resolve(f.path);
      let ok: boolean;
      try {
        ok = place(temps[i], abs, force);
      } catch (e) {
        throw fileError(e, shownOf(abs), 'write');
      }
      if (!ok) throw lostRace(shownOf(abs));
      placed.push(abs);
    });
  } catch (e) {
    if (!force) for (const p of placed) removeQuietly(p);
    throw e;
  } finally {
    for (const t of temps) removeQuietly(t);
    removeQuietly(lock);
  }
}
