/**
 * The plant pellet inside the energy balance of a cooled (or adiabatic) tube: the rate along the
 * tube is multiplied by the pellet's effectiveness factor evaluated at the local bulk
 * concentrations and the local temperature (src/pellets: orthogonal collocation of the pellet
 * reaction-diffusion problem, Villadsen and Stewart 1967, or Bischoff's generalized modulus;
 * optionally the non-isothermal pellet; the external film of the Wakao correlations when the case
 * gives the data for it).
 *
 * Method: a table of eta keyed by the conversion of the key species (pellets/eta-table.ts) that
 * lives for one march from the inlet. Every march (each trial tube count, each counter-current
 * shot, each Monte Carlo draw, each point of the runaway scan) starts with an empty table and
 * solves the pellet wherever the table cannot bridge within `step` of conversion and a relative
 * change of `relTol`, at the state the march then visits. Along one march the states form a single
 * curve, so eta is a function of conversion on it; the table therefore follows the local
 * temperature and the parameters of the draw (eta is re-evaluated for every draw, never reused from
 * the nominal fit). An eta above DIRECT_ABOVE (a species formed inside the pellet that reacts
 * further there) switches to a pellet solve at every call, as in pellet-hook.ts.
 * The film coefficients use the tube's mass flux and the inlet density and diffusivities, held
 * along the tube (they change little with conversion); stated in the result.
 */
import type { SpeciesSpec } from '../chemistry/spec.js';
import type { Warning } from '../core/outcome.js';
import type { CompiledKinetics } from '../kinetics/compiled.js';
import { EffectivenessEvaluator, type PelletModel } from '../pellets/effectiveness.js';
import { EtaTable } from '../pellets/eta-table.js';
import { HEAT_TRANSFER, MASS_TRANSFER } from '../pellets/external.js';
import type { RateFactor } from '../reactors/thermal/tube-balances.js';
import type { DesignCase } from './case.js';
import type { CasePellet } from './case-pellet.js';
import { casePelletModel, keySpecies, needsDirect, pelletFilm, solvePellet } from './pellet-hook.js';

/** Largest relative change of eta bridged by the per-march table (tighter than the isothermal 0.25: eta follows T). */
export const THERMAL_ETA_REL_TOL = 0.02;
/** The case's etaStep is divided by this under heat (eta follows T, which changes fastest near the inlet). */
export const THERMAL_STEP_DIVISOR = 5;

/** The effectiveness factor of one tube's marches (see the file header). */
export class ThermalPelletFactor {
  readonly evaluator: EffectivenessEvaluator;
  readonly table: EtaTable;
  private direct = false;
  /** Pellet solves that did not converge (their eta is still used). */
  failures = 0;
  lastFailure?: string;

  /**
   * @param theta the live parameter vector of the tube (overwritten per Monte Carlo draw)
   * @param key index of the key species; inletFlow its feed per tube, mol/s
   */
  constructor(readonly model: PelletModel, theta: Float64Array, private readonly key: number, private readonly inletFlow: number, step: number) {
    this.evaluator = new EffectivenessEvaluator(model, theta);
    this.table = new EtaTable(model.kinetics.reactionIds.length, step / THERMAL_STEP_DIVISOR, THERMAL_ETA_REL_TOL);
  }

  /** A new march: forget the table. */
  readonly reset = (): void => {
    this.table.clear();
    this.direct = false;
  };

  readonly factor: RateFactor = (C, T, eta, y) => {
    const x = this.inletFlow > 0 ? 1 - y[this.key] / this.inletFlow : 0;
    if (!this.direct && this.table.lookup(x, eta)) return;
    solvePellet(this.evaluator, C, T, eta, this);
    if (this.direct) return;
    this.table.insert(x, eta, 0);
    this.direct = needsDirect(eta);
  };
}

/** What the pellet model under heat rests on, for the result. */
export interface ThermalPelletInfo {
  method: 'numerical' | 'generalized';
  nonIsothermal: boolean;
  /** The film applied along the tube, or null when the case lacks its data (internal effectiveness only). */
  film: { massCorrelation: string; heatCorrelation: string | null; reynolds: number; basis: string } | null;
}

/** Builds the pellet factor of one tube of N with mass flux G (kg/(m2 s)). */
export interface ThermalPelletBuilder {
  (N: number, G: number): ThermalPelletFactor;
  info: (G: number) => ThermalPelletInfo;
  warnings: (G: number) => Warning[];
}

/**
 * The builder for a case with heat.mode and a pellet: dH are the resolved reaction enthalpies
 * (J/mol; they drive the non-isothermal pellet and the heat film).
 */
export function thermalPelletBuilder(kinetics: CompiledKinetics, kase: DesignCase, cp: CasePellet, species: readonly SpeciesSpec[], molarMasses: ArrayLike<number>, theta: Float64Array, dH: Float64Array): ThermalPelletBuilder {
  const key = keySpecies(kinetics, kase);
  // The pellet (geometry, diffusivities, enthalpies) is resolved once; only the film follows the mass flux.
  const pellet = casePelletModel(kinetics, kase, cp, species);
  if (pellet.thermal) pellet.thermal = { ...pellet.thermal, enthalpy: dH };
  const filmAt = (G: number) => pelletFilm(kase, cp, species, molarMasses, G, dH);
  const build = ((N: number, G: number) => {
    const film = filmAt(G);
    const model: PelletModel = film ? { ...pellet, film: film.film } : pellet;
    return new ThermalPelletFactor(model, theta, key, kase.feed[key] / N, cp.etaStep);
  }) as ThermalPelletBuilder;
  build.info = (G) => {
    const f = filmAt(G);
    return {
      method: cp.method,
      nonIsothermal: cp.nonIsothermal,
      film: f ? { massCorrelation: MASS_TRANSFER.name, heatCorrelation: f.film.h !== undefined ? HEAT_TRANSFER.name : null, reynolds: f.reynolds, basis: 'coefficients at the tube inlet (mass flux, density, diffusivities), held along the tube' } : null,
    };
  };
  build.warnings = (G) => filmAt(G)?.warnings ?? [];
  return build;
}
