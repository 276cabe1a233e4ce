/**
 * A fixed, invented gas-phase packed-bed study for the benchmarks (not a test fixture):
 *   A + B <=> C on a catalyst, inert I, Ergun pressure drop alpha, isothermal runs at 460-540 K,
 *   reversible power law r = k (C_A C_B - C_C / K) per kg of catalyst,
 *   k = k_ref exp(-E/R (1/T - 1/T_ref)), K = K_ref exp(-dH/R (1/T - 1/T_ref)), T_ref = 500 K.
 * Four parameters (k1, E1, K1, dH1), two measured responses per run (outlet flows of A and C).
 * The data are the model's own predictions at TRUE values plus seeded Gaussian noise (1 % relative,
 * plus a small absolute floor); sigma per observation is the known noise level.
 * syntheticStudy(n) builds the Study object directly (no file I/O); the conditions of run i depend
 * only on i, so a larger study contains the smaller one as its first runs.
 */
import { buildChemistry } from '../src/chemistry/mechanism';
import type { SpeciesSpec } from '../src/chemistry/spec';
import type { ReactionSpec } from '../src/kinetics/spec';
import { GAS_CONSTANT } from '../src/core/constants';
import { makeParameter, type Parameter } from '../src/core/parameter';
import type { Observation, Study, StudyRun } from '../src/study/types';
import { StudyModel } from '../src/workflow/study-model';
import { cosineNormals } from '../src/numerics/random';

/** True parameter values (SI): k1 m6/(mol kg s), E1 J/mol, K1 m3/mol, dH1 J/mol. */
export const TRUTH = { k1: 4e-6, E1: 62_000, K1: 0.05, dH1: -45_000 } as const;
/** Starting values given to every fitter (deliberately off the truth). */
export const START = { k1: 1.5e-6, E1: 50_000, K1: 0.12, dH1: -30_000 } as const;
export const T_REF = 500;
/** Ergun pressure-drop parameter, 1/kg. */
export const ALPHA = 0.03;
export const REL_NOISE = 0.01;
export const ABS_NOISE = 1e-6;

const species: SpeciesSpec[] = [{ name: 'A' }, { name: 'B' }, { name: 'C' }, { name: 'I', inert: true }];
const reactions: ReactionSpec[] = [
  {
    id: 'r1',
    equation: 'A + B <=> C',
    rate: {
      form: 'reversible-power-law',
      basis: 'mass',
      rateConstant: { k: 'k1', activationEnergy: 'E1' },
      equilibriumConstant: { K: 'K1', enthalpy: 'dH1' },
    },
  },
];

/** Seeded normal draws (mulberry32 + Box-Muller cosine branch), shared with the tests. */
export const normals = cosineNormals;

function parameters(values: Record<string, number>): Parameter[] {
  return [
    makeParameter({ name: 'k1', value: values.k1, unit: 'm6/(mol kg s)', transform: 'log' }),
    makeParameter({ name: 'E1', value: values.E1, unit: 'J/mol' }),
    makeParameter({ name: 'K1', value: values.K1, unit: 'm3/mol', transform: 'log' }),
    makeParameter({ name: 'dH1', value: values.dH1, unit: 'J/mol' }),
  ];
}

/** Conditions of run i (deterministic in i). */
export function runConditions(i: number): StudyRun {
  const T = 460 + 10 * (i % 9); // 460..540 K
  const P = (3 + (i % 4)) * 1e5; // 3..6 bar
  const W = 1 + ((i * 7) % 11) * 0.9; // 1..10 kg
  const FA = 0.01 + 0.002 * ((i * 3) % 5);
  const FB = 0.012 + 0.003 * ((i * 5) % 4);
  const FI = 0.005 + 0.002 * (i % 3);
  return {
    id: `R${i + 1}`,
    temperature: T,
    pressure: P,
    size: W,
    feed: Float64Array.from([FA, FB, 0, FI]),
    location: { file: 'synthetic.csv', line: i + 2 },
  };
}

/** The study with n runs and noisy data generated at TRUTH (seed fixed). */
export function syntheticStudy(n = 50, seed = 2024): Study {
  const chemistry = buildChemistry(species, reactions);
  const runs = Array.from({ length: n }, (_, i) => runConditions(i));
  const observations: Observation[] = [];
  runs.forEach((run, r) => {
    for (const [s, j] of [['A', 0], ['C', 2]] as const) {
      observations.push({
        index: observations.length, runId: run.id, runIndex: r, response: 'outlet-flow', species: s, speciesIndex: j,
        value: 0, unit: 'mol/s', errorModel: 'unweighted', location: { file: 'synthetic.csv', line: r + 2, column: `F${s}` },
      });
    }
  });
  const base: Study = {
    title: `synthetic packed bed, ${n} runs`,
    studyPath: 'synthetic.study.json',
    species,
    reactions,
    chemistry,
    keyReactant: 'A',
    keyReactantIndex: 0,
    reactor: { kind: 'packed-bed', phase: 'gas', pressureDrop: { alpha: ALPHA } },
    referenceTemperature: T_REF,
    referenceTemperatureSource: 'study',
    parameters: parameters(START),
    scopes: ['k1', 'E1', 'K1', 'dH1'].map((b) => ({ base: b, scope: 'global' as const })),
    runs,
    observations,
    errorModels: {},
    candidates: [],
    replicateGroups: [],
  };
  const truthModel = new StudyModel({ ...base, parameters: parameters(TRUTH) });
  const theta = Float64Array.from(truthModel.parameters, (p) => (p.transform === 'log' ? Math.log(p.value) : p.value));
  const pred = new Float64Array(observations.length);
  if (!truthModel.predict(theta, pred)) throw new Error('synthetic study: the model failed at the true values');
  const z = normals(seed);
  return {
    ...base,
    observations: observations.map((o) => {
      const sd = REL_NOISE * Math.abs(pred[o.index]) + ABS_NOISE;
      return { ...o, value: pred[o.index] + sd * z(), sigma: sd };
    }),
  };
}

/** The same data as plain JSON for the SciPy script (SI units). */
export function studyAsJson(study: Study): unknown {
  return {
    referenceTemperature: study.referenceTemperature,
    alpha: ALPHA,
    R: GAS_CONSTANT,
    start: START,
    truth: TRUTH,
    runs: study.runs.map((r) => ({ T: r.temperature, P: r.pressure, W: r.size, feed: Array.from(r.feed!) })),
    observations: study.observations.map((o) => ({ run: o.runIndex, species: o.speciesIndex, value: o.value, sigma: o.sigma })),
  };
}
