/**
 * Parameter draws for a Bayesian-style design: the criterion is averaged over points drawn from
 * the fit's normal approximation N(theta_hat, C) in the estimation space (Chaloner & Verdinelli
 * 1995, Statistical Science 10, 273-304, section 2: the "pseudo-Bayesian" expected criterion).
 */
import { SeededRandom, cholesky, correlatedDraw } from '../design/random.js';
import type { StudyFit } from '../workflow/fit-study.js';
import type { InformationPoint } from './information.js';

/** `count` points drawn from the fit's covariance (the estimate itself when count is 0). */
export function parameterDraws(at: InformationPoint, sf: StudyFit, count: number, seed: number): { points: InformationPoint[]; warning?: string } {
  if (count <= 0) return { points: [at] };
  const cov = sf.fit.covariance.internal;
  const p = at.free.length;
  const L = cov ? cholesky(cov.flat(), p) : null;
  if (!L) return { points: [at], warning: 'the fit has no usable covariance, so the design is local (at the estimate) instead of averaged over draws' };
  const rng = new SeededRandom(seed);
  const mean = Float64Array.from(at.free, (i) => at.theta[i]);
  const e = new Float64Array(p);
  const z = new Float64Array(p);
  const points: InformationPoint[] = [];
  for (let d = 0; d < count; d++) {
    correlatedDraw(rng, mean, L, p, e, z);
    const theta = Float64Array.from(at.theta);
    at.free.forEach((i, k) => {
      theta[i] = z[k];
    });
    points.push({ ...at, theta });
  }
  return { points };
}
