/**
 * The verdict on a fitted-kinetics hand-off before it is sized (core/verdict.ts): trustworthy
 * only when the fit that wrote it was trustworthy (its recorded verdict), its covariance is
 * positive definite (checked again here by a Cholesky factorisation, Golub & Van Loan 2013,
 * "Matrix Computations", 4th ed., section 4.2), and its content hash matches (handoff-hash.ts).
 * `rateloom size` refuses any other hand-off unless the user passes --accept-untrustworthy; then
 * the sizing runs, its result is not trustworthy (exit 1), and every output carries a caution
 * naming why. Without a positive-definite covariance no kinetic uncertainty is propagated: the
 * Monte Carlo is skipped and a warning says so, so a percentile never silently equals the nominal
 * size.
 */
import { RateloomError } from '../core/errors.js';
import { verdictFrom, type Verdict, type VerdictReason } from '../core/verdict.js';
import type { FittedKinetics } from './handoff.js';
import { handoffHash } from './handoff-hash.js';

export type HandoffVerdictStatus = 'trustworthy' | 'hash-mismatch' | 'fit-untrustworthy' | 'covariance-singular';
export type HandoffVerdict = Verdict<HandoffVerdictStatus>;

/** The covariance (row-major lists) is positive definite: a Cholesky factorisation succeeds. */
export function positiveDefinite(m: readonly (readonly number[])[]): boolean {
  const n = m.length;
  if (n === 0) return true;
  const L = new Float64Array(n * n);
  for (let j = 0; j < n; j++) {
    let d = m[j][j];
    for (let k = 0; k < j; k++) d -= L[j * n + k] ** 2;
    if (!(d > 0) || !Number.isFinite(d)) return false;
    L[j * n + j] = Math.sqrt(d);
    for (let i = j + 1; i < n; i++) {
      let s = m[i][j];
      for (let k = 0; k < j; k++) s -= L[i * n + k] * L[j * n + k];
      L[i * n + j] = s / L[j * n + j];
    }
  }
  return true;
}

/** Decide the verdict on a hand-off (rules in the file header). */
export function handoffVerdict(h: FittedKinetics): HandoffVerdict {
  const reasons: VerdictReason[] = [];
  if (!h.contentHash || h.contentHash !== handoffHash(h)) {
    reasons.push({ code: 'hash-mismatch', message: h.contentHash ? 'the hand-off was changed after rateloom wrote it (its content hash does not match)' : 'the hand-off carries no content hash, so rateloom cannot tell whether it was changed' });
  }
  const v = h.verdict;
  if (!v || !v.trustworthy) {
    const why = v?.reasons?.[0]?.message;
    reasons.push({ code: 'fit-untrustworthy', message: v ? `the fit that wrote it is not trustworthy (${v.status}${why ? `: ${why}` : ''})` : 'the hand-off records no verdict on its fit' });
  }
  if (h.covarianceStatus !== 'positive-definite' || !positiveDefinite(h.covariance.matrix)) {
    reasons.push({ code: 'covariance-singular', message: 'its parameter covariance is not positive definite, so no kinetic uncertainty can be propagated' });
  }
  return verdictFrom<HandoffVerdictStatus>('trustworthy', 'the hand-off comes unchanged from a trustworthy fit with a positive-definite covariance', reasons);
}

/** Throw (bad input, exit 2) unless the hand-off is trustworthy or the user accepted it explicitly. */
export function assertSizable(v: HandoffVerdict, accept: boolean): void {
  if (v.trustworthy || accept) return;
  throw new RateloomError('E_HANDOFF_UNTRUSTED', `refusing to size from this hand-off: ${v.reasons.map((r) => r.message).join('; ')}`, {
    path: [v.reasons[0].code === 'hash-mismatch' ? 'contentHash' : v.reasons[0].code === 'fit-untrustworthy' ? 'verdict' : 'covariance'],
    fix: 'Fit again until the verdict is trustworthy and size the hand-off it writes, unchanged; or pass --accept-untrustworthy to size it anyway (the result is then marked not trustworthy in every output).',
  });
}

/** The cautions a sizing from an accepted untrustworthy hand-off carries (none when trustworthy). */
export function handoffCautions(v: HandoffVerdict): string[] {
  if (v.trustworthy) return [];
  return [`NOT TRUSTWORTHY KINETICS, sized only because --accept-untrustworthy was given: ${v.reasons.map((r) => r.message).join('; ')}. Do not use this size for design.`];
}
