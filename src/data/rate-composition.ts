/**
 * Where a measured rate was measured: the composition at which the rate law is evaluated for a
 * 'rate' response. A stirred tank's rate belongs to its outlet; a differential bed's to the mean
 * of its inlet and outlet; an initial-rate batch to its charge. The study gives that composition as
 * columns (concentrations, partial pressures, mole fractions with the total pressure, or outlet
 * molar flows), read here row by row into concentrations in mol/m3. Without such columns the rate
 * law is evaluated at the feed (or initial) composition, and `check` says so.
 *
 * Ideal gas (common practice): C_j = p_j / (R T) = y_j P / (R T) = (F_j / F_T) P / (R T); a liquid's
 * outlet flows give C_j = F_j / v0 (constant density). R (CODATA 2018) is
 * defined once in src/core/constants.ts.
 *
 * Balance rates: for a stirred tank (or a differential bed) with feed and outlet flows, the mole
 * balance of an ideal stirred tank gives the rate of species j at the outlet composition,
 * r_j = (F_j0 - F_j) / W (or / V), consumption counted positive (Fogler, Elements of Chemical
 * Reaction Engineering, 5th ed., eq. 1-7 rearranged; common practice). With independent flow
 * errors, sigma_r = sqrt(sigma_F0^2 + sigma_F^2) / W (first-order propagation, JCGM 100:2008 GUM
 * eq. 10).
 */
import { RateloomError, type FieldPath } from '../core/errors.js';
import type { Quantity } from '../units/index.js';
import type { Phase, ReactorKind } from '../reactors/types.js';
import type { FieldSpec } from './spec.js';
import { GAS_CONSTANT } from '../core/constants.js';

/** The composition at which measured rates of a per-run source were measured. */
export interface RateCompositionSpec {
  /**
   * What the species columns hold: 'concentration' (mol/m3 or any concentration unit),
   * 'partial-pressure' (gas; any pressure unit), 'mole-fraction' (gas; with `totalPressure` or the
   * run's pressure), 'outlet-flow' (molar flows leaving; gas uses the run's pressure and
   * temperature, liquid the run's volumetric flow).
   */
  basis: 'concentration' | 'partial-pressure' | 'mole-fraction' | 'outlet-flow';
  /** One field per species; species not listed count as zero. */
  species: Record<string, FieldSpec>;
  /** mole-fraction only: total pressure where the fractions were measured. Default: the run's pressure. */
  totalPressure?: FieldSpec;
}

/** A rate of one species derived from its feed and outlet flows by the mole balance. */
export interface BalanceRateSpec {
  species: string;
  /** Column with the outlet molar flow of the species (the feed flow comes from the run's feed). */
  outletColumn: string;
  /** Molar-flow unit of the outlet (and sigma) columns. */
  unit: string;
  /** Column with the standard deviation of the outlet flow (same unit). Default none. */
  outletSigmaColumn?: string;
  /** Column with the standard deviation of the feed flow (same unit). Default none (feed exact). */
  feedSigmaColumn?: string;
  /** Name of an entry of the study's errorModels, used when no sigma column is given. */
  errorModel?: string;
}

/** A prepared field, as mapping.ts makes it (kept structural to avoid an import cycle). */
export interface PreparedLike {
  name: string;
  header?: string;
}

/** What this file needs from the mapping's row reader and field preparation. */
export interface MappingTools<P extends PreparedLike> {
  prepare(name: string, f: FieldSpec, q: Quantity, path: FieldPath): P;
  speciesIndex(name: string, path: FieldPath): number;
  /** SI value of a prepared field in the current row (undefined when empty or bad, problem noted). */
  num(p: P, required: boolean, min: 'nonneg' | 'positive' | 'any'): number | undefined;
  reject(message: string, column?: string): void;
}

export interface PreparedComposition<P extends PreparedLike> {
  basis: RateCompositionSpec['basis'];
  fields: { j: number; p: P }[];
  totalPressure?: P;
  /** One sentence for `check`: which columns give the composition and how. */
  description: string;
}

const QUANTITY: Record<RateCompositionSpec['basis'], Quantity> = {
  concentration: 'concentration',
  'partial-pressure': 'pressure',
  'mole-fraction': 'dimensionless',
  'outlet-flow': 'molar-flow',
};

/** Check and prepare the composition mapping of a source (bad mapping: RateloomError). */
export function prepareRateComposition<P extends PreparedLike>(spec: RateCompositionSpec, phase: Phase, tools: MappingTools<P>, path: FieldPath): PreparedComposition<P> {
  if ((spec.basis === 'partial-pressure' || spec.basis === 'mole-fraction') && phase !== 'gas') {
    throw new RateloomError('E_VALUE', `a rate composition given as ${spec.basis}s needs a gas-phase study`, { path: [...path, 'basis'], fix: "Give liquid compositions as 'concentration' or 'outlet-flow'." });
  }
  const names = Object.keys(spec.species);
  if (!names.length) throw new RateloomError('E_MISSING_FIELD', 'the rate composition lists no species', { path: [...path, 'species'] });
  const fields = names.map((sp) => ({ j: tools.speciesIndex(sp, [...path, 'species', sp]), p: tools.prepare(`${spec.basis} of ${sp} (rate composition)`, spec.species[sp], QUANTITY[spec.basis], [...path, 'species', sp]) }));
  const totalPressure = spec.totalPressure ? tools.prepare('total pressure (rate composition)', spec.totalPressure, 'pressure', [...path, 'totalPressure']) : undefined;
  const cols = fields.map(({ p }) => p.header ?? `${p.name} (constant)`).join(', ');
  const how: Record<RateCompositionSpec['basis'], string> = {
    concentration: 'concentrations as given',
    'partial-pressure': 'C_j = p_j/(R T), ideal gas at the run temperature',
    'mole-fraction': `C_j = y_j P/(R T), ideal gas, P from ${totalPressure ? (totalPressure.header ?? 'the given value') : "the run's pressure"}`,
    'outlet-flow': phase === 'gas' ? "C_j = (F_j/F_T) P/(R T), ideal gas at the run's pressure and temperature" : "C_j = F_j/v0 with the run's volumetric flow",
  };
  return { basis: spec.basis, fields, ...(totalPressure ? { totalPressure } : {}), description: `measured rates evaluated at the measured composition: ${spec.basis} columns ${cols} (${how[spec.basis]})` };
}

/** Conditions of the row needed to turn the composition into concentrations (SI). */
export interface RowConditions {
  temperature?: number;
  pressure?: number;
  volumetricFlow?: number;
}

/** Concentrations (mol/m3) of one row, or undefined when a cell is missing or bad (problem noted). */
export function readRateComposition<P extends PreparedLike>(c: PreparedComposition<P>, nS: number, row: RowConditions, tools: MappingTools<P>, gas: boolean): Float64Array | undefined {
  const x = new Float64Array(nS);
  let ok = true;
  for (const { j, p } of c.fields) {
    const v = tools.num(p, true, 'nonneg');
    if (v === undefined) ok = false;
    else x[j] = v;
  }
  if (!ok) return undefined;
  const T = row.temperature;
  if (c.basis === 'concentration') return x;
  if (c.basis === 'outlet-flow' && !gas) {
    if (!(row.volumetricFlow !== undefined && row.volumetricFlow > 0)) return missing(tools, 'a liquid rate composition from outlet flows needs the volumetric flow of the run');
    for (let j = 0; j < nS; j++) x[j] /= row.volumetricFlow;
    return x;
  }
  if (T === undefined) return undefined;
  let P = row.pressure;
  if (c.basis === 'mole-fraction' && c.totalPressure) P = tools.num(c.totalPressure, true, 'positive');
  if (c.basis === 'partial-pressure') P = 1;
  if (P === undefined) return missing(tools, `a rate composition from ${c.basis}s needs the total pressure of the run`);
  let scale = P / (GAS_CONSTANT * T);
  if (c.basis === 'outlet-flow') {
    let FT = 0;
    for (let j = 0; j < nS; j++) FT += x[j];
    if (!(FT > 0)) return missing(tools, 'the outlet flows of the rate composition add up to zero mol/s');
    scale /= FT;
  }
  for (let j = 0; j < nS; j++) x[j] *= scale;
  return x;
}

function missing(tools: MappingTools<PreparedLike>, message: string): undefined {
  tools.reject(message);
  return undefined;
}

/** Prepared balance-rate fields. */
export interface PreparedBalanceRate<P extends PreparedLike> {
  spec: BalanceRateSpec;
  j: number;
  outlet: P;
  outletSigma?: P;
  feedSigma?: P;
}

/** Check and prepare balance-rate responses (only flow reactors with feed flows and a size). */
export function prepareBalanceRates<P extends PreparedLike>(specs: readonly BalanceRateSpec[], kind: ReactorKind, tools: MappingTools<P>, path: FieldPath): PreparedBalanceRate<P>[] {
  if (specs.length && (kind === 'batch' || kind === 'semibatch')) {
    throw new RateloomError('E_VALUE', `rates from the mole balance need a flow reactor, not a ${kind}`, { path, fix: 'Give the rates as a measured rate column, or the amounts at times as outlet-concentration responses.' });
  }
  return specs.map((s, i) => {
    const p = [...path, i];
    const j = tools.speciesIndex(s.species, [...p, 'species']);
    const field = (column: string, what: string, key: string) => tools.prepare(`${what} of ${s.species}`, { column, unit: s.unit }, 'molar-flow', [...p, key]);
    return {
      spec: s,
      j,
      outlet: field(s.outletColumn, 'outlet flow', 'outletColumn'),
      ...(s.outletSigmaColumn !== undefined ? { outletSigma: field(s.outletSigmaColumn, 'sigma of the outlet flow', 'outletSigmaColumn') } : {}),
      ...(s.feedSigmaColumn !== undefined ? { feedSigma: field(s.feedSigmaColumn, 'sigma of the feed flow', 'feedSigmaColumn') } : {}),
    };
  });
}

/** One balance rate of a row: value (mol/(kg s) or mol/(m3 s)) and propagated sigma, or undefined. */
export function readBalanceRate<P extends PreparedLike>(b: PreparedBalanceRate<P>, feed: Float64Array | undefined, divisor: number | undefined, tools: MappingTools<P>): { value: number; sigma?: number } | undefined {
  const F = tools.num(b.outlet, false, 'nonneg');
  if (F === undefined) return undefined; // an empty outlet cell is simply not measured
  if (!feed) return missing(tools, `a rate of ${b.spec.species} from the mole balance needs the feed flows of the run`);
  if (!(divisor !== undefined && divisor > 0)) return missing(tools, `a rate of ${b.spec.species} from the mole balance needs a catalyst mass or volume above zero`);
  const sF = b.outletSigma ? tools.num(b.outletSigma, false, 'nonneg') : undefined;
  const sF0 = b.feedSigma ? tools.num(b.feedSigma, false, 'nonneg') : undefined;
  const value = (feed[b.j] - F) / divisor;
  if (sF === undefined && sF0 === undefined) return { value };
  const sigma = Math.sqrt((sF ?? 0) ** 2 + (sF0 ?? 0) ** 2) / divisor;
  return sigma > 0 ? { value, sigma } : { value };
}
