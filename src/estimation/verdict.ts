/**
 * The verdict on a fit: the one place that decides whether a least-squares fit may be trusted.
 * The rules, checked in this order (the first that fails names the status):
 *
 *   1. model-failure    the model was evaluated at every run at the reported optimum;
 *   2. not-converged    the solver stopped on a convergence test, not on an iteration or
 *                       evaluation limit;
 *   3. no-search        the convergence test was met after a real search: at least one accepted
 *                       step, except when the gradient test already held at the start (a start
 *                       that is itself a stationary point; rule 5 catches a flat model there);
 *   4. degenerate       the optimum is not degenerate: the model is not identically zero where
 *                       the data are not, and no parameter sits at overflow (|value| >= 1e100,
 *                       or |ln value| > 690 for a log parameter);
 *   5. singular/no-dof  the covariance is finite and positive definite (a rank deficiency is
 *                       reported with the parameters that make it up), and there are degrees of
 *                       freedom to estimate the error scale when it is not known;
 *   6. misfit           when the measurement error size is known: the chi-square test of the
 *                       weighted SSR on its n - p degrees of freedom does not reject the model
 *                       at p < `misfitPValue` (default 0.001); with replicates, neither does the
 *                       lack-of-fit F test;
 *   7. not-identifiable no parameter is practically non-identifiable: the smallest singular value
 *                       of the column-scaled Jacobian is at least `minSingularRatio` (default
 *                       1e-6) times the largest, no log-transformed parameter's interval (linear
 *                       or profile) spans more than `maxIntervalDecades` (default 2) decades,
 *                       and no profile interval stays open because the search range ended.
 *
 * When all hold, the verdict is 'converged' (trustworthy, exit 0); otherwise the fit finished but
 * must not be trusted (exit 1). Chi-square test: Bates & Watts 1988, "Nonlinear Regression
 * Analysis and Its Applications", section 1.3 (the weighted SSR is chi-square on n - p degrees of
 * freedom when the error model is right); lack of fit: Draper & Smith 1998, section 2.1.
 */
import type { Warning } from '../core/outcome.js';
import { verdictFrom, type Verdict, type VerdictReason } from '../core/verdict.js';
import type { FitResult } from './fit-types.js';
import { FIT_STATUS, type FitStatus } from './status.js';

export type FitVerdictStatus =
  | 'converged'
  | 'model-failure'
  | 'not-converged'
  | 'no-search'
  | 'degenerate'
  | 'singular'
  | 'no-dof'
  | 'misfit'
  | 'not-identifiable';

export type FitVerdict = Verdict<FitVerdictStatus>;

/** Thresholds of the verdict rules (see the file header). */
export interface VerdictRules {
  /** p-value of the chi-square or lack-of-fit test below which the fit is a misfit; default 0.001. */
  misfitPValue?: number;
  /** Widest accepted interval of a log-transformed parameter, in decades (log10 hi/lo); default 2. */
  maxIntervalDecades?: number;
  /** Smallest accepted ratio of the smallest to the largest singular value of the column-scaled Jacobian; default 1e-6. */
  minSingularRatio?: number;
}

export const DEFAULT_VERDICT_RULES: Required<VerdictRules> = { misfitPValue: 0.001, maxIntervalDecades: 2, minSingularRatio: 1e-6 };

/** |value| at or above this counts as overflow; so does |ln value| above LOG_OVERFLOW for a log parameter. */
export const VALUE_OVERFLOW = 1e100;
export const LOG_OVERFLOW = 690;

/** Everything the rules look at, read from a FitResult by verdictInput (or built by hand in tests). */
export interface FitVerdictInput {
  solverStatus: FitStatus;
  iterations: number;
  /** The model was evaluated at every observation at the estimate. */
  evaluated: boolean;
  /** Which runs failed at the estimate, in words (when not evaluated). */
  failureDetail?: string;
  /** Largest |prediction| and |measured value| at the estimate. */
  maxAbsPredicted: number;
  maxAbsMeasured: number;
  /** Free parameters: name, value, estimation-space value, log-transformed or not. */
  parameters: { name: string; value: number; internal: number; log: boolean; linear: [number, number] | null; profile?: [number | null, number | null]; profileOpen?: boolean }[];
  /** Free parameters. */
  p: number;
  dof: number;
  sigmaKnown: boolean;
  /** The covariance was formed (finite, positive definite). */
  covariance: boolean;
  /** Names in the most nearly singular direction of the scaled Jacobian. */
  nullNames: string[];
  /** Smallest / largest singular value of the column-scaled Jacobian; null when not computed. */
  singularRatio: number | null;
  chiSquare: number;
  chiSquarePValue: number | null;
  lackOfFit: { F: number; pValue: number; dofLack: number; dofPure: number } | null;
  /** Observation indices with the largest |weighted residual|, worst first. */
  worst: number[];
}

const fmt = (v: number): string => (Math.abs(v) >= 1e-3 && Math.abs(v) < 1e5 ? v.toPrecision(4) : v.toExponential(3));
const list = (names: string[]): string => names.join(', ');
/** A p-value in words; a survival function that underflowed to 0 is shown as a bound. */
const pText = (v: number): string => (v > 0 ? `p = ${v.toExponential(2)}` : 'p < 1e-15');

function searchReasons(x: FitVerdictInput): VerdictReason[] {
  if (!x.evaluated) return [{ code: 'model-failure', message: `the model cannot be evaluated at every run at the reported parameter values${x.failureDetail ? ` (${x.failureDetail})` : ''}` }];
  if (x.solverStatus === 'model-failure') return [{ code: 'model-failure', message: 'the search stopped because the model failed at every trial point near the estimate' }];
  if (x.solverStatus === 'max-iterations' || x.solverStatus === 'max-evaluations') {
    return [{ code: 'not-converged', message: `the search stopped at its ${x.solverStatus === 'max-iterations' ? 'iteration' : 'model-evaluation'} limit before a convergence test was met` }];
  }
  if (x.iterations === 0 && x.p > 0 && x.solverStatus !== 'converged-gtol') {
    return [{ code: 'no-search', message: `the ${x.solverStatus.replace('converged-', '')} test was met after 0 accepted steps: no step from the start reduced the sum of squares, so the start was never improved on` }];
  }
  return [];
}

function degenerateReasons(x: FitVerdictInput): VerdictReason[] {
  const out: VerdictReason[] = [];
  if (x.maxAbsMeasured > 0 && !(x.maxAbsPredicted > 1e-12 * x.maxAbsMeasured)) {
    out.push({ code: 'degenerate', message: 'the model is identically zero at the estimate while the data are not (a degenerate solution)' });
  }
  const over = x.parameters.filter((q) => !Number.isFinite(q.value) || Math.abs(q.value) >= VALUE_OVERFLOW || (q.log && Math.abs(q.internal) > LOG_OVERFLOW));
  if (over.length) {
    out.push({ code: 'degenerate', message: `parameter${over.length > 1 ? 's' : ''} ${list(over.map((q) => `${q.name} = ${fmt(q.value)}`))} ran off to overflow (a degenerate solution)`, path: over.map((q) => q.name) });
  }
  return out;
}

function covarianceReasons(x: FitVerdictInput): VerdictReason[] {
  if (x.covariance || x.p === 0) return [];
  if (x.dof <= 0 && !x.sigmaKnown) {
    return [{ code: 'no-dof', message: `${x.p + x.dof} observations for ${x.p} free parameters leave no degrees of freedom to estimate the error scale, so there is no covariance` }];
  }
  const who = x.nullNames.length ? `: the data cannot separate ${list(x.nullNames)}` : '';
  return [{ code: 'singular', message: `the covariance is singular (the Jacobian is rank-deficient)${who}`, path: x.nullNames }];
}

function misfitReasons(x: FitVerdictInput, r: Required<VerdictRules>): VerdictReason[] {
  const out: VerdictReason[] = [];
  const worst = x.worst.length ? `; worst observations ${x.worst.join(', ')}` : '';
  if (x.sigmaKnown && x.chiSquarePValue !== null && x.chiSquarePValue < r.misfitPValue) {
    out.push({
      code: 'misfit',
      message: `the residuals are larger than the stated measurement error allows: chi-square ${fmt(x.chiSquare)} on ${x.dof} degrees of freedom, ${pText(x.chiSquarePValue)} < ${r.misfitPValue} (residual std dev ${fmt(Math.sqrt(x.chiSquare / Math.max(x.dof, 1)))} sigma)${worst}`,
      path: x.worst,
    });
  }
  if (x.lackOfFit && x.lackOfFit.pValue < r.misfitPValue) {
    const l = x.lackOfFit;
    out.push({ code: 'misfit', message: `the lack-of-fit test rejects the model against the replicate scatter: F = ${fmt(l.F)} on (${l.dofLack}, ${l.dofPure}) degrees of freedom, ${pText(l.pValue)} < ${r.misfitPValue}${worst}`, path: x.worst });
  }
  return out;
}

/** log10(hi/lo) of a positive interval; Infinity when an end is missing or not positive. */
function decades(iv: readonly [number | null, number | null] | null | undefined): number {
  if (!iv) return 0;
  const [lo, hi] = iv;
  if (lo === null || hi === null || !(lo > 0) || !(hi > 0)) return Infinity;
  return Math.log10(hi / lo);
}

function identifiabilityReasons(x: FitVerdictInput, r: Required<VerdictRules>): VerdictReason[] {
  const out: VerdictReason[] = [];
  if (x.singularRatio !== null && x.p > 1 && x.singularRatio < r.minSingularRatio) {
    const who = x.nullNames.length ? ` (mostly ${list(x.nullNames)})` : '';
    out.push({ code: 'not-identifiable', message: `a near-zero singular value of the scaled Jacobian (${x.singularRatio.toExponential(2)} of the largest, limit ${r.minSingularRatio}): a combination of parameters${who} is barely determined by the data`, path: x.nullNames });
  }
  for (const q of x.parameters) {
    const span = q.log ? Math.max(decades(q.linear), q.profile && !q.profileOpen ? decades(q.profile) : 0) : 0;
    if (span > r.maxIntervalDecades) {
      out.push({ code: 'not-identifiable', message: `the interval of ${q.name} spans ${Number.isFinite(span) ? span.toFixed(1) : 'unboundedly many'} decades (limit ${r.maxIntervalDecades}): the data barely determine it`, path: [q.name] });
    } else if (q.profileOpen) {
      out.push({ code: 'not-identifiable', message: `the profile interval of ${q.name} never closes within the search range: the data do not bound it`, path: [q.name] });
    }
  }
  return out;
}

/** Decide the verdict from its inputs (pure; the rules are in the file header). */
export function decideFitVerdict(x: FitVerdictInput, rules: VerdictRules = {}): FitVerdict {
  const r = { ...DEFAULT_VERDICT_RULES, ...rules };
  const search = searchReasons(x);
  const reasons = search.length && search[0].code === 'model-failure' && !x.evaluated
    ? search
    : [...search, ...degenerateReasons(x), ...covarianceReasons(x), ...misfitReasons(x, r), ...identifiabilityReasons(x, r)];
  return verdictFrom<FitVerdictStatus>('converged', 'Converged: a convergence test was met after a real search, the model was evaluated at every run and the covariance is positive definite', reasons);
}

/** The verdict inputs of a fit result (see FitVerdictInput). */
export function verdictInput(fit: Omit<FitResult, 'verdict'>): FitVerdictInput {
  const s = fit.statistics;
  let maxP = 0;
  let maxM = 0;
  for (const o of fit.observations) {
    maxP = Math.max(maxP, Math.abs(o.predicted));
    maxM = Math.max(maxM, Math.abs(o.measured));
  }
  const worst = fit.observations
    .slice()
    .sort((a, b) => Math.abs(b.weightedResidual) - Math.abs(a.weightedResidual))
    .slice(0, 5)
    .map((o) => o.index);
  const openByName = new Set(fit.profiles.filter((pr) => pr.ends.includes('search-range')).map((pr) => pr.name));
  const failure = fit.warnings.find((w) => w.code === 'model-failure-at-estimate');
  const nullWarning = fit.warnings.find((w) => w.code === 'not-identifiable' || w.code === 'ill-conditioned');
  return {
    solverStatus: s.solverStatus,
    iterations: s.iterations,
    evaluated: fit.observations.length === s.n,
    ...(failure?.path?.length ? { failureDetail: `failing: ${failure.path.map((r) => (r === '*' ? 'model' : `run ${r}`)).join(', ')}` } : {}),
    maxAbsPredicted: maxP,
    maxAbsMeasured: maxM,
    parameters: fit.parameters
      .filter((q) => !q.fixed)
      .map((q) => ({ name: q.name, value: q.value, internal: q.internalValue, log: q.transform === 'log', linear: q.ci.linear, ...(q.ci.profile ? { profile: q.ci.profile } : {}), profileOpen: openByName.has(q.name) })),
    p: s.p,
    dof: s.dof,
    sigmaKnown: s.covarianceBasis === 'known-sigma',
    covariance: fit.covariance.internal !== null,
    nullNames: (nullWarning?.path ?? []).map(String),
    singularRatio: s.singularRatio,
    chiSquare: s.chiSquare,
    chiSquarePValue: s.chiSquarePValue,
    lackOfFit: s.lackOfFit,
    worst,
  };
}

/** Warning codes that restate verdict reasons (replaced each time the verdict is decided again). */
const VERDICT_WARNING: Partial<Record<FitVerdictStatus, string>> = {
  'no-search': 'no-search',
  degenerate: 'degenerate',
  misfit: 'misfit',
  'not-identifiable': 'poorly-identified',
};

/**
 * Decide the verdict of a fit and make the result say it: `verdict`, and `status`, `success` and
 * `message` from it (a trustworthy fit keeps the solver's convergence status; otherwise the
 * status is the first failed rule's). Reasons of the kinds no other warning states (no search,
 * degenerate, misfit, poor identifiability) are also added as warnings. Returns a new result.
 */
export function applyVerdict(fit: Omit<FitResult, 'verdict'> & { verdict?: FitVerdict }, rules: VerdictRules = {}): FitResult {
  const verdict = decideFitVerdict(verdictInput(fit), rules);
  const s = fit.statistics;
  const status: FitStatus = verdict.trustworthy || verdict.status === 'not-converged' ? s.solverStatus : verdict.status === 'converged' ? s.solverStatus : verdict.status;
  const first = verdict.reasons[0];
  const message = verdict.trustworthy || status === s.solverStatus ? s.solverMessage : `${FIT_STATUS[status].message}: ${first.message}`;
  const codes = new Set(Object.values(VERDICT_WARNING));
  const warnings: Warning[] = fit.warnings.filter((w) => !codes.has(w.code));
  for (const r of verdict.reasons) {
    const code = VERDICT_WARNING[r.code as FitVerdictStatus];
    if (code) warnings.push({ code, message: r.message, ...(r.path ? { path: r.path } : {}) });
  }
  return { ...fit, status, success: FIT_STATUS[status].success && verdict.trustworthy, message, warnings, verdict };
}

/** Verdict codes that still leave a genuine minimum with a covariance (its SSR and AICc mean something). */
const MINIMUM_FOUND: ReadonlySet<string> = new Set(['misfit', 'not-identifiable']);

/**
 * The search found a genuine minimum with a covariance: the verdict is trustworthy or fails only
 * for misfit or poor identifiability. Rival rate laws are ranked among such fits (a misfit or a
 * superfluous parameter is exactly what the ranking is there to show).
 */
export function minimumFound(fit: Pick<FitResult, 'verdict'>): boolean {
  return fit.verdict.reasons.every((r) => MINIMUM_FOUND.has(r.code));
}
