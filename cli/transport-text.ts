/**
 * Plain-text table of the transport diagnostics of the lab runs (check and fit commands).
 */
import { type LabTransport } from '../src/index.js';
import { g } from './format.js';

const cell = (x: number | null, digits = 3): string => (x === null ? 'n/a' : g(x, digits));

export function formatTransport(t: LabTransport): string {
  const L: string[] = [];
  const bad = t.rows.filter((r) => !r.intrinsic);
  L.push(`Transport checks of the lab runs (${t.rateSource} of ${t.keyReactant}, reaction ${t.reaction}; limits Weisz-Prater ${t.limits.weiszPrater}, Mears ${t.limits.mears}):`);
  L.push('  run                rate mol/(kg s)  Weisz-Prater  Mears mass  Mears heat  rise K  intrinsic');
  for (const r of t.rows) {
    L.push(`  ${r.runId.padEnd(18)} ${g(r.observedRate, 3).padStart(15)}  ${cell(r.weiszPrater).padStart(12)}  ${cell(r.mearsMass).padStart(10)}  ${cell(r.mearsHeat).padStart(10)}  ${cell(r.praterRise).padStart(6)}  ${r.intrinsic ? 'yes' : `no (${r.failed.join(', ')})`}`);
  }
  if (t.skipped.length) L.push(`  not checked: ${t.skipped.map((s) => `${s.runId} (${s.reason})`).join('; ')}`);
  if (bad.length) L.push(`  ${bad.length} of ${t.rows.length} runs may not be intrinsic. ${t.note}`);
  for (const w of t.warnings) if (w.code === 'correlation-range') L.push(`  [${w.code}] ${w.message}`);
  return L.join('\n');
}
