/**
 * Consistency of the study's constants with its runs, for `rateloom check`. Each warning states
 * both numbers with their units.
 *
 * - Ergun inputs (reactor.pressureDrop.ergun) are one set of numbers for every run, but the
 *   superficial mass flux G and the inlet gas density rho0 depend on each run's feed and inlet
 *   state: G_run = sum_j F_j0 M_j / A_c, rho0_run = P0 M_mean / (R T0) with M_mean = sum_j y_j M_j
 *   (ideal gas; common practice). A difference above 10 % is reported.
 * - A gas batch run's initial pressure against the ideal-gas pressure of its initial
 *   concentrations, P = sum_j C_j0 R T; a difference above 2 % is reported.
 * R = 8.314 462 618 J/(mol K), defined once in src/core/constants.ts.
 */
import type { Study, StudyRun } from './types.js';
import { GAS_CONSTANT } from '../core/constants.js';

/** Relative difference above which the Ergun inputs are reported against a run. */
export const ERGUN_TOLERANCE = 0.1;
/** Relative difference above which a gas batch's pressure is reported against its concentrations. */
export const BATCH_PRESSURE_TOLERANCE = 0.02;

const fmt = (x: number) => x.toPrecision(4);

function relDiff(a: number, b: number): number {
  return Math.abs(a - b) / Math.max(Math.abs(a), Math.abs(b));
}

/** Mass flow (kg/s) and mean molar mass (kg/mol) of a run's feed; undefined when a molar mass is missing. */
function feedMass(study: Study, run: StudyRun): { mass: number; meanM: number } | undefined {
  const F = run.feed;
  if (!F) return undefined;
  let mass = 0;
  let FT = 0;
  for (let j = 0; j < F.length; j++) {
    if (F[j] === 0) continue;
    const M = study.chemistry.molarMass[j];
    if (M === undefined) return undefined;
    mass += F[j] * M;
    FT += F[j];
  }
  return FT > 0 ? { mass, meanM: mass / FT } : undefined;
}

function ergunWarnings(study: Study): string[] {
  const e = study.reactor.pressureDrop?.ergun;
  if (!e || study.reactor.phase !== 'gas') return [];
  const out: string[] = [];
  let unknownM = false;
  for (const run of study.runs) {
    const f = feedMass(study, run);
    if (!f) {
      unknownM ||= run.feed !== undefined;
      continue;
    }
    const G = f.mass / e.crossSection;
    if (relDiff(G, e.superficialMassFlux) > ERGUN_TOLERANCE) {
      out.push(`run ${run.id}: the Ergun superficial mass flux is ${fmt(e.superficialMassFlux)} kg/(m2 s), but the run's feed gives ${fmt(G)} kg/(m2 s) (${fmt(f.mass)} kg/s over ${fmt(e.crossSection)} m2)`);
    }
    if (run.pressure !== undefined) {
      const rho = (run.pressure * f.meanM) / (GAS_CONSTANT * run.temperature);
      if (relDiff(rho, e.inletDensity) > ERGUN_TOLERANCE) {
        out.push(`run ${run.id}: the Ergun inlet density is ${fmt(e.inletDensity)} kg/m3, but the run's inlet (${fmt(run.pressure)} Pa, ${fmt(run.temperature)} K, mean molar mass ${fmt(f.meanM * 1000)} g/mol) gives ${fmt(rho)} kg/m3`);
      }
    }
  }
  if (unknownM) out.push('the Ergun inputs could not be compared with the runs: give every fed species a formula or a molar mass');
  return out;
}

function batchPressureWarnings(study: Study): string[] {
  if (study.reactor.kind !== 'batch' || study.reactor.phase !== 'gas') return [];
  const out: string[] = [];
  for (const run of study.runs) {
    const C = run.initialConcentrations;
    if (!C || run.pressure === undefined) continue;
    let CT = 0;
    for (let j = 0; j < C.length; j++) CT += C[j];
    const P = CT * GAS_CONSTANT * run.temperature;
    if (relDiff(P, run.pressure) > BATCH_PRESSURE_TOLERANCE) {
      out.push(`run ${run.id}: the initial pressure is ${fmt(run.pressure)} Pa, but the initial concentrations (${fmt(CT)} mol/m3 in all) at ${fmt(run.temperature)} K give ${fmt(P)} Pa (ideal gas)`);
    }
  }
  return out;
}

/** Every consistency warning of the study, one sentence each. */
export function consistencyWarnings(study: Study): string[] {
  return [...ergunWarnings(study), ...batchPressureWarnings(study)];
}
