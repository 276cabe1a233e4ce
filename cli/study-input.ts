/**
 * Reading a study file and its CSV sources from disk for the commands (the library itself does no
 * file I/O: it is handed a reader).
 */
import { basename } from 'node:path';
import { loadStudy } from '../src/study/load';
import type { LoadedStudy } from '../src/study/types';
import { readText } from './io';

export function readStudy(studyPath: string, strict = false): LoadedStudy {
  const text = readText(studyPath, 'study file');
  return loadStudy(text, studyPath, (abs) => readText(abs, 'data file'), strict ? { strict: true } : {});
}

/** A file-name stem from a study path: 'lab/pbr.study.json' -> 'pbr'. */
export function studyStem(studyPath: string): string {
  return basename(studyPath).replace(/\.json$/i, '').replace(/\.study$/i, '') || 'study';
}
