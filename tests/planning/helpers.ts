/**
 * Shared pieces of the planning tests: a study loaded from in-memory JSON and CSV text, and the
 * study file of a liquid batch decay A -> B (first order, measured outlet concentration of A with
 * an absolute error) that the planning reference and discrimination tests start from.
 */
import { loadStudy } from '../../src/study/load';
import type { Study } from '../../src/study/types';

/** Load a study from in-memory study JSON and CSV text (the CSV is the data file 'runs.csv'). */
export function studyFromText(doc: unknown, csv: string): Study {
  return loadStudy(JSON.stringify(doc), '/virtual/study.json', () => csv).study;
}

/** The batch decay's concentrations and rate constant (in the study file's units). */
export interface BatchDecay {
  /** Initial concentration of A, in `unit`. */
  c0: number;
  /** Concentration unit of the study file ('mol/L', 'mol/m^3'). */
  unit: string;
  /** Start value of k, 1/s. */
  k: number;
  /** Absolute measurement error of CA, in `unit`. */
  sigma: number;
}

/**
 * Study file of the batch decay A -> B, r = k C_A, at 300 K: CSV columns run, t_s (s) and CA
 * (`unit`), error model 'lab'.
 */
export function batchDecayStudy({ c0, unit, k, sigma }: BatchDecay) {
  return {
    species: [{ name: 'A' }, { name: 'B' }],
    reactions: [{ id: 'r', equation: 'A -> B', rate: { form: 'power-law', basis: 'volume', rateConstant: { k: 'k' }, orders: { A: 1 } } }],
    reactor: { kind: 'batch', phase: 'liquid' },
    referenceTemperature: 300,
    data: [{
      file: 'runs.csv', layout: 'per-run',
      columns: {
        run: 'run', temperature: { value: 300, unit: 'K' }, time: { column: 't_s', unit: 's' },
        initialConcentrations: { A: { value: c0, unit }, B: { value: 0, unit } },
        measured: [{ response: 'outlet-concentration', species: 'A', column: 'CA', unit, errorModel: 'lab' }],
      },
    }],
    parameters: [{ name: 'k', value: k, unit: '1/s', lower: 1e-9, upper: 1 }],
    errorModels: { lab: { absolute: { value: sigma, unit } } },
  };
}
