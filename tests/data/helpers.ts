import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { loadStudy, type LoadOptions } from '../../src/study';

export const FIXTURES = join(import.meta.dirname, 'fixtures');
export const STUDY_PATH = join(FIXTURES, 'study.json');

/** The fixture study as an object, to vary in tests. */
export function baseStudy(): any {
  return JSON.parse(readFileSync(STUDY_PATH, 'utf8'));
}

/** Load a study object against the fixture folder, with optional extra in-memory files. */
export function load(study: unknown, files: Record<string, string> = {}, opts: LoadOptions = {}) {
  return loadStudy(JSON.stringify(study), STUDY_PATH, (abs) => {
    const name = abs.slice(FIXTURES.length + 1);
    return files[name] ?? readFileSync(abs, 'utf8');
  }, opts);
}

/** The fixture study with its per-run source replaced by `file` and no long source. */
export function withRunsFile(file: string): any {
  const s = baseStudy();
  s.data = [{ ...s.data[0], file }];
  return s;
}
