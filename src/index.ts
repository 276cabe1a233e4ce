/**
 * rateloom's public API: named exports only. The flow runs one way:
 * data and study files -> chemistry, kinetics, reactors -> numerics -> estimation -> design -> report.
 */
export { VERSION } from './version';

// Core: typed errors, outcomes, parameters.
export { RateloomError, ERROR_CODES, isRateloomError, formatPath, type ErrorCode, type ErrorLocation } from './core/errors';
export type { Outcome, Warning, StatusTable } from './core/outcome';
export { exitCodeOf, verdictFrom, EXIT_TRUSTWORTHY, EXIT_UNTRUSTWORTHY, EXIT_BAD_INPUT, type Verdict, type VerdictReason } from './core/verdict';
export { makeParameter, toInternal, toExternal, type Parameter, type Transform } from './core/parameter';

// Units at the edges.
export { toSI, fromSI, unitFor, acceptedUnits, siUnit, compoundToSI } from './units';

// Chemistry and kinetics.
export type { SpeciesSpec, ReactionSpec } from './chemistry/spec';
export { parseFormula, molarMassOf } from './chemistry/formula';
export { parseEquation } from './chemistry/equation';
export { buildChemistry, elementBalanceResidual, type Chemistry } from './chemistry/mechanism';
export type { RateLawSpec, RateBasis, ArrheniusRef, VantHoffRef } from './kinetics/spec';
export type { CompiledKinetics } from './kinetics/compiled';
export { compileKinetics, netRates, type KineticsInput, type CompiledKineticsInfo, type RateDescription } from './kinetics/compile';
export { arrhenius, vantHoff, GAS_CONSTANT } from './kinetics/temperature';

// Reactor models.
export { solveReactor, REACTOR_MODELS, ergunAlpha, resolveAlpha } from './reactors';
export type { ReactorSpec, ReactorKind, RunConditions, ReactorOptions, ReactorSolution, ReactorProfile, ErgunInputs } from './reactors/types';

// Catalyst pellets: effectiveness factors, film transfer, lab-run transport diagnostics.
export * from './pellets';
export { labTransport, checkLabTransport, fittedLabTransport, type LabTransport } from './workflow/lab-transport';

// Numerics.
export { integrate, newton, brent, findAllRoots, solveLinear } from './numerics';
export type { OdeOptions, OdeResult, OdeEvent } from './numerics';

// Data and study files.
export { readCsv, decodeInput, DEFAULT_MAX_INPUT_BYTES, type InputEncoding, type DecodedText } from './data';
export type { ValidationReport, Rejection } from './data';
export { loadStudy, STUDY_SCHEMA } from './study';
export type { Study, LoadedStudy, Observation, StudyRun, ErrorModel, CandidateSet } from './study';
export type { LabData, LabRunDerived, LabDataSpec, ActivitySpec, Activity, LabResponseKind } from './study/lab-types';
export { wetToDry, fractionsFromFlows, flowFromStandard, conversionFromStandard, selectivity, yieldOf, elementClosure } from './data/lab-arithmetic';

// Estimation.
export { fitModel, multistartFit, compareModels, levenbergMarquardt, profileParameter } from './estimation';
export { decideFitVerdict, applyVerdict, minimumFound, DEFAULT_VERDICT_RULES, type FitVerdict, type FitVerdictInput, type FitVerdictStatus, type VerdictRules } from './estimation';
export type { RegressionModel, FitResult, FitData, FitOptions, FittedParameter, Comparison } from './estimation';

// Workflow: a study as a regression model, fits, comparisons, hand-off, report view models.
export { StudyModel } from './workflow/study-model';
export { fitStudy, buildHandoff, studyVariants, type StudyFit, type StudyFitOptions } from './workflow/fit-study';
export { compareStudy, type StudyComparison } from './workflow/compare-study';
export { estimateStartValues } from './workflow/start-values';
export { derivedQuantities, type DerivedQuantity } from './workflow/derived';
export { driftCheck, type DriftCheck, type ReferenceSeries } from './workflow/drift';
export { fitReportData } from './workflow/fit-report-data';
export { sizingReportData } from './workflow/sizing-report-data';

// Design.
export type { FittedKinetics } from './design/handoff';
export { parseHandoff } from './design/handoff-load';
export { kineticsFromHandoff } from './design/kinetics';
export { loadCase, type DesignCase } from './design/case';
export { sizeReactor, type SizingResult, type SizingOptions } from './design/size';

// Reports.
export { renderFitReport, renderSizingReport } from './report';
export type { FitReportData, SizingReportData, RenderedReport } from './report';

// Planning the next lab runs (precision or model discrimination).
export { planRuns, PLAN_STATUS, parseLimits, LIMITS_SCHEMA, greedyExchange, criterionValue } from './planning';
export type { PlanOptions, PlanResult, PlannedRun, LabLimits, CriterionKind, ExchangeProblem, ExchangeResult } from './planning';
