/**
 * What every planning mode shares: the study's per-run layout, the candidate grid, the candidates
 * the lab can actually run (solved at today's parameters, inside the conversion and outlet-flow
 * limits), and where the parameters stand for a fitted rate-law set.
 */
import type { Study } from '../study/types.js';
import { studyFitData } from '../workflow/fit-data.js';
import { findVariant, type StudyFit } from '../workflow/fit-study.js';
import { StudyModel, initialAmount } from '../workflow/study-model.js';
import type { PerRunSourceSpec } from '../data/spec.js';
import { buildCandidates, studyOfRuns, type CandidateSet } from './candidates.js';
import { runInformation, totalInformation, type InformationPoint } from './information.js';
import { perRunSource, type LabLimits } from './limits.js';
import type { ExcludedCandidates } from '../report/types.js';

export interface PlanContext {
  study: Study;
  src: PerRunSourceSpec;
  limits: LabLimits;
  candidates: CandidateSet;
  /** The candidates as a study (one observation per measured column per run). */
  candidateStudy: Study;
  /** Indices of the candidates the lab can run. */
  usable: number[];
  excluded: ExcludedCandidates[];
  /** Predicted conversion of the key reactant per candidate (null where undefined or unsolved). */
  conversions: (number | null)[];
}

/** Where a fit leaves the parameters: estimation-space values, free indices, information scale. */
export function pointOfFit(sf: StudyFit): InformationPoint {
  const params = sf.fit.parameters;
  const free = params.map((p, i) => (p.fixed ? -1 : i)).filter((i) => i >= 0);
  const s = sf.fit.statistics.residualStdDev;
  const scale = sf.fit.statistics.covarianceBasis === 'known-sigma' || s === null || !(s > 0) ? 1 : 1 / (s * s);
  const variant = { ...findVariant(sf.model.study, sf.variant), parameters: params };
  return { variant, theta: Float64Array.from(params.map((p) => p.internalValue)), free, scale };
}

/** Information of the study's own runs at a point, with the sigma the fit used. */
export function studyInformation(study: Study, at: InformationPoint): Float64Array {
  const data = studyFitData(study);
  const info = runInformation(study, at, (i) => data.sigma[i]);
  return totalInformation(info, at.free.length);
}

/** Conversion of the key reactant and total outlet amount of each candidate at a point. */
function predictOutlets(cs: Study, at: InformationPoint): { conversion: (number | null)[]; outflow: (number | null)[] } {
  const model = new StudyModel(cs, at.variant);
  const ext = model.toExternal(at.theta);
  const j = cs.keyReactantIndex;
  const conversion: (number | null)[] = [];
  const outflow: (number | null)[] = [];
  cs.runs.forEach((run, r) => {
    let sol: ReturnType<StudyModel['solveRun']> | null = null;
    try {
      sol = model.solveRun(r, ext);
    } catch {
      // A run the reactor model refuses (no feed at all, say) is one the lab cannot run.
    }
    if (!sol || !sol.success) {
      conversion.push(null);
      outflow.push(null);
      return;
    }
    const a0 = initialAmount(j, run, cs);
    conversion.push(a0 > 0 ? (a0 - sol.outletAmounts[j]) / a0 : null);
    outflow.push(Array.from(sol.outletAmounts).reduce((s, v) => s + v, 0));
  });
  return { conversion, outflow };
}

/** Build the candidate grid and keep the candidates the lab can run at today's parameters. */
export function planContext(study: Study, limits: LabLimits, at: InformationPoint): PlanContext {
  const src = perRunSource(study);
  const candidates = buildCandidates(study, src, limits);
  const candidateStudy = studyOfRuns(study, src, candidates.runs);
  const { conversion, outflow } = predictOutlets(candidateStudy, at);
  const counts = new Map<string, number>();
  const usable: number[] = [];
  const flow = study.reactor.kind !== 'batch' && study.reactor.kind !== 'semibatch';
  conversion.forEach((x, c) => {
    let why: string | undefined;
    if (outflow[c] === null) why = 'the reactor could not be solved there';
    else if (limits.maxConversion !== undefined && x !== null && x > limits.maxConversion) why = `predicted conversion above maxConversion ${limits.maxConversion}`;
    else if (limits.minConversion !== undefined && x !== null && x < limits.minConversion) why = `predicted conversion below minConversion ${limits.minConversion}`;
    else if (flow && limits.minOutletFlow !== undefined && (outflow[c] as number) < limits.minOutletFlow) why = `predicted outlet flow below minOutletFlow ${limits.minOutletFlow} mol/s`;
    if (why) counts.set(why, (counts.get(why) ?? 0) + 1);
    else usable.push(c);
  });
  const excluded = [...counts.entries()].map(([reason, count]) => ({ reason, count }));
  return { study, src, limits, candidates, candidateStudy, usable, excluded, conversions: conversion };
}
