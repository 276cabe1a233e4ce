/**
 * Verdicts: whether a result may be trusted, and why not. Every command's result carries one; it
 * alone decides the exit code (0 trustworthy, 1 finished but not to be trusted; bad input never
 * reaches a verdict, it throws a RateloomError and exits 2), the colour of the report's badge and
 * whether a hand-off may be sized. The rules of each kind of verdict live beside the method they
 * judge (estimation/verdict.ts for fits, design/handoff-verdict.ts for hand-offs); this file holds
 * only the shape they share.
 */

/** One reason a result is not trustworthy: stable code, readable message, optional path. */
export interface VerdictReason {
  /** Stable code, the same as the verdict status it would give on its own (e.g. 'misfit'). */
  code: string;
  message: string;
  /** What the reason is about: parameter names, run ids, ... */
  path?: ReadonlyArray<string | number>;
}

/** A verdict: trustworthy or not, a status naming the first failed rule, and every reason. */
export interface Verdict<S extends string = string> {
  /** True only when every rule held. */
  trustworthy: boolean;
  /** The status: the trustworthy status (e.g. 'converged'), or the code of the first failed rule. */
  status: S;
  /** One sentence: what the status means, with the first reason's detail. */
  message: string;
  /** Every failed rule, most fundamental first; empty when trustworthy. */
  reasons: VerdictReason[];
}

/** Exit code of a command that finished: 0 for a trustworthy result, 1 otherwise. */
export const EXIT_TRUSTWORTHY = 0;
export const EXIT_UNTRUSTWORTHY = 1;
/** Exit code for bad input or usage (a RateloomError). */
export const EXIT_BAD_INPUT = 2;

/** The exit code a finished result earns: 0 when trustworthy, 1 when not. */
export function exitCodeOf(v: Pick<Verdict, 'trustworthy'>): 0 | 1 {
  return v.trustworthy ? EXIT_TRUSTWORTHY : EXIT_UNTRUSTWORTHY;
}

/**
 * Build a verdict from the reasons found (in rule order): trustworthy with `okStatus` when there
 * are none, otherwise the first reason's code is the status.
 */
export function verdictFrom<S extends string>(okStatus: S, okMessage: string, reasons: VerdictReason[]): Verdict<S> {
  if (!reasons.length) return { trustworthy: true, status: okStatus, message: okMessage, reasons: [] };
  const first = reasons[0];
  const more = reasons.length > 1 ? ` (and ${reasons.length - 1} more reason${reasons.length > 2 ? 's' : ''})` : '';
  return { trustworthy: false, status: first.code as S, message: `Not trustworthy: ${first.message}${more}`, reasons };
}
