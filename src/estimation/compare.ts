/**
 * Rival-model comparison on the same data: sums of squares, AICc, BIC and Akaike weights
 * (Burnham & Anderson 2002, "Model Selection and Multimodel Inference", 2nd ed., Springer, ch. 2:
 * delta_i = AICc_i - min AICc, w_i = exp(-delta_i/2) / sum exp(-delta_j/2); delta < 2 means
 * "substantial support", i.e. the data cannot tell the models apart), and the extra-sum-of-squares
 * F test for nested pairs named by the caller (Bates & Watts 1988, section 3.10:
 * F = ((SSR_s - SSR_l)/(p_l - p_s)) / (SSR_l/(n - p_l))); with known sigma the difference of the
 * chi-square statistics, SSR_s - SSR_l ~ chi2(p_l - p_s), is used instead.
 * Fits that did not converge are listed last and take no part in weights or the verdict.
 */
import { criterionDeltaText, criterionText } from '../core/criterion.js';
import { RateloomError } from '../core/errors.js';
import type { Warning } from '../core/outcome.js';
import { chiSquareCdf, fSurvival } from './distributions.js';
import type { FitResult } from './fit-types.js';
import { minimumFound } from './verdict.js';

export interface RivalFit {
  /** Model name shown in the verdict. */
  name: string;
  fit: FitResult;
}

export interface CompareOptions {
  /** Nested pairs [simpler, larger] by name: the simpler model is a special case of the larger. */
  nested?: ReadonlyArray<readonly [string, string]>;
  /** Significance level of the nested tests; default 0.05. */
  alpha?: number;
}

export interface RankedModel {
  name: string;
  /** 1 = best supported; non-converged fits come last. */
  rank: number;
  /** The fit reached a genuine minimum with a covariance (verdict.ts minimumFound), so it is ranked. */
  converged: boolean;
  /** Status of the fit's verdict ('converged', 'misfit', ...). */
  verdict: string;
  /** The fit's verdict is trustworthy. */
  trustworthy: boolean;
  ssr: number;
  n: number;
  p: number;
  dof: number;
  aicc: number | null;
  bic: number;
  /** The value of the ranking criterion (AICc, or AIC when AICc is undefined for some model); null for non-converged fits. */
  criterion: number | null;
  /** Criterion minus the best model's; null for non-converged fits. Print it with criterionDeltaText (src/core/criterion.ts). */
  delta: number | null;
  /** Akaike weight; null for non-converged fits. */
  akaikeWeight: number | null;
}

export interface NestedTest {
  simpler: string;
  larger: string;
  test: 'F' | 'chi-square';
  statistic: number;
  dof1: number;
  dof2: number | null;
  pValue: number;
  /** The larger model fits significantly better at level alpha. */
  largerSignificantlyBetter: boolean;
}

export interface Comparison {
  /** 'aicc', or 'aic' when AICc is undefined for some model (too few observations). */
  criterion: 'aicc' | 'aic';
  ranking: RankedModel[];
  nestedTests: NestedTest[];
  /** Names of converged models within delta < 2 of the best (the best included). */
  indistinguishable: string[];
  verdict: string;
  warnings: Warning[];
}

/** Rank rival fits of the same data; see the file header. Throws for inconsistent input. */
export function compareModels(rivals: readonly RivalFit[], options: CompareOptions = {}): Comparison {
  if (rivals.length < 2) throw new RateloomError('E_VALUE', 'comparison needs at least two fitted models', { path: ['models'] });
  const names = new Set<string>();
  for (const r of rivals) {
    if (names.has(r.name)) throw new RateloomError('E_VALUE', `model name '${r.name}' is used twice`, { path: ['models', r.name] });
    names.add(r.name);
  }
  const n = rivals[0].fit.statistics.n;
  const basis = rivals[0].fit.statistics.covarianceBasis;
  for (const r of rivals) {
    if (r.fit.statistics.n !== n) {
      throw new RateloomError('E_DATA', `model '${r.name}' was fitted to ${r.fit.statistics.n} observations, not ${n}: rivals must share the data`, {
        path: ['models', r.name],
      });
    }
    if (r.fit.statistics.covarianceBasis !== basis) {
      throw new RateloomError('E_DATA', `model '${r.name}' treats sigma differently (${r.fit.statistics.covarianceBasis} vs ${basis})`, {
        path: ['models', r.name],
      });
    }
  }
  const alpha = options.alpha ?? 0.05;
  const warnings: Warning[] = [];
  const ok = rivals.filter((r) => minimumFound(r.fit));
  const bad = rivals.filter((r) => !minimumFound(r.fit));
  for (const r of bad) warnings.push({ code: 'not-converged', message: `model '${r.name}' reached no usable minimum (${r.fit.status}) and is not ranked`, path: [r.name] });
  const criterion: 'aicc' | 'aic' = ok.every((r) => r.fit.statistics.aicc !== null) ? 'aicc' : 'aic';
  if (criterion === 'aic') warnings.push({ code: 'aic-used', message: 'AICc is undefined for at least one model (n - k - 1 <= 0); plain AIC is used' });
  const crit = (r: RivalFit) => (criterion === 'aicc' ? (r.fit.statistics.aicc as number) : r.fit.statistics.aic);
  ok.sort((a, b) => crit(a) - crit(b));
  const best = ok.length ? crit(ok[0]) : 0;
  const rel = ok.map((r) => Math.exp(-(crit(r) - best) / 2));
  const sumRel = rel.reduce((s, v) => s + v, 0);
  const row = (r: RivalFit, rank: number, conv: boolean, delta: number | null, w: number | null): RankedModel => ({
    name: r.name,
    rank,
    converged: conv,
    verdict: r.fit.verdict.status,
    trustworthy: r.fit.verdict.trustworthy,
    ssr: r.fit.statistics.ssr,
    n: r.fit.statistics.n,
    p: r.fit.statistics.p,
    dof: r.fit.statistics.dof,
    aicc: r.fit.statistics.aicc,
    bic: r.fit.statistics.bic,
    criterion: conv ? crit(r) : null,
    delta,
    akaikeWeight: w,
  });
  const ranking: RankedModel[] = [
    ...ok.map((r, i) => row(r, i + 1, true, crit(r) - best, rel[i] / sumRel)),
    ...bad.map((r, i) => row(r, ok.length + i + 1, false, null, null)),
  ];
  const indistinguishable = ranking.filter((m) => m.converged && (m.delta as number) < 2).map((m) => m.name);

  const nestedTests = nestedTestsOf(rivals, options.nested ?? [], basis, alpha, warnings);

  return { criterion, ranking, nestedTests, indistinguishable, verdict: verdictText(ranking, indistinguishable, nestedTests, criterion, alpha), warnings };
}

/** Likelihood-ratio (chi-square, known sigma) or F tests of the nested pairs; skipped pairs add a warning. */
function nestedTestsOf(
  rivals: readonly RivalFit[],
  nested: ReadonlyArray<readonly [string, string]>,
  basis: FitResult['statistics']['covarianceBasis'],
  alpha: number,
  warnings: Warning[],
): NestedTest[] {
  const byName = new Map(rivals.map((r) => [r.name, r]));
  const nestedTests: NestedTest[] = [];
  for (const [sName, lName] of nested) {
    const s = byName.get(sName);
    const l = byName.get(lName);
    if (!s || !l) {
      throw new RateloomError('E_VALUE', `nested pair names unknown model '${!s ? sName : lName}'`, { path: ['nested'] });
    }
    const ps = s.fit.statistics.p;
    const pl = l.fit.statistics.p;
    if (!(pl > ps)) {
      throw new RateloomError('E_VALUE', `in nested pair [${sName}, ${lName}] the larger model must have more free parameters`, { path: ['nested'] });
    }
    if (!minimumFound(s.fit) || !minimumFound(l.fit)) {
      warnings.push({ code: 'nested-skipped', message: `nested test ${sName} vs ${lName} skipped: a fit did not converge` });
      continue;
    }
    const dSSR = Math.max(0, s.fit.statistics.ssr - l.fit.statistics.ssr);
    const d1 = pl - ps;
    if (basis === 'known-sigma') {
      const pValue = Math.max(0, 1 - chiSquareCdf(dSSR, d1));
      nestedTests.push({ simpler: sName, larger: lName, test: 'chi-square', statistic: dSSR, dof1: d1, dof2: null, pValue, largerSignificantlyBetter: pValue < alpha });
    } else {
      const d2 = l.fit.statistics.dof;
      if (d2 <= 0) {
        warnings.push({ code: 'nested-skipped', message: `nested test ${sName} vs ${lName} skipped: no residual degrees of freedom` });
        continue;
      }
      const F = dSSR / d1 / (l.fit.statistics.ssr / d2);
      const pValue = fSurvival(F, d1, d2);
      nestedTests.push({ simpler: sName, larger: lName, test: 'F', statistic: F, dof1: d1, dof2: d2, pValue, largerSignificantlyBetter: pValue < alpha });
    }
  }
  return nestedTests;
}

function verdictText(ranking: RankedModel[], tied: string[], tests: NestedTest[], criterion: string, alpha: number): string {
  const conv = ranking.filter((m) => m.converged);
  if (conv.length === 0) return 'No model converged; the data support none of them as fitted.';
  const label = criterion === 'aicc' ? 'AICc' : 'AIC';
  const parts: string[] = [];
  const best = conv[0];
  if (tied.length > 1) {
    parts.push(
      `The data cannot tell apart ${tied.join(', ')} (${label} within 2 of the best); ${best.name} ranks first with Akaike weight ${(best.akaikeWeight as number).toFixed(2)}.`,
    );
  } else {
    parts.push(`The data support ${best.name} (Akaike weight ${(best.akaikeWeight as number).toFixed(2)}).`);
  }
  const weaker = conv.filter((m) => !tied.includes(m.name));
  if (weaker.length) {
    parts.push(`Less supported: ${weaker.map((m) => `${m.name} (${label} ${criterionText(m.criterion)}, ${criterionDeltaText(m.criterion, best.criterion)} above ${best.name}'s ${criterionText(best.criterion)})`).join(', ')}.`);
  }
  for (const t of tests) {
    parts.push(
      t.largerSignificantlyBetter
        ? `${t.larger} fits significantly better than the nested ${t.simpler} (${t.test} test, p = ${t.pValue.toPrecision(2)} < ${alpha}).`
        : `${t.larger} does not fit significantly better than the nested ${t.simpler} (${t.test} test, p = ${t.pValue.toPrecision(2)}); prefer the simpler model.`,
    );
  }
  const failed = ranking.filter((m) => !m.converged);
  if (failed.length) parts.push(`Not converged, not ranked: ${failed.map((m) => m.name).join(', ')}.`);
  return parts.join(' ');
}
