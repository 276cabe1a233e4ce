/**
 * One simulated lab campaign on the demo packed bed (job module of the worker pool, src/parallel/
 * pool.ts, for tests/slow/planning-campaigns.test.ts). Truth: datasets-demo/truth.json. Noise:
 * the study's error model at the true value (normal, independent). A campaign:
 *   1. a first screening campaign of 8 runs drawn at random in the mild corner of the limits
 *      (lower 40 % of temperature and catalyst mass), simulated, fitted (both rivals);
 *   2. 8 runs drawn at random within the whole limits (rejecting those the lab cannot run: true
 *      conversion above maxConversion), the same for both comparisons;
 *   3. 8 runs planned Ds-optimal for E1, and 8 runs planned to tell the rivals apart (Box-Hill);
 *   4. each set added to the first campaign, simulated, refitted: E1 interval widths and the
 *      Akaike (AICc) weight of the true rate law compared between planned and random.
 */
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { deriveSeed } from '../../src/parallel/pool';
import { SeededRandom } from '../../src/numerics/random';
import { compareModels } from '../../src/estimation/compare';
import { toInternal } from '../../src/core/parameter';
import { loadStudy } from '../../src/study/load';
import { applyParameterValues } from '../../src/study/simulate';
import { sigmaFromModel, type Study } from '../../src/study/types';
import { fitStudy, type StudyFit } from '../../src/workflow/fit-study';
import { StudyModel, initialAmount, type ModelVariant } from '../../src/workflow/study-model';
import { findVariant } from '../../src/workflow/fit-study';
import { heldConditions, mapRows, studyOfRuns, rowsFor } from '../../src/planning/candidates';
import { parseLimits, perRunSource, type LabLimits } from '../../src/planning/limits';
import { planRuns } from '../../src/planning/plan';
import type { PerRunSourceSpec } from '../../src/data/spec';

const ROOT = resolve(import.meta.dirname, '../..');
const N = 8;

export interface CampaignContext {
  seed: number;
  /** Candidate levels per factor of the planner. */
  levels: number;
  /** True water adsorption constant of the discrimination campaigns, m3/mol. */
  kw: number;
}

export interface CampaignResult {
  index: number;
  widthPlanned: number;
  widthRandom: number;
  weightPlanned: number;
  weightRandom: number;
  /** Weight of the true rate law after the first campaign alone. */
  weightFirst: number;
}

interface State {
  study: Study;
  truth: ModelVariant;
  src: PerRunSourceSpec;
  limits: LabLimits;
  held: Map<string, number>;
  seed: number;
}

function demoStudy(): { study: Study; truth: Record<string, unknown> } {
  const path = resolve(ROOT, 'datasets-demo/pbr/pbr.study.json');
  const study = loadStudy(readFileSync(path, 'utf8'), path, (p) => readFileSync(p, 'utf8')).study;
  const truth = JSON.parse(readFileSync(resolve(ROOT, 'datasets-demo/truth.json'), 'utf8')).pbr.parameters;
  return { study, truth };
}

function stateOf(study: Study, truth: ModelVariant, ctx: CampaignContext): State {
  const src = perRunSource(study);
  const limitsDoc = JSON.parse(readFileSync(resolve(ROOT, 'datasets-demo/pbr/lab.limits.json'), 'utf8'));
  const limits = parseLimits({ ...limitsDoc, levels: ctx.levels }, study);
  return { study, truth, src, limits, held: heldConditions(study, src, limits.factors), seed: ctx.seed };
}

export interface States {
  /** Precision: truth and model the study's own reversible power law. */
  precision: State;
  /** Discrimination: truth the water-inhibited (Langmuir-Hinshelwood) form, rival the power law. */
  discrimination: State;
}

export function setup(ctx: CampaignContext): States {
  const { study, truth } = demoStudy();
  const parameters = applyParameterValues(study.parameters, truth, 'truth.json');
  const lh = study.candidates.filter((c) => c.name === 'waterInhibited').map((c) => ({ ...c, parameters: applyParameterValues(c.parameters, { ...truth, KW: ctx.kw }, 'truth.json') }));
  const precision = { ...study, parameters, candidates: [] };
  const discrimination = { ...study, parameters, candidates: lh };
  return {
    precision: stateOf(precision, findVariant(precision, 'base'), ctx),
    discrimination: stateOf(discrimination, findVariant(discrimination, 'waterInhibited'), ctx),
  };
}

/** Runs at scaled points, with data simulated from the truth; null (when `enforce`) if a run's true conversion exceeds maxConversion. */
function simulateRuns(s: State, points: Float64Array[], prefix: string, rng: SeededRandom, enforce = true): Study | null {
  const rows = rowsFor(points, s.limits.factors, s.held, prefix);
  const st = studyOfRuns(s.study, s.src, mapRows(s.study, s.src, rows));
  const model = new StudyModel(st, s.truth);
  const theta = Float64Array.from(model.parameters, (p) => toInternal(p, p.value));
  const pred = new Float64Array(model.nObservations);
  if (!model.predict(theta, pred)) return null;
  const j = st.keyReactantIndex;
  const key = st.chemistry.speciesNames[j];
  for (const o of st.observations) {
    if (enforce && o.species === key && o.response === 'outlet-flow' && s.limits.maxConversion !== undefined) {
      const fin = initialAmount(j, st.runs[o.runIndex], st);
      if (fin > 0 && 1 - pred[o.index] / fin > s.limits.maxConversion) return null;
    }
  }
  const observations = st.observations.map((o) => ({ ...o, value: pred[o.index] + (sigmaFromModel(st.errorModels[o.errorModel], pred[o.index]) ?? 0) * rng.normal() }));
  return { ...st, observations };
}

function randomPoint(rng: SeededRandom, dims: number, top: number[]): Float64Array {
  return Float64Array.from({ length: dims }, (_, k) => rng.next() * top[k]);
}

/** n runs drawn at random (scaled box [0, top]), each kept only if the lab can run it. */
function randomRuns(s: State, n: number, prefix: string, top: number[], rng: SeededRandom): Study {
  const keep: Float64Array[] = [];
  while (keep.length < n) {
    const u = randomPoint(rng, s.limits.factors.length, top);
    if (simulateRuns(s, [u], 'probe', rng)) keep.push(u);
  }
  return simulateRuns(s, keep, prefix, rng) as Study;
}

/** Two simulated studies joined (runs and observations renumbered). */
function join(a: Study, b: Study): Study {
  const runs = [...a.runs, ...b.runs];
  const observations = [...a.observations, ...b.observations.map((o) => ({ ...o, runIndex: o.runIndex + a.runs.length }))].map((o, index) => ({ ...o, index }));
  return { ...a, runs, observations };
}

function fit(study: Study, variant: string): StudyFit {
  return fitStudy(study, { variant, profile: false, starts: 0 });
}

function e1Width(sf: StudyFit): number {
  const ci = sf.fit.parameters.find((p) => p.name === 'E1')?.ci.linear;
  return ci ? ci[1] - ci[0] : Infinity;
}

/** Akaike (AICc) weight of the true water-inhibited form against the power law. */
function trueWeight(study: Study): number {
  const fits = ['base', 'waterInhibited'].map((v) => ({ name: v, fit: fit(study, v).fit }));
  return compareModels(fits).ranking.find((r) => r.name === 'waterInhibited')?.akaikeWeight ?? 0;
}

/** Planned runs (their conditions, scaled) from a plan result, simulated. */
function plannedStudy(s: State, plan: ReturnType<typeof planRuns>, prefix: string, rng: SeededRandom): Study {
  const points = plan.runs.map((r) => Float64Array.from(r.scaled));
  // The plan kept to maxConversion at the fitted values; the lab runs them whatever the truth does.
  return simulateRuns(s, points, prefix, rng, false) as Study;
}

const ALL = (s: State) => s.limits.factors.map(() => 1);
const LOWER_HALF = (s: State) => s.limits.factors.map(() => 0.5);

/** E1 interval width after 8 Ds-optimal runs and after 8 random runs, from one first campaign. */
function precisionCampaign(s: State, rng: SeededRandom): { planned: number; random: number } {
  const first = randomRuns(s, N, 'F', LOWER_HALF(s), rng);
  const random = randomRuns(s, N, 'R', ALL(s), rng);
  const plan = planRuns(first, s.limits, [fit(first, 'base')], { runs: N, criterion: 'Ds', subset: ['E1'] });
  return { planned: e1Width(fit(join(first, plannedStudy(s, plan, 'P', rng)), 'base')), random: e1Width(fit(join(first, random), 'base')) };
}

/** Weight of the true rate law after 8 Box-Hill runs and after 8 random runs, from one first campaign. */
function discriminationCampaign(s: State, rng: SeededRandom): { planned: number; random: number; first: number } {
  const first = randomRuns(s, N, 'F', LOWER_HALF(s), rng);
  const random = randomRuns(s, N, 'R', ALL(s), rng);
  const fits = ['base', 'waterInhibited'].map((v) => fit(first, v));
  const plan = planRuns(first, s.limits, fits, { runs: N, mode: 'discrimination', posteriorDraws: 50 });
  return { planned: trueWeight(join(first, plannedStudy(s, plan, 'D', rng))), random: trueWeight(join(first, random)), first: trueWeight(first) };
}

export function runJob(s: States, index: number): CampaignResult {
  const rng = new SeededRandom(deriveSeed(s.precision.seed, index));
  const p = precisionCampaign(s.precision, rng);
  const d = discriminationCampaign(s.discrimination, rng);
  return { index, widthPlanned: p.planned, widthRandom: p.random, weightPlanned: d.planned, weightRandom: d.random, weightFirst: d.first };
}
