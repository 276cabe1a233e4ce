/**
 * Shared by the lab tests: the demo's gas-analyser study on a campaign CSV, fitted either as the
 * study says (fraction ratios to the N2 standard) or after converting the fractions to outlet
 * flows by hand, F_i = F_N2,0 y_i / y_N2 (common practice), as a spreadsheet would, each flow then
 * given a relative error of its own.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { DEMO_DIR } from '../../datasets-demo/generate';
import { loadStudy } from '../../src/study/load';
import type { Study } from '../../src/study/types';

export const GC_STUDY = join(DEMO_DIR, 'gc/gc.study.json');
export const gcRaw = (): any => JSON.parse(readFileSync(GC_STUDY, 'utf8'));
const SPECIES = ['C2H6', 'O2', 'C2H4', 'CO2'];

/** Load a variant of the gc study on in-memory CSV text. */
export function loadGc(raw: unknown, csv: string): Study {
  return loadStudy(JSON.stringify(raw), GC_STUDY, () => csv).study;
}

/** The campaign CSV with hand-converted outlet flows (mmol/min) appended: F_i = F_N2,0 y_i / y_N2. */
export function withHandFlows(csv: string): string {
  const lines = csv.split('\n');
  const h = lines.findIndex((l) => l.startsWith('run,'));
  const head = lines[h].split(',');
  const col = (n: string) => head.indexOf(n);
  return lines
    .map((l, i) => {
      if (i < h || l === '') return l;
      if (i === h) return `${l},${SPECIES.map((s) => `F_${s}`).join(',')}`;
      const c = l.split(',');
      const fN2 = Number(c[col('F_N2_in')]);
      const yN2 = Number(c[col('y_N2')]);
      return `${l},${SPECIES.map((s) => ((fN2 * Number(c[col(`y_${s}`)])) / yN2).toFixed(6)).join(',')}`;
    })
    .join('\n');
}

/** The hand-converted study: outlet flows with a relative error per flow; the lab file only gives the time on stream. */
export function handFlowStudy(relative: number): any {
  const raw = gcRaw();
  raw.data[0].columns.measured = SPECIES.map((s) => ({ response: 'outlet-flow', species: s, column: `F_${s}`, unit: 'mmol/min', errorModel: 'flows' }));
  raw.errorModels = { ...raw.errorModels, flows: { relative } };
  raw.labData = { file: 'runs.csv', run: 'run', fractions: { N2: 'y_N2' }, unit: '%', basis: 'dry', removed: ['H2O'], standard: 'N2', fit: [], timeOnStream: { column: 'tos_h', unit: 'h' } };
  return raw;
}
