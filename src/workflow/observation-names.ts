/**
 * Estimation names observations by index; a study knows their runs, responses and CSV lines. These
 * rewrites make the influence warning and the misfit verdict name them: the runs and responses
 * whose weighted residuals are largest (root mean square, in units of sigma).
 */
import type { VerdictReason } from '../core/verdict.js';
import type { FitResult } from '../estimation/fit-types.js';
import type { Study } from '../study/types.js';
import type { InfluentialTableData } from '../report/types.js';

/** How many influential observations are shown by name (the rest are counted). */
export const INFLUENTIAL_SHOWN = 5;

/** The influential observations: how many, and the `shown` most extreme by |studentized residual| (the outlier test's statistic). */
export function influentialTable(fit: Pick<FitResult, 'influential'>, study: Study, shown = INFLUENTIAL_SHOWN): InfluentialTableData {
  const sorted = [...fit.influential].sort((a, b) => Math.abs(b.studentizedResidual ?? 0) - Math.abs(a.studentizedResidual ?? 0));
  return {
    count: fit.influential.length,
    rows: sorted.slice(0, shown).map((o) => {
      const ob = study.observations[o.index];
      return {
        runId: ob.runId,
        response: `${ob.response}${ob.species ? ` ${ob.species}` : ''}${ob.position !== undefined ? ` at ${ob.position}` : ''}`,
        line: `${ob.location.file}:${ob.location.line}`,
        studentizedResidual: o.studentizedResidual,
        cooksDistance: o.cooksDistance,
        movesEstimates: o.movesEstimates,
      };
    }),
  };
}

/** The influence warning: the count, and the most extreme few by name. */
function influenceMessage(fit: FitResult, study: Study): string {
  const t = influentialTable(fit, study);
  const named = t.rows.map((r) => `run ${r.runId} ${r.response} (${r.line})`).join('; ');
  const which = t.count > t.rows.length ? `the ${t.rows.length} most extreme of them (largest |studentized residual|)` : t.count > 1 ? 'they are' : 'it is';
  return `${t.count} influential observation(s) (a studentized residual beyond the Bonferroni bound); ${which}: ${named}. The fit's table of influential observations gives their residuals and Cook's distances.`;
}

/** Root-mean-square weighted residual per key, largest first. */
function rmsBy(fit: FitResult, key: (i: number) => string): { key: string; rms: number }[] {
  const acc = new Map<string, { ss: number; n: number }>();
  for (const o of fit.observations) {
    const k = key(o.index);
    const a = acc.get(k) ?? { ss: 0, n: 0 };
    a.ss += o.weightedResidual ** 2;
    a.n++;
    acc.set(k, a);
  }
  return [...acc.entries()].map(([k, a]) => ({ key: k, rms: Math.sqrt(a.ss / a.n) })).sort((a, b) => b.rms - a.rms);
}

/** The responses and runs that misfit most, in words, and the worst run ids. */
export function worstMisfit(fit: FitResult, study: Study, count = 3): { text: string; runs: string[] } {
  const responses = rmsBy(fit, (i) => `${study.observations[i].species ? `${study.observations[i].species} ` : ''}${study.observations[i].response}`).slice(0, count);
  const runs = rmsBy(fit, (i) => study.observations[i].runId).slice(0, count);
  const f = (v: number) => v.toPrecision(3);
  return {
    text: `worst responses ${responses.map((r) => `${r.key} (rms ${f(r.rms)} sigma)`).join(', ')}; worst runs ${runs.map((r) => `${r.key} (rms ${f(r.rms)} sigma)`).join(', ')}`,
    runs: runs.map((r) => r.key),
  };
}

function renameMisfit(r: VerdictReason, worst: { text: string; runs: string[] }): VerdictReason {
  const cut = r.message.indexOf('; worst observations');
  return { ...r, message: `${cut >= 0 ? r.message.slice(0, cut) : r.message}; ${worst.text}`, path: worst.runs };
}

/** Name runs, responses and CSV lines in the influence warning and the misfit reasons of a study fit. */
export function nameObservations(fit: FitResult, study: Study): FitResult {
  const hasMisfit = fit.verdict.reasons.some((r) => r.code === 'misfit');
  if (!fit.influential.length && !hasMisfit) return fit;
  const worst = hasMisfit ? worstMisfit(fit, study) : { text: '', runs: [] };
  const warnings = fit.warnings.map((w) => {
    if (w.code === 'misfit') return renameMisfit(w, worst);
    if (w.code !== 'influential-observations') return w;
    return {
      ...w,
      message: influenceMessage(fit, study),
      path: [...new Set(fit.influential.map((o) => study.observations[o.index].runId))],
    };
  });
  const reasons = fit.verdict.reasons.map((r) => (r.code === 'misfit' ? renameMisfit(r, worst) : r));
  const first = fit.verdict.reasons[0];
  const message = first?.code === 'misfit' ? fit.message.replace(first.message, reasons[0].message) : fit.message;
  const verdictMessage = first?.code === 'misfit' ? fit.verdict.message.replace(first.message, reasons[0].message) : fit.verdict.message;
  return { ...fit, warnings, message, verdict: { ...fit.verdict, reasons, message: verdictMessage } };
}
