/**
 * Reading the CSV sources a study names: each path is taken relative to the study's folder and
 * must stay inside it (unless the caller allows otherwise), the same file may be listed only once,
 * and messages show the path as written in the study, never the resolved one.
 */
import { dirname, isAbsolute, relative, resolve, sep } from 'node:path';
import { RateloomError, isRateloomError } from '../core/errors.js';
import { readCsv, type CsvTable } from '../data/csv.js';
import type { AnySourceSpec } from '../data/spec.js';

/** How data paths may be resolved. */
export interface SourcePathOptions {
  /** Accept data files outside the study's folder (absolute paths or '..'); default false. */
  allowDataOutside?: boolean;
}

/** True when `abs` is `dir` itself or inside it. */
function inside(dir: string, abs: string): boolean {
  const rel = relative(dir, abs);
  return rel === '' || (!rel.startsWith(`..${sep}`) && rel !== '..' && !isAbsolute(rel));
}

/** The absolute path of data source i, confined to the study folder unless allowed. */
export function sourcePath(file: string, i: number, studyPath: string, opts: SourcePathOptions): string {
  const baseDir = resolve(dirname(studyPath));
  const abs = isAbsolute(file) ? resolve(file) : resolve(baseDir, file);
  if (!opts.allowDataOutside && !inside(baseDir, abs)) {
    throw new RateloomError('E_VALUE', `data file '${file}' is outside the study's folder`, {
      path: ['data', i, 'file'],
      fix: 'Put the CSV file in the study\'s folder (or below it) and give its relative path, or pass --allow-data-outside to accept it.',
    });
  }
  return abs;
}

/** Read one source; any failure names the file as written in the study. */
function readOne(file: string, i: number, abs: string, readFile: (absPath: string) => string): string {
  try {
    return readFile(abs);
  } catch (e) {
    const shown = (t: string) => t.split(abs).join(file);
    const code = isRateloomError(e) ? e.code : 'E_FILE';
    const why = isRateloomError(e) ? shown(e.problem) : `data file '${file}' cannot be read (${shown((e as Error).message)})`;
    throw new RateloomError(code, why, {
      path: ['data', i, 'file'],
      location: { file },
      fix: !isRateloomError(e) || /does not exist|cannot be read|is a folder/.test(e.problem) ? "Check the data file path; it is taken relative to the study file's folder." : e.fix,
    });
  }
}

/** Read and parse every source of a study, refusing repeats and paths outside its folder. */
export function readSources(data: readonly AnySourceSpec[], studyPath: string, readFile: (absPath: string) => string, opts: SourcePathOptions = {}): CsvTable[] {
  const firstAt = new Map<string, number>();
  return data.map((src, i) => {
    const abs = sourcePath(src.file, i, studyPath, opts);
    const before = firstAt.get(abs);
    if (before !== undefined) {
      throw new RateloomError('E_VALUE', `data file '${src.file}' is listed twice (data[${before}] and data[${i}]); its rows would be counted twice`, {
        path: ['data', i, 'file'],
        fix: 'List each CSV file once; put all its columns in one source entry.',
      });
    }
    firstAt.set(abs, i);
    return readCsv(readOne(src.file, i, abs, readFile), src.file);
  });
}
