import { describe, expect, it } from 'vitest';
import { loadCase } from '../../src/design/case';
import { sizeReactor } from '../../src/design/size';
import { kineticsFromHandoff } from '../../src/design/kinetics';
import { buildSystem } from '../../src/design/system';
import { Sizer } from '../../src/design/sizer';
import { bundleAlpha } from '../../src/design/tubes';
import { CAUTIONS } from '../../src/design/cautions';
import { tubeBundleCase, tubeBundleHandoff } from './handoff-fixture';

// The shared invented tube-bundle scenario (handoff-fixture.ts) at 480 K, with a heat of reaction.
const h = tubeBundleHandoff({ temperature: { min: 460, max: 500, unit: 'K' }, feedMoleFraction: { A: { min: 0.2, max: 0.45, unit: '1' } } });
const dk = kineticsFromHandoff(h);
const raw = tubeBundleCase('tube bundle', '480 K', { heat: { reactionEnthalpy: { r1: '-90 kJ/mol' }, heatCapacity: '40 J/(mol K)' } });
const kase = loadCase(raw, ['A', 'B', 'C', 'N2'], ['r1']);

describe('tube bundle', () => {
  const r = sizeReactor({ handoff: h, kinetics: dk.kinetics, kase, molarMasses: dk.molarMasses, options: { draws: 300, profileDraws: 20 } });
  it('the nominal tube count is the smallest within the allowed pressure drop for the nominal fit', () => {
    expect(r.status).toBe('sized');
    const t = r.tubes!;
    expect(t.pressureDrop.pa).toBeLessThanOrEqual(0.5e5);
    expect(t.pressureDrop.bar).toBeCloseTo(t.pressureDrop.pa / 1e5, 12);
    expect(t.count).toBeGreaterThanOrEqual(t.nominalCount);
    // One tube fewer than the nominal count exceeds the limit (or cannot reach the target).
    const sys = buildSystem(dk.kinetics, kase, [1e-4, 80000]);
    const sz = new Sizer(sys);
    sys.alpha = bundleAlpha(sys, dk.molarMasses!, t.nominalCount - 1).alpha;
    const fewer = sz.size();
    const dpFewer = fewer.status === 'sized' ? 5e5 * (1 - Math.sqrt(fewer.y[4])) : Infinity;
    expect(dpFewer).toBeGreaterThan(0.5e5);
    // Geometry: L = W_tube / (rho_b A_c). Source: definition of bulk density.
    const Ac = (Math.PI * 0.025 ** 2) / 4;
    expect(t.length).toBeCloseTo(r.size!.value / t.count / (800 * Ac), 9);
    expect(r.pressure!.drop).toBeCloseTo(t.pressureDrop.pa, 6);
  });
  it('adiabatic rise: (-dH) X y_A0 / cp and heat duty in kW with a warning', () => {
    // Source: analytic energy balance of one reaction with nu_A = -1.
    expect(r.heat!.adiabaticRise).toBeCloseTo((90000 * 0.7 * 0.4) / 40, 6);
    expect(r.heat!.heatDuty.value).toBeCloseTo((90000 * 0.7 * 20) / 1000, 6);
    const w = r.warnings.find((x) => x.code === 'W_HEAT');
    expect(w?.message).toContain('630 K exceeds 10 K');
    expect(w?.message).toContain('1260 kW');
    expect(r.cautions).toEqual([...CAUTIONS]);
  });
  it('carries the uncertainty with the tube count fixed', () => {
    const u = r.uncertainty!;
    expect(u.quantity).toBe('size');
    expect(u.succeeded + u.failed.count).toBe(300);
    expect(u.percentiles[0].value).toBeGreaterThan(u.median);
  });
});
