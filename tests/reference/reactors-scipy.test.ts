/**
 * Gas-phase packed beds with several reactions and pressure drop against SciPy solve_ivp
 * (Radau, rtol 1e-11), plus element balances along the profile and the stiff case's method.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { buildChemistry, elementBalanceResidual } from '../../src/chemistry/mechanism';
import { solveReactor } from '../../src/reactors';
import { compile, pl, rpl } from '../reactors/compiled';

interface RefCase {
  species: string[];
  T: number;
  P0: number;
  feed: number[];
  W: number;
  alpha: number;
  params: Record<string, number>;
  W_points: number[];
  profile: { F: number[]; p: number }[];
  radau_vs_lsoda_max_rel_diff: number;
}
const ref = JSON.parse(readFileSync(new URL('./scipy/reactors_multi.json', import.meta.url), 'utf8')) as {
  scipy: string;
  R: number;
  cases: Record<string, RefCase>;
};

const MULTI_SPECIES = [
  { name: 'A', formula: 'C2H4' },
  { name: 'B', formula: 'H2O' },
  { name: 'C', formula: 'C2H6O' },
  { name: 'D', formula: 'C2H6O' },
  { name: 'I', formula: 'N2', inert: true },
];
const MULTI_REACTIONS = [
  { equation: 'A + B <=> C', rate: rpl('k1', 'K1', 'mass') },
  { equation: 'C -> D', rate: pl('k2', 'mass') },
];
const STIFF_SPECIES = [
  { name: 'A', formula: 'C4H10' },
  { name: 'B', formula: 'C4H10' },
  { name: 'C', formula: 'C4H10' },
  { name: 'I', formula: 'Ar', inert: true },
];
const STIFF_REACTIONS = [
  { equation: 'A <=> B', rate: rpl('k1', 'K1', 'mass') },
  { equation: 'B -> C', rate: pl('k2', 'mass') },
];
const chemOf = (species: typeof MULTI_SPECIES, reactions: typeof MULTI_REACTIONS) =>
  buildChemistry(species, reactions.map((r, i) => ({ id: `r${i + 1}`, equation: r.equation })));

const KINETICS = {
  multi: { kin: compile(MULTI_SPECIES, MULTI_REACTIONS, ['k1', 'K1', 'k2']), chem: chemOf(MULTI_SPECIES, MULTI_REACTIONS) },
  stiff: { kin: compile(STIFF_SPECIES, STIFF_REACTIONS, ['k1', 'K1', 'k2']), chem: chemOf(STIFF_SPECIES, STIFF_REACTIONS) },
};

function solveCase(name: 'multi' | 'stiff', extra: object = {}) {
  const c = ref.cases[name];
  const { kin } = KINETICS[name];
  const theta = Float64Array.from(kin.parameterNames.map((p) => c.params[p]));
  const run = { id: name, temperature: c.T, pressure: c.P0, feed: Float64Array.from(c.feed), size: c.W };
  return solveReactor({ kind: 'packed-bed', phase: 'gas', pressureDrop: { alpha: c.alpha } }, run, kin, theta, {
    rtol: 1e-10,
    atol: 1e-13,
    profile: true,
    profilePoints: c.W_points,
    ...extra,
  });
}

describe('SciPy reference: gas-phase packed beds with pressure drop', () => {
  it('records the SciPy version and a self-consistent reference', () => {
    expect(ref.scipy).toMatch(/^\d+\.\d+/);
    // Source: SciPy solve_ivp Radau vs LSODA, script tests/reference/scipy/reactors_multi.py
    for (const c of Object.values(ref.cases)) expect(c.radau_vs_lsoda_max_rel_diff).toBeLessThan(1e-8);
  });

  for (const name of ['multi', 'stiff'] as const) {
    it(`${name}: outlet and profile agree to 1e-6 relative`, () => {
      const c = ref.cases[name];
      const s = solveCase(name);
      expect(s.status).toBe('success');
      const prof = s.profile!;
      expect(prof.x).toEqual(c.W_points);
      const FT0 = c.feed.reduce((a, b) => a + b, 0);
      for (let i = 0; i < c.W_points.length; i++) {
        for (let j = 0; j < c.species.length; j++) {
          const want = c.profile[i].F[j];
          // Source: SciPy solve_ivp (Radau, rtol 1e-11), script tests/reference/scipy/reactors_multi.py
          expect(Math.abs(prof.amounts[i][j] - want)).toBeLessThan(1e-6 * Math.max(Math.abs(want), 1e-3 * FT0));
        }
        // Source: SciPy solve_ivp (Radau), same script: pressure ratio p along the bed
        expect(Math.abs(prof.pressureRatio[i] - c.profile[i].p)).toBeLessThan(1e-6 * c.profile[i].p);
      }
      const last = c.profile[c.profile.length - 1];
      for (let j = 0; j < c.species.length; j++) {
        // Source: SciPy solve_ivp outlet, script tests/reference/scipy/reactors_multi.py
        expect(Math.abs(s.outletAmounts[j] - last.F[j]) / Math.abs(last.F[j])).toBeLessThan(1e-6);
      }
      expect(Math.abs(s.pressureRatio - last.p) / last.p).toBeLessThan(1e-6);
      for (const row of prof.concentrations) for (const v of row) expect(Number.isFinite(v)).toBe(true);
    });
  }

  it('multi: element balances close to round-off at every profile point', () => {
    const s = solveCase('multi');
    const { chem, kin } = KINETICS.multi;
    expect(Array.from(chem.stoich)).toEqual(Array.from(kin.stoich));
    const nS = chem.speciesNames.length;
    const feed = ref.cases.multi.feed;
    const inlet = elementBalanceResidual(chem, new Float64Array(nS), feed);
    for (const row of s.profile!.amounts) {
      const change = elementBalanceResidual(chem, feed, row);
      // Source: element conservation of balanced reactions (common practice, no source)
      for (let e = 0; e < chem.elements.length; e++) expect(Math.abs(change[e])).toBeLessThan(1e-12 * inlet[e]);
    }
  });

  it('stiff: completes through the stiff method within its step budget', () => {
    const s = solveCase('stiff', { maxSteps: 2000 });
    expect(s.status).toBe('success');
    expect(s.stats.method).toContain('stiff');
    expect(s.stats.steps).toBeLessThan(2000);
    // A, B and C are isomers (C4H10); the inert is carried unchanged
    const { chem, kin } = KINETICS.stiff;
    expect(Array.from(chem.stoich)).toEqual(Array.from(kin.stoich));
    const nS = chem.speciesNames.length;
    const feed = ref.cases.stiff.feed;
    const inlet = elementBalanceResidual(chem, new Float64Array(nS), feed);
    for (const row of s.profile!.amounts) {
      const change = elementBalanceResidual(chem, feed, row);
      // Source: element conservation of balanced reactions (common practice, no source)
      for (let e = 0; e < chem.elements.length; e++) expect(Math.abs(change[e])).toBeLessThan(1e-12 * inlet[e]);
      expect(row[3]).toBe(1);
    }
  });
});
