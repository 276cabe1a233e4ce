/**
 * View-model types of the report layer. The report only formats what it is handed: the lead (or a
 * command) fills these plain-data objects from the fit result (src/estimation) and the sizing
 * result (src/design). Everything is JSON-serialisable; numbers are in the unit named beside them
 * (SI unless a field says otherwise). Optional fields may be left out or set to null when a value
 * was not computed; the report then shows "not computed" instead of a number.
 */

import type { Outcome } from '../core/outcome.js';

/** A warning shown in the summary: stable code, readable message, optional path (run, parameter). */
export interface ReportWarning {
  code: string;
  message: string;
  path?: ReadonlyArray<string | number>;
}

/** An interval [lo, hi] in the unit of the quantity it belongs to. */
export type Interval = readonly [number, number];

// ---------------------------------------------------------------------------------------------
// Fit report
// ---------------------------------------------------------------------------------------------

/** One row of the parameter table. */
export interface ParameterRowData {
  /** Parameter name, for example 'k1' or 'E1'. */
  name: string;
  /** Unit of value, stdError and both intervals, for example 'mol/(kg s Pa)' or 'J/mol'. */
  unit: string;
  /** Estimate (or the held value when fixed). */
  value: number;
  /** Standard error in `unit`; null or absent when not computed. */
  stdError?: number | null;
  /** Confidence level of both intervals as a fraction, for example 0.95. */
  ciLevel?: number;
  /** Linearised (Wald) interval from the covariance, in `unit`. */
  linearCI?: Interval | null;
  /** Profile-likelihood interval in `unit`; an open side is null (interval not closed there). */
  profileCI?: readonly [number | null, number | null] | null;
  /** Held at its value during fitting; default false. */
  fixed?: boolean;
  /** Short flags such as 'at bound', 'poorly determined', 'correlated with k2'. */
  flags?: string[];
}

/** Correlation matrix of the estimated parameters. */
export interface CorrelationData {
  /** Parameter names, in the order of the matrix rows and columns. */
  names: string[];
  /** Symmetric matrix with ones on the diagonal, values in [-1, 1]. */
  matrix: number[][];
}

/** Lack-of-fit F test against pure error from replicates. */
export interface LackOfFitData {
  /** F statistic (dimensionless). */
  F: number;
  /** Degrees of freedom of lack of fit. */
  dofLackOfFit: number;
  /** Degrees of freedom of pure error. */
  dofPureError: number;
  /** p value (dimensionless, 0..1). */
  pValue: number;
  /** One-line reading, for example 'no evidence of lack of fit at the 5 % level'. */
  conclusion?: string;
}

/** Regression statistics. */
export interface FitStatisticsData {
  /** Number of observations. */
  n: number;
  /** Number of estimated parameters. */
  p: number;
  /** Degrees of freedom n - p. */
  dof: number;
  /** Sum of squared (weighted) residuals. */
  ssr: number;
  /** Unit of ssr; '1' when residuals are weighted to be dimensionless. Default '1'. */
  ssrUnit?: string;
  /** Residual standard deviation sqrt(ssr / dof). */
  residualStdDev: number;
  /** Unit of residualStdDev; default '1'. */
  residualUnit?: string;
  /** Corrected Akaike information criterion (dimensionless). */
  aicc: number;
  /** Bayesian information criterion (dimensionless). */
  bic: number;
  /** How the covariance was computed, for example 's² (JᵀJ)⁻¹ at the optimum'. */
  covarianceBasis: string;
  /** Lack-of-fit test when replicates exist; null or absent otherwise. */
  lackOfFit?: LackOfFitData | null;
}

/** A quantity with a label and unit, used for space time and feed ratio. */
export interface LabelledValue {
  /** Label shown on axes and in tables, for example 'W/F_A0', 'τ' or 'H2/A'. */
  label: string;
  /** Unit, for example 'kg s/mol', 's' or '1'. */
  unit: string;
  value: number;
}

/** Operating conditions of one run. */
export interface RunConditionsData {
  /** Temperature in `temperatureUnit` (K when absent). */
  temperature: number;
  /** Unit of `temperature`: that of the study's temperature column, or its displayUnits; default K. */
  temperatureUnit?: string;
  /** Total inlet pressure in `pressureUnit` (Pa, shown in kPa, when absent). */
  pressure: number;
  /** Unit of `pressure`: that of the study's pressure column, or its displayUnits; absent: Pa (shown in kPa). */
  pressureUnit?: string;
  /** Space time: W/F_A0 (kg s/mol) for packed beds or τ (s) for volume reactors. */
  spaceTime?: LabelledValue | null;
  /** Feed ratio, for example H2/A in mol/mol. */
  feedRatio?: LabelledValue | null;
}

/** One measured response of one run. */
export interface ResponseObservationData {
  /** Response label, for example 'F_C out' or 'X_A'. */
  response: string;
  /** Unit of measured, predicted and residual, for example 'mol/s' or '1'. */
  unit: string;
  measured: number;
  /** Predicted value; null when the model could not be evaluated for this run at the estimate. */
  predicted: number | null;
  /** measured - predicted, in `unit`; null with predicted. */
  residual: number | null;
  /** Studentized residual (dimensionless); null or absent when not computed. */
  studentized?: number | null;
}

/** One run with its conditions and observations. */
export interface RunObservationData {
  runId: string;
  conditions: RunConditionsData;
  responses: ResponseObservationData[];
}

/** An (x, y) point. */
export interface XY {
  x: number;
  y: number;
}

/** Measured points and predicted curve of one species along a run's coordinate. */
export interface SpeciesProfileData {
  species: string;
  measured: XY[];
  predicted: XY[];
}

/** Measured vs predicted profile along the reactor (or in time) for one run. */
export interface RunProfileData {
  runId: string;
  /** Coordinate along the reactor, for example { label: 'W', unit: 'kg' } or { label: 't', unit: 's' }. */
  coordinate: { label: string; unit: string };
  /** The plotted quantity, for example { label: 'F_j', unit: 'mol/s' }. */
  quantity: { label: string; unit: string };
  species: SpeciesProfileData[];
}

/** Profile-likelihood curve of one parameter. */
export interface LikelihoodProfileData {
  parameter: string;
  /** Unit of the parameter values. */
  unit: string;
  /** The estimate, drawn as a vertical rule. */
  estimate: number;
  /** Name of the objective, for example 'SSR' or 'Δ objective'; default 'objective'. */
  objectiveLabel?: string;
  /** Unit of the objective; default '1'. */
  objectiveUnit?: string;
  /** The curve: parameter value against objective (re-optimised over the others). */
  points: { value: number; objective: number }[];
  /** Objective value that bounds the profile interval, drawn as a horizontal rule. */
  threshold: number;
}

/** One candidate model in the rival-model comparison. */
export interface RivalModelData {
  name: string;
  ssr: number;
  /** Unit of ssr; default '1'. */
  ssrUnit?: string;
  dof: number;
  aicc: number;
  bic: number;
  /** Akaike weight in [0, 1]. */
  akaikeWeight: number;
  /** Short verdict, for example 'preferred', 'plausible', 'rejected'. */
  verdict: string;
}

/** One starting value rateloom estimated (the study left the parameter open). */
export interface StartValueRowData {
  /** Parameter name, for example 'k_ref'. */
  parameter: string;
  /** The starting value in `unit`. */
  value: number;
  /** Unit of value, for example 'mol/(kg s)' or 'J/mol'. */
  unit: string;
  /** How it was obtained, for example 'differential' (rate analysis) or 'default'. */
  method: string;
  /** One line saying how, for example 'from 12 low-conversion points'. */
  how: string;
}

/** Starting values estimated by rateloom, with notes on what the estimate assumed or skipped. */
export interface StartValuesData {
  rows: StartValueRowData[];
  /** Points used by the differential method (0 when it did not run); absent when not known. */
  points?: number | null;
  /** Why the estimate was skipped or limited, and what it assumed. */
  notes?: string[];
}

/** Everything the fit report shows. */
export interface FitReportData {
  title: string;
  studyName: string;
  /** Tool and version, for example 'rateloom 0.1.0'. */
  generatedBy: string;
  /** Free-form date text; left out for byte-identical reports. */
  generatedAt?: string;
  /** Fit status code, for example 'converged'. */
  status: string;
  /** True when the fit can be trusted. */
  success: boolean;
  message: string;
  warnings: ReportWarning[];
  parameters: ParameterRowData[];
  correlation?: CorrelationData | null;
  statistics: FitStatisticsData;
  runs: RunObservationData[];
  /** Transport diagnostics of the lab runs (when the study describes the lab pellet); null otherwise. */
  transport?: TransportReportData | null;
  profiles?: RunProfileData[];
  likelihoodProfiles?: LikelihoodProfileData[];
  rivalModels?: RivalModelData[];
  /** Rate laws as readable lines, for example 'r1 = k1 K_A p_A / (1 + K_A p_A)^2'. */
  kinetics?: string[];
  /** Starting values rateloom estimated for parameters the study left open; null or absent when the study gave every value. */
  startValues?: StartValuesData | null;
  /** Influential observations: their count and the most extreme few (absent or null when there are none). */
  influential?: InfluentialTableData | null;  /** Lab data and catalyst activity (docs/lab-data.md); null or absent when the study has neither. */
  lab?: LabReportData | null;
}

/** One measured reference point of the activity chart. */
export interface DriftPointData {
  /** Reference group id. */
  group: string;
  run: string;
  /** Time on stream (h) or run number. */
  time: number;
  measured: number;
  /** Measurement sigma, in the response's unit; null when unknown. */
  sigma: number | null;
  /** Prediction at the fitted parameters; null when not computed. */
  predicted: number | null;
}

/** The lab-data and catalyst-activity section of a fit report. */
export interface LabReportData {
  /** Plain-text notes (how fractions were fitted, fresh-catalyst kinetics, decay rate with its interval, balance warnings). */
  notes: string[];
  /** Repeated reference conditions against time on stream; null when there are none. */
  drift?: { timeLabel: string; timeUnit: string; responseTitle: string; verdict: string; points: DriftPointData[] } | null;
}

// ---------------------------------------------------------------------------------------------
// Sizing report
// ---------------------------------------------------------------------------------------------

/** One species of the outlet composition. */
export interface OutletSpeciesData {
  species: string;
  /** Median outlet value. */
  value: number;
  /** Unit, for example 'mol/s' or '1' for mole fractions. */
  unit: string;
  /** Lower and upper band (same level as the size band), optional. */
  lo?: number | null;
  hi?: number | null;
}

/** One series of the production profile (a species flow or the conversion). */
export interface ProductionSeriesData {
  name: string;
  points: { x: number; median: number; lo: number; hi: number }[];
}

/** Monte Carlo size distribution: the raw samples or a ready histogram. */
export interface SizeDistributionData {
  /** Sampled sizes in the size unit (preferred). */
  samples?: number[];
  /** Or pre-binned counts: [start, end) in the size unit. */
  histogram?: { start: number; end: number; count: number }[];
}

/** Effect of one parameter on the required size. */
export interface SensitivityRowData {
  parameter: string;
  /** Signed effect, in `SizingReportData.sensitivityUnit`. */
  effect: number;
}

/**
 * Tube layout of a multitubular bed: the nominal layout (count, diameter, length for the nominal
 * catalyst mass) and, when the count was designed for a percentile of the required size, the
 * catalyst to install at that percentile. The install fields may be left out or null.
 */
export interface TubesData {
  /** Number of tubes. */
  count: number;
  /** Tube inner diameter in m (shown in mm). */
  diameter: number;
  /** Bed length per tube for the nominal catalyst mass, in m. */
  length: number;
  /** Size per tube in the size unit; null or absent when not computed. */
  sizePerTube?: number | null;
  /** Percentile of the required size the count was designed for, as a fraction (0.95 = P95); null for the nominal fit only. */
  designLevel?: number | null;
  /** Catalyst to install at the design percentile (all tubes), in kg. */
  installCatalyst?: number | null;
  /** Bed length per tube holding the catalyst to install, in m. */
  installLength?: number | null;
  /** Pressure drop over the installed bed with the nominal kinetics, in Pa (shown in kPa). */
  installPressureDrop?: number | null;
}

/** Everything the sizing report shows. */
export interface SizingReportData {
  title: string;
  caseName: string;
  generatedBy: string;
  generatedAt?: string;
  status: string;
  success: boolean;
  message: string;
  /** What must be met, for example { description: 'production of C', value: 0.8, unit: 'mol/s' }. */
  target: { description: string; value: number; unit: string };
  /** Required size: median and upper percentiles over parameter uncertainty. */
  size: { label: string; unit: string; median: number; p90: number; p95: number; nominal?: number | null };
  /** Reactor type in words, for example 'packed bed, isothermal'. */
  reactor?: string;
  outlet: OutletSpeciesData[];
  /** Pressure drop over the bed in Pa (shown in kPa); null when not modelled. */
  pressureDrop?: { value: number; lo?: number | null; hi?: number | null; fractionOfInlet?: number | null } | null;
  /** Tube layout when the bed is split into tubes; null otherwise. */
  tubes?: TubesData | null;
  /** Production profile with its uncertainty band. */
  productionProfile?: {
    coordinate: { label: string; unit: string };
    quantity: { label: string; unit: string };
    /** Level of the lo-hi band as a fraction, for example 0.9. */
    bandLevel: number;
    series: ProductionSeriesData[];
  } | null;
  sizeDistribution?: SizeDistributionData | null;
  /** What `effect` measures, for example 'change of P50 size for +1 standard error'. */
  sensitivityMeasure?: string;
  /** Unit of `effect`, for example '%'. */
  sensitivityUnit?: string;
  sensitivity?: SensitivityRowData[];
  /** Monte Carlo draws that failed (solver trouble) out of the total. */
  draws?: { total: number; failed: number } | null;
  warnings: ReportWarning[];
  /** Cautions that must be read before using the size (always shown prominently). */
  cautions: string[];
  /** The plant pellet: effectiveness factor along the bed and the pellet trade-off; null without a pellet. */
  pellet?: PelletReportData | null;
  /** The energy balance of a cooled or adiabatic bed; null when sized isothermally. */
  thermal?: ThermalReportData | null;
}

/** The energy balance in a sizing report (temperatures in K, positions in m). */
export interface ThermalReportData {
  mode: string;
  binding: string;
  met: boolean;
  hotSpot: { value: number; position: number; limit: number | null };
  profile: { z: number[]; T: number[]; Ta: (number | null)[] };
  hotSpotPercentiles?: { level: number; value: number }[];
  hotSpotHistogram?: { start: number; end: number; count: number }[];
  runaway?: { criterion: string; coolant: number[]; hotSpot: number[]; critical: number | null; design: number };
  /** Tube design under heat: count, inner diameter (m), length and its limit (m), pressure drop (Pa), U (W/(m2 K)) and its source. */
  design?: { count: number; diameter: number; length: number; maxLength: number; pressureDrop: number; allowedPressureDrop: number; U: number | null; uSource: string };
  /** Outlet temperature (K) with percentiles over the draws. */
  outletTemperature?: { value: number; percentiles?: { level: number; value: number }[] };
  /** Runaway margin: critical minus design coolant temperature (K), with percentiles over the draws it was computed for. */
  runawayMargin?: {
    value: number | null; percentiles?: { level: number; value: number }[];
    /** Draws with a margin, of all draws (a random subset: the draws are independent). */
    draws?: number; of?: number;
    /** Distribution-free 95 % interval of the lowest percentile, K: the error the subset adds. */
    interval?: [number, number] | null;
  };
  /** The plant pellet under heat: eta per reaction at the tube inlet and outlet (local temperature), and the film used. */
  pellet?: { rows: { reaction: string; inlet: number; outlet: number }[]; film: string | null };
}

/** The plant pellet in a sizing report (lengths in mm, masses in kg, pressures in kPa). */
export interface PelletReportData {
  /** 'numerical' (collocation solve at each point) or 'generalized' (Bischoff's modulus). */
  method: 'numerical' | 'generalized';
  /** Shape and the rule used for it. */
  shape: string;
  diameterMm: number;
  /** Diameter used by the bed correlations, 6 Vp/Sp, mm. */
  equivalentDiameterMm: number;
  /** Effective diffusivity per species, m2/s. */
  effectiveDiffusivity: { species: string; value: number }[];
  /** eta per reaction along the bed (size in kg, conversion of the key species as a fraction). */
  profile: { keySpecies: string; series: { reaction: string; points: { size: number; conversion: number; eta: number }[] }[] };
  /** Catalyst mass with the pellet (nominal fit) and with intrinsic kinetics alone, kg. */
  nominalSize: number | null;
  intrinsicSize: number | null;
  pelletSolves: number;
  /** Film at the bed inlet: correlations, Reynolds number, internal and overall effectiveness per reaction. */
  film?: { correlations: string[]; reynolds: number; rows: { reaction: string; internal: number; overall: number }[] } | null;
  tradeOff: {
    tubeCount: number | null;
    /** Allowed pressure drop, kPa, when the case has tubes. */
    allowedKPa: number | null;
    rows: { diameterMm: number; catalystMass: number | null; pressureDropKPa: number | null; etaInlet: number; status: string }[];
  };
}

/** Transport diagnostics of the lab runs in a fit report. */
export interface TransportReportData {
  /** Where the observed rates came from, in words. */
  rateSource: string;
  keyReactant: string;
  reaction: string;
  /** Observed rate in mol/(kg s); Weisz-Prater and Mears numbers dimensionless; Prater rise in K. */
  rows: { runId: string; observedRate: number; weiszPrater: number; mearsMass: number | null; mearsHeat: number | null; praterRise: number | null; intrinsic: boolean; failed: string[] }[];
  limits: { weiszPrater: number; mears: number };
  correlations: string[];
  /** What transport limits do to fitted parameters. */
  note: string;
  skipped: number;
}

// ---------------------------------------------------------------------------------------------
// Run plan report: the runs proposed (src/planning builds it), why each was chosen, the expected
// precision after them beside today's, and (discrimination) the expected posterior model
// probabilities. Plain data, SI values with their units; serialises to JSON as is.
// ---------------------------------------------------------------------------------------------

export type PlanStatus = 'planned' | 'fewer-runs' | 'fit-not-trustworthy' | 'no-candidates' | 'indistinguishable';

export type PlanMode = 'precision' | 'discrimination';

export type DiscriminationCriterion = 'box-hill' | 'hunter-reiner';

/** One condition of a planned run. */
export interface PlannedCondition {
  /** 'temperature' or 'feed.H2O'. */
  key: string;
  /** CSV header in the study's layout. */
  column: string;
  /** SI value and unit. */
  value: number;
  unit: string;
  /** The value in the column's own unit (as in the CSV) and that unit. */
  shown: number;
  shownUnit: string;
  /** Whether the plan chose it (true) or held it at the study's usual value. */
  varied: boolean;
}

export interface PlannedRun {
  id: string;
  conditions: PlannedCondition[];
  /** Why this run: its share of the criterion and what it informs. */
  reason: string;
  /** Criterion lost if this run were dropped from the plan (criterion units; see `criterion`). */
  contribution: number;
  /** Predicted conversion of the key reactant (fraction) at today's parameters, where defined. */
  predictedConversion: number | null;
  /** Factors scaled to 0..1 over the limits (for charts). */
  scaled: number[];
}

export interface ParameterPrecision {
  name: string;
  /** SI unit of the value, standard errors and widths. */
  unit: string;
  value: number;
  stdErrorNow: number | null;
  stdErrorAfter: number | null;
  /** Width of the linear interval at `level` (hi - lo, SI). */
  widthNow: number | null;
  widthAfter: number | null;
  /** 1 - widthAfter / widthNow; null when either is unknown. */
  shrink: number | null;
}

export interface ModelProbability {
  model: string;
  /** Akaike weight of the model on today's data (the prior of the plan). */
  now: number;
  /** Expected posterior probability of the model after the planned runs when it is the true one. */
  expectedIfTrue: number;
}

export interface DiscriminationSummary {
  criterion: DiscriminationCriterion;
  models: ModelProbability[];
  /** expected[i][j]: expected posterior probability of model j when model i is true. */
  expected: number[][];
  /** Monte Carlo draws behind `expected`. */
  draws: number;
}

export interface ExcludedCandidates {
  reason: string;
  count: number;
}

export interface PlanResult extends Outcome<PlanStatus> {
  mode: PlanMode;
  /** 'D', 'Ds', 'A' (precision) or 'box-hill' / 'hunter-reiner' (discrimination). */
  criterion: string;
  /** Ds: the parameters of interest. */
  subset?: string[];
  /** The rate-law set the precision is planned for (precision mode). */
  model: string;
  /** Parameter draws the criterion was averaged over (0: local design at the estimate). */
  draws: number;
  runs: PlannedRun[];
  /** The planned runs in the study's own CSV layout, inputs filled, measured columns empty. */
  csv: string;
  precision: ParameterPrecision[];
  level: number;
  discrimination?: DiscriminationSummary;
  candidates: { count: number; usable: number; excluded: ExcludedCandidates[] };
  /** The study's runs in the scaled condition space (for charts). */
  oldRuns: { id: string; scaled: number[]; values: number[] }[];
  /** The varied conditions: SI range and unit, and the range in the study's column unit (shownMin..shownMax). */
  factors: { key: string; column: string; unit: string; min: number; max: number; shownUnit: string; shownMin: number; shownMax: number }[];
}

// ---------------------------------------------------------------------------------------------
// Outputs
// ---------------------------------------------------------------------------------------------

/** A chart: its vega-lite spec plus a title and caption for the document. */
export interface ChartSpec {
  /** Stable id, used as the HTML element id, for example 'parity-F_C'. */
  id: string;
  title: string;
  caption?: string;
  /** The vega-lite specification (plain JSON). */
  spec: import('vega-lite').TopLevelSpec;
}

/** A chart after rendering: SVG text, or the reason it could not be drawn. */
export interface RenderedChart {
  id: string;
  title: string;
  caption?: string;
  svg?: string;
  error?: string;
  /** Warnings vega or vega-lite raised while compiling or drawing. */
  messages?: string[];
}

/** What renderFitReport and renderSizingReport return. */
export interface RenderedReport {
  /** One self-contained HTML document (inline CSS and SVG, no scripts, no external URLs). */
  html: string;
  /** A Markdown summary of the same numbers. */
  markdown: string;
  /** The charts as rendered (for callers that want the SVG files separately). */
  charts: RenderedChart[];
  /** Problems met while drawing (a chart that failed, values dropped as non-finite). */
  warnings: ReportWarning[];
}

/** One influential observation as a table row. */
export interface InfluentialRow {
  runId: string;
  /** Response and species, for example 'outlet-flow C2H4'. */
  response: string;
  /** CSV file and line. */
  line: string;
  studentizedResidual: number | null;
  cooksDistance: number | null;
  /** Dropping it moves the estimates beyond their 50 % confidence region (Cook's distance above the median of F). */
  movesEstimates: boolean;
}

/** The influential observations of a fit: how many, and the most extreme few (by |studentized residual|). */
export interface InfluentialTableData {
  count: number;
  rows: InfluentialRow[];
}
