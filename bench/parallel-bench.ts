/**
 * Section (g) of bench/run.ts: the worker-thread pool (src/parallel) on this machine's cores.
 * Profiles of the 4 parameters and 6 multistart starts of the synthetic study, each run serially
 * (workers = 1: same job module in this thread) and on 2 workers; the outcomes must be identical.
 * Times include starting the workers (tsx + module load + model setup in each).
 * Run alone: npx tsx bench/parallel-bench.ts
 */
import { pathToFileURL } from 'node:url';
import { fitStudy } from '../src/workflow/fit-study';
import { multistartDesign, parallelProfiles, parallelStarts } from '../src/parallel/study-adapter';
import { syntheticStudy } from './synthetic-study';

export async function runParallelBench(quick = false): Promise<{ lines: string[]; results: Record<string, unknown> }> {
  const runs = 50;
  const study = syntheticStudy(runs);
  const sf = fitStudy(study, { profile: false });
  const ctx = { study, fit: {} };
  const lines: string[] = [];
  const results: Record<string, unknown> = { runs };

  const time = async <T>(f: () => Promise<T>) => {
    const t0 = performance.now();
    const value = await f();
    return { value, ms: performance.now() - t0 };
  };
  // profiles
  const p1 = await time(() => parallelProfiles(ctx, sf.fit, { workers: 1 }));
  const p2 = await time(() => parallelProfiles(ctx, sf.fit, { workers: 2 }));
  const sameP = JSON.stringify(p1.value) === JSON.stringify(p2.value);
  const okP = p2.value.filter((o) => o.ok).length;
  lines.push(`profiles of ${p1.value.length} parameters (${runs} runs): serial ${(p1.ms / 1000).toFixed(2)} s, 2 workers ${(p2.ms / 1000).toFixed(2)} s -> speed-up ${(p1.ms / p2.ms).toFixed(2)}x; ${okP}/${p2.value.length} ok; identical to serial: ${sameP}`);
  results.profiles = { serialMs: p1.ms, twoWorkersMs: p2.ms, speedup: p1.ms / p2.ms, identical: sameP };

  // multistart
  const free = sf.model.parameters.map((p) => ({
    transform: p.transform,
    start: p.transform === 'log' ? Math.log(p.value) : p.value,
    lower: p.transform === 'log' ? (p.lower > 0 ? Math.log(p.lower) : -Infinity) : p.lower,
    upper: p.transform === 'log' ? Math.log(p.upper) : p.upper,
  }));
  const design = multistartDesign(free, quick ? 3 : 5, 7);
  const s1 = await time(() => parallelStarts(ctx, design, { workers: 1 }));
  const s2 = await time(() => parallelStarts(ctx, design, { workers: 2 }));
  const sameS = JSON.stringify(s1.value) === JSON.stringify(s2.value);
  const conv = s2.value.filter((o) => o.ok && o.value.success).length;
  lines.push(`multistart, ${design.length} starts (${runs} runs): serial ${(s1.ms / 1000).toFixed(2)} s, 2 workers ${(s2.ms / 1000).toFixed(2)} s -> speed-up ${(s1.ms / s2.ms).toFixed(2)}x; ${conv} converged; identical to serial: ${sameS}`);
  results.multistart = { starts: design.length, serialMs: s1.ms, twoWorkersMs: s2.ms, speedup: s1.ms / s2.ms, identical: sameS };
  return { lines, results };
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
  const r = await runParallelBench(process.argv.includes('--quick'));
  for (const l of r.lines) console.log(l);
}
