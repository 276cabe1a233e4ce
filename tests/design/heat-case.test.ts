/** The energy-balance fields of the case file: units, defaults and refusals naming the field. */
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { loadCase } from '../../src/design/case';
import { DEFAULT_MAX_TUBE_LENGTH } from '../../src/design/heat-case';
import { err } from '../kinetics/helpers';

const sp = ['A', 'B', 'C', 'N2'];
const cooled = () => {
  const raw = JSON.parse(readFileSync('tests/design/fixtures/bed.case.json', 'utf8'));
  raw.heat = {
    mode: 'co-current',
    reactionEnthalpy: { r1: '-90 kJ/mol' },
    heatCapacities: { A: '40 J/(mol K)', B: '35 J/(mol K)', C: { shomate: { A: 30, B: 20, C: -5, D: 1, E: 0.2 } }, N2: '29.1 J/(mol K)' },
    overallCoefficient: '150 W/(m2 K)',
    coolant: { temperature: '210 degC', flow: '36 t/h', heatCapacity: '2.2 kJ/(kg K)' },
    maxTemperature: '280 degC',
  };
  return raw;
};
describe('heat inputs of the case file', () => {
  it('converts the thermal inputs to SI and applies the documented defaults', () => {
    const th = loadCase(cooled(), sp, ['r1']).heat!.thermal!;
    expect(th.mode).toBe('co-current');
    expect(th.overallCoefficient).toBe(150);
    // 210 degC = 483.15 K; 36 t/h = 10 kg/s; 2.2 kJ/(kg K) = 2200 J/(kg K) (SI Brochure factors)
    expect(th.coolant.temperature).toBeCloseTo(483.15, 10);
    expect(th.coolant.flow).toBeCloseTo(10, 12);
    expect(th.coolant.heatCapacity).toBe(2200);
    expect(th.maxTemperature).toBeCloseTo(553.15, 10);
    expect(th.maxTubeLength).toBe(DEFAULT_MAX_TUBE_LENGTH);
    expect(th.referenceTemperature).toBe(298.15);
    expect(th.heatCapacities[2]).toEqual({ form: 'shomate', A: 30, B: 20, C: -5, D: 1, E: 0.2 });
  });
  it('refuses a non-positive U, naming the field', () => {
    const raw = cooled();
    raw.heat.overallCoefficient = '0 W/(m2 K)';
    const e = err(() => loadCase(raw, sp, ['r1']));
    expect(e.path).toEqual(['heat', 'overallCoefficient']);
  });
  it('refuses a cooled mode without U', () => {
    const raw = cooled();
    delete raw.heat.overallCoefficient;
    const e = err(() => loadCase(raw, sp, ['r1']));
    expect(e.code).toBe('E_MISSING_FIELD');
    expect(e.fix).toMatch(/wallCorrelation/);
  });
  it('refuses a coolant at or above the temperature limit', () => {
    const raw = cooled();
    raw.heat.coolant.temperature = '290 degC';
    const e = err(() => loadCase(raw, sp, ['r1']));
    expect(e.path).toEqual(['heat', 'coolant', 'temperature']);
  });
  it('refuses a co-current coolant without its flow', () => {
    const raw = cooled();
    delete raw.heat.coolant.flow;
    expect(err(() => loadCase(raw, sp, ['r1'])).path).toEqual(['heat', 'coolant', 'flow']);
  });
  it('refuses an unknown mode with the closest name', () => {
    const raw = cooled();
    raw.heat.mode = 'cocurrent';
    const e = err(() => loadCase(raw, sp, ['r1']));
    expect(e.path).toEqual(['heat', 'mode']);
    expect(e.fix).toMatch(/co-current/);
  });
  it('refuses a heat capacity for an unknown species', () => {
    const raw = cooled();
    raw.heat.heatCapacities.Q = '30 J/(mol K)';
    expect(err(() => loadCase(raw, sp, ['r1'])).code).toBe('E_UNKNOWN_SPECIES');
  });
  it('computes the mean heat capacity of the feed when only per-species values are given', () => {
    const c = loadCase(cooled(), sp, ['r1']);
    // feed 0.4 A + 0.4 B + 0.2 N2 (C absent): 0.4*40 + 0.4*35 + 0.2*29.1
    expect(c.heat!.heatCapacity).toBeCloseTo(0.4 * 40 + 0.4 * 35 + 0.2 * 29.1, 10);
  });
});
