/**
 * Lab data as the instruments give it (see docs/lab-data.md): the study-file section `labData`
 * (outlet mole fractions from a gas analyser, wet or dry basis, an internal standard, derived
 * selectivity and yield) and `activity` (catalyst activity over time on stream), and their
 * resolved forms carried by the Study.
 */
import type { FieldSpec, MeasureSpec } from '../data/spec.js';

/** Responses computed from analyser fractions; each is predicted from the model's outlet flows. */
export type LabResponseKind = 'outlet-fraction' | 'fraction-ratio' | 'selectivity' | 'yield';

/** The responses a labData section may fit (conversion from the internal standard included). */
export type LabFitKind = LabResponseKind | 'conversion';

/** A product/reactant pair for selectivity and yield. */
export interface SelectivitySpec {
  product: string;
  reactant: string;
  /** |nu_A| / nu_P; default from the first reaction that consumes the reactant and forms the product. */
  factor?: number;
}

/** The `labData` section as written. */
export interface LabDataSpec {
  /** CSV file with one row per run (may be the file of a per-run source). */
  file: string;
  /** Column holding the run id (the runs are defined by the per-run sources). */
  run: string;
  /** Species -> column of its outlet mole fraction. */
  fractions: Record<string, string>;
  /** Unit of the fraction columns: '1', '%' or 'ppm'. Default '1'. */
  unit?: string;
  /** 'wet' (everything analysed) or 'dry' (the `removed` species are condensed before the analyser). Default 'wet'. */
  basis?: 'wet' | 'dry';
  /** Species removed before the analyser (dry basis only), for example ["H2O"]. */
  removed?: string[];
  /** Inert species used as internal standard; its outlet flow equals its feed flow. */
  standard?: string;
  /** Responses to fit. Default ['fraction-ratio'] with a standard, else ['outlet-fraction']. */
  fit?: LabFitKind[];
  /** Reactants whose conversion is shown (and fitted when 'conversion' is in fit). Default: the key reactant. */
  conversion?: string[];
  /** Product/reactant pairs for selectivity and yield. */
  selectivity?: SelectivitySpec[];
  /** Error model of the fractions (absolute in a dimensionless unit, and/or relative). */
  errorModel?: string;
  /** Largest accepted excess of the measured fractions' sum over 1. Default 0.03. */
  sumTolerance?: number;
  /** Element balance closure check: elements (default all) and tolerance (default 0.05 = 5 %). */
  balance?: { elements?: string[]; tolerance?: number };
  /** Time on stream of each run (a column with a time unit). */
  timeOnStream?: FieldSpec;
  /** Alternative to timeOnStream: a column with the run's sequence number. */
  sequence?: string;
}

/** The `activity` section as written. */
export interface ActivitySpec {
  /** 'none', 'linear' (a = 1 - b t), 'exponential' (a = exp(-kd t)) or 'piecewise' (one a per run group after the first). */
  model: 'none' | 'linear' | 'exponential' | 'piecewise';
  /** Start of the decay rate (linear, exponential); default 0 in the rate's unit. */
  start?: MeasureSpec;
}

/** Per-observation terms of a lab response, with species indices into the study's species. */
export interface LabTerms {
  /** Per species: removed before the analyser (outlet-fraction on a dry basis). */
  removed?: readonly boolean[];
  /** Index of the internal standard (fraction-ratio). */
  standard?: number;
  /** Index of the reactant (selectivity, yield). */
  reactant?: number;
  /** |nu_A| / nu_P (selectivity, yield). */
  factor?: number;
}

/** Quantities derived from one run's analyser fractions, for `check` and reports (SI). */
export interface LabRunDerived {
  runId: string;
  line: number;
  /** Time on stream (s) or sequence number, when given. */
  time?: number;
  /** Sum of the measured fractions (analysed basis). */
  fractionSum: number;
  /** Outlet flows from the internal standard, mol/s (species -> value); absent without a standard. */
  flows?: Record<string, number>;
  conversion?: Record<string, number>;
  /** 'P/A' -> value. */
  selectivity?: Record<string, number>;
  yield?: Record<string, number>;
  /** Element -> closure (out/in, 1 = closed); only elements whose carriers are all measured. */
  closure?: Record<string, number>;
  /** Elements whose closure is outside the tolerance. */
  outside?: string[];
}

/** The resolved labData section. */
export interface LabData {
  file: string;
  basis: 'wet' | 'dry';
  removed: string[];
  standard?: string;
  fit: LabFitKind[];
  species: string[];
  sumTolerance: number;
  balanceTolerance: number;
  /** Unit of the time axis: 's' for time on stream, 'run' for a sequence number; undefined when neither. */
  timeUnit?: 's' | 'run';
  derived: LabRunDerived[];
  /** Warnings of the checks (balance closure outside tolerance, ...), runs kept. */
  warnings: string[];
  /** Lab rows not used because their run was rejected by the per-run sources (shown by `check`). */
  skipped: LabSkipped[];
}

/** A lab row skipped because its run was rejected. */
export interface LabSkipped {
  runId: string;
  /** 1-based line in the lab file. */
  line: number;
}

/** The resolved activity model. */
export interface Activity {
  model: 'none' | 'linear' | 'exponential' | 'piecewise';
  /** Names of its parameters in study.parameters. */
  parameters: string[];
  /** Unit of time on stream: 's' or 'run'. */
  timeUnit: 's' | 'run';
}
