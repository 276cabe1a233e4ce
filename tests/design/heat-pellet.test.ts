/**
 * Sizing under heat with a plant pellet (design/heat-pellet.ts): the effectiveness factor follows
 * the local temperature along the tube, the energy balance still obeys the adiabatic relation, and
 * the per-march eta table matches a pellet solved at every right-hand-side call.
 */
import { describe, expect, it } from 'vitest';
import { loadCase } from '../../src/design/case';
import { kineticsFromHandoff } from '../../src/design/kinetics';
import { sizeReactor } from '../../src/design/size';
import { parameterMap } from '../../src/design/handoff-load';
import { buildSystem } from '../../src/design/system';
import { resolveEnthalpies } from '../../src/design/thermal-design';
import { HeatSizer } from '../../src/design/heat-size';
import { thermalPelletBuilder } from '../../src/design/heat-pellet';
import { ThermalTube } from '../../src/reactors/thermal/thermal-tube';
import { etaSphereFirstOrder } from '../../src/pellets/analytic';
import { GAS_CONSTANT } from '../../src/core/constants';
import { handoff, param, seal } from './handoff-fixture';
import { sizingReportData } from '../../src/workflow/sizing-report-data';
import { renderSizingReport } from '../../src/report';

// A -> B per kg catalyst, first order with Arrhenius: k(T) = k0 exp(-E/R (1/T - 1/Tref)).
const k0 = 2e-3;
const E = 60000;
const Tref = 500;
const h0 = handoff(['A', 'B', 'N2'], [{ id: 'r1', equation: 'A -> B', rate: { form: 'power-law', basis: 'mass', rateConstant: { k: 'k', activationEnergy: 'E' } } }],
  [param('k', k0, 'log', 'm3/(kg s)', 0.05 * k0), param('E', E, 'none', 'J/mol', 1000)], { names: ['k', 'E'], matrix: [[0.0025, 0], [0, 1e6]] },
  { temperature: { min: 480, max: 560, unit: 'K' } }, Tref);
h0.species = [{ name: 'A', molarMass: 0.03 }, { name: 'B', molarMass: 0.03 }, { name: 'N2', formula: 'N2' }];
const h = seal(h0);
const dk = kineticsFromHandoff(h);
const De = 1e-6;
const rhoP = 1333;
const R = 1.5e-3;
const pellet = { shape: 'sphere', diameter: '3 mm', porosity: 0.4, effectiveDiffusivity: '1e-6 m2/s', density: '1333 kg/m3' };
const cp = { A: '40 J/(mol K)', B: '40 J/(mol K)', N2: '30 J/(mol K)' };
const raw = (heat: Record<string, unknown>, draws = 0) => ({
  name: 'hot pellet bed', reactor: { kind: 'packed-bed', phase: 'gas' }, temperature: '500 K', pressure: '5 bar',
  feed: { totalFlow: '20 mol/s', moleFractions: { A: 0.1, N2: 0.9 } }, target: { conversion: 0.6, species: 'A' },
  tubes: { innerDiameter: '30 mm', particleDiameter: '3 mm', voidFraction: 0.4, bulkDensity: '800 kg/m3', particleDensity: '1333 kg/m3', viscosity: '2.5e-5 Pa s', allowedPressureDrop: '0.5 bar' },
  heat: { reactionEnthalpy: { r1: '-80 kJ/mol' }, heatCapacities: cp, maxTemperature: '700 K', ...heat },
  pellet, uncertainty: { draws, seed: 5 },
});
const size = (heat: Record<string, unknown>, draws = 0) =>
  sizeReactor({ handoff: h, kinetics: dk.kinetics, kase: loadCase(raw(heat, draws), ['A', 'B', 'N2'], ['r1']), molarMasses: dk.molarMasses, options: { draws } });

describe('adiabatic bed with a spherical pellet', () => {
  const r = size({ mode: 'adiabatic' });
  const p = r.thermal!.pellet!;
  it('sizes under heat and keeps the pellet cautions and the energy-balance cautions', () => {
    expect(r.status).toBe('sized');
    expect(r.cautions.join(' ')).toMatch(/pseudo-homogeneous/);
    expect(r.cautions.join(' ')).toMatch(/pilot/);
    expect(p.film).toBeNull(); // no molecular diffusivity or fluid data: internal effectiveness only
  });
  it('the Markdown report lists eta at the inlet and outlet of the tube', async () => {
    const mdText = (await renderSizingReport(sizingReportData(r))).markdown;
    expect(mdText).toContain(`Pellet effectiveness of r1, inlet / outlet (local temperature) | ${p.profile.eta.r1[0].toPrecision(4)}`);
    expect(mdText).toContain('Pellet film | not applied');
  });
  it('T along the bed satisfies the adiabatic relation T = T0 + (-dH) X y_A0 / cp_mix (textbook relation; dCp = 0)', () => {
    // y_A0 = 0.1, cp_mix = 0.1*40 + 0.9*30 = 31 J/(mol K): rise 8000 X / 31 K
    p.profile.conversion.forEach((X, i) => expect(Math.abs(p.profile.T[i] - (500 + (80000 * 0.1 * X) / 31))).toBeLessThan(1e-5));
  });
  it('eta at every point equals the first-order sphere at the local temperature (Thiele closed form)', () => {
    p.profile.T.forEach((T, i) => {
      const k = k0 * Math.exp((-E / GAS_CONSTANT) * (1 / T - 1 / Tref));
      const phi = R * Math.sqrt((k * rhoP) / De);
      expect(Math.abs(p.profile.eta.r1[i] - etaSphereFirstOrder(phi))).toBeLessThan(1e-6);
    });
    // hotter downstream: a larger modulus and a smaller eta than at the inlet
    expect(p.profile.eta.r1[20]).toBeLessThan(p.profile.eta.r1[0] - 0.01);
  });
});

describe('cooled bed with a pellet: the per-march table against a pellet solved at every call', () => {
  const kase = loadCase(raw({ mode: 'constant-coolant', overallCoefficient: '120 W/(m2 K)', coolant: { temperature: '505 K' } }), ['A', 'B', 'N2'], ['r1']);
  const map = parameterMap(h, dk.kinetics.parameterNames);
  const sys = buildSystem(dk.kinetics, kase, map.theta);
  const th = kase.heat!.thermal!;
  const en = resolveEnthalpies(dk.kinetics, h, kase, th);
  const build = thermalPelletBuilder(dk.kinetics, kase, kase.pellet!, h.species, dk.molarMasses!, sys.theta, en.values);
  const hs = new HeatSizer(sys, dk.kinetics, th, en.values, dk.molarMasses!, undefined, build);
  const cooled = size({ mode: 'constant-coolant', overallCoefficient: '120 W/(m2 K)', coolant: { temperature: '505 K' } }, 6);
  const N = cooled.thermal!.design.count;
  const trial = hs.trial(N, 0, 0.6);
  it('agree on the outlet conversion, outlet temperature and hot spot to 1e-4 with no more pellet solves', () => {
    expect(trial.status).toBe('sized');
    const f = trial.tube.pellet!;
    const directSpec = { ...trial.tube.spec, beforeMarch: undefined, rateFactor: (C: Float64Array, T: number, eta: Float64Array) => void eta.set(f.evaluator.evaluate(C, T).factor) };
    const s0 = f.evaluator.solves;
    const direct = new ThermalTube(directSpec, dk.kinetics, sys.theta).solve(trial.W);
    const directSolves = f.evaluator.solves - s0;
    const s1 = f.evaluator.solves;
    const tabled = new ThermalTube(trial.tube.spec, dk.kinetics, sys.theta).solve(trial.W);
    const tabledSolves = f.evaluator.solves - s1;
    const X = (s: typeof direct) => 1 - s.outlet[0] / (2 / N);
    expect(Math.abs(X(tabled) / X(direct) - 1)).toBeLessThan(1e-4);
    expect(Math.abs(tabled.outletTemperature - direct.outletTemperature)).toBeLessThan(1e-4 * 500);
    expect(Math.abs(tabled.hotSpot.temperature - direct.hotSpot.temperature)).toBeLessThan(1e-4 * 500);
    expect(tabled.hotSpot.temperature).toBeGreaterThan(505);
    // measured 88 against 101 solves here (a short, non-stiff march); the table pays off in stiff marches
    expect(tabledSolves).toBeLessThanOrEqual(directSolves);
  });
  it('Monte Carlo draws re-evaluate eta with their own parameters (hot-spot percentiles, no failures)', () => {
    expect(cooled.status).toBe('sized');
    const d = cooled.thermal!.draws!;
    expect(d.hotSpot.succeeded).toBe(6);
    const [p50, , p95] = d.hotSpot.percentiles.map((q) => q.value);
    expect(p95).toBeGreaterThan(p50);
  });
});
