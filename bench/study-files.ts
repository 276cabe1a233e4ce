/**
 * The bench's synthetic packed-bed study (bench/synthetic-study.ts) written as the files a user
 * would give the `rateloom` command: a study file and its CSV, SI units, every number with full
 * precision (String(x) round-trips a double), the per-observation sigma in a sigma column. Used by
 * the whole-process bench (bench/process-bench.ts) so that `rateloom fit` and bench/scipy_fit.py
 * fit the same data.
 */
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Study } from '../src/study/types';
import { ALPHA, START } from './synthetic-study';

const UNITS = { k1: 'm^6/(mol kg s)', E1: 'J/mol', K1: 'm^3/mol', dH1: 'J/mol' } as const;

function csvText(study: Study): string {
  const rows = ['run,T_K,P_Pa,W_kg,FA_in,FB_in,FI_in,FA,sA,FC,sC'];
  study.runs.forEach((run, r) => {
    const obs = study.observations.filter((o) => o.runIndex === r);
    const a = obs.find((o) => o.species === 'A');
    const c = obs.find((o) => o.species === 'C');
    if (!a || !c || !run.feed) throw new Error(`bench study: run ${run.id} lacks a feed or a measured value`);
    const f = run.feed;
    rows.push([run.id, run.temperature, run.pressure, run.size, f[0], f[1], f[3], a.value, a.sigma, c.value, c.sigma].map(String).join(','));
  });
  return `${rows.join('\n')}\n`;
}

function studyDocument(study: Study, csv: string): unknown {
  const flow = (column: string) => ({ column, unit: 'mol/s' });
  return {
    title: study.title,
    species: study.species,
    reactions: study.reactions,
    keyReactant: 'A',
    reactor: { kind: 'packed-bed', phase: 'gas', pressureDrop: { alpha: { value: ALPHA, unit: '1/kg' } } },
    referenceTemperature: { value: study.referenceTemperature, unit: 'K' },
    data: [{
      file: csv,
      layout: 'per-run',
      columns: {
        run: 'run',
        temperature: { column: 'T_K', unit: 'K' },
        pressure: { column: 'P_Pa', unit: 'Pa' },
        catalystMass: { column: 'W_kg', unit: 'kg' },
        feed: { A: flow('FA_in'), B: flow('FB_in'), I: flow('FI_in') },
        measured: [
          { response: 'outlet-flow', species: 'A', column: 'FA', sigmaColumn: 'sA', unit: 'mol/s' },
          { response: 'outlet-flow', species: 'C', column: 'FC', sigmaColumn: 'sC', unit: 'mol/s' },
        ],
      },
    }],
    parameters: (Object.keys(UNITS) as (keyof typeof UNITS)[]).map((name) => ({ name, value: START[name], unit: UNITS[name] })),
  };
}

/** Write <dir>/<stem>.study.json and <dir>/<stem>.csv; returns the study file's path. */
export function writeStudyFiles(study: Study, dir: string, stem: string): string {
  const csv = `${stem}.csv`;
  writeFileSync(join(dir, csv), csvText(study));
  const path = join(dir, `${stem}.study.json`);
  writeFileSync(path, `${JSON.stringify(studyDocument(study, csv), null, 2)}\n`);
  return path;
}
