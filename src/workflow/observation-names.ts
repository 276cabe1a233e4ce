/**
 * Estimation names observations by index; a study knows their runs, responses and CSV lines. These
 * rewrites make the influence warning and the misfit verdict name them: the runs and responses
 * whose weighted residuals are largest (root mean square, in units of sigma).
 */
import type { VerdictReason } from '../core/verdict.js';
import type { FitResult } from '../estimation/fit-types.js';
import type { Study } from '../study/types.js';

const label = (study: Study, i: number): string => {
  const o = study.observations[i];
  return `run ${o.runId} ${o.species ?? ''} ${o.response}${o.position !== undefined ? ` at ${o.position}` : ''} (${o.location.file}:${o.location.line})`.replace(/\s+/g, ' ');
};

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
      message: `${fit.influential.length} influential observation(s) (Cook's distance above the median of F(p, n-p), or a studentized residual beyond the Bonferroni bound): ${fit.influential.map((o) => label(study, o.index)).join('; ')}`,
      path: [...new Set(fit.influential.map((o) => study.observations[o.index].runId))],
    };
  });
  const reasons = fit.verdict.reasons.map((r) => (r.code === 'misfit' ? renameMisfit(r, worst) : r));
  const first = fit.verdict.reasons[0];
  const message = first?.code === 'misfit' ? fit.message.replace(first.message, reasons[0].message) : fit.message;
  const verdictMessage = first?.code === 'misfit' ? fit.verdict.message.replace(first.message, reasons[0].message) : fit.verdict.message;
  return { ...fit, warnings, message, verdict: { ...fit.verdict, reasons, message: verdictMessage } };
}
