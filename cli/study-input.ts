/**
 * Reading a study file and its CSV sources from disk for the commands (the library itself does no
 * file I/O: it is handed a reader).
 */
import { basename } from 'node:path';
import { loadStudy, type LoadOptions, type LoadedStudy } from '../src/index.js';
import { readText } from './io.js';

/** Set by the global --allow-data-outside flag: accept data files outside the study's folder. */
let allowDataOutside = false;

export function setAllowDataOutside(on: boolean): void {
  allowDataOutside = on;
}

/** The loader options every command passes (strict as asked, data-path confinement as set). */
export function studyLoadOptions(strict = false): LoadOptions {
  return { ...(strict ? { strict: true } : {}), ...(allowDataOutside ? { allowDataOutside: true } : {}) };
}

export function readStudy(studyPath: string, strict = false): LoadedStudy {
  const text = readText(studyPath, 'study file');
  return loadStudy(text, studyPath, (abs) => readText(abs, 'data file'), studyLoadOptions(strict));
}

/** A file-name stem from a study path: 'lab/pbr.study.json' -> 'pbr'. */
export function studyStem(studyPath: string): string {
  return basename(studyPath).replace(/\.json$/i, '').replace(/\.study$/i, '') || 'study';
}
