import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { locatePath } from '../../src/study/locate';
import { loadStudy } from '../../src/study/load';
import { RateloomError } from '../../src/core/errors';
import { STUDY_PATH } from '../data/helpers';

describe('locatePath', () => {
  const text = '{\n  "a": 1,\n  "b": [\n    { "c": "x" },\n    { "c": "y", "d": [1, 2] }\n  ],\n  "s": "q\\"}"\n}';
  it('finds keys and array items', () => {
    expect(locatePath(text, ['a'])).toEqual({ line: 2, column: 3 });
    expect(locatePath(text, ['b', 1, 'c'])).toEqual({ line: 5, column: 7 });
    expect(locatePath(text, ['b', 1, 'd', 1])).toEqual({ line: 5, column: 26 });
    expect(locatePath(text, ['b', 1, 'zz'])).toEqual({ line: 5, column: 5 }); // deepest existing ancestor
    expect(locatePath(text, ['s'])).toEqual({ line: 7, column: 3 });
    expect(locatePath(text, [])).toBeUndefined();
  });
  it('study errors carry the line of the misspelt field', () => {
    const text = readFileSync(STUDY_PATH, 'utf8').replace('"keyReactant"', '"keyReactnt"');
    const line = text.split('\n').findIndex((l) => l.includes('keyReactnt')) + 1;
    try {
      loadStudy(text, STUDY_PATH, (f) => readFileSync(f, 'utf8'));
      expect.unreachable();
    } catch (e) {
      const err = e as RateloomError;
      expect(err.code).toBe('E_UNKNOWN_FIELD');
      expect(err.details?.closest).toBe('keyReactant');
      expect(err.location?.line).toBe(line);
    }
  });
});
