/**
 * The lab-data part of `rateloom check`: basis and standard, per run the outlet flows derived from
 * the internal standard (mol/s), conversion, selectivity, yield (%), element balance closure (%)
 * against its stated tolerance, and the warnings (runs outside are kept).
 */
import { type LabData } from '../src/index.js';
import { g, table } from './format.js';

const pct = (x: number | undefined) => (x === undefined ? 'n/a' : `${g(100 * x, 4)} %`);

function header(lab: LabData): string[] {
  const L: string[] = [];
  L.push(`Lab data (${lab.file}): ${lab.basis} basis${lab.removed.length ? ` (removed before the analyser: ${lab.removed.join(', ')})` : ''}; fractions of ${lab.species.join(', ')}`);
  L.push(`  internal standard: ${lab.standard ?? 'none (flows, conversion, selectivity and balances need one)'}`);
  L.push(`  fitted: ${lab.fit.join(', ')}; fractions may sum to at most 1 + ${lab.sumTolerance}`);
  if (lab.timeUnit) L.push(`  runs carry ${lab.timeUnit === 's' ? 'a time on stream' : 'a sequence number'}`);
  return L;
}

/** Text lines of the lab-data section of `check`. */
export function formatLabCheck(lab: LabData): string {
  const L = header(lab);
  const withFlows = lab.derived.filter((d) => d.flows);
  if (withFlows.length) {
    const species = Object.keys(withFlows[0].flows ?? {});
    const sel = Object.keys(withFlows[0].selectivity ?? {});
    const conv = Object.keys(withFlows[0].conversion ?? {});
    const elems = [...new Set(withFlows.flatMap((d) => Object.keys(d.closure ?? {})))];
    const rows: string[][] = [['run', ...(lab.timeUnit ? [lab.timeUnit === 's' ? 'TOS h' : 'seq'] : []), ...species.map((s) => `F_${s} mol/s`), ...conv.map((s) => `X_${s}`), ...sel.flatMap((p) => [`S_${p}`, `Y_${p}`]), ...elems.map((e) => `${e} closure`)]];
    for (const d of withFlows) {
      rows.push([
        d.runId,
        ...(lab.timeUnit ? [d.time === undefined ? 'n/a' : g(lab.timeUnit === 's' ? d.time / 3600 : d.time)] : []),
        ...species.map((s) => g(d.flows?.[s])),
        ...conv.map((s) => pct(d.conversion?.[s])),
        ...sel.flatMap((p) => [pct(d.selectivity?.[p]), pct(d.yield?.[p])]),
        ...elems.map((e) => `${pct(d.closure?.[e])}${d.outside?.includes(e) ? ' !' : ''}`),
      ]);
    }
    L.push('  derived from the internal standard (flows in mol/s; X, S, Y and closures in %):');
    L.push(...table(rows).split('\n').map((l) => `    ${l}`));
    L.push(`  element balance closure tolerance: 100 +/- ${g(100 * lab.balanceTolerance)} %${elems.length ? '' : ' (no element has all its carriers measured)'}`);
  }
  if (lab.skipped.length) {
    L.push(`  skipped (${lab.skipped.length} lab row(s) of runs rejected by the per-run sources, not fitted): ${lab.skipped.map((k) => `${k.runId} (${lab.file}:${k.line})`).join(', ')}`);
  }
  if (lab.warnings.length) {
    L.push(`  warnings (${lab.warnings.length}; the runs are kept):`);
    for (const w of lab.warnings) L.push(`    ${w}`);
  } else L.push('  balance warnings: none');
  return L.join('\n');
}
