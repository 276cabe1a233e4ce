import { describe, expect, it } from 'vitest';
import { loadCase } from '../../src/design/case';
import { buildSystem } from '../../src/design/system';
import { Sizer } from '../../src/design/sizer';
import { fixtureKinetics } from '../design/kinetics-fixtures';

// Invented liquid case: A -> B, first order, k = 2e-3 1/s at 350 K, E = 60 kJ/mol.
const kin = fixtureKinetics(['A', 'B'], ['k', 'E'], [{ id: 'r1', nu: [-1, 1], k: 0, E: 1, K: -1, basis: 'volume' }], 350);
const theta = [2e-3, 60000];

function liquidCase(kind: string, X: number, T = 350) {
  return loadCase(
    {
      name: 'first order',
      reactor: { kind, phase: 'liquid' },
      feed: { flows: { A: '5 mol/s' }, volumetricFlow: '3.6 m3/h' },
      temperature: `${T} K`,
      target: { conversion: X, species: 'A' },
    },
    ['A', 'B'],
    ['r1'],
  );
}

describe('first-order sizing against closed forms', () => {
  it('plug flow: V = v0/k ln(1/(1-X))', () => {
    const c = liquidCase('plug-flow', 0.9);
    const res = new Sizer(buildSystem(kin, c, theta)).size();
    const v0 = 1e-3;
    // Source: analytic solution of the isothermal first-order plug-flow mole balance.
    expect(res.status).toBe('sized');
    expect(res.size).toBeCloseTo((v0 / 2e-3) * Math.log(1 / 0.1), 6);
    expect(Math.abs(res.size / ((v0 / 2e-3) * Math.log(10)) - 1)).toBeLessThan(1e-8);
  });
  it('plug flow with Arrhenius at another temperature', () => {
    const T = 370;
    const c = liquidCase('plug-flow', 0.75, T);
    const res = new Sizer(buildSystem(kin, c, theta)).size();
    const k = 2e-3 * Math.exp((-60000 / 8.314462618) * (1 / T - 1 / 350));
    // Source: analytic solution of the first-order plug-flow balance with k from the Arrhenius law.
    expect(Math.abs(res.size / ((1e-3 / k) * Math.log(4)) - 1)).toBeLessThan(1e-8);
  });
  it('stirred tank: V = v0 X/(k(1-X))', () => {
    const c = liquidCase('stirred-tank', 0.8);
    const res = new Sizer(buildSystem(kin, c, theta)).size();
    expect(res.status).toBe('sized');
    // Source: analytic solution of the first-order stirred-tank balance.
    expect(Math.abs(res.size / ((1e-3 * 0.8) / (2e-3 * 0.2)) - 1)).toBeLessThan(1e-9);
  });
  it('batch: t = ln(1/(1-X))/k', () => {
    const c = loadCase(
      { name: 'b', reactor: { kind: 'batch', phase: 'liquid' }, feed: { concentrations: { A: '2 mol/L' } }, temperature: '350 K', target: { conversion: 0.5, species: 'A' } },
      ['A', 'B'],
      ['r1'],
    );
    const res = new Sizer(buildSystem(kin, c, theta)).size();
    // Source: analytic solution of the first-order constant-volume batch balance.
    expect(Math.abs(res.size / (Math.log(2) / 2e-3) - 1)).toBeLessThan(1e-8);
  });
  it('rates a given plug-flow volume: X = 1 - exp(-k V/v0)', () => {
    const c = loadCase(
      { name: 'g', reactor: { kind: 'plug-flow', phase: 'liquid' }, feed: { flows: { A: '5 mol/s' }, volumetricFlow: '1e-3 m3/s' }, temperature: '350 K', target: { size: '0.5 m3' } },
      ['A', 'B'],
      ['r1'],
    );
    const sz = new Sizer(buildSystem(kin, c, theta));
    const res = sz.size();
    // Source: analytic solution of the first-order plug-flow balance.
    expect(sz.conversion(res.y, 0)).toBeCloseTo(1 - Math.exp(-2e-3 * 0.5 / 1e-3), 9);
  });
});
