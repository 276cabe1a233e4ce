/**
 * The causes of bad input and faults listed in the robustness issue, one per row, each mapped to
 * the regression test that covers it (tests are named after the class of input, not the number).
 * This test keeps the table true: every file it names exists and holds the named test.
 *
 * | #  | cause                                                        | file                          |
 * |----|--------------------------------------------------------------|-------------------------------|
 * | 1  | report of a run the model cannot evaluate                    | report-failed-run             |
 * | 2  | temperature of 1e308 K widening the covered range            | input-guards                  |
 * | 3  | quadratic replicate grouping (timing: npm run bench, (k))    | input-guards                  |
 * | 4  | the same CSV listed twice                                    | input-guards                  |
 * | 5  | two fits racing for the same --out                           | output-faults                 |
 * | 6  | zero flow, all-zero feed, negative pressure-drop parameter   | input-guards                  |
 * | 7  | JSON nested 10,000 deep                                      | input-guards, json-text       |
 * | 8  | parameter unit of the wrong dimension                        | input-guards                  |
 * | 9  | binary data file, size limit                                 | input-guards, csv-bytes-fuzz  |
 * | 10 | unit with 20,000 nested parentheses                          | input-guards                  |
 * | 11 | --out naming a file, a full device, a read-only parent       | output-faults                 |
 * | 12 | numeric options out of range (--draws 1e12, --starts 1e9)    | cli-numeric-options           |
 * | 13 | Latin-1 and UTF-16 files                                     | input-guards, csv-bytes-fuzz  |
 * | 14 | semicolons and decimal commas                                | input-guards, csv-bytes-fuzz  |
 * | 15 | reaction orders naming a foreign species                     | input-guards                  |
 * | 16 | keys such as constructor or __proto__                        | input-guards, documents-fuzz  |
 * | 17 | hand-off edited to a rate constant of 1e300                  | handoff-numbers               |
 * | 18 | library API called with null or a wrong type                 | api-arguments                 |
 * | 19 | data paths leaving the study folder                          | input-guards                  |
 * | 20 | --name ../../x                                               | output-faults, documents-fuzz |
 * | 21 | partial outputs under final names after a kill               | output-kill                   |
 * Generated inputs per class: CSV bytes (csv-bytes-fuzz), study JSON and case files and output
 * paths (documents-fuzz, study-fuzz), unit strings (unit-strings-fuzz, input-guards), numeric options
 * (cli-numeric-options), API arguments (api-arguments), hand-off numbers (handoff-numbers).
 * RFC 4180 quoting: tests/data/csv-rfc4180.test.ts.
 */
import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';

const CASES: [number, string, string][] = [
  [1, 'report-failed-run', 'shows the runs as not computed instead of crashing'],
  [2, 'input-guards', 'a temperature far outside physics rejects its row and leaves the covered range alone'],
  [3, 'input-guards', '200,000 runs in 24 condition groups are grouped'],
  [4, 'input-guards', 'the same CSV file listed twice is refused'],
  [5, 'output-faults', 'exactly one wins; the other exits 2 saying nothing was written; the file is whole'],
  [6, 'input-guards', 'a zero volumetric flow and an all-zero feed reject their rows'],
  [6, 'input-guards', 'a negative pressure-drop parameter is refused'],
  [7, 'input-guards', 'nesting 10,000 levels deep is E_JSON, not a stack overflow'],
  [8, 'input-guards', "a parameter's unit must match the dimension its rate law needs"],
  [9, 'input-guards', 'a NUL byte is refused at once with its line'],
  [9, 'input-guards', 'a file above the size limit is refused'],
  [10, 'input-guards', '20,000 nested parentheses are E_UNIT, not a stack overflow'],
  [11, 'output-faults', 'an output folder whose path runs through a file is one clear E_FILE line'],
  [11, 'output-faults', 'file-system errors name the cause in one line'],
  [12, 'cli-numeric-options', 'the cases seen: --draws 1e12 and --starts 1e9 are refused with their ranges'],
  [13, 'input-guards', 'encodings are detected and named as in the WHATWG Encoding Standard'],
  [14, 'input-guards', 'semicolon-separated files with decimal commas load like the comma file'],
  [14, 'input-guards', 'a decimal comma in a comma-separated file is named as the likely cause'],
  [15, 'input-guards', 'reaction orders naming a species outside the reaction are refused'],
  [16, 'input-guards', 'names that shadow object built-ins are refused'],
  [17, 'handoff-numbers', 'a rate constant of 1e300'],
  [18, 'api-arguments', 'each entry point with null as every argument names the function and the argument'],
  [19, 'input-guards', 'a data path leaving the study folder is refused unless allowed'],
  [20, 'output-faults', '--name cannot leave --out'],
  [21, 'output-kill', 'every output under its final name is whole'],
  [21, 'output-kill', 'no file in src/ or cli/ writes a file except cli/output.ts'],
];

describe('every cause of the robustness issue has its regression test', () => {
  it('covers causes 1 to 21', () => {
    expect(new Set(CASES.map((c) => c[0]))).toEqual(new Set(Array.from({ length: 21 }, (_, i) => i + 1)));
  });
  it.each(CASES)('cause %i: %s.test.ts holds "%s"', (_n, file, title) => {
    const path = join(import.meta.dirname, `${file}.test.ts`);
    expect(existsSync(path)).toBe(true);
    expect(readFileSync(path, 'utf8')).toContain(title);
  });
});
