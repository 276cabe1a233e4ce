/**
 * rateloom's public API: named exports only. The flow runs one way:
 * data and study files -> chemistry, kinetics, reactors -> numerics -> estimation -> design -> report.
 */
export { VERSION } from './version.js';

// Core: typed errors, outcomes, parameters.
export { RateloomError, InternalError, ERROR_CODES, isRateloomError, formatPath, type ErrorCode, type ErrorLocation } from './core/errors.js';
export { parseJsonText } from './core/json-text.js';
export { OPTION_RANGES, optionProblem, rangeText, checkOption, type OptionName, type OptionRange } from './core/option-ranges.js';
export type { Outcome, Warning, StatusTable } from './core/outcome.js';
export { exitCodeOf, verdictFrom, EXIT_TRUSTWORTHY, EXIT_UNTRUSTWORTHY, EXIT_BAD_INPUT, type Verdict, type VerdictReason } from './core/verdict.js';
export { makeParameter, toInternal, toExternal, type Parameter, type Transform } from './core/parameter.js';

// Units at the edges.
export { toSI, fromSI, unitFor, acceptedUnits, siUnit, compoundToSI, checkDisplayUnits, displayUnitFor, displayConversion, shownValue, shownDifference, unitDims, type DisplayUnits, type DisplayConversion } from './units/index.js';
export { criterionText, criterionDeltaText } from './core/criterion.js';
export { shownSizing, type ShownSizing, type CaseDisplaySpec } from './design/shown-sizing.js';
export { studyDisplay, type StudyDisplay, type StudyDisplaySpec } from './study/display.js';

// Chemistry and kinetics.
export type { SpeciesSpec, ReactionEquationSpec } from './chemistry/spec.js';
export { parseFormula, molarMassOf } from './chemistry/formula.js';
export { parseEquation } from './chemistry/equation.js';
export { buildChemistry, elementBalanceResidual, type Chemistry } from './chemistry/mechanism.js';
export type { ReactionSpec, RateLawSpec, RateBasis, ArrheniusRef, VantHoffRef } from './kinetics/spec.js';
export type { CompiledKinetics } from './kinetics/compiled.js';
export { compileKinetics, netRates, type KineticsInput, type CompiledKineticsInfo, type RateDescription } from './kinetics/compile.js';
export { arrhenius, vantHoff } from './kinetics/temperature.js';
export { GAS_CONSTANT, STANDARD_ATMOSPHERE, CELSIUS_ZERO } from './core/constants.js';

// Reactor models.
export { solveReactor, REACTOR_MODELS, ergunAlpha, resolveAlpha } from './reactors/index.js';
export type { ReactorSpec, ReactorKind, RunConditions, ReactorOptions, ReactorSolution, ReactorProfile, ErgunInputs } from './reactors/types.js';

// Catalyst pellets: effectiveness factors, film transfer, lab-run transport diagnostics.
export * from './pellets/index.js';
export { labTransport, checkLabTransport, fittedLabTransport, type LabTransport } from './workflow/lab-transport.js';

// Numerics.
export { integrate, newton, brent, findAllRoots, solveLinear } from './numerics/index.js';
export type { OdeOptions, OdeResult, OdeEvent } from './numerics/index.js';

// Data and study files.
export { readCsv, decodeInput, DEFAULT_MAX_INPUT_BYTES, type InputEncoding, type DecodedText } from './data/index.js';
export { formatRejection } from './data/validation.js';
export { nulError, sniffBom, tooLargeError } from './data/decode.js';
export type { ValidationReport, Rejection } from './data/index.js';
export { STUDY_SCHEMA, type LoadOptions } from './study/index.js';
export { summarizeStudy, type StudySummary, type Range } from './study/summary.js';
export { applyParameterValues, simulateStudy, type SimulationResult, type SimulatedRun, type SimulateOptions } from './study/simulate.js';
export type { SimulatedHeat } from './study/simulate-heat-types.js';
export { simulateWithHeat, type SimulateHeatOptions } from './design/simulate-heat.js';
export type { Study, LoadedStudy, Observation, StudyRun, ErrorModel, CandidateSet } from './study/index.js';
export type { LabData, LabRunDerived, LabSkipped, LabDataSpec, ActivitySpec, Activity, LabResponseKind } from './study/lab-types.js';
export { wetToDry, fractionsFromFlows, flowFromStandard, conversionFromStandard, selectivity, yieldOf, elementClosure } from './data/lab-arithmetic.js';

// Estimation.
export { fitModel, multistartFit, compareModels, levenbergMarquardt, profileParameter } from './estimation/index.js';
export { decideFitVerdict, applyVerdict, minimumFound, DEFAULT_VERDICT_RULES, type FitVerdict, type FitVerdictInput, type FitVerdictStatus, type VerdictRules } from './estimation/index.js';
export type { RegressionModel, FitResult, FitData, FitOptions, FittedParameter, Comparison } from './estimation/index.js';

// Workflow: a study as a regression model, fits, comparisons, hand-off, report view models.
export { StudyModel } from './workflow/study-model.js';
export { buildHandoff, studyVariants, type StudyFit, type StudyFitOptions } from './workflow/fit-study.js';
export { compareStudy, type StudyComparison, type StudyCompareOptions } from './workflow/compare-study.js';
export { estimateStartValues } from './workflow/start-values.js';
export { derivedQuantities, type DerivedQuantity } from './workflow/derived.js';
export { driftCheck, type DriftCheck, type ReferenceSeries } from './workflow/drift.js';
export { fitReportData } from './workflow/fit-report-data.js';
export { influentialTable } from './workflow/observation-names.js';
export { shownFitParts, shownParameters, shownDerived, shownObservations, shownQuantity, type ShownQuantity, type ShownParameter, type ShownDerived, type ShownObservation } from './workflow/shown-results.js';
export { crossCheckStudyFit, crossCheckIntegration, CROSS_CHECK_TOLERANCES, type StudyCrossCheck, type IntegrationCrossCheck } from './workflow/cross-check-study.js';
export { crossCheckOptimum, sharedDigits, weightedSsr, type OptimumCrossCheck, type EstimateAgreement } from './estimation/cross-check.js';
export { sizingReportData } from './workflow/sizing-report-data.js';

// Design.
export type { FittedKinetics } from './design/handoff.js';
export { parseHandoff } from './design/handoff-load.js';
export { kineticsFromHandoff } from './design/kinetics.js';
export { loadCase, type DesignCase } from './design/case.js';
export type { SizingResult, SizingOptions, SizingInput } from './design/size.js';
export type { PelletSizing } from './design/pellet-sizing.js';

// Reports.
export { renderFitReport, renderSizingReport, renderPlanReport } from './report/lazy.js';
export type { PlanReportMeta } from './report/plan-report.js';
export type { FitReportData, SizingReportData, RenderedReport, ReportWarning } from './report/types.js';

// Worker threads: the same results as the serial functions, with the work spread over cores.
export { fitStudyParallel, compareStudyParallel, type ParallelFitOptions } from './parallel/fit-parallel.js';
export { sizeReactorParallel, type ParallelSizingOptions } from './parallel/size-parallel.js';
export { AUTO_RULE_TEXT, type WorkersSetting } from './parallel/auto.js';

// Entry points taking file paths (the only part of the library that reads files).
export { loadStudy, fitStudy, simulate, compare, type StudySource, type SimulateStudyOptions } from './api/study.js';
export { sizeReactor, prepareSizing, sizingInput, type SizingSetup } from './api/size.js';
export { readText, readJson, maxInputBytes } from './api/files.js';

// Planning the next lab runs (precision or model discrimination).
export { planRuns, PLAN_STATUS, checkDistinctRivals, parseLimits, LIMITS_SCHEMA, greedyExchange, criterionValue } from './planning/index.js';
export type { PlanOptions, PlanResult, PlannedRun, LabLimits, CriterionKind, ExchangeProblem, ExchangeResult } from './planning/index.js';

// From lab CSV files to a study skeleton.
export { studySkeleton, parseOrders, recogniseColumn, splitHeader, rateConstantUnit, type SkeletonOptions, type StudySkeleton, type LocatedTodo, type SkeletonFile } from './onboard/index.js';
