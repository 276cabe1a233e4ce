/**
 * Benchmark (not a test): generate a 10,000-row per-run CSV in memory (invented data, with a few
 * replicate runs and a few bad rows) and time loadStudy = CSV parse + mapping + validation +
 * replicate search. Run: npx tsx bench/csv-load.ts
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { loadStudy } from '../src/study/load';

const fixtures = join(import.meta.dirname, '../tests/data/fixtures');
const study = JSON.parse(readFileSync(join(fixtures, 'study.json'), 'utf8'));
study.data = [study.data[0]];

/** An N-row per-run CSV of invented data (replicates every 50th run, a bad cell every 997th row). */
export function makeCsv(n: number): string {
  const lines = ['# generated benchmark data', 'run,charge,T_C,P_barg,W_g,FA0,FH2_0,FN2_0,FA,FH2,FB'];
  let seed = 12345;
  const rnd = () => ((seed = (seed * 1103515245 + 12345) % 2147483648) / 2147483648);
  for (let i = 0; i < n; i++) {
    const T = 180 + 10 * (i % 9);
    const W = 0.2 + 0.1 * ((i * 7) % 13) + (i % 50 === 1 ? 0 : 1e-4 * rnd());
    const X = Math.min(0.9, 0.05 + 0.8 * rnd());
    const FA0 = 2;
    const bad = i % 997 === 0 ? 'x' : '';
    lines.push(`R${i},c${1 + (i % 3)},${T},1.0,${W.toFixed(6)},${FA0}${bad},4,1,${(FA0 * (1 - X)).toFixed(5)},${(4 - FA0 * X).toFixed(5)},${(FA0 * X).toFixed(5)}`);
  }
  return lines.join('\n') + '\n';
}

/**
 * Time loading an N-row CSV study; returns the report lines, the median wall time (ms) and the
 * median CPU time of this process (user + system, ms; less sensitive to a loaded machine).
 */
export function runCsvLoad(N = 10_000, repeats = 7): { lines: string[]; rows: number; medianMs: number; cpuMedianMs: number } {
  const csv = makeCsv(N);
  const studyText = JSON.stringify(study);
  const studyPath = join(fixtures, 'bench.study.json');
  const read = () => csv;
  loadStudy(studyText, studyPath, read); // warm-up
  const times: number[] = [];
  const cpu: number[] = [];
  let last;
  for (let k = 0; k < repeats; k++) {
    const c0 = process.cpuUsage();
    const t0 = performance.now();
    last = loadStudy(studyText, studyPath, read);
    times.push(performance.now() - t0);
    const c = process.cpuUsage(c0);
    cpu.push((c.user + c.system) / 1000);
  }
  times.sort((a, b) => a - b);
  cpu.sort((a, b) => a - b);
  const mid = Math.floor(repeats / 2);
  const r = last!.report;
  const lines = [
    `csv-load: ${N} rows (${(csv.length / 1024).toFixed(0)} KiB), load+validate median ${times[mid].toFixed(1)} ms wall (min ${times[0].toFixed(1)}, max ${times[repeats - 1].toFixed(1)}), median ${cpu[mid].toFixed(1)} ms cpu (min ${cpu[0].toFixed(1)}; ${repeats} runs after 1 warm-up)`,
    `  rows in ${r.rowsIn} = used ${r.rowsUsed} + rejected ${r.rowsRejected}; runs ${last!.study.runs.length}; observations ${last!.study.observations.length}; replicate groups ${r.replicateGroups.length}`,
  ];
  return { lines, rows: N, medianMs: times[mid], cpuMedianMs: cpu[mid] };
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
  for (const l of runCsvLoad(Number(process.argv[2] ?? 10_000)).lines) console.log(l);
}
