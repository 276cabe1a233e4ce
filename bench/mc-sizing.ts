/**
 * Benchmark: 10,000 Monte Carlo sizing draws of an invented gas packed bed with pressure drop
 * (tube bundle, Ergun alpha, second-order kinetics with Arrhenius). Prints the wall time of the
 * nominal sizing with tube search and of the Monte Carlo draws.
 * Run: npx tsx bench/mc-sizing.ts [draws]
 */
import { readFileSync } from 'node:fs';
import { pathToFileURL } from 'node:url';
import { parseHandoff } from '../src/design/handoff-load';
import { kineticsFromHandoff } from '../src/design/kinetics';
import { loadCase } from '../src/design/case';
import { sizeReactor } from '../src/design/size';

const root = new URL('../tests/design/fixtures/', import.meta.url);
const h = parseHandoff(JSON.parse(readFileSync(new URL('bed.kinetics.json', root), 'utf8')));
const dk = kineticsFromHandoff(h);
const kase = loadCase(JSON.parse(readFileSync(new URL('bed.case.json', root), 'utf8')), dk.kinetics.speciesNames, dk.kinetics.reactionIds);

/** Run the sizing benchmark; returns the timings (ms) and prints nothing. */
export function runMcSizing(draws = 10000): { lines: string[]; nominalMs: number; drawsMs: number; draws: number; failed: number; medianKg: number; p90Kg: number; p95Kg: number; tubeCount?: number } {
  const t0 = performance.now();
  const nominal = sizeReactor({ handoff: h, kinetics: dk.kinetics, kase, molarMasses: dk.molarMasses!, options: { draws: 0, profileDraws: 0 } });
  const t1 = performance.now();
  const r = sizeReactor({ handoff: h, kinetics: dk.kinetics, kase, molarMasses: dk.molarMasses!, options: { draws, profileDraws: 200 } });
  const t2 = performance.now();
  const u = r.uncertainty!;
  const lines = [
    `case: ${kase.name}; status ${r.status}; ${r.tubes?.count} tubes; nominal W ${nominal.size?.value.toFixed(3)} kg`,
  `nominal sizing with tube search: ${(t1 - t0).toFixed(0)} ms`,
  `${draws} Monte Carlo draws (+200-draw band, delta method): ${((t2 - t1) / 1000).toFixed(2)} s (${(((t2 - t1) * 1000) / draws).toFixed(0)} us per draw)`,
  `median ${u.median.toFixed(3)} kg, P90 ${u.percentiles[0].value.toFixed(3)} kg, P95 ${u.percentiles[1].value.toFixed(3)} kg, failed ${u.failed.count}`];
  return { lines, nominalMs: t1 - t0, drawsMs: t2 - t1, draws, failed: u.failed.count, medianKg: u.median, p90Kg: u.percentiles[0].value, p95Kg: u.percentiles[1].value, ...(r.tubes ? { tubeCount: r.tubes.count } : {}) };
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
  for (const l of runMcSizing(Number(process.argv[2] ?? 10000)).lines) console.log(l);
}
