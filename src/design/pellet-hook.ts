/**
 * The plant pellet in the bed balances: a RateHook (system.ts) that multiplies the intrinsic rates
 * by the pellet's effectiveness factor at the local bulk state. The factor comes from the pellet
 * model of src/pellets (numerical collocation solve or Bischoff's generalized modulus) through an
 * EtaTable keyed by the conversion of the key species, so the pellet is solved about once per
 * `etaStep` of conversion, not at every right-hand-side call. The table is a function of the
 * kinetic parameters and the pressure-drop parameter: it is rebuilt when either changes (another
 * tube count, another Monte Carlo draw), so every draw's eta comes from its own parameters.
 */
import type { CompiledKinetics } from '../kinetics/compiled.js';
import type { SpeciesSpec } from '../chemistry/spec.js';
import { RateloomError } from '../core/errors.js';
import { EffectivenessEvaluator, type PelletModel } from '../pellets/effectiveness.js';
import { EtaTable } from '../pellets/eta-table.js';
import { effectiveDiffusivities, molecularDiffusivities } from '../pellets/diffusivity.js';
import { HEAT_TRANSFER, MASS_TRANSFER, heatTransfer, massTransfer, rangeWarning, type BedFlow } from '../pellets/external.js';
import type { Warning } from '../core/outcome.js';
import { pelletGeometry } from '../pellets/geometry.js';
import type { PelletSpec } from '../pellets/types.js';
import type { DesignCase } from './case.js';
import type { CasePellet } from './case-pellet.js';
import { buildSystem, type DesignSystem, type RateHook } from './system.js';
import { Sizer } from './sizer.js';
import { learnEtaTable } from './pellet-learn.js';
import { GAS_CONSTANT, STANDARD_ATMOSPHERE } from '../core/constants.js';

/** The pellet scaled to another diameter (all lengths in proportion). */
export function scaledPellet(p: PelletSpec, diameter: number): PelletSpec {
  const f = diameter / p.diameter;
  return {
    ...p,
    diameter,
    ...(p.length !== undefined ? { length: p.length * f } : {}),
    ...(p.innerDiameter !== undefined ? { innerDiameter: p.innerDiameter * f } : {}),
  };
}

/** Per reaction: compiled rate -> mol per m3 of pellet per s. */
function rateToPellet(kinetics: CompiledKinetics, kase: DesignCase, rhoP: number): Float64Array {
  return Float64Array.from(kinetics.basis, (b, i) => {
    if (b === 'mass') return rhoP;
    if (kase.bulkDensity === undefined) {
      throw new RateloomError('E_CASE', `reaction '${kinetics.reactionIds[i]}' has a volume-based rate; the pellet needs the bed bulk density to convert it`, {
        path: ['bulkDensity'], fix: 'Add "bulkDensity" (or tubes.bulkDensity), kg catalyst per m3 of bed.',
      });
    }
    return rhoP / kase.bulkDensity;
  });
}

/** The resolved pellet model of a case (SI). */
export function casePelletModel(kinetics: CompiledKinetics, kase: DesignCase, cp: CasePellet, species: readonly SpeciesSpec[], pellet: PelletSpec = cp.pellet): PelletModel {
  const geo = pelletGeometry(pellet);
  const P = kase.pressure ?? STANDARD_ATMOSPHERE;
  if (kase.reactor.phase === 'liquid' && pellet.molecularDiffusivity !== undefined && typeof pellet.molecularDiffusivity === 'object' && 'estimate' in pellet.molecularDiffusivity) {
    throw new RateloomError('E_CASE', "Fuller's correlation estimates gas diffusivities; this case is liquid", { path: ['pellet', 'molecularDiffusivity'], fix: 'Give the molecular or effective diffusivity (m2/s).' });
  }
  const De = effectiveDiffusivities(pellet, species, kase.temperature, P, ['pellet']);
  const model: PelletModel = {
    kinetics, a: geo.a, R: geo.R, volumeToSurface: geo.volumeToSurface, De,
    rateToPellet: rateToPellet(kinetics, kase, pellet.density), method: cp.method,
  };
  if (cp.nonIsothermal) {
    if (pellet.thermalConductivity === undefined) {
      throw new RateloomError('E_MISSING_FIELD', 'a non-isothermal pellet needs its thermal conductivity', { path: ['pellet', 'thermalConductivity'], fix: 'Add "thermalConductivity": "0.3 W/(m K)".' });
    }
    if (!kase.heat) {
      throw new RateloomError('E_MISSING_FIELD', 'a non-isothermal pellet needs the reaction enthalpies', { path: ['heat', 'reactionEnthalpy'], fix: 'Add "heat": { "reactionEnthalpy": { "r1": "-90 kJ/mol" }, "heatCapacity": ... }.' });
    }
    const h = kase.heat.reactionEnthalpy;
    model.thermal = { conductivity: pellet.thermalConductivity, enthalpy: Float64Array.from(kinetics.reactionIds, (id) => h[id] ?? 0) };
  }
  return model;
}

/** Fluid density at the inlet (ideal gas), kg/m3. */
function inletDensity(kase: DesignCase, molarMasses: ArrayLike<number>): number {
  let m = 0;
  let F = 0;
  kase.feed.forEach((f, j) => {
    m += f * molarMasses[j];
    F += f;
  });
  return (kase.pressure! * (m / F)) / (GAS_CONSTANT * kase.temperature);
}

/**
 * The film of the plant pellet for superficial mass flux G (kg/(m2 s)) at the bed inlet state:
 * k_c per species (Wakao-Funazkri) and, with the fluid's conductivity and heat capacity and the
 * reaction enthalpies, h (Wakao-Kaguei-Funazkri); undefined when the molecular diffusivities, the
 * viscosity, the molar masses or the pressure are missing. Warnings give a Reynolds number outside
 * the correlations' ranges.
 */
export function pelletFilm(kase: DesignCase, cp: CasePellet, species: readonly SpeciesSpec[], molarMasses: ArrayLike<number>, G: number, enthalpy?: Float64Array): { film: NonNullable<PelletModel['film']>; reynolds: number; warnings: Warning[] } | undefined {
  const mu = cp.fluid.viscosity ?? kase.tubes?.viscosity;
  const Dm = molecularDiffusivities(cp.pellet, species, kase.temperature, kase.pressure ?? STANDARD_ATMOSPHERE, ['pellet']);
  if (mu === undefined || !Dm || kase.pressure === undefined) return undefined;
  const geo = pelletGeometry(cp.pellet);
  const flow: BedFlow = { particleDiameter: geo.equivalentDiameter, massFlux: G, density: inletDensity(kase, molarMasses), viscosity: mu };
  const mts = Array.from(Dm, (D) => massTransfer(flow, D));
  const warnings = rangeWarning(MASS_TRANSFER, mts[0].Re, 'external mass transfer at the bed inlet');
  const kc = Float64Array.from(mts, (m) => m.kc);
  const { thermalConductivity: kf, heatCapacity: cpf } = cp.fluid;
  if (kf === undefined || cpf === undefined || !enthalpy) return { film: { kc }, reynolds: mts[0].Re, warnings };
  warnings.push(...rangeWarning(HEAT_TRANSFER, mts[0].Re, 'external heat transfer at the bed inlet'));
  return { film: { kc, h: heatTransfer(flow, kf, cpf).h, enthalpy }, reynolds: mts[0].Re, warnings };
}

/** Where a rate factor counts its pellet solves that did not converge (their eta is still used). */
export interface PelletSolveTally {
  failures: number;
  lastFailure?: string;
}

/** eta at bulk (C, T) from a pellet solve, into `eta`; a solve that did not converge is counted on `tally`. */
export function solvePellet(evaluator: EffectivenessEvaluator, C: Float64Array, T: number, eta: Float64Array, tally: PelletSolveTally): void {
  const res = evaluator.evaluate(C, T);
  if (!res.ok) {
    tally.failures++;
    tally.lastFailure = res.detail;
  }
  eta.set(res.factor);
}

/** Whether a table entry calls for a pellet solve at every call (some eta above DIRECT_ABOVE). */
export function needsDirect(eta: ArrayLike<number>): boolean {
  for (let i = 0; i < eta.length; i++) if (eta[i] > DIRECT_ABOVE) return true;
  return false;
}

/** Key species of the eta table: the target species of a conversion target, else the first fed reactant. */
export function keySpecies(kinetics: CompiledKinetics, kase: DesignCase): number {
  if (kase.target.kind === 'conversion') return kase.species.indexOf(kase.target.species);
  const nS = kinetics.speciesNames.length;
  for (let j = 0; j < nS; j++) {
    for (let i = 0; i < kinetics.reactionIds.length; i++) if (kinetics.stoich[i * nS + j] < 0 && kase.feed[j] > 0) return j;
  }
  return 0;
}

/** An eta above this in the table switches the hook to a pellet solve at every call. */
export const DIRECT_ABOVE = 3;

/** Conversion of the key species up to which the learning pass fills the table. */
function learnUpTo(kase: DesignCase): number {
  return kase.target.kind === 'conversion' ? Math.min(0.995, kase.target.value + 0.05) : 0.99;
}

/** Tables kept per hook for recently seen (alpha, parameters) pairs. */
const TABLES_KEPT = 8;

/**
 * The rate hook: rates times eta from the table. The table is filled by a learning pass
 * (pellet-learn.ts), an integration of the bed with the current parameters (those of the bound
 * system) at the current pressure-drop parameter that solves the pellet at the end of each
 * error-controlled conversion segment; afterwards the sizing with those parameters only
 * interpolates. The learning pass starts from flat pellet profiles and depends on nothing but the
 * case, the parameters and alpha, so serial and worker Monte Carlo paths see the same numbers, and
 * the last TABLES_KEPT tables are kept by (alpha, parameters) and reused when a pair comes back
 * (the tube search's final count, the nominal parameters after a gradient step). A new alpha
 * (another tube count) or a new parameter vector (another draw) is looked at when a march starts
 * (t = 0) or outside a march (rates at a state, t NaN), never at the later steps of a march.
 */
export class PelletRateHook implements RateHook {
  table: EtaTable;
  readonly evaluator: EffectivenessEvaluator;
  private readonly eta: Float64Array;
  private readonly theta: Float64Array;
  private alpha = NaN;
  private learning = false;
  private readonly kept = new Map<string, { table: EtaTable; direct: boolean }>();
  /**
   * Solve the pellet at every call instead of reading the table: set when the table holds an eta
   * above DIRECT_ABOVE (a reaction whose surface rate nearly vanishes, such as a product that
   * reacts further inside the pellet). eta then behaves like 1/C at the surface, and a table keyed by
   * conversion would make the bed balances artificially stiff.
   */
  direct = false;
  private sys?: DesignSystem;
  /** Pellet solves that did not converge (their eta is still used). */
  failures = 0;
  lastFailure?: string;
  /** Learning passes run (a kept table reused is not counted). */
  learnings = 0;

  constructor(readonly model: PelletModel, private readonly kase: DesignCase, theta: ArrayLike<number>, private readonly key: number, private readonly inlet: number, private readonly step: number) {
    this.theta = Float64Array.from(theta);
    this.evaluator = new EffectivenessEvaluator(model, this.theta);
    this.table = new EtaTable(model.kinetics.reactionIds.length, step);
    this.eta = new Float64Array(model.kinetics.reactionIds.length);
  }

  /** The system whose pressure-drop parameter the table follows. */
  bind(sys: DesignSystem): void {
    this.sys = sys;
  }

  /** Progress coordinate: conversion of the key species at state y. */
  progress(y: ArrayLike<number>): number {
    return this.inlet > 0 ? 1 - y[this.key] / this.inlet : 0;
  }

  /** True (and the copy updated) when the bound system's parameters differ from the table's. */
  private thetaMoved(): boolean {
    const live = this.sys?.theta;
    if (!live) return false;
    for (let i = 0; i < live.length; i++) {
      if (live[i] !== this.theta[i]) {
        this.theta.set(live);
        return true;
      }
    }
    return false;
  }

  /** The table for pressure-drop parameter alpha and the table's parameters: a kept one, or learned now. */
  learn(alpha: number): void {
    this.alpha = alpha;
    const id = `${alpha}|${this.theta.join(',')}`;
    const kept = this.kept.get(id);
    if (kept) {
      this.table = kept.table;
      this.direct = kept.direct;
      return;
    }
    this.table = new EtaTable(this.model.kinetics.reactionIds.length, this.step);
    this.evaluator.clearWarmStart();
    this.learning = true;
    try {
      this.learnPass(alpha);
    } finally {
      this.learning = false;
    }
    this.learnings++;
    this.direct = this.table.entries().some((e) => needsDirect(e.values));
    if (this.kept.size >= TABLES_KEPT) this.kept.delete(this.kept.keys().next().value as string);
    this.kept.set(id, { table: this.table, direct: this.direct });
  }

  /** Integrate the bed with the table's parameters at alpha, solving the pellet segment by segment. */
  private learnPass(alpha: number): void {
    const sys = buildSystem(this.model.kinetics, this.kase, this.theta, this);
    sys.alpha = alpha;
    const C = new Float64Array(sys.nS);
    learnEtaTable({
      sys,
      table: this.table,
      progress: (y) => this.progress(y),
      solveAt: (_t, y) => {
        const eta = new Float64Array(this.eta.length);
        sys.concentrations(y, C);
        solvePellet(this.evaluator, C, this.kase.temperature, eta, this);
        return eta;
      },
      end: learnUpTo(this.kase),
      maxStep: this.step,
      sizeLimit: () => {
        const est = new Sizer(sys).initialEstimate();
        return Number.isFinite(est) && est > 0 ? est * 1e6 : 0;
      },
    });
  }

  apply(t: number, y: Float64Array, C: Float64Array, T: number, r: Float64Array): void {
    const eta = this.eta;
    const x = this.progress(y);
    if (this.learning) {
      this.table.predict(x, eta);
    } else {
      // The parameters and alpha change only between marches: look at them where a march starts
      // (t = 0, its first evaluation) or outside one (t NaN: ratesAt), not at every step.
      if (!(t > 0)) {
        const alpha = this.sys ? this.sys.alpha : 0;
        if (this.thetaMoved() || alpha !== this.alpha) this.learn(alpha);
        if (this.direct) this.evaluator.clearWarmStart();
      }
      if (this.direct) eta.set(this.evaluator.evaluate(C, T).factor);
      else if (!this.table.interpolate(x, eta)) eta.fill(1);
    }
    for (let i = 0; i < r.length; i++) r[i] *= eta[i];
  }
}
