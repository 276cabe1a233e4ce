/**
 * The rival rate-law sets of a discrimination plan, set up for divergence.ts: each rival's point
 * estimate and parameter covariance (inverse Fisher information of today's runs, Bard 1974 ch. 10,
 * restricted to the parameters today's data identify), its predictions and exact sensitivities at
 * every candidate, whitened by the measurement sigma, and the per-candidate blocks of the criterion.
 * Today's model probabilities are the Akaike (AICc) weights of the fits (estimation/compare.ts).
 */
import { RateloomError } from '../core/errors.js';
import { compareModels } from '../estimation/compare.js';
import { cholesky } from '../design/random.js';
import { canonicalJson } from '../design/handoff-hash.js';
import type { Study } from '../study/types.js';
import type { StudyFit } from '../workflow/fit-study.js';
import type { ModelVariant } from '../workflow/study-model.js';
import { inverseSpd } from './criteria.js';
import { pointOfFit, studyInformation, type PlanContext } from './context.js';
import type { DiscriminationBlocks, PairBlocks } from './divergence.js';
import { plannedSigma, runSensitivities, type InformationPoint, type RunSensitivities } from './information.js';

/** A rival at a candidate, whitened: predictions mu / sigma (q) and U = (G / sigma) L (q x p). */
export interface RivalAtCandidate {
  mu: Float64Array;
  U: Float64Array;
}

export interface RivalSetup {
  names: string[];
  /** Today's probability of each rival (Akaike weights; 0 for a fit that reached no minimum). */
  prior: number[];
  /** Free parameters of each rival. */
  p: number[];
  /** Observations per candidate run. */
  q: number;
  /** Indices (into ctx.candidates) of the candidates every rival can be solved at. */
  usable: number[];
  /** Per rival, per usable candidate. */
  at: RivalAtCandidate[][];
  /** Measurement sigma (SI) per usable candidate and observation. */
  sigma: Float64Array[];
  warnings: string[];
}

/**
 * Throws (exit 2) unless there are two or more rival rate-law sets and no two of them have the
 * same rate laws and the same parameters (then nothing could tell them apart).
 */
export function checkDistinctRivals(variants: readonly ModelVariant[]): void {
  if (variants.length < 2) throw new RateloomError('E_VALUE', `discrimination needs two or more rival rate-law sets, the study has ${variants.length}`, { path: ['candidates'], fix: 'Add rival rate-law sets under "candidates" in the study, or plan for precision (--mode precision).' });
  const keys = variants.map((v) =>
    canonicalJson({
      reactions: v.reactions,
      parameters: v.parameters.map((p) => ({ name: p.name, fixed: p.fixed, held: p.fixed ? p.value : undefined })).sort((x, y) => (x.name < y.name ? -1 : 1)),
    }),
  );
  for (let i = 0; i < variants.length; i++) {
    for (let j = i + 1; j < variants.length; j++) {
      if (keys[i] === keys[j]) throw new RateloomError('E_VALUE', `the rival rate-law sets '${variants[i].name}' and '${variants[j].name}' are identical: same rate laws and parameters, so no run can tell them apart`, { path: ['candidates', variants[j].name], fix: `Remove '${variants[j].name}' or change its rate law.` });
    }
  }
}

/** Today's model probabilities: Akaike weights of the rivals' fits (0 for a fit with no minimum). */
export function priorWeights(fits: readonly StudyFit[], warnings: string[]): number[] {
  const cmp = compareModels(fits.map((f) => ({ name: f.variant, fit: f.fit })));
  for (const w of cmp.warnings) warnings.push(w.message);
  return fits.map((f) => cmp.ranking.find((r) => r.name === f.variant)?.akaikeWeight ?? 0);
}

/**
 * Covariance factor L (C = L L', estimation space) of a rival from today's information, over the
 * parameters today's runs identify; the others are held (zero rows) and named in a warning.
 */
export function identifiedCovarianceFactor(study: Study, at: InformationPoint, names: readonly string[], warnings: string[]): Float64Array {
  const p = at.free.length;
  const F = studyInformation(study, at);
  const s = Float64Array.from({ length: p }, (_, a) => (F[a * p + a] > 0 ? 1 / Math.sqrt(F[a * p + a]) : 0));
  const kept: number[] = [];
  for (let a = 0; a < p; a++) {
    if (!(s[a] > 0)) continue;
    const trial = [...kept, a];
    const k = trial.length;
    const sub = Float64Array.from({ length: k * k }, (_, x) => F[trial[Math.floor(x / k)] * p + trial[x % k]] * s[trial[Math.floor(x / k)]] * s[trial[x % k]]);
    const L = cholesky(sub, k);
    if (L && L[(k - 1) * k + (k - 1)] > 1e-6) kept.push(a);
  }
  const held = names.filter((_, a) => !kept.includes(a));
  if (held.length) warnings.push(`'${at.variant.name}': today's runs do not identify ${held.join(', ')}; the plan ignores their uncertainty`);
  const k = kept.length;
  const sub = Float64Array.from({ length: k * k }, (_, x) => F[kept[Math.floor(x / k)] * p + kept[x % k]]);
  const inv = (k > 0 ? inverseSpd(sub, k) : null) ?? new Float64Array(k * k);
  const C = new Float64Array(p * p);
  kept.forEach((a, x) => kept.forEach((b, y) => (C[a * p + b] = inv[x * k + y])));
  return cholesky(C, p) ?? new Float64Array(p * p);
}

/** Candidates (from ctx.usable) where every rival solved with finite predictions and sensitivities. */
function solvedEverywhere(ctx: PlanContext, sens: readonly RunSensitivities[], q: number): number[] {
  const failed = new Set(sens.flatMap((s) => s.failures.map((f) => f.run)));
  return ctx.usable.filter((c) => {
    if (failed.has(ctx.candidateStudy.runs[c].id)) return false;
    return sens.every((s) => {
      for (let o = c * q; o < (c + 1) * q; o++) {
        if (!Number.isFinite(s.predictions[o])) return false;
        for (let a = 0; a < s.p; a++) if (!Number.isFinite(s.J[o * s.p + a])) return false;
      }
      return true;
    });
  });
}

/** Whitened predictions and U of one rival at one candidate. */
function whiten(s: RunSensitivities, L: Float64Array, c: number, q: number, sigma: Float64Array): RivalAtCandidate {
  const p = s.p;
  const mu = new Float64Array(q);
  const U = new Float64Array(q * p);
  for (let r = 0; r < q; r++) {
    const o = c * q + r;
    mu[r] = s.predictions[o] / sigma[r];
    for (let b = 0; b < p; b++) {
      let t = 0;
      for (let a = b; a < p; a++) t += s.J[o * p + a] * L[a * p + b];
      U[r * p + b] = t / sigma[r];
    }
  }
  return { mu, U };
}

/** Measurement sigma of each observation of candidate c at the probability-weighted mean prediction. */
function commonSigma(ctx: PlanContext, sens: readonly RunSensitivities[], prior: readonly number[], c: number, q: number, scale: number): Float64Array {
  const total = prior.reduce((a, b) => a + b, 0);
  return Float64Array.from({ length: q }, (_, r) => {
    const o = c * q + r;
    const mean = sens.reduce((acc, s, m) => acc + (total > 0 ? prior[m] / total : 1 / sens.length) * s.predictions[o], 0);
    return plannedSigma(ctx.candidateStudy, ctx.candidateStudy.observations[o].errorModel, mean) / Math.sqrt(scale);
  });
}

/** Set up the rivals at every candidate. */
export function setupRivals(ctx: PlanContext, fits: readonly StudyFit[], prior: readonly number[]): RivalSetup {
  const warnings: string[] = [];
  const points = fits.map(pointOfFit);
  const names = fits.map((f) => f.variant);
  const Ls = points.map((at, m) => identifiedCovarianceFactor(ctx.study, at, at.free.map((i) => fits[m].fit.parameters[i].name), warnings));
  const sens = points.map((at) => runSensitivities(ctx.candidateStudy, at));
  const q = ctx.candidateStudy.observations.length / Math.max(1, ctx.candidateStudy.runs.length);
  const usable = solvedEverywhere(ctx, sens, q);
  const best = prior.indexOf(Math.max(...prior));
  const scale = points[Math.max(0, best)].scale;
  const sigma = usable.map((c) => commonSigma(ctx, sens, prior, c, q, scale));
  const at = sens.map((s, m) => usable.map((c, k) => whiten(s, Ls[m], c, q, sigma[k])));
  return { names, prior: [...prior], p: points.map((x) => x.free.length), q, usable, at, sigma, warnings };
}

/** A' B for A (q x pa) and B (q x pb), row-major. */
function crossProduct(A: Float64Array, pa: number, B: Float64Array, pb: number, q: number): Float64Array {
  const out = new Float64Array(pa * pb);
  for (let r = 0; r < q; r++) for (let a = 0; a < pa; a++) for (let b = 0; b < pb; b++) out[a * pb + b] += A[r * pa + a] * B[r * pb + b];
  return out;
}

/** Per-candidate blocks of the criterion (divergence.ts) from the set-up rivals. */
export function discriminationBlocks(rs: RivalSetup): DiscriminationBlocks {
  const { p, q } = rs;
  const own = rs.at.map((cands, m) => cands.map((x) => crossProduct(x.U, p[m], x.U, p[m], q)));
  const pairs: PairBlocks[] = [];
  for (let i = 0; i < p.length; i++) {
    for (let j = i + 1; j < p.length; j++) {
      const d = rs.usable.map((_, k) => Float64Array.from(rs.at[i][k].mu, (v, r) => v - rs.at[j][k].mu[r]));
      pairs.push({
        i,
        j,
        delta: Float64Array.from(d, (dk) => dk.reduce((s, v) => s + v * v, 0)),
        wi: d.map((dk, k) => crossProduct(rs.at[i][k].U, p[i], dk, 1, q)),
        wj: d.map((dk, k) => crossProduct(rs.at[j][k].U, p[j], dk, 1, q)),
        cross: rs.usable.map((_, k) => crossProduct(rs.at[i][k].U, p[i], rs.at[j][k].U, p[j], q)),
      });
    }
  }
  return { p, own, pairs, prior: rs.prior };
}
