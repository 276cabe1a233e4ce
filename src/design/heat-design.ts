/**
 * Sizing under heat: the cooled (or adiabatic) multitubular packed bed of a case with heat.mode.
 * Steps: reaction enthalpies (thermal-design.ts) -> tube count and binding constraint at the given
 * diameter, or the widest of heat.searchDiameters meeting every limit (heat-size.ts) -> temperature
 * and coolant profiles of the design -> runaway margin (runaway.ts) -> Monte Carlo: the size each
 * parameter set needs (uncertainty.ts propagate, with the thermal sizing as its quantity) and the
 * installed tube rated over the draws (thermal-uncertainty.ts). A design whose hot spot at the
 * design percentile exceeds heat.maxTemperature does not meet it (status 'hot-spot-exceeded').
 */
import { outcome, type Warning } from '../core/outcome.js';
import type { ShootingReport } from '../reactors/thermal/counter-current.js';
import { ThermalTube } from '../reactors/thermal/thermal-tube.js';
import type { CoolingMode } from '../reactors/thermal/layout.js';
import type { ParameterMap } from './handoff-load.js';
import type { ThermalCase } from './heat-case.js';
import { chooseTubes, HeatSizer, type Binding, type HeatDesignChoice, type TubeTrial } from './heat-size.js';
import { runawayMargin, type RunawayMargin } from './runaway.js';
import { Sizer } from './sizer.js';
import type { DesignSystem } from './system.js';
import { resolveEnthalpies, type EnthalpySource } from './thermal-design.js';
import { thermalDraws, type ThermalDraws } from './thermal-uncertainty.js';
import { propagate, type Percentile, type UncertaintyResult } from './uncertainty.js';
import type { WallCoefficient } from './wall-coefficient.js';
import { thermalPelletBuilder, type ThermalPelletBuilder, type ThermalPelletInfo } from './heat-pellet.js';
import { SIZING_STATUS, type SizingBase, type SizingInput, type SizingResult, type UngatedSizing } from './size.js';

/** The energy-balance part of a sizing result. */
export interface ThermalSizing {
  mode: Exclude<CoolingMode, 'isothermal'>;
  model: string;
  enthalpies: EnthalpySource[];
  heatTransfer: { U: number | null; unit: 'W/(m2 K)'; source: string; wall?: WallCoefficient };
  design: {
    count: number; innerDiameter: number; length: number; catalystPerTube: number; catalystMass: number;
    pressureDrop: { pa: number; bar: number }; allowedPressureDrop: number; maxTubeLength: number;
    binding: Binding; met: boolean; countFor: HeatDesignChoice['countFor'];
    searchedDiameters?: { diameter: number; count: number; hotSpot: number; binding: Binding; met: boolean }[];
  };
  hotSpot: { temperature: number; position: { catalystPerTube: number; length: number }; limit: number | null; percentiles?: Percentile[] };
  outletTemperature: { value: number; percentiles?: Percentile[] };
  coolant: { inlet: number | null; atGasInlet: number | null; atGasOutlet: number | null };
  /** Along one tube: position (m), catalyst (kg), T and Ta (K), conversion of the key species, p/p0. */
  profile: { z: number[]; W: number[]; T: number[]; Ta: (number | null)[]; conversion: number[]; p: number[] };
  bvp?: ShootingReport;
  runaway?: RunawayMargin;
  draws?: ThermalDraws;
  /** The plant pellet under heat: eta per reaction along the designed tube at the local temperature. */
  pellet?: ThermalPelletInfo & { profile: { z: number[]; conversion: number[]; T: number[]; eta: Record<string, number[]> }; solves: number };
}

const MODEL = 'one-dimensional pseudo-homogeneous plug flow (no radial gradients), mole + energy + Ergun balances';

/** The pellet factor builder of a case with a pellet (eta at the local temperature), else undefined. */
function pelletBuilder(input: SizingInput, sys: DesignSystem, dH: Float64Array): ThermalPelletBuilder | undefined {
  const k = input.kase;
  return k.pellet ? thermalPelletBuilder(input.kinetics, k, k.pellet, input.handoff.species, input.molarMasses!, sys.theta, dH) : undefined;
}

/** Design at the case diameter or the widest searched diameter that meets every limit. */
function chooseDesign(sys: DesignSystem, input: SizingInput, th: ThermalCase, dH: Float64Array, key: number, X: number): { hs: HeatSizer; choice: HeatDesignChoice; searched?: ThermalSizing['design']['searchedDiameters'] } {
  const pellet = pelletBuilder(input, sys, dH);
  const base = new HeatSizer(sys, input.kinetics, th, dH, input.molarMasses!, undefined, pellet);
  const choice = chooseTubes(base, key, X);
  if (choice.met || !th.searchDiameters) return { hs: base, choice };
  const searched: NonNullable<ThermalSizing['design']['searchedDiameters']> = [];
  for (const D of [...th.searchDiameters].sort((a, b) => b - a)) {
    const hs = new HeatSizer(sys, input.kinetics, th, dH, input.molarMasses!, D, pellet);
    const c = chooseTubes(hs, key, X);
    searched.push({ diameter: D, count: c.trial.N, hotSpot: c.trial.hotSpot, binding: c.binding, met: c.met });
    if (c.met) return { hs, choice: c, searched };
  }
  return { hs: base, choice, searched };
}

/** Profile of the designed tube on 101 points. */
function profileOf(hs: HeatSizer, t: TubeTrial, key: number): ThermalSizing['profile'] {
  const W = Array.from({ length: 101 }, (_, i) => (t.W * i) / 100);
  const sol = new ThermalTube(t.tube.spec, hs.kinetics, hs.sys.theta).solve(t.W, { profile: W });
  const rb = hs.sys.kase.tubes!.bulkDensity;
  const p = sol.profile!;
  return {
    z: p.x.map((x) => x / (rb * hs.area())), W: p.x, T: p.T, Ta: p.Ta,
    conversion: p.F.map((F) => hs.conversion(F, t.N, key)), p: p.p,
  };
}

/** eta per reaction at 21 points of the designed tube, solved afresh at the local state (bulk T included). */
function pelletAlongBed(hs: HeatSizer, t: TubeTrial, key: number): NonNullable<ThermalSizing['pellet']> {
  const f = t.tube.pellet!;
  const W = Array.from({ length: 21 }, (_, i) => (t.W * i) / 20);
  const tt = new ThermalTube(t.tube.spec, hs.kinetics, hs.sys.theta);
  const p = tt.solve(t.W, { profile: W }).profile!;
  const L = tt.balances.layout;
  const y = new Float64Array(L.n);
  const C = new Float64Array(L.nS);
  const ids = hs.kinetics.reactionIds;
  const eta: Record<string, number[]> = Object.fromEntries(ids.map((id) => [id, [] as number[]]));
  p.x.forEach((_, i) => {
    y.set(p.F[i]);
    if (L.p >= 0) y[L.p] = p.p[i];
    if (L.T >= 0) y[L.T] = p.T[i];
    tt.balances.concentrations(y, C);
    const e = f.evaluator.evaluate(C, p.T[i]);
    ids.forEach((id, r) => eta[id].push(e.factor[r]));
  });
  const rb = hs.sys.kase.tubes!.bulkDensity;
  return {
    ...hs.pellet!.info(t.tube.G),
    profile: { z: p.x.map((x) => x / (rb * hs.area())), conversion: p.F.map((F) => hs.conversion(F, t.N, key)), T: p.T, eta },
    solves: f.evaluator.solves,
  };
}

/** The thermal section and the whole-bed size for the chosen design (nominal fit). */
function describeDesign(hs: HeatSizer, choice: HeatDesignChoice, th: ThermalCase, key: number, searched?: ThermalSizing['design']['searchedDiameters']): ThermalSizing {
  const t = choice.trial;
  const sol = t.solution;
  const rb = hs.sys.kase.tubes!.bulkDensity;
  const U = th.mode === 'adiabatic' ? null : t.tube.U;
  return {
    mode: th.mode, model: MODEL,
    enthalpies: [],
    heatTransfer: { U, unit: 'W/(m2 K)', source: th.mode === 'adiabatic' ? 'adiabatic: no heat exchange' : t.tube.uSource, ...(t.tube.wall ? { wall: t.tube.wall } : {}) },
    design: {
      count: t.N, innerDiameter: hs.diameter, length: t.length, catalystPerTube: t.W, catalystMass: t.W * t.N,
      pressureDrop: { pa: t.drop, bar: t.drop / 1e5 }, allowedPressureDrop: hs.sys.kase.tubes!.allowedPressureDrop, maxTubeLength: th.maxTubeLength,
      binding: choice.binding, met: choice.met, countFor: choice.countFor, ...(searched ? { searchedDiameters: searched } : {}),
    },
    hotSpot: { temperature: t.hotSpot, position: { catalystPerTube: sol?.hotSpot.position ?? NaN, length: (sol?.hotSpot.position ?? NaN) / (rb * hs.area()) }, limit: th.maxTemperature ?? null },
    outletTemperature: { value: sol?.outletTemperature ?? NaN },
    coolant: { inlet: th.mode === 'adiabatic' ? null : th.coolant.temperature, atGasInlet: sol?.coolant.atInlet ?? null, atGasOutlet: sol?.coolant.atOutlet ?? null },
    profile: profileOf(hs, t, key),
    ...(sol?.bvp ? { bvp: sol.bvp } : {}),
    ...(t.tube.pellet ? { pellet: pelletAlongBed(hs, t, key) } : {}),
  };
}

/** Monte Carlo: size percentiles (propagate) and the installed tube rated over the draws. */
function drawsFor(input: SizingInput, map: ParameterMap, sys: DesignSystem, hs: HeatSizer, t: TubeTrial, key: number, X: number, runawayGuess: number | null): { unc: UncertaintyResult; draws?: ThermalDraws } {
  const opts = input.options ?? {};
  const kase = input.kase;
  const draws = opts.draws ?? kase.uncertainty.draws;
  const seed = opts.seed ?? kase.uncertainty.seed;
  const levels = opts.levels ?? kase.uncertainty.levels;
  const quantity = (): { value: number; status: string } => {
    const r = hs.trial(t.N, key, X, 1e-7);
    return { value: r.status === 'sized' ? r.W * t.N : NaN, status: r.status };
  };
  const unc = propagate(new Sizer(sys), map, quantity, t.W * t.N, 'size', 'kg', undefined, { draws, seed, levels, ...(opts.onProgress ? { onProgress: opts.onProgress } : {}) });
  if (draws === 0) return { unc };
  const level = opts.designLevel ?? kase.uncertainty.designLevel ?? 0.95;
  const installed = Math.max(unc.percentiles.find((p) => Math.abs(p.level - level) < 1e-9)?.value ?? t.W * t.N, t.W * t.N) / t.N;
  const td = thermalDraws(t.tube.spec, input.kinetics, map, sys.theta, installed, key, { draws, seed, levels: [...new Set([...levels, level])].sort(), runawayGuess });
  return { unc, draws: td };
}

/** Size the cooled bed of a case with heat.mode (see the file header). */
export function sizeCooledBed(input: SizingInput, map: ParameterMap, sys: DesignSystem, key: number, X: number, warnings: Warning[], base: SizingBase): UngatedSizing {
  const th = input.kase.heat!.thermal!;
  const en = resolveEnthalpies(input.kinetics, input.handoff, input.kase, th);
  warnings.push(...en.warnings);
  const { hs, choice, searched } = chooseDesign(sys, input, th, en.values, key, X);
  const t = choice.trial;
  if (t.status !== 'sized') {
    const status = t.status === 'pressure-exhausted' ? 'pressure-exhausted' : t.status === 'bvp-not-converged' ? 'bvp-not-converged' : t.status === 'runaway' ? 'runaway' : 'target-unreachable';
    return { ...outcome(SIZING_STATUS, status, warnings, choice.detail ?? t.detail), ...base };
  }
  const thermal = describeDesign(hs, choice, th, key, searched);
  thermal.enthalpies = en.sources;
  if (th.mode !== 'adiabatic') thermal.runaway = runawayMargin(t.tube.spec, input.kinetics, sys.theta, t.W);
  t.tube.wall?.warnings.forEach((w) => warnings.push(w));
  if (hs.pellet) warnings.push(...hs.pellet.warnings(t.tube.G));
  if (t.tube.pellet && t.tube.pellet.failures > 0) warnings.push({ code: 'W_PELLET_SOLVE', message: `${t.tube.pellet.failures} pellet solves did not converge (${t.tube.pellet.lastFailure ?? ''}); their effectiveness factors were used as found`, path: ['pellet'] });
  const mc = drawsFor(input, map, sys, hs, t, key, X, thermal.runaway?.criticalCoolantTemperature ?? null);
  if (mc.draws) {
    thermal.draws = mc.draws;
    thermal.hotSpot.percentiles = mc.draws.hotSpot.percentiles;
    thermal.outletTemperature.percentiles = mc.draws.outletTemperature.percentiles;
  }
  return verdict(input, thermal, mc.unc, warnings, base, t, hs);
}

/** The full sizing result of a cooled bed: status from the limits and the hot-spot percentile. */
function verdict(input: SizingInput, thermal: ThermalSizing, unc: UncertaintyResult, warnings: Warning[], base: SizingBase, t: TubeTrial, hs: HeatSizer): UngatedSizing {
  const kase = input.kase;
  const level = input.options?.designLevel ?? kase.uncertainty.designLevel ?? 0.95;
  const limit = thermal.hotSpot.limit;
  const hotAtLevel = thermal.hotSpot.percentiles?.find((p) => Math.abs(p.level - level) < 1e-9)?.value;
  let status: SizingResult['status'] = 'sized';
  let detail: string | undefined;
  if (!thermal.design.met) {
    status = thermal.design.binding === 'hot spot' ? 'hot-spot-exceeded' : 'limits-not-met';
    detail = `the design does not meet the ${thermal.design.binding} limit`;
  } else if (limit !== null && hotAtLevel !== undefined && hotAtLevel > limit) {
    status = 'hot-spot-exceeded';
    detail = `the P${Math.round(level * 100)} hot spot ${hotAtLevel.toFixed(1)} K exceeds heat.maxTemperature ${limit.toFixed(1)} K`;
  }
  if (thermal.runaway?.margin !== null && thermal.runaway?.margin !== undefined && thermal.runaway.margin < 10) {
    warnings.push({ code: 'W_RUNAWAY', message: `the design coolant temperature is within ${thermal.runaway.margin.toFixed(1)} K of the critical coolant temperature (${thermal.runaway.criterion})`, path: ['heat', 'coolant', 'temperature'] });
  }
  const W = thermal.design.catalystMass;
  const FA0 = kase.feed[kase.species.indexOf((kase.target as { species: string }).species)];
  const amounts: Record<string, number> = {};
  const moleFractions: Record<string, number> = {};
  const out = t.solution!.outlet;
  let total = 0;
  out.forEach((v) => (total += Math.max(v, 0)));
  kase.species.forEach((s, j) => {
    amounts[s] = Math.max(out[j], 0) * t.N;
    moleFractions[s] = total > 0 ? Math.max(out[j], 0) / total : 0;
  });
  const tgt = kase.target as { species: string; value: number };
  const P0 = kase.pressure!;
  return {
    ...outcome(SIZING_STATUS, status, warnings, detail),
    ...base,
    size: { value: W, unit: 'kg', quantity: 'catalyst mass' },
    spaceTime: { value: W / FA0, unit: 'kg s/mol', definition: `W/F_${tgt.species},0` },
    outlet: { amounts, amountUnit: 'mol/s', moleFractions, conversion: { species: tgt.species, value: hs.conversion(out, t.N, kase.species.indexOf(tgt.species)) } },
    pressure: { inlet: P0, outlet: P0 - t.drop, drop: t.drop, dropBar: t.drop / 1e5, unit: 'Pa' },
    tubes: {
      count: t.N, innerDiameter: hs.diameter, length: t.length, catalystPerTube: t.W, flowPerTube: t.tube.spec.F0.reduce((a, b) => a + b, 0),
      superficialMassFlux: t.tube.G, alphaPerTube: t.tube.spec.alpha, pressureDrop: { pa: t.drop, bar: t.drop / 1e5 },
      allowedPressureDrop: kase.tubes!.allowedPressureDrop, designedFor: { level: null, basis: `nominal fit, energy balance (${thermal.design.binding} binding)` }, nominalCount: t.N,
    },
    uncertainty: unc,
    thermal,
  };
}
