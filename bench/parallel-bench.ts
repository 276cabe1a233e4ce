/**
 * Section (g) of bench/run.ts: the worker-thread pool (src/parallel) on this machine's cores.
 * Profiles of the 4 parameters and 6 multistart starts of the synthetic study, each run serially
 * (workers = 1: same job module in this thread) and on 2 workers; the outcomes must be identical.
 * Pool start (tsx + module load + model setup in each worker) is timed apart for profiles and
 * multistart and included for Monte Carlo. CPU time covers all threads: "cores busy" = cpu / wall
 * shows how much of the 2 cores the workers actually got on a shared machine.
 * Run alone: npx tsx bench/parallel-bench.ts
 */
import { readFileSync } from 'node:fs';
import { pathToFileURL } from 'node:url';
import { quantileSorted } from '../src/design/uncertainty';
import { parallelDraws } from '../src/parallel/mc-adapter';
import { fitStudy } from '../src/workflow/fit-study';
import { multistartDesign, profileJobs, startJobs, startStudyPool } from '../src/parallel/study-adapter';
import { syntheticStudy } from './synthetic-study';

export async function runParallelBench(quick = false, serialMc?: { drawsMs: number; medianKg: number; p90Kg: number; p95Kg: number; draws: number; tubeCount?: number }): Promise<{ lines: string[]; results: Record<string, unknown> }> {
  const runs = 50;
  const study = syntheticStudy(runs);
  const sf = fitStudy(study, { profile: false });
  const ctx = { study, fit: {} };
  const lines: string[] = [];
  const results: Record<string, unknown> = { runs };

  /** Wall time and CPU time of the whole process (all threads, so the workers' too). */
  const time = async <T>(f: () => Promise<T>) => {
    const c0 = process.cpuUsage();
    const t0 = performance.now();
    const value = await f();
    const c = process.cpuUsage(c0);
    return { value, ms: performance.now() - t0, cpuMs: (c.user + c.system) / 1000 };
  };
  const free = sf.model.parameters.map((p) => ({
    transform: p.transform,
    start: p.transform === 'log' ? Math.log(p.value) : p.value,
    lower: p.transform === 'log' ? (p.lower > 0 ? Math.log(p.lower) : -Infinity) : p.lower,
    upper: p.transform === 'log' ? Math.log(p.upper) : p.upper,
  }));
  const design = multistartDesign(free, quick ? 3 : 5, 7);
  const batches = { profiles: profileJobs(sf.fit), multistart: startJobs(design) };
  const out: Record<string, Record<string, unknown>> = {};
  const runAll = async (workers: number) => {
    const st = await time(() => startStudyPool(ctx, { workers }));
    const pool = st.value;
    const res: Record<string, { ms: number; cpuMs: number; outcomes: unknown[] }> = {};
    for (const [name, jobs] of Object.entries(batches)) {
      const r = await time(() => pool.run(jobs));
      res[name] = { ms: r.ms, cpuMs: r.cpuMs, outcomes: r.value };
    }
    await pool.close();
    return { startMs: st.ms, workers: pool.workers, res };
  };
  const serial = await runAll(1);
  const two = await runAll(2);
  lines.push(`pool start: ${two.workers} workers ready in ${(two.startMs / 1000).toFixed(2)} s (tsx + modules + study model in each); serial setup ${(serial.startMs / 1000).toFixed(2)} s`);
  for (const name of Object.keys(batches)) {
    const s1 = serial.res[name];
    const s2 = two.res[name];
    const same = JSON.stringify(s1.outcomes) === JSON.stringify(s2.outcomes);
    const ok = (s2.outcomes as { ok: boolean }[]).filter((o) => o.ok).length;
    const withStart = (s1.ms + serial.startMs) / (s2.ms + two.startMs);
    lines.push(
      `${name} (${s1.outcomes.length} jobs, ${runs} runs): serial ${(s1.ms / 1000).toFixed(2)} s, 2 workers ${(s2.ms / 1000).toFixed(2)} s -> speed-up ${(s1.ms / s2.ms).toFixed(2)}x (${withStart.toFixed(2)}x counting pool start); ` +
        `cpu ${(s1.cpuMs / 1000).toFixed(2)} s vs ${(s2.cpuMs / 1000).toFixed(2)} s, cores busy ${(s2.cpuMs / s2.ms).toFixed(2)} of 2; ${ok}/${s2.outcomes.length} ok; identical to serial: ${same}`,
    );
    out[name] = { jobs: s1.outcomes.length, serialMs: s1.ms, twoWorkersMs: s2.ms, serialCpuMs: s1.cpuMs, twoWorkersCpuMs: s2.cpuMs, coresBusy: s2.cpuMs / s2.ms, speedup: s1.ms / s2.ms, speedupWithStart: withStart, identical: same };
  }
  results.poolStartMs = two.startMs;

  // Monte Carlo draws of the sizing case (bench/mc-sizing.ts), in chunks
  const root = new URL('../tests/design/fixtures/', import.meta.url);
  const mcCtx = {
    handoff: JSON.parse(readFileSync(new URL('bed.kinetics.json', root), 'utf8')),
    case: JSON.parse(readFileSync(new URL('bed.case.json', root), 'utf8')),
    // the tube bundle the serial sizing settled on (raised for its design percentile)
    ...(serialMc?.tubeCount !== undefined ? { tubeCount: serialMc.tubeCount } : {}),
  };
  const draws = serialMc?.draws ?? (quick ? 1000 : 10000);
  const stats = (v: Float64Array) => {
    const ok = Float64Array.from(v.filter((x) => Number.isFinite(x))).sort();
    return { median: quantileSorted(ok, 0.5), p90: quantileSorted(ok, 0.9), p95: quantileSorted(ok, 0.95), failed: v.length - ok.length };
  };
  const m1 = await time(() => parallelDraws(mcCtx, { draws, workers: 1, chunks: 8 }));
  const m2 = await time(() => parallelDraws(mcCtx, { draws, workers: 2, chunks: 8 }));
  const st1 = stats(m1.value.values);
  const st2 = stats(m2.value.values);
  const sameMc = m1.value.values.every((x, i) => Object.is(x, m2.value.values[i]));
  const matchesSize = serialMc ? st2.median === serialMc.medianKg && st2.p90 === serialMc.p90Kg && st2.p95 === serialMc.p95Kg : undefined;
  lines.push(
    `Monte Carlo, ${draws} draws in 8 chunks: serial ${(m1.ms / 1000).toFixed(2)} s, 2 workers ${(m2.ms / 1000).toFixed(2)} s (pool start included) -> speed-up ${(m1.ms / m2.ms).toFixed(2)}x, cores busy ${(m2.cpuMs / m2.ms).toFixed(2)}; ` +
      `identical draws: ${sameMc}; median ${st2.median.toFixed(3)} kg, P90 ${st2.p90.toFixed(3)}, P95 ${st2.p95.toFixed(3)}, failed ${st2.failed}` +
      (matchesSize !== undefined ? `; equal to sizeReactor's serial percentiles: ${matchesSize}` : ''),
  );
  results.monteCarlo = { draws, serialMs: m1.ms, twoWorkersMs: m2.ms, speedup: m1.ms / m2.ms, identical: sameMc, matchesSizeReactor: matchesSize, median: st2.median, p90: st2.p90, p95: st2.p95, status: m2.value.status, serialStats: st1 };
  results.batches = out;
  return { lines, results };
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
  const r = await runParallelBench(process.argv.includes('--quick'));
  for (const l of r.lines) console.log(l);
}
