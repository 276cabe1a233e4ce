/** Sizing a cooled multitubular packed bed under the energy balance (design/heat-design.ts). */
import { describe, expect, it } from 'vitest';
import { loadCase } from '../../src/design/case';
import { kineticsFromHandoff } from '../../src/design/kinetics';
import { sizeReactor } from '../../src/design/size';
import { tubeBundleCase, tubeBundleHandoff } from './handoff-fixture';

const h = tubeBundleHandoff({ temperature: { min: 460, max: 500, unit: 'K' }, feedMoleFraction: { A: { min: 0.2, max: 0.45, unit: '1' } } });
const dk = kineticsFromHandoff(h);
// dilute feed (5 % A, 5 % B in N2): an adiabatic rise of about 100 K at the target conversion
const heat = (over: Record<string, unknown> = {}) => ({
  feed: { totalFlow: '50 mol/s', moleFractions: { A: 0.05, B: 0.05, N2: 0.9 } },
  heat: {
    mode: 'co-current', reactionEnthalpy: { r1: '-90 kJ/mol' }, referenceTemperature: '480 K',
    heatCapacities: { A: '40 J/(mol K)', B: '35 J/(mol K)', C: '80 J/(mol K)', N2: '29.1 J/(mol K)' },
    overallCoefficient: '150 W/(m2 K)', coolant: { temperature: '478 K', flow: '30 kg/s', heatCapacity: '2.2 kJ/(kg K)' },
    maxTemperature: '540 K', ...over,
  },
});
const size = (over: Record<string, unknown> = {}, draws = 0) =>
  sizeReactor({ handoff: h, kinetics: dk.kinetics, kase: loadCase(tubeBundleCase('cooled', '480 K', heat(over)), ['A', 'B', 'C', 'N2'], ['r1']), molarMasses: dk.molarMasses, options: { draws } });

describe('cooled multitubular bed', () => {
  const r = size();
  it('meets the target within every limit and names the binding constraint', () => {
    expect(r.status).toBe('sized');
    const th = r.thermal!;
    expect(th.design.pressureDrop.pa).toBeLessThanOrEqual(0.5e5 * (1 + 1e-9));
    expect(th.design.length).toBeLessThanOrEqual(12);
    expect(th.hotSpot.temperature).toBeLessThanOrEqual(540);
    expect(['pressure drop', 'tube length', 'target conversion']).toContain(th.design.binding);
    expect(Math.abs(r.outlet!.conversion!.value - 0.7)).toBeLessThan(1e-6);
    // the profile starts at the inlet temperature and reaches its maximum at the hot spot
    expect(th.profile.T[0]).toBeCloseTo(480, 9);
    expect(Math.max(...th.profile.T)).toBeLessThanOrEqual(th.hotSpot.temperature + 1e-6);
    expect(th.hotSpot.temperature).toBeGreaterThan(483);
  });
  it('one tube fewer breaks the binding limit', () => {
    const th = r.thermal!;
    const need = th.design.binding === 'pressure drop' ? th.design.countFor.pressureDrop : th.design.countFor.tubeLength;
    expect(need).toBe(th.design.count);
  });
  it('reports the runaway margin by the generalized sensitivity criterion', () => {
    const ru = r.thermal!.runaway!;
    expect(ru.criterion).toMatch(/Morbidelli/);
    expect(ru.criticalCoolantTemperature).not.toBeNull();
    expect(ru.margin).toBeCloseTo(ru.criticalCoolantTemperature! - 478, 9);
  });
  it('a hot-spot limit below the design hot spot is not met (exit 1), never silently isothermal', () => {
    const low = size({ maxTemperature: '482 K' });
    expect(low.status).toBe('hot-spot-exceeded');
    expect(low.success).toBe(false);
    expect(low.thermal!.design.binding).toBe('hot spot');
    expect(low.thermal!.hotSpot.temperature).toBeGreaterThan(482);
  });
  it('an adiabatic variant runs hotter than the cooled design', () => {
    const a = size({ mode: 'adiabatic', maxTemperature: '900 K' });
    expect(a.status).toBe('sized');
    expect(a.thermal!.hotSpot.temperature).toBeGreaterThan(r.thermal!.hotSpot.temperature);
    expect(a.thermal!.runaway).toBeUndefined();
  });
});

describe('cooled bed under the kinetic uncertainty', () => {
  const r = size({}, 200);
  it('gives hot spot, outlet temperature and runaway margin at P50/P90/P95', () => {
    const d = r.thermal!.draws!;
    expect(d.hotSpot.succeeded).toBe(200);
    expect(d.hotSpot.percentiles.map((p) => p.level)).toEqual([0.5, 0.9, 0.95]);
    const [p50, p90, p95] = d.hotSpot.percentiles.map((p) => p.value);
    expect(p50).toBeLessThanOrEqual(p90);
    expect(p90).toBeLessThanOrEqual(p95);
    expect(d.outletTemperature.percentiles.length).toBe(3);
    // the runaway margin on the first 100 draws (a random subset), low levels for the conservative side
    expect(d.runawayMargin.draws).toBe(100);
    expect(d.runawayMargin.succeeded).toBe(100);
    expect(d.runawayMargin.percentiles.map((p) => p.level)).toEqual([0.5, 0.05, 0.1]);
    const [m50, m5] = d.runawayMargin.percentiles.map((p) => p.value);
    expect(m5).toBeLessThanOrEqual(m50);
    expect(Math.abs(m50 - r.thermal!.runaway!.margin!)).toBeLessThan(5);
    const iv = d.runawayMargin.intervals[1]!;
    expect(iv.lower).toBeLessThanOrEqual(m5);
    expect(iv.upper).toBeGreaterThanOrEqual(m5);
    expect(r.uncertainty!.percentiles.length).toBe(2);
  });
  it('a limit between the nominal and the P95 hot spot is reported as not met', () => {
    const d = r.thermal!.draws!;
    const nominal = r.thermal!.hotSpot.temperature;
    const p95 = d.hotSpot.percentiles[2].value;
    expect(p95).toBeGreaterThan(nominal);
    const mid = (nominal + p95) / 2;
    const tight = size({ maxTemperature: `${mid} K` }, 200);
    expect(tight.status).toBe('hot-spot-exceeded');
    expect(tight.message).toMatch(/P95 hot spot/);
  });
});
