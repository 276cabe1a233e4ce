/**
 * Benchmark (not a test): a 1,000,000-row per-run CSV (invented data, bench/csv-load.ts) loaded,
 * checked and grouped into replicates by loadStudy, in a child process of its own so that its peak
 * memory (max resident set size) is measured alone and a runaway cannot take the bench down (heap
 * capped at 8 GiB). Baseline in the same child: the least any reader must do with the same text
 * (split into lines and cells, Number() of every cell). Target from the robustness issue: the load
 * in under 30 s; memory bounded: at most 2 KiB per row at peak. Run: npx tsx bench/csv-million.ts
 */
import { spawnSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { loadStudy } from '../src/study/load';
import { makeCsv } from './csv-load';

/** What the child measures. */
export interface CsvMillionResult {
  rows: number;
  megabytes: number;
  /** Split into lines and cells and Number() of every cell, ms. */
  baselineMs: number;
  /** loadStudy (decode-free text -> checked, grouped Study), wall ms and CPU ms of the process. */
  loadMs: number;
  loadCpuMs: number;
  /** Peak resident set size of the child process, MiB. */
  maxRssMiB: number;
  rowsUsed: number;
  rowsRejected: number;
  replicateGroups: number;
}

/** The least work of reading the numbers of a CSV text: lines, cells, Number(). */
function baseline(csv: string): number {
  let sum = 0;
  for (const line of csv.split('\n')) {
    if (!line || line.startsWith('#')) continue;
    for (const cell of line.split(',')) {
      const v = Number(cell);
      if (v === v) sum += v;
    }
  }
  return sum;
}

function child(rows: number): CsvMillionResult {
  const fixtures = join(import.meta.dirname, '../tests/data/fixtures');
  const study = JSON.parse(readFileSync(join(fixtures, 'study.json'), 'utf8'));
  study.data = [study.data[0]];
  const csv = makeCsv(rows);
  const t0 = performance.now();
  baseline(csv);
  const baselineMs = performance.now() - t0;
  const c0 = process.cpuUsage();
  const t1 = performance.now();
  const { report } = loadStudy(JSON.stringify(study), join(fixtures, 'bench.study.json'), () => csv);
  const loadMs = performance.now() - t1;
  const c = process.cpuUsage(c0);
  return {
    rows,
    megabytes: csv.length / 1e6,
    baselineMs,
    loadMs,
    loadCpuMs: (c.user + c.system) / 1000,
    maxRssMiB: process.resourceUsage().maxRSS / 1024,
    rowsUsed: report.rowsUsed,
    rowsRejected: report.rowsRejected,
    replicateGroups: report.replicateGroups.length,
  };
}

/** Run the measurement in a child process (tsx, heap capped); undefined when the child failed. */
export function runCsvMillion(rows = 1_000_000): { result?: CsvMillionResult; error?: string } {
  const self = fileURLToPath(import.meta.url);
  const tsx = join(import.meta.dirname, '../node_modules/tsx/dist/loader.mjs');
  const r = spawnSync(process.execPath, ['--max-old-space-size=8192', '--import', tsx, self, '--child', String(rows)], { encoding: 'utf8', timeout: 600_000 });
  const last = r.stdout.trim().split('\n').pop() ?? '';
  if (r.status !== 0 || !last.startsWith('{')) return { error: `child exited ${r.status ?? r.signal}: ${r.stderr.trim().split('\n').slice(-2).join(' ')}` };
  return { result: JSON.parse(last) as CsvMillionResult };
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
  const i = process.argv.indexOf('--child');
  if (i >= 0) console.log(JSON.stringify(child(Number(process.argv[i + 1]))));
  else console.log(runCsvMillion(Number(process.argv[2] ?? 1_000_000)));
}
