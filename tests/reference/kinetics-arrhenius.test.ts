import { describe, expect, it } from 'vitest';
import { buildChemistry } from '../../src/chemistry/mechanism';
import { compileKinetics } from '../../src/kinetics/compile';
import { arrhenius, vantHoff } from '../../src/kinetics/temperature';
import { GAS_CONSTANT } from '../../src/core/constants';

const chem = buildChemistry([{ name: 'A' }, { name: 'B' }], [{ id: 'r1', equation: 'A <=> B' }]);
const Tref = 550;
const kin = compileKinetics({
  chemistry: chem,
  parameterNames: ['k', 'E', 'K', 'dH'],
  referenceTemperature: Tref,
  rates: [{ form: 'power-law', rateConstant: { k: 'k', activationEnergy: 'E' }, orders: { A: 1 } }],
});
const theta = Float64Array.of(0.42, 83_000, 1, 0);
/** First-order rate at C_A = 1 mol/m3 equals k(T). */
function k(T: number): number {
  const out = new Float64Array(1);
  kin.rates(Float64Array.of(1, 0), T, theta, out);
  return out[0];
}

describe('Arrhenius and van t Hoff temperature dependence', () => {
  it('uses the CODATA 2018 gas constant', () => {
    // Source: CODATA 2018 exact value R = N_A k_B = 8.314462618... J/(mol K); value from memory.
    expect(GAS_CONSTANT).toBe(8.314462618);
  });

  it('k(T_ref) = k_ref', () => {
    // Source: analytic, exp(0) = 1 at T = T_ref.
    expect(k(Tref)).toBe(0.42);
    expect(arrhenius(0.42, 83_000, Tref, Tref)).toBe(0.42);
    expect(vantHoff(3.1, -50_000, Tref, Tref)).toBe(3.1);
  });

  it('ln k is linear in 1/T with slope -E/R', () => {
    // Source: analytic, ln k = ln k_ref - E/R (1/T - 1/T_ref).
    const temps = [420, 480, 530, 600, 700, 820];
    const x = temps.map((T) => 1 / T);
    const y = temps.map((T) => Math.log(k(T)));
    const n = x.length;
    const mx = x.reduce((a, b) => a + b) / n;
    const my = y.reduce((a, b) => a + b) / n;
    let sxy = 0;
    let sxx = 0;
    for (let i = 0; i < n; i++) {
      sxy += (x[i] - mx) * (y[i] - my);
      sxx += (x[i] - mx) ** 2;
    }
    const slope = sxy / sxx;
    expect(slope / (-83_000 / GAS_CONSTANT)).toBeCloseTo(1, 10);
    // every point on the line (residuals at rounding level)
    for (let i = 0; i < n; i++) expect(Math.abs(y[i] - (my + slope * (x[i] - mx)))).toBeLessThan(1e-10);
    // ratio of rates at two temperatures
    expect(k(600) / k(500)).toBeCloseTo(Math.exp((-83_000 / GAS_CONSTANT) * (1 / 600 - 1 / 500)), 10);
  });

  it('van t Hoff K decreases with T for an exothermic reaction and matches the closed form', () => {
    // Source: analytic closed form K = K_ref exp(-dH/R (1/T - 1/T_ref)).
    expect(vantHoff(3.1, -50_000, 650, Tref)).toBeCloseTo(3.1 * Math.exp((50_000 / 8.314462618) * (1 / 650 - 1 / Tref)), 12);
    expect(vantHoff(3.1, -50_000, 650, Tref)).toBeLessThan(3.1);
  });
});
