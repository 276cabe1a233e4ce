/**
 * The resolved study: validated, SI, ready for estimation and simulation. Produced by loadStudy
 * (load.ts) from the study file and its CSV sources.
 */
import type { Chemistry } from '../chemistry/mechanism.js';
import type { SpeciesSpec } from '../chemistry/spec.js';
import type { ReactionSpec } from '../kinetics/spec.js';
import type { Parameter } from '../core/parameter.js';
import type { ReactorSpec, RunConditions } from '../reactors/types.js';
import type { ReplicateGroup, ValidationReport } from '../data/report.js';
import type { AnySourceSpec, ResponseKind } from '../data/spec.js';
import type { RunParameterRef } from '../data/run-parameters.js';
import type { PelletSpec } from '../pellets/types.js';
import type { PelletFluid } from '../pellets/load.js';
import type { Activity, LabData, LabResponseKind, LabTerms } from './lab-types.js';
import type { StudyDisplaySpec } from './display.js';

export type { ResponseKind } from '../data/spec.js';

/** Where a value came from: file and 1-based line (and column header) of the CSV. */
export interface SourceLocation {
  file: string;
  line: number;
  column?: string;
}

/** A run of the study: its SI conditions, the group it belongs to, and the row that defined it. */
export interface StudyRun extends RunConditions {
  /** Run group (for example the catalyst charge) for per-run-group parameters. */
  group?: string;
  /** Composition (mol/m3) at which the run's rates were measured (rateComposition columns). */
  rateConcentrations?: Float64Array;
  /** Feed flows or initial concentrations held by fitted parameters (src/data/run-parameters.ts). */
  runParameters?: readonly RunParameterRef[];
  /** Time on stream (s) or sequence number of the run (labData timeOnStream / sequence). */
  timeOnStream?: number;
  location: SourceLocation;
}

export interface Observation {
  /** Position in study.observations. */
  index: number;
  runId: string;
  /** Index of the run in study.runs. */
  runIndex: number;
  response: ResponseKind | LabResponseKind;
  species?: string;
  speciesIndex?: number;
  /** Terms of a lab response (basis, standard, reactant and factor); see src/study/lab-types.ts. */
  lab?: LabTerms;
  /** Position (kg or m3 along the reactor) or time (s) of a profile point; undefined = outlet / end. */
  position?: number;
  /** Measured value, SI (`unit`). Conversion is a fraction; rate counts consumption of a reactant as positive. */
  value: number;
  /** SI unit of value and sigma. */
  unit: string;
  /** Standard deviation given with the value (sigma column), SI. */
  sigma?: number;
  /**
   * Lab responses: sigma was propagated from the error model of the analyser fractions; the
   * loadings (dh/dy_i) sigma_i per species index give the covariance of two responses of the same
   * run (l_a . l_b). See src/study/lab-measures.ts.
   */
  errorLoadings?: number[];
  /** Name of the error model in study.errorModels. */
  errorModel: string;
  location: SourceLocation;
}

/**
 * How the standard deviation of a response is known.
 *   absolute / relative / combined: sigma^2 = absolute^2 + (relative * y)^2 (SI).
 *   replicates: sigma from the pooled pure error of replicate runs (`absolute` holds it, SI).
 *   unweighted: equal weights, one unknown sigma estimated from the residuals.
 */
export interface ErrorModel {
  name: string;
  kind: 'absolute' | 'relative' | 'combined' | 'replicates' | 'unweighted';
  /** SI, in the unit of the response; 0 when not used. */
  absolute: number;
  /** Fraction; 0 when not used. */
  relative: number;
  /** SI unit of `absolute` (that of the responses using the model); undefined when not used. */
  unit?: string;
  /** Degrees of freedom behind a replicates sigma. */
  dof?: number;
  /**
   * True when the model gives the measurement's standard deviation (the study's size 'known', the
   * default; replicates too); false when it gives only relative weights (size 'weights') and for
   * 'unweighted'. Any observation whose model is not known makes the fit estimate the scale.
   */
  sizeKnown: boolean;
}

/** Name of the error model used by observations that name none. */
export const DEFAULT_ERROR_MODEL = 'unweighted';

/** sigma of an observation value y under a model; undefined for 'unweighted'. */
export function sigmaFromModel(m: ErrorModel, y: number): number | undefined {
  if (m.kind === 'unweighted') return undefined;
  return Math.sqrt(m.absolute * m.absolute + (m.relative * y) ** 2);
}

/** A per-run-group parameter: one copy per group, named '<base>@<group>'. */
export interface ParameterScope {
  base: string;
  scope: 'global' | 'per-run-group';
  /** group id -> expanded parameter name (per-run-group only). */
  members?: Record<string, string>;
}

/** A rival rate-law set. */
export interface CandidateSet {
  name: string;
  description?: string;
  /** Full reaction list with the replaced rate laws. */
  reactions: ReactionSpec[];
  /** A simpler set ('base' or another candidate's name) that this one contains as a special case. */
  nests?: string;
  /** Ids of the reactions whose rate laws were replaced. */
  replaced: string[];
  /** All parameters of this candidate: the base ones plus its own (SI), expanded per group. */
  parameters: Parameter[];
  scopes: ParameterScope[];
  /** Names of this set's parameters whose start the study left to rateloom (value omitted or 'auto'). */
  autoStart?: string[];
}

/** The lab pellet and tube (study `transport`), SI: what the transport diagnostics of the runs need. */
export interface StudyTransport {
  pellet: PelletSpec;
  fluid: PelletFluid;
  /** Inner diameter of the lab tube, m. */
  tubeDiameter?: number;
  /** Reaction enthalpy per reaction id, J/mol. */
  reactionEnthalpy: Record<string, number>;
}

export interface Study {
  title?: string;
  /** Path of the study file as given. */
  studyPath: string;
  species: SpeciesSpec[];
  reactions: ReactionSpec[];
  chemistry: Chemistry;
  /** Species whose conversion is reported. */
  keyReactant: string;
  keyReactantIndex: number;
  reactor: ReactorSpec;
  /** K; given in the study or picked near the middle of the data's temperatures. */
  referenceTemperature: number;
  referenceTemperatureSource: 'study' | 'data';
  /** False when no rate law depends on the reference temperature (messages then omit it). */
  referenceTemperatureApplies?: boolean;
  /** Parameters in SI, per-run-group ones expanded to '<base>@<group>'. */
  parameters: Parameter[];
  scopes: ParameterScope[];
  /**
   * Names (expanded per group) of the parameters whose start the study left to rateloom (value
   * omitted or 'auto'); they hold the documented default start (study/parameters.ts) until
   * src/workflow/start-values.ts estimates better ones. Absent when every value was given.
   */
  autoStart?: string[];
  runs: StudyRun[];
  observations: Observation[];
  errorModels: Record<string, ErrorModel>;
  candidates: CandidateSet[];
  replicateGroups: ReplicateGroup[];
  /** Where measured rates are evaluated and how derived rates were formed, one sentence per source. */
  rateNotes?: string[];
  /** The lab pellet, for transport diagnostics of the runs (absent when the study gives none). */
  transport?: StudyTransport;
  /** Analyser data (labData section), when given. */
  lab?: LabData;
  /** Catalyst activity model (activity section), when given and not 'none'. */
  activity?: Activity;
  /** The data sources as written in the study file (column mapping and units), for writers that
   * produce CSV in the study's own layout (the run planner). */
  sources?: AnySourceSpec[];
  /** The study's displayUnits and the units it wrote, for showing numbers (src/study/display.ts). */
  display?: StudyDisplaySpec;
}

export interface LoadedStudy {
  study: Study;
  report: ValidationReport;
}
