/**
 * The verdict rule table (src/estimation/verdict.ts): one row per status, each built from a
 * trustworthy base by breaking exactly one rule, plus the order of the rules and the exit code.
 */
import { describe, expect, it } from 'vitest';
import { exitCodeOf } from '../../src/core/verdict';
import { decideFitVerdict, type FitVerdictInput, type FitVerdictStatus } from '../../src/estimation/verdict';

const base = (): FitVerdictInput => ({
  solverStatus: 'converged-ftol',
  iterations: 7,
  evaluated: true,
  maxAbsPredicted: 2,
  maxAbsMeasured: 2.1,
  parameters: [
    { name: 'k', value: 1e-3, internal: Math.log(1e-3), log: true, linear: [0.9e-3, 1.1e-3], profile: [0.9e-3, 1.1e-3], profileOpen: false },
    { name: 'E', value: 8e4, internal: 8e4, log: false, linear: [7.9e4, 8.1e4] },
  ],
  p: 2,
  dof: 18,
  sigmaKnown: true,
  covariance: true,
  nullNames: [],
  singularRatio: 0.3,
  chiSquare: 17,
  chiSquarePValue: 0.52,
  lackOfFit: null,
  worst: [3, 1],
});

const ROWS: { status: FitVerdictStatus; why: string; change: (x: FitVerdictInput) => void }[] = [
  { status: 'converged', why: 'every rule holds', change: () => {} },
  { status: 'converged', why: 'the gradient test held at the start (the start is a stationary point)', change: (x) => { x.solverStatus = 'converged-gtol'; x.iterations = 0; } },
  { status: 'converged', why: 'relative weights: no chi-square test, any scale', change: (x) => { x.sigmaKnown = false; x.chiSquare = 1e6; x.chiSquarePValue = null; } },
  { status: 'model-failure', why: 'the model fails at the estimate', change: (x) => { x.evaluated = false; } },
  { status: 'model-failure', why: 'the search stopped on model failures near the estimate', change: (x) => { x.solverStatus = 'model-failure'; } },
  { status: 'not-converged', why: 'iteration limit', change: (x) => { x.solverStatus = 'max-iterations'; } },
  { status: 'not-converged', why: 'evaluation limit', change: (x) => { x.solverStatus = 'max-evaluations'; } },
  { status: 'no-search', why: 'the step-size test after 0 iterations', change: (x) => { x.solverStatus = 'converged-xtol'; x.iterations = 0; } },
  { status: 'no-search', why: 'the SSR test after 0 iterations', change: (x) => { x.solverStatus = 'converged-ftol'; x.iterations = 0; } },
  { status: 'degenerate', why: 'the model is identically zero', change: (x) => { x.maxAbsPredicted = 0; } },
  { status: 'degenerate', why: 'a parameter ran to overflow', change: (x) => { x.parameters[1].value = 3e120; x.parameters[1].internal = 3e120; } },
  { status: 'degenerate', why: 'a log parameter ran to exp overflow', change: (x) => { x.parameters[0].internal = 700; x.parameters[0].value = Infinity; } },
  { status: 'singular', why: 'no covariance (rank-deficient Jacobian)', change: (x) => { x.covariance = false; x.nullNames = ['k', 'E']; } },
  { status: 'no-dof', why: 'sigma estimated with n = p', change: (x) => { x.covariance = false; x.sigmaKnown = false; x.dof = 0; x.chiSquarePValue = null; } },
  { status: 'misfit', why: 'chi-square rejects at p < 0.001', change: (x) => { x.chiSquare = 300; x.chiSquarePValue = 1e-40; } },
  { status: 'misfit', why: 'lack of fit against replicates rejects', change: (x) => { x.lackOfFit = { F: 40, pValue: 1e-5, dofLack: 15, dofPure: 3 }; } },
  { status: 'not-identifiable', why: 'near-zero singular value of the scaled Jacobian', change: (x) => { x.singularRatio = 1e-8; x.nullNames = ['k', 'E']; } },
  { status: 'not-identifiable', why: 'a log parameter interval spans 5 decades', change: (x) => { x.parameters[0].linear = [1e-6, 0.1]; } },
  { status: 'not-identifiable', why: 'a profile interval never closes', change: (x) => { x.parameters[0].profile = [0.9e-3, null]; x.parameters[0].profileOpen = true; } },
];

describe('fit verdict rule table', () => {
  for (const row of ROWS) {
    it(`${row.status}: ${row.why}`, () => {
      const x = base();
      row.change(x);
      const v = decideFitVerdict(x);
      expect(v.status).toBe(row.status);
      expect(v.trustworthy).toBe(row.status === 'converged');
      expect(exitCodeOf(v)).toBe(row.status === 'converged' ? 0 : 1);
      if (row.status !== 'converged') {
        expect(v.reasons[0].code).toBe(row.status);
        expect(v.message).toContain(v.reasons[0].message);
      }
    });
  }

  it('covers every status of the type', () => {
    const all: FitVerdictStatus[] = ['converged', 'model-failure', 'not-converged', 'no-search', 'degenerate', 'singular', 'no-dof', 'misfit', 'not-identifiable'];
    expect(new Set(ROWS.map((r) => r.status))).toEqual(new Set(all));
  });

  it('lists every failed rule, most fundamental first', () => {
    const x = base();
    x.solverStatus = 'max-iterations';
    x.chiSquarePValue = 1e-9;
    x.singularRatio = 1e-9;
    const v = decideFitVerdict(x);
    expect(v.reasons.map((r) => r.code)).toEqual(['not-converged', 'misfit', 'not-identifiable']);
    expect(v.status).toBe('not-converged');
  });

  it('the thresholds are options: a stricter misfit level and a wider decade limit', () => {
    const x = base();
    x.chiSquarePValue = 0.01;
    x.parameters[0].linear = [1e-5, 0.1];
    expect(decideFitVerdict(x).status).toBe('not-identifiable');
    expect(decideFitVerdict(x, { misfitPValue: 0.05 }).status).toBe('misfit');
    expect(decideFitVerdict(x, { maxIntervalDecades: 5 }).trustworthy).toBe(true);
  });
});
