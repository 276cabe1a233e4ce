import { describe, expect, it } from 'vitest';
import { buildChemistry } from '../../src/chemistry/mechanism';
import { compileKinetics, type CompiledKineticsInfo } from '../../src/kinetics/compile';
import type { RateLawSpec } from '../../src/kinetics/spec';
import { GAS_CONSTANT as R } from '../../src/core/constants';
import { centralDiff, close, err } from './helpers';

const Tref = 600;
const chem = buildChemistry(
  [{ name: 'A' }, { name: 'B' }, { name: 'C' }, { name: 'D' }, { name: 'I', inert: true }],
  [{ id: 'r1', equation: 'A + 2 B <=> C + D' }],
);
const params = ['k', 'E', 'K', 'dH', 'KA', 'dHA', 'KC', 'a', 'b'];
// physical parameter values: k, E (J/mol), K, dH (J/mol), KA, dHA, KC, fitted orders a, b
const theta = Float64Array.of(0.8, 65_000, 3.5, -40_000, 0.6, -20_000, 0.25, 0.7, 1.3);
const C = Float64Array.of(2.0, 1.5, 0.4, 0.3, 5);
const T = 640;

function compile(rate: RateLawSpec): CompiledKineticsInfo {
  return compileKinetics({ chemistry: chem, rates: [rate], parameterNames: params, referenceTemperature: Tref });
}
function rate(k: CompiledKineticsInfo, c: Float64Array = C, t = T, th: Float64Array = theta): number {
  const out = new Float64Array(1);
  k.rates(c, t, th, out);
  return out[0];
}
const arr = (k: number, E: number) => k * Math.exp((-E / R) * (1 / T - 1 / Tref));

/** Check ratesJacC and ratesJacP against central differences (1e-6 relative). */
function checkJacobians(k: CompiledKineticsInfo, c: Float64Array = C, t = T) {
  const nS = 5;
  const nP = params.length;
  const jc = new Float64Array(nS);
  const jp = new Float64Array(nP);
  k.ratesJacC(c, t, theta, jc);
  k.ratesJacP(c, t, theta, jp);
  for (let j = 0; j < nS; j++) {
    const fd = centralDiff((z) => Float64Array.of(rate(k, z, t)), c, j)[0];
    expect(close(jc[j], fd), `dr/dC${j}: ${jc[j]} vs ${fd}`).toBe(true);
  }
  for (let p = 0; p < nP; p++) {
    const fd = centralDiff((z) => Float64Array.of(rate(k, c, t, z)), theta, p)[0];
    expect(close(jp[p], fd), `dr/d${params[p]}: ${jp[p]} vs ${fd}`).toBe(true);
  }
}

describe('rate-law forms: values against hand-computed closed forms', () => {
  it('power law with default orders (reactant coefficients) and Arrhenius k', () => {
    const k = compile({ form: 'power-law', rateConstant: { k: 'k', activationEnergy: 'E' } });
    // Source: closed form r = k(T) C_A C_B^2.
    expect(rate(k)).toBeCloseTo(arr(0.8, 65_000) * 2.0 * 1.5 ** 2, 12);
    checkJacobians(k);
    expect(k.describe()[0].parameterUnits.k).toBe('(m3/mol)^2/s');
  });

  it('power law with fitted and fractional orders', () => {
    const k = compile({ form: 'power-law', rateConstant: { k: 'k' }, orders: { A: 'a', B: 0.5 } });
    // Source: closed form r = k C_A^a C_B^0.5.
    expect(rate(k)).toBeCloseTo(0.8 * 2.0 ** 0.7 * Math.sqrt(1.5), 12);
    checkJacobians(k);
  });

  it('power law on partial pressures p = C R T', () => {
    const k = compile({ form: 'power-law', basis: 'mass', rateConstant: { k: 'k' }, orders: { A: 1, B: 'b' }, pressureBasis: true });
    // Source: closed form r = k (C_A R T) (C_B R T)^b.
    expect(rate(k)).toBeCloseTo(0.8 * (2.0 * R * T) * (1.5 * R * T) ** 1.3, 6);
    expect(k.basis).toEqual(['mass']);
    checkJacobians(k);
  });

  it('reversible power law with default reverse orders and van t Hoff K', () => {
    const k = compile({
      form: 'reversible-power-law',
      rateConstant: { k: 'k', activationEnergy: 'E' },
      equilibriumConstant: { K: 'K', enthalpy: 'dH' },
    });
    const Keq = 3.5 * Math.exp((40_000 / R) * (1 / T - 1 / Tref));
    // Source: closed form r = k(T) (C_A C_B^2 - C_C C_D / K(T)).
    expect(rate(k)).toBeCloseTo(arr(0.8, 65_000) * (2.0 * 1.5 ** 2 - (0.4 * 0.3) / Keq), 12);
    checkJacobians(k);
    // net rate vanishes at equilibrium: choose C_D so that C_A C_B^2 = C_C C_D / K
    const Ceq = Float64Array.of(2.0, 1.5, 0.4, (Keq * 2.0 * 1.5 ** 2) / 0.4, 5);
    expect(Math.abs(rate(k, Ceq))).toBeLessThan(1e-12);
    expect(k.describe()[0].parameterUnits.K).toBe('(mol/m3)^-1');
  });

  it('LHHW with adsorption terms, exponent and equilibrium', () => {
    const k = compile({
      form: 'lhhw',
      rateConstant: { k: 'k', activationEnergy: 'E' },
      equilibriumConstant: { K: 'K' },
      orders: { A: 1, B: 1 },
      reverseOrders: { C: 1 },
      adsorption: { A: { K: 'KA', enthalpy: 'dHA' }, C: { K: 'KC' } },
      exponent: 2,
    });
    const KA = 0.6 * Math.exp((20_000 / R) * (1 / T - 1 / Tref));
    // Source: closed form r = k(T) (C_A C_B - C_C/K) / (1 + K_A(T) C_A + K_C C_C)^2.
    const expected = (arr(0.8, 65_000) * (2.0 * 1.5 - 0.4 / 3.5)) / (1 + KA * 2.0 + 0.25 * 0.4) ** 2;
    expect(rate(k)).toBeCloseTo(expected, 12);
    checkJacobians(k);
    expect(k.describe()[0].text).toBe(
      'k*exp(-E/R*(1/T - 1/T_ref))*(C_A*C_B - C_C/K)/(1 + (KA*exp(-dHA/R*(1/T - 1/T_ref)))*C_A + KC*C_C)^2',
    );
  });

  it('LHHW without equilibrium on partial pressures', () => {
    const k = compile({ form: 'lhhw', rateConstant: { k: 'k' }, orders: { A: 0.5 }, adsorption: { A: { K: 'KA' } }, pressureBasis: true });
    const pA = 2.0 * R * T;
    // Source: closed form r = k p_A^0.5 / (1 + K_A p_A).
    expect(rate(k)).toBeCloseTo((0.8 * Math.sqrt(pA)) / (1 + 0.6 * pA), 12);
    checkJacobians(k);
  });

  it('custom expression with C_, p_, T, R, T_ref and parameters', () => {
    const k = compile({ form: 'expression', expression: 'k*exp(-E/R*(1/T - 1/T_ref))*C_A*p_B^0.5/(1 + KA*C_C)' });
    // Source: closed form of the expression itself.
    expect(rate(k)).toBeCloseTo((arr(0.8, 65_000) * 2.0 * Math.sqrt(1.5 * R * T)) / (1 + 0.6 * 0.4), 12);
    checkJacobians(k);
  });

  it('treats negative concentrations as zero, with finite derivatives at zero', () => {
    const k = compile({ form: 'power-law', rateConstant: { k: 'k' }, orders: { A: 0.5, B: 'a' } });
    const Cneg = Float64Array.of(-1e-6, 1.5, 0, 0, 0);
    expect(rate(k, Cneg)).toBe(0);
    const C0 = Float64Array.of(0, 0, 0, 0, 0);
    const jc = new Float64Array(5);
    const jp = new Float64Array(params.length);
    k.ratesJacC(C0, T, theta, jc);
    k.ratesJacP(C0, T, theta, jp);
    for (const v of [...jc, ...jp]) expect(Number.isFinite(v)).toBe(true);
    k.ratesJacC(Float64Array.of(1e-40, 1, 0, 0, 0), T, theta, jc);
    expect(Number.isFinite(jc[0])).toBe(true);
  });
});

describe('rate-law errors', () => {
  it('refuses a negative numeric order on a reacting species, allows it on an inert one', () => {
    const e = err(() => compile({ form: 'power-law', rateConstant: { k: 'k' }, orders: { A: 1, B: -1 } }));
    expect(e.code).toBe('E_ORDER');
    expect(e.fix).toContain('LHHW adsorption term');
    expect(e.path).toEqual(['reactions', 0, 'rate', 'orders', 'B']);
    const k = compile({ form: 'power-law', rateConstant: { k: 'k' }, orders: { A: 1, I: -1 } });
    expect(rate(k)).toBeCloseTo((0.8 * 2.0) / 5, 14);
  });

  it('names unknown species and parameters with the closest valid name', () => {
    let e = err(() => compile({ form: 'power-law', rateConstant: { k: 'k' }, orders: { Ax: 1 } }));
    expect(e.code).toBe('E_UNKNOWN_SPECIES');
    expect(e.message).toContain("did you mean 'A'");
    e = err(() => compile({ form: 'lhhw', rateConstant: { k: 'k' }, adsorption: { Cc: { K: 'KA' } } }));
    expect(e.code).toBe('E_UNKNOWN_SPECIES');
    expect(e.path).toEqual(['reactions', 0, 'rate', 'adsorption', 'Cc']);
    e = err(() => compile({ form: 'power-law', rateConstant: { k: 'kk', activationEnergy: 'E' } }));
    expect(e.code).toBe('E_UNKNOWN_PARAMETER');
    expect(e.message).toContain("did you mean 'k'");
    expect(e.path).toEqual(['reactions', 0, 'rate', 'rateConstant', 'k']);
    e = err(() => compile({ form: 'expression', expression: 'k*C_Ax' }));
    expect(e.code).toBe('E_UNKNOWN_SPECIES');
    expect(e.message).toContain("did you mean 'C_A'");
    expect(e.location?.column).toBe(3);
    e = err(() => compile({ form: 'expression', expression: 'kk*C_A' }));
    expect(e.code).toBe('E_UNKNOWN_PARAMETER');
    expect(e.message).toContain("did you mean 'k'");
  });

  it('refuses other malformed rate laws', () => {
    expect(err(() => compile({ form: 'power-law', rateConstant: { k: 'k' }, orders: { A: 'x y' as unknown as string } })).code).toBe(
      'E_UNKNOWN_PARAMETER',
    );
    expect(err(() => compile({ form: 'power-law', rateConstant: { k: 'k' }, orders: { A: NaN } })).code).toBe('E_VALUE');
    expect(err(() => compile({ form: 'lhhw', rateConstant: { k: 'k' }, adsorption: {}, exponent: -1 })).code).toBe('E_VALUE');
    expect(err(() => compile({ form: 'powerlaw' } as unknown as RateLawSpec)).message).toContain("did you mean 'power-law'");
    expect(err(() => compile({ form: 'power-law', basis: 'area', rateConstant: { k: 'k' } } as unknown as RateLawSpec)).code).toBe('E_VALUE');
    const irr = buildChemistry([{ name: 'A' }, { name: 'B' }], [{ id: 'r1', equation: 'A -> B' }]);
    const e = err(() =>
      compileKinetics({
        chemistry: irr,
        rates: [{ form: 'reversible-power-law', rateConstant: { k: 'k' }, equilibriumConstant: { K: 'K' } }],
        parameterNames: ['k', 'K'],
        referenceTemperature: 500,
      }),
    );
    expect(e.message).toContain("irreversible ('->')");
  });
});
