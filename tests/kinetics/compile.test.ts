import { describe, expect, it } from 'vitest';
import { buildChemistry } from '../../src/chemistry/mechanism';
import { compileKinetics, netRates } from '../../src/kinetics/compile';
import { centralDiff, close, err } from './helpers';

const chem = buildChemistry(
  [{ name: 'A' }, { name: 'B' }, { name: 'C' }, { name: 'D' }],
  [
    { id: 'r1', equation: 'A + B <=> C' },
    { id: 'r2', equation: 'C -> D' },
    { id: 'r3', equation: '2 A -> D' },
  ],
);
const parameterNames = ['k1', 'K1', 'k2', 'E2', 'k3', 'KB'];
const theta = Float64Array.of(1.2, 4, 0.3, 50_000, 0.05, 0.9);
const kin = compileKinetics({
  chemistry: chem,
  parameterNames,
  referenceTemperature: 500,
  rates: [
    { form: 'reversible-power-law', rateConstant: { k: 'k1' }, equilibriumConstant: { K: 'K1' } },
    { form: 'power-law', basis: 'mass', rateConstant: { k: 'k2', activationEnergy: 'E2' } },
    { form: 'lhhw', rateConstant: { k: 'k3' }, adsorption: { B: { K: 'KB' } } },
  ],
});

describe('compileKinetics', () => {
  it('exposes the contract fields', () => {
    expect(kin.speciesNames).toEqual(['A', 'B', 'C', 'D']);
    expect(kin.reactionIds).toEqual(['r1', 'r2', 'r3']);
    expect(kin.parameterNames).toEqual(parameterNames);
    expect(kin.basis).toEqual(['volume', 'mass', 'volume']);
    expect(kin.referenceTemperature).toBe(500);
    expect([...kin.stoich]).toEqual([-1, -1, 1, 0, 0, 0, -1, 1, -2, 0, 0, 1]);
    const d = kin.describe();
    expect(d.map((x) => x.rateUnit)).toEqual(['mol/(m3 s)', 'mol/(kg s)', 'mol/(m3 s)']);
    expect(d[2].text).toBe('k3*C_A^2/(1 + KB*C_B)');
    expect(d[1].parameterUnits).toEqual({ k2: 'm3/(kg s)', E2: 'J/mol' }); // mol/(kg s) per mol/m3
    expect(kin.expressions()).toHaveLength(3);
  });

  it('has full Jacobians matching central differences (nR x nS and nR x nP, row-major)', () => {
    const C = Float64Array.of(1.1, 0.7, 0.2, 0.05);
    const T = 530;
    const nR = 3;
    const jc = new Float64Array(nR * 4);
    const jp = new Float64Array(nR * parameterNames.length);
    kin.ratesJacC(C, T, theta, jc);
    kin.ratesJacP(C, T, theta, jp);
    const rates = (c: Float64Array, th: Float64Array) => {
      const out = new Float64Array(nR);
      kin.rates(c, T, th, out);
      return out;
    };
    for (let j = 0; j < 4; j++) {
      const fd = centralDiff((z) => rates(z, theta), C, j);
      for (let i = 0; i < nR; i++) expect(close(jc[i * 4 + j], fd[i]), `r${i} C${j}`).toBe(true);
    }
    for (let p = 0; p < parameterNames.length; p++) {
      const fd = centralDiff((z) => rates(C, z), theta, p);
      for (let i = 0; i < nR; i++) expect(close(jp[i * 6 + p], fd[i]), `r${i} ${parameterNames[p]}`).toBe(true);
    }
  });

  it('overwrites stale values in the Jacobian output (structural zeros are written)', () => {
    const jc = new Float64Array(12).fill(99);
    kin.ratesJacC(Float64Array.of(1, 1, 1, 1), 500, theta, jc);
    expect(jc[3]).toBe(0); // r1 does not depend on D
    expect(jc[4]).toBe(0); // r2 does not depend on A
  });

  it('netRates sums nu_ij r_i', () => {
    const r = Float64Array.of(0.5, 0.2, 0.1);
    const out = new Float64Array(4).fill(7);
    netRates(kin, r, out);
    // Source: hand computation R_A = -r1 - 2 r3, R_B = -r1, R_C = r1 - r2, R_D = r2 + r3.
    expect([...out].map((x) => +x.toFixed(12))).toEqual([-0.7, -0.5, 0.3, 0.3]);
  });

  it('validates its input', () => {
    expect(err(() => compileKinetics({ chemistry: chem, parameterNames, referenceTemperature: 500, rates: [] })).message).toContain(
      'one rate law per reaction',
    );
    const rates = kin.describe().map(() => ({ form: 'power-law' as const, rateConstant: { k: 'k1' } }));
    expect(err(() => compileKinetics({ chemistry: chem, parameterNames, referenceTemperature: 0, rates })).code).toBe('E_VALUE');
    expect(err(() => compileKinetics({ chemistry: chem, parameterNames: ['k1', 'k1'], referenceTemperature: 500, rates })).message).toContain(
      'declared twice',
    );
    expect(err(() => compileKinetics({ chemistry: chem, parameterNames: ['k 1'], referenceTemperature: 500, rates })).code).toBe('E_VALUE');
    expect(
      err(() =>
        compileKinetics({
          chemistry: chem,
          parameterNames: ['T', 'k1'],
          referenceTemperature: 500,
          rates: [{ form: 'expression', expression: 'k1*C_A' }, rates[1], rates[2]],
        }),
      ).message,
    ).toContain('clashes with a built-in symbol');
  });

  it('runs without allocating per call (heap stays flat over many calls)', () => {
    const C = Float64Array.of(1, 1, 1, 1);
    const out = new Float64Array(3);
    const jc = new Float64Array(12);
    for (let n = 0; n < 20_000; n++) kin.rates(C, 500, theta, out); // warm up / optimise
    const g = globalThis as { gc?: () => void };
    g.gc?.();
    const before = process.memoryUsage().heapUsed;
    for (let n = 0; n < 200_000; n++) {
      kin.rates(C, 500, theta, out);
      kin.ratesJacC(C, 500, theta, jc);
    }
    const grown = process.memoryUsage().heapUsed - before;
    // Generous bound: 200k calls allocating even one 16-byte object each would add >3 MB.
    expect(grown).toBeLessThan(3_000_000);
  });
});
