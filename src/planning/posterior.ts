/**
 * Expected posterior model probabilities after the planned runs (Box & Hill 1967, Technometrics 9,
 * 57-71: P_i' proportional to P_i p_i(y), with p_i the predictive density of the new data under
 * rival i, N(mu_i, V_i), V_i = Sigma + G_i C_i G_i'). For each rival taken as the true one, outcomes
 * y are drawn from its predictive normal (measurement error plus today's parameter uncertainty,
 * Monte Carlo) and each rival's posterior probability is averaged over the draws. Whitened units
 * (Sigma = I); V_j^-1 by the Woodbury identity and log det V_j = log det(I + U_j'U_j).
 */
import { SeededRandom } from '../design/random.js';
import { inverseSpd, logDetSpd } from './criteria.js';
import type { RivalSetup } from './rivals.js';

interface Stacked {
  /** Stacked whitened predictions (n q). */
  mu: Float64Array;
  /** Stacked U (n q x p). */
  U: Float64Array;
  p: number;
  /** (I + U'U)^-1 and log det (I + U'U). */
  Ainv: Float64Array;
  logDet: number;
}

function stack(rs: RivalSetup, m: number, chosen: readonly number[]): Stacked {
  const { q } = rs;
  const p = rs.p[m];
  const N = chosen.length * q;
  const mu = new Float64Array(N);
  const U = new Float64Array(N * p);
  chosen.forEach((k, r) => {
    mu.set(rs.at[m][k].mu, r * q);
    U.set(rs.at[m][k].U, r * q * p);
  });
  const A = new Float64Array(p * p);
  for (let a = 0; a < p; a++) A[a * p + a] = 1;
  for (let o = 0; o < N; o++) for (let a = 0; a < p; a++) for (let b = 0; b < p; b++) A[a * p + b] += U[o * p + a] * U[o * p + b];
  return { mu, U, p, Ainv: inverseSpd(A, p) ?? new Float64Array(p * p), logDet: p > 0 ? logDetSpd(A, p) : 0 };
}

/** log predictive density of y under a rival, up to the constant shared by all rivals. */
function logDensity(s: Stacked, y: Float64Array, r: Float64Array, w: Float64Array): number {
  const { p } = s;
  let rr = 0;
  for (let o = 0; o < y.length; o++) {
    r[o] = y[o] - s.mu[o];
    rr += r[o] * r[o];
  }
  w.fill(0);
  for (let o = 0; o < y.length; o++) for (let a = 0; a < p; a++) w[a] += s.U[o * p + a] * r[o];
  let quad = 0;
  for (let a = 0; a < p; a++) for (let b = 0; b < p; b++) quad += w[a] * s.Ainv[a * p + b] * w[b];
  return -0.5 * s.logDet - 0.5 * (rr - quad);
}

/** Posterior probabilities from the prior and log densities (log-sum-exp). */
export function posteriorProbabilities(prior: readonly number[], logDens: readonly number[]): number[] {
  const lp = prior.map((P, j) => (P > 0 ? Math.log(P) + logDens[j] : -Infinity));
  const top = Math.max(...lp);
  if (!Number.isFinite(top)) return prior.map(() => 0);
  const e = lp.map((v) => Math.exp(v - top));
  const total = e.reduce((a, b) => a + b, 0);
  return e.map((v) => v / total);
}

/** One outcome drawn from rival i's predictive normal: mu + U z + e. */
function drawOutcome(s: Stacked, rng: SeededRandom, y: Float64Array, z: Float64Array): void {
  for (let a = 0; a < s.p; a++) z[a] = rng.normal();
  for (let o = 0; o < y.length; o++) {
    let t = s.mu[o] + rng.normal();
    for (let a = 0; a < s.p; a++) t += s.U[o * s.p + a] * z[a];
    y[o] = t;
  }
}

/**
 * expected[i][j]: mean posterior probability of rival j after the chosen runs when rival i is true,
 * over `draws` simulated outcomes per rival (seeded).
 */
export function expectedPosteriors(rs: RivalSetup, chosen: readonly number[], draws: number, seed: number): number[][] {
  const M = rs.names.length;
  const st = Array.from({ length: M }, (_, m) => stack(rs, m, chosen));
  const N = chosen.length * rs.q;
  const y = new Float64Array(N);
  const r = new Float64Array(N);
  const pMax = Math.max(0, ...rs.p);
  const w = new Float64Array(pMax);
  const z = new Float64Array(pMax);
  const rng = new SeededRandom(seed);
  return st.map((truth) => {
    const mean = new Array<number>(M).fill(0);
    for (let d = 0; d < draws; d++) {
      drawOutcome(truth, rng, y, z);
      const post = posteriorProbabilities(rs.prior, st.map((s) => logDensity(s, y, r, w)));
      post.forEach((v, j) => (mean[j] += v / draws));
    }
    return mean;
  });
}
