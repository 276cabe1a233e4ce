/** Text of `rateloom fit --cross-check` (src/workflow/cross-check-study.ts). */
import { sharedDigits, type StudyCrossCheck } from '../src/index.js';
import { g, table } from './format.js';

const digitsText = (d: number) => (d >= 16 ? 'identical' : `${d.toFixed(1)} digits`);

/** The agreement of the fit with ml-levenberg-marquardt and odex, and any disagreement. */
export function formatCrossCheck(cc: StudyCrossCheck): string {
  if (!cc.checked) return `Cross-check: not done - ${cc.reason}`;
  const { optimum: o, integration: i, tolerances: t } = cc;
  const L = [`Cross-check (ml-levenberg-marquardt re-solve from the estimates; odex re-integration at rtol ${t.odexRtol}): ${cc.agrees ? 'AGREES' : 'DISAGREES'}`];
  const rows = [['parameter', 'reported', 'ml-levenberg-marquardt', 'shared digits', 'unit']];
  for (const e of o.estimates) rows.push([e.name, g(e.reported, 10), g(e.recheck, 10), digitsText(sharedDigits(e.recheck, e.reported)), e.unit]);
  L.push(table(rows));
  L.push(`  estimates: ${digitsText(o.digits)} in common (asked: ${t.estimateDigits}); package status ${o.solverStatus} after ${o.iterations} iterations`);
  L.push(`  weighted SSR: reported ${g(o.ssrReported, 10)}, re-solved ${g(o.ssrRecheck, 10)} (relative difference ${o.ssrRelativeDifference.toExponential(2)}; asked <= ${t.ssrRelative})`);
  L.push(`  odex: ${i.runsIntegrated} runs re-integrated${i.runsAlgebraic ? `, ${i.runsAlgebraic} algebraic (recomputed, nothing to integrate)` : ''}; predictions differ by at most ${i.maxRelativeDifference.toExponential(2)} relative (asked <= ${t.predictionRelative}); weighted SSR from them ${g(i.ssrOdex, 10)} (relative difference ${i.ssrRelativeDifference.toExponential(2)})`);
  for (const w of cc.warnings) L.push(`  warning [${w.code}] ${w.message}`);
  return L.join('\n');
}
