/**
 * `rateloom new` on three invented lab exports (wide, stacked, one file per run): the skeleton
 * loads as written and, with only the rate law filled in (the `rates` option, as `--rate` gives
 * it), reaches a trustworthy fit whose estimates agree with the recorded true values the data were
 * generated from (datasets-demo/layouts/truth.json; the check is against the known truth of a
 * simulation: each estimate within 4 standard errors).
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { LAYOUTS_DIR, generateLayouts, readLayoutsTruth, type LayoutTruth } from '../../datasets-demo/layouts/generate';
import { compoundToSI, fitStudy, loadStudy, studySkeleton } from '../../src/index';

const R = 8.314462618; // J/(mol K), exact (SI Brochure, 9th ed.)
const truth = readLayoutsTruth();
const read = (f: string) => ({ file: f, text: readFileSync(join(LAYOUTS_DIR, f), 'utf8') });

describe('invented layouts', () => {
  it('regenerate byte for byte from truth.json', () => {
    for (const f of generateLayouts()) expect(readFileSync(join(LAYOUTS_DIR, f.path), 'utf8'), f.path).toBe(f.content);
  });

  const cases: [string, string[], LayoutTruth, string, string][] = [
    ['wide', ['wide/bench-runs.csv'], truth.wide, 'per-run', 'packed-bed'],
    ['stacked', ['stacked/tank-runs.csv'], truth.stacked, 'stacked', 'stirred-tank'],
    ['run-file', ['B1', 'B2', 'B3', 'B4'].map((b) => `run-files/${b}.csv`), truth.runFile, 'run-file', 'batch'],
  ];
  it.each(cases)('%s: skeleton + rate law -> trustworthy fit near the truth', (name, files, t, layout, kind) => {
    const studyPath = join(LAYOUTS_DIR, `${name}.study.json`);
    const sk = studySkeleton(files.map(read), { studyPath, rates: [t.rate] });
    expect(sk.layout).toBe(layout);
    expect(sk.reactor.kind).toBe(kind);
    expect(sk.todo.some((x) => /PLACEHOLDER reaction/.test(x.what) && x.line !== undefined)).toBe(true);
    const { study, report } = loadStudy(sk.text, studyPath, (abs) => readFileSync(abs, 'utf8'));
    expect(report.rowsRejected).toBe(0);
    const r = fitStudy(study, { profile: false });
    expect(r.fit.verdict.trustworthy).toBe(true);
    expect(r.fit.success).toBe(true);
    const [k, E] = r.fit.parameters;
    // True k at the fit's reference temperature (Arrhenius), SI.
    const Tref = study.referenceTemperature;
    const T0 = compoundToSI(t.referenceTemperature.value, t.referenceTemperature.unit).value;
    const Etrue = compoundToSI(t.parameters.E.value, t.parameters.E.unit).value;
    const kTrue = compoundToSI(t.parameters.k.value, t.parameters.k.unit).value * Math.exp((-Etrue / R) * (1 / Tref - 1 / T0));
    expect(Math.abs(k.value - kTrue)).toBeLessThan(4 * (k.stdError as number));
    expect(Math.abs(E.value - Etrue)).toBeLessThan(4 * (E.stdError as number));
  }, 60000);
});
