/**
 * The data part of a study file as written (before validation): CSV sources, their layout and
 * column mapping. Every number carries its unit; see schema/study.schema.json for descriptions.
 */

import type { BalanceRateSpec, RateCompositionSpec } from './rate-composition.js';

/** A value and its unit, for example { value: 250, unit: 'degC' }. */
export interface MeasureSpec {
  value: number;
  unit: string;
}

/** A quantity read from a CSV column, one constant for all rows, or a fitted parameter. Exactly one of column/value/parameter. */
export interface FieldSpec {
  column?: string;
  value?: number;
  /**
   * Name of a study parameter that holds the value (feed flows and initial concentrations only):
   * an initial amount or a roughly known feed fitted with the kinetics. Its start is the
   * parameter's value; its unit must be of the field's kind. See run-parameters.ts.
   */
  parameter?: string;
  unit: string;
  /** Pressure only: gauge readings (the source's ambientPressure is added). Default false. */
  gauge?: boolean;
}

export type ResponseKind = 'outlet-flow' | 'outlet-concentration' | 'conversion' | 'rate' | 'outlet-pressure';

export interface MeasuredSpec {
  response: ResponseKind;
  /** Species measured; required for every response except outlet-pressure. */
  species?: string;
  column: string;
  unit: string;
  /** Column with the standard deviation of each value (same unit). */
  sigmaColumn?: string;
  /** outlet-pressure only: gauge readings. Default false. */
  gauge?: boolean;
  /** Name of an entry of the study's errorModels. */
  errorModel?: string;
}

export interface PerRunColumns {
  run: string;
  group?: string;
  temperature: FieldSpec;
  pressure?: FieldSpec;
  catalystMass?: FieldSpec;
  volume?: FieldSpec;
  time?: FieldSpec;
  feed?: Record<string, FieldSpec>;
  totalFeed?: FieldSpec;
  feedFractions?: Record<string, FieldSpec>;
  volumetricFlow?: FieldSpec;
  inletConcentrations?: Record<string, FieldSpec>;
  initialConcentrations?: Record<string, FieldSpec>;
  initialVolume?: FieldSpec;
  measured?: MeasuredSpec[];
  /** Composition at which this source's measured rates were measured (see rate-composition.ts). */
  rateComposition?: RateCompositionSpec;
  /** Rates derived from feed and outlet flows by the mole balance (see rate-composition.ts). */
  balanceRates?: BalanceRateSpec[];
}

export interface PerRunSourceSpec {
  file: string;
  layout: 'per-run';
  /** Added to gauge pressure columns. */
  ambientPressure?: MeasureSpec;
  columns: PerRunColumns;
}

export interface LongSourceSpec {
  file: string;
  layout: 'long';
  response: ResponseKind;
  /** Unit of the value and sigma columns. */
  unit: string;
  errorModel?: string;
  columns: { run: string; position?: FieldSpec; species?: string; value: string; sigma?: string };
}

export type SourceSpec = PerRunSourceSpec | LongSourceSpec;

/** A per-species amount column of a stacked source: a molar flow or a concentration (its unit tells which). */
export interface StackedAmountSpec {
  column: string;
  unit: string;
}

/**
 * One row per run and species (the "long" export of many lab spreadsheets): the run's conditions
 * repeated on each of its rows, a species column, and that species' inlet and measured outlet
 * amount. See stacked.ts.
 */
export interface StackedSourceSpec {
  file: string;
  layout: 'stacked';
  ambientPressure?: MeasureSpec;
  errorModel?: string;
  columns: {
    run: string;
    species: string;
    temperature: FieldSpec;
    pressure?: FieldSpec;
    catalystMass?: FieldSpec;
    volume?: FieldSpec;
    volumetricFlow?: FieldSpec;
    /** Feed molar flow, or inlet concentration (flow reactors; with volumetricFlow), or initial concentration (batch). */
    inlet?: StackedAmountSpec;
    /** Measured outlet molar flow (outlet-flow) or concentration (outlet-concentration). */
    outlet: StackedAmountSpec;
  };
}

/**
 * One file per run (a batch run's samples): a time column, the temperature, and one concentration
 * column per species. The row at time 0 gives the initial concentrations; every later row is a
 * sample. See run-file.ts.
 */
export interface RunFileSourceSpec {
  file: string;
  layout: 'run-file';
  /** Run id. Default: the file name without folders and extension. */
  run?: string;
  /** Unit of the species columns (a concentration unit). */
  unit: string;
  errorModel?: string;
  columns: {
    time: FieldSpec;
    temperature: FieldSpec;
    pressure?: FieldSpec;
    /** Species -> column of its concentration. */
    species: Record<string, string>;
  };
}

/** Every source layout a study may use. */
export type AnySourceSpec = SourceSpec | StackedSourceSpec | RunFileSourceSpec;
