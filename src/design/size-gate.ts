/**
 * The gate in front of every sizing (sizeReactor, sizeReactorWith and so the worker path): the
 * hand-off's verdict (handoff-verdict.ts) is decided first; an untrustworthy hand-off is refused
 * (RateloomError, exit 2) unless `acceptUntrustworthy` is set, and then the result carries the
 * reasons in its cautions and its verdict is not trustworthy (exit 1). Without a positive-definite
 * covariance no Monte Carlo runs and the result has no uncertainty block, with a warning, so no
 * percentile ever silently equals the nominal size.
 */
import type { Warning } from '../core/outcome.js';
import { verdictFrom, type Verdict, type VerdictReason } from '../core/verdict.js';
import { assertSizable, handoffCautions, handoffVerdict, type HandoffVerdict } from './handoff-verdict.js';
import type { SizingInput, SizingResult } from './size.js';

export type SizingVerdictStatus = 'trustworthy' | 'sizing-failed' | 'hash-mismatch' | 'fit-untrustworthy' | 'covariance-singular';
export type SizingVerdict = Verdict<SizingVerdictStatus>;

/** The hand-off's verdict and the input to size with (no Monte Carlo draws without a usable covariance). Throws when refused. */
export function gateSizing(input: SizingInput): { input: SizingInput; kinetics: HandoffVerdict } {
  const kinetics = handoffVerdict(input.handoff);
  assertSizable(kinetics, input.options?.acceptUntrustworthy ?? false);
  if (!kinetics.reasons.some((r) => r.code === 'covariance-singular')) return { input, kinetics };
  return { input: { ...input, options: { ...input.options, draws: 0 } }, kinetics };
}

/** The sizing result with the hand-off's verdict, its cautions, and the sizing's own verdict. */
export function finishGated(result: Omit<SizingResult, 'kinetics' | 'verdict'>, kinetics: HandoffVerdict): SizingResult {
  const warnings: Warning[] = [...result.warnings];
  const noCovariance = kinetics.reasons.some((r) => r.code === 'covariance-singular');
  const { uncertainty, ...rest } = result;
  if (noCovariance) {
    warnings.push({
      code: 'W_NO_UNCERTAINTY',
      message: 'the hand-off has no positive-definite parameter covariance, so no kinetic uncertainty was propagated: there are no percentiles, and the nominal size carries no margin',
      path: ['covariance'],
    });
  }
  const reasons: VerdictReason[] = [...(result.success ? [] : [{ code: 'sizing-failed', message: result.message }]), ...kinetics.reasons];
  const verdict = verdictFrom<SizingVerdictStatus>('trustworthy', 'sized from an unchanged hand-off of a trustworthy fit', reasons);
  return {
    ...rest,
    ...(uncertainty && !noCovariance ? { uncertainty } : {}),
    warnings,
    cautions: [...handoffCautions(kinetics), ...result.cautions],
    kinetics,
    verdict,
  };
}
