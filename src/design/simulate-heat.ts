/**
 * One run of a study solved with its mole and energy balances (simulate --heat): the lab reactor
 * of the run, fed (or charged) at the run's temperature, with the heat inputs of
 * simulate-heat-input.ts.
 *
 * - Packed bed and plug flow: the non-isothermal tube of reactors/thermal (thermal-tube.ts; mole,
 *   energy, Ergun and coolant balances; counter-current coolant by shooting), with
 *   U a = 4 U / D per m3 of tube (divided by the bulk density per kg of catalyst).
 * - Stirred tank: every steady state of the algebraic heat balance with its stability
 *   (stirred-tank-heat.ts); the run reports the coolest stable state (the one a start-up from a
 *   cold feed normally reaches; the list shows the others).
 * - Batch and semibatch: the jacketed vessel in time (batch-heat.ts), UA = U times heat.exchangeArea.
 * The run's outlet, conversion and concentrations are those of the non-isothermal solution. This
 * lives in design/ because the heat inputs are read by the case file's loader (design/heat-case.ts).
 */
import { RateloomError } from '../core/errors.js';
import { GAS_CONSTANT } from '../core/constants.js';
import type { CompiledKinetics } from '../kinetics/compiled.js';
import { DEFAULT_BATCH_VOLUME } from '../reactors/batch.js';
import { basisWeights } from '../reactors/checks.js';
import { prepareFlowTube } from '../reactors/flow-tube.js';
import type { ReactorSpec } from '../reactors/types.js';

import { solveBatchHeat } from '../reactors/thermal/batch-heat.js';
import { ReactionEnthalpy } from '../reactors/thermal/enthalpy.js';
import { stirredTankSteadyStates, type StirredHeatStatus } from '../reactors/thermal/stirred-tank-heat.js';
import { checkHeatCapacities, checkThermalSpec } from '../reactors/thermal/thermal-inputs.js';
import { ThermalTube, type ThermalStatus } from '../reactors/thermal/thermal-tube.js';
import type { ThermalTubeSpec } from '../reactors/thermal/tube-balances.js';
import { loadSimulationHeat, type SimulationHeat } from './simulate-heat-input.js';
import type { Parameter } from '../core/parameter.js';
import type { ReactorSolution } from '../reactors/types.js';
import { simulatedRun, simulateStudy, type RunSolver, type SimulateOptions, type SimulationResult } from '../study/simulate.js';
import type { Study } from '../study/types.js';
import type { StudyRun } from '../study/types.js';
import type { SimulatedHeat } from '../study/simulate-heat-types.js';

/** What the non-isothermal solve of one run gives simulate.ts. */
export interface HeatRunSolution {
  status: ThermalStatus | StirredHeatStatus;
  success: boolean;
  message: string;
  warnings: string[];
  /** Outlet flows (mol/s) or final moles (mol). */
  amounts: Float64Array;
  /** Outlet (final) concentrations, mol/m3. */
  concentrations: Float64Array;
  pressureRatio: number;
  heat: SimulatedHeat;
}

/** Everything a run's heat solve needs besides the run. */
export interface HeatRunContext {
  reactor: ReactorSpec;
  kinetics: CompiledKinetics;
  theta: Float64Array;
  heat: SimulationHeat;
  species: readonly string[];
  keyIndex: number;
  profile: boolean;
}

/** Profile points along the reactor (or in time). */
const PROFILE_POINTS = 51;

const TUBE_MODEL = 'one-dimensional pseudo-homogeneous plug flow (no radial gradients): mole + energy (+ Ergun, + coolant) balances';

/** Reaction enthalpies and the species-present check of a run. */
function enthalpyOf(ctx: HeatRunContext, amounts: ArrayLike<number>): ReactionEnthalpy {
  const { kinetics, heat } = ctx;
  const nS = ctx.species.length;
  const present = Float64Array.from({ length: nS }, (_, j) => {
    let reacts = 0;
    for (let i = 0; i < kinetics.reactionIds.length; i++) if (kinetics.stoich[i * nS + j] !== 0) reacts = 1;
    return amounts[j] > 0 ? 1 : reacts;
  });
  checkHeatCapacities(present, heat.thermal.heatCapacities, ctx.species);
  return new ReactionEnthalpy(kinetics.stoich, heat.enthalpies, heat.thermal.referenceTemperature, heat.thermal.heatCapacities);
}

function positions(size: number): number[] {
  return Array.from({ length: PROFILE_POINTS }, (_, i) => (size * i) / (PROFILE_POINTS - 1));
}

function limitOf(heat: SimulationHeat, hot: number): SimulatedHeat['limit'] {
  const m = heat.thermal.maxTemperature;
  return m === undefined ? undefined : { maxTemperature: m, exceeded: hot > m };
}

/** Solve one run under heat (see the file header); bad input throws RateloomError. */
export function solveRunWithHeat(run: StudyRun, ctx: HeatRunContext): HeatRunSolution {
  const kind = ctx.reactor.kind;
  if (kind === 'packed-bed' || kind === 'plug-flow') return tubeRun(run, ctx, kind);
  if (kind === 'stirred-tank') return tankRun(run, ctx);
  return vesselRun(run, ctx);
}

/** The thermal spec of a lab tube (packed bed or plug flow). */
function tubeSpec(run: StudyRun, ctx: HeatRunContext, kind: 'packed-bed' | 'plug-flow'): { spec: ThermalTubeSpec; size: number } {
  const prep = prepareFlowTube(kind, ctx.reactor, run, ctx.kinetics);
  const th = ctx.heat.thermal;
  const U = th.overallCoefficient ?? 0;
  const D = ctx.heat.innerDiameter ?? NaN;
  const rb = ctx.heat.bulkDensity ?? ctx.reactor.bulkDensity ?? NaN;
  const perVolume = (4 * U) / D;
  const spec: ThermalTubeSpec = {
    kind, gas: prep.gas, mode: th.mode, T0: run.temperature, ...(prep.gas ? { P0: run.pressure } : { v0: run.volumetricFlow }),
    F0: prep.F0, alpha: prep.alpha, weights: prep.weights, enthalpy: enthalpyOf(ctx, prep.F0), cp: th.heatCapacities,
    Ua: th.mode === 'adiabatic' ? 0 : kind === 'packed-bed' ? perVolume / rb : perVolume,
    coolantTemperature: th.mode === 'adiabatic' ? NaN : th.coolant.temperature,
    coolantFlowCapacity: (th.coolant.flow ?? NaN) * (th.coolant.heatCapacity ?? NaN),
  };
  checkThermalSpec(spec, ctx.species);
  return { spec, size: prep.size };
}

function tubeRun(run: StudyRun, ctx: HeatRunContext, kind: 'packed-bed' | 'plug-flow'): HeatRunSolution {
  const { spec, size } = tubeSpec(run, ctx, kind);
  const tt = new ThermalTube(spec, ctx.kinetics, ctx.theta);
  const sol = tt.solve(size, ctx.profile ? { profile: positions(size) } : {});
  const L = tt.balances.layout;
  const y = new Float64Array(L.n);
  y.set(sol.outlet);
  if (L.p >= 0) y[L.p] = sol.outletPressureRatio;
  if (L.T >= 0) y[L.T] = sol.outletTemperature;
  const C = new Float64Array(L.nS);
  tt.balances.concentrations(y, C);
  const unit = kind === 'packed-bed' ? 'kg' : 'm3';
  const heat: SimulatedHeat = {
    mode: ctx.heat.thermal.mode, model: TUBE_MODEL, feedTemperature: spec.T0, outletTemperature: sol.outletTemperature,
    hotSpot: { temperature: sol.hotSpot.temperature, position: sol.hotSpot.position, unit },
    coolant: { temperature: spec.mode === 'adiabatic' ? null : spec.coolantTemperature, atInlet: sol.coolant.atInlet, atOutlet: sol.coolant.atOutlet },
    ...(sol.profile ? { profile: { x: sol.profile.x, unit, T: sol.profile.T, Ta: sol.profile.Ta } } : {}),
    ...(sol.bvp ? { bvp: sol.bvp } : {}),
  };
  return finish({ status: sol.status, success: sol.success, message: sol.message, warnings: sol.warnings.map((w) => w.message), amounts: sol.outlet, concentrations: C, pressureRatio: sol.outletPressureRatio, heat }, ctx);
}

/** Attach the limit check (a warning when the hot spot passes heat.maxTemperature). */
function finish(s: HeatRunSolution, ctx: HeatRunContext): HeatRunSolution {
  const limit = limitOf(ctx.heat, s.heat.hotSpot.temperature);
  if (!limit) return s;
  s.heat.limit = limit;
  if (limit.exceeded) s.warnings.push(`the highest temperature ${s.heat.hotSpot.temperature.toFixed(2)} K exceeds heat.maxTemperature ${limit.maxTemperature.toFixed(2)} K`);
  return s;
}

/** UA of a vessel, W/K (0 adiabatic). */
function vesselUA(ctx: HeatRunContext): number {
  const th = ctx.heat.thermal;
  return th.mode === 'adiabatic' ? 0 : (th.overallCoefficient ?? 0) * (th.exchangeArea ?? 0);
}

function tankRun(run: StudyRun, ctx: HeatRunContext): HeatRunSolution {
  const gas = ctx.reactor.phase === 'gas';
  const F0 = Float64Array.from(run.feed ?? []);
  const allMass = ctx.kinetics.basis.every((b) => b === 'mass');
  const W = run.catalystMass ?? (allMass ? run.size : undefined);
  const weights = basisWeights(ctx.kinetics, run.size, W, {
    volume: [['runs', run.id, 'size'], 'unreachable', ''],
    mass: [['runs', run.id, 'catalystMass'], 'a mass-basis rate in a stirred tank needs the catalyst mass', 'Give the run its catalystMass in kg.'],
  });
  const th = ctx.heat.thermal;
  const UA = vesselUA(ctx);
  const res = stirredTankSteadyStates({
    gas, T0: run.temperature, ...(gas ? { P: run.pressure } : { v0: run.volumetricFlow }), F0, size: 1, weights,
    enthalpy: enthalpyOf(ctx, F0), cp: th.heatCapacities, UA, Ta: UA > 0 ? th.coolant.temperature : run.temperature,
  }, ctx.kinetics, ctx.theta);
  const k = ctx.keyIndex;
  const pick = res.steadyStates.find((s) => s.stable) ?? res.steadyStates[0];
  const states = res.steadyStates.map((s) => ({
    temperature: s.temperature, conversion: k >= 0 && F0[k] > 0 ? (F0[k] - s.outlet[k]) / F0[k] : null, stable: s.stable, reported: s === pick, outlet: s.outlet,
  }));
  const amounts = pick ? Float64Array.from(pick.outlet) : F0;
  const T = pick?.temperature ?? run.temperature;
  const C = tankConcentrations(amounts, gas, run, T);
  const warnings = res.warnings.map((w) => w.message);
  if (states.length > 1) warnings.push(`the tank has ${states.length} steady states; the coolest stable one is reported, and start-up decides which one the reactor reaches`);
  const heat: SimulatedHeat = {
    mode: th.mode, model: 'well-mixed tank: algebraic mole and heat balances, heat generated = heat removed', feedTemperature: run.temperature, outletTemperature: T,
    hotSpot: { temperature: T, position: null, unit: 'm3' }, coolant: { temperature: UA > 0 ? th.coolant.temperature : null, atInlet: null, atOutlet: null },
    steadyStates: states, stabilityCriterion: res.stabilityCriterion,
  };
  return finish({ status: res.status, success: res.success && pick !== undefined, message: res.message, warnings, amounts, concentrations: C, pressureRatio: 1, heat }, ctx);
}

function tankConcentrations(F: Float64Array, gas: boolean, run: StudyRun, T: number): Float64Array {
  if (!gas) return F.map((f) => f / (run.volumetricFlow as number));
  let FT = 0;
  for (const f of F) FT += Math.max(f, 0);
  return F.map((f) => (FT > 0 ? ((run.pressure as number) / (GAS_CONSTANT * T)) * (Math.max(f, 0) / FT) : 0));
}

/** Batch or semibatch vessel with a jacket (liquid). */
function vesselRun(run: StudyRun, ctx: HeatRunContext): HeatRunSolution {
  const kind = ctx.reactor.kind;
  if (ctx.reactor.phase === 'gas') throw new RateloomError('E_VALUE', `the energy balance of a ${kind} vessel is written for a liquid`, { path: ['reactor', 'phase'], fix: 'Drop --heat for a gas-phase vessel.' });
  const nS = ctx.species.length;
  const V0 = run.initialVolume ?? DEFAULT_BATCH_VOLUME;
  const N0 = Float64Array.from({ length: nS }, (_, j) => (run.initialConcentrations?.[j] ?? 0) * V0);
  const semi = kind === 'semibatch';
  const massWeight = semi || run.catalystMass === undefined ? undefined : run.catalystMass / V0;
  const weights = basisWeights(ctx.kinetics, 1, massWeight, {
    volume: [['reactions'], 'unreachable', ''],
    mass: [['runs', run.id, 'catalystMass'], `a mass-basis rate in a ${kind} under heat needs ${semi ? 'a batch vessel (the catalyst loading changes with the volume)' : 'the catalyst mass'}`, semi ? 'Drop --heat for this study.' : 'Give the run its catalystMass in kg.'],
  });
  const feed = semi && run.feed ? { flows: Float64Array.from(run.feed), volumetricFlow: run.volumetricFlow ?? 0, temperature: run.temperature } : undefined;
  const present = Float64Array.from(N0, (n, j) => n + (feed?.flows[j] ?? 0));
  const th = ctx.heat.thermal;
  const UA = vesselUA(ctx);
  const res = solveBatchHeat({
    T0: run.temperature, V0, N0, weights, enthalpy: enthalpyOf(ctx, present), cp: th.heatCapacities, UA, Ta: UA > 0 ? th.coolant.temperature : run.temperature,
    ...(feed ? { feed } : {}),
  }, ctx.kinetics, ctx.theta, run.size, ctx.profile ? { profile: positions(run.size) } : {});
  const Vend = V0 + (feed ? feed.volumetricFlow * res.t : 0);
  const heat: SimulatedHeat = {
    mode: th.mode, model: 'well-mixed liquid vessel with a jacket at one temperature: mole and energy balances in time', feedTemperature: run.temperature, outletTemperature: res.temperature,
    hotSpot: { temperature: res.hotSpot.temperature, position: res.hotSpot.position, unit: 's' },
    coolant: { temperature: UA > 0 ? th.coolant.temperature : null, atInlet: null, atOutlet: null },
    ...(res.profile ? { profile: { x: res.profile.t, unit: 's', T: res.profile.T, Ta: res.profile.t.map(() => (UA > 0 ? th.coolant.temperature : null)) } } : {}),
  };
  const amounts = Float64Array.from(res.moles);
  return finish({ status: res.status, success: res.success, message: res.message, warnings: res.warnings.map((w) => w.message), amounts, concentrations: amounts.map((n) => n / Vend), pressureRatio: 1, heat }, ctx);
}

/** Options of simulateWithHeat: those of simulateStudy plus the heat file's name for messages. */
export interface SimulateHeatOptions extends SimulateOptions {
  /** File name of the heat inputs, for error messages; default 'heat'. */
  heatFile?: string;
}

/**
 * Solve every run of a study with its mole and energy balances: `heat` is the parsed JSON of a heat
 * file ({ "heat": {...case-file heat block...}, "tubes": { "innerDiameter": ... } },
 * simulate-heat-input.ts); the rest as simulateStudy.
 */
export function simulateWithHeat(study: Study, parameters: readonly Parameter[], heatDoc: unknown, options: SimulateHeatOptions = {}): SimulationResult {
  const { heatFile, ...rest } = options;
  const heat = loadSimulationHeat(heatDoc, study, heatFile ?? 'heat');
  const solver: RunSolver = (st, run, solved, kinetics, theta, measured) => {
    const h = solveRunWithHeat(solved, { reactor: st.reactor, kinetics, theta, heat, species: st.chemistry.speciesNames, keyIndex: st.keyReactantIndex, profile: rest.profile === true });
    const sol: ReactorSolution = {
      runId: run.id, status: 'success', success: h.success, message: h.message, warnings: [],
      outletAmounts: h.amounts, outletConcentrations: h.concentrations, pressureRatio: h.pressureRatio,
      stats: { rhsEvaluations: 0, jacobianEvaluations: 0, steps: 0, method: 'energy balance' },
    };
    const base = simulatedRun(st, run, sol, measured);
    return { ...base, status: h.status, warnings: [...h.warnings, ...base.warnings], heat: h.heat };
  };
  return simulateStudy(study, parameters, rest, solver);
}
