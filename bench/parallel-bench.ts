/**
 * Section (g) of bench/run.ts: the worker-thread pool (src/parallel) on this machine's cores,
 * measured through the entry points the commands use:
 *   profiles     fitStudy vs fitStudyParallel, single fit + profiles of the 4 parameters (50 runs)
 *   multistart   fitStudy vs fitStudyParallel, --starts 7 (quick 3), no profiles
 *   Monte Carlo  sizeReactor vs sizeReactorParallel on the sizing case of bench/mc-sizing.ts
 *                (every pass of the percentile tube design)
 * Serial = the library function; 2 workers = the parallel entry point with workers: 2, pool start
 * included (it overlaps the first fit). The results must be identical (JSON text compared). CPU
 * time covers all threads: "cores busy" = cpu / wall shows how much of the 2 cores the work got on
 * a shared machine.
 * The library is the compiled one (dist/, built by `npm run build`, which `npm run bench` runs first),
 * so the workers load the bundled job modules of dist/bundle/parallel/ as the installed package does.
 * Run alone: npm run build && npx tsx bench/parallel-bench.ts [--quick]
 */
import { readFileSync } from 'node:fs';
import { pathToFileURL } from 'node:url';
import { loadCase } from '../dist/src/design/case.js';
import { parseHandoff } from '../dist/src/design/handoff-load.js';
import { kineticsFromHandoff } from '../dist/src/design/kinetics.js';
import { sizeReactor } from '../dist/src/design/size.js';
import { fitStudyParallel } from '../dist/src/parallel/fit-parallel.js';
import { sizeReactorParallel } from '../dist/src/parallel/size-parallel.js';
import { fitStudy, type StudyFit } from '../dist/src/workflow/fit-study.js';
import { toJson } from '../cli/run';
import { syntheticStudy } from './synthetic-study';

export async function runParallelBench(quick = false, serialMc?: { drawsMs: number; medianKg: number; p90Kg: number; p95Kg: number; draws: number; tubeCount?: number }): Promise<{ lines: string[]; results: Record<string, unknown> }> {
  const runs = 50;
  const study = syntheticStudy(runs);
  const lines: string[] = [];
  const results: Record<string, unknown> = { runs };

  /** Wall time and CPU time of the whole process (all threads, so the workers' too). */
  const time = async <T>(f: () => T | Promise<T>) => {
    const c0 = process.cpuUsage();
    const t0 = performance.now();
    const value = await f();
    const c = process.cpuUsage(c0);
    return { value, ms: performance.now() - t0, cpuMs: (c.user + c.system) / 1000 };
  };
  const fitText = (sf: StudyFit) => toJson({ ...sf, model: undefined });
  const out: Record<string, Record<string, unknown>> = {};
  const report = (name: string, what: string, s1: { ms: number; cpuMs: number }, s2: { ms: number; cpuMs: number }, same: boolean, extra = '') => {
    lines.push(
      `${name} (${what}): serial ${(s1.ms / 1000).toFixed(2)} s, 2 workers ${(s2.ms / 1000).toFixed(2)} s (pool start included) -> speed-up ${(s1.ms / s2.ms).toFixed(2)}x; ` +
        `cpu ${(s1.cpuMs / 1000).toFixed(2)} s vs ${(s2.cpuMs / 1000).toFixed(2)} s, cores busy ${(s1.cpuMs / s1.ms).toFixed(2)} vs ${(s2.cpuMs / s2.ms).toFixed(2)} of 2; identical to serial: ${same}${extra}`,
    );
    out[name] = { what, serialMs: s1.ms, twoWorkersMs: s2.ms, serialCpuMs: s1.cpuMs, twoWorkersCpuMs: s2.cpuMs, speedup: s1.ms / s2.ms, identical: same };
  };

  // profiles: one fit, then the profile of every free parameter
  const pOpts = { profile: true };
  const p1 = await time(() => fitStudy(study, pOpts));
  const p2 = await time(() => fitStudyParallel(study, { ...pOpts, workers: 2 }));
  report('profiles', `${p1.value.fit.profiles.length} parameters, ${runs} runs`, p1, p2, fitText(p1.value) === fitText(p2.value));

  // multistart: the given start and the Latin-hypercube starts
  const starts = quick ? 3 : 7;
  const mOpts = { profile: false, starts, seed: 7 };
  const m1 = await time(() => fitStudy(study, mOpts));
  const m2 = await time(() => fitStudyParallel(study, { ...mOpts, workers: 2 }));
  report('multistart', `${starts + 1} starts, ${runs} runs`, m1, m2, fitText(m1.value) === fitText(m2.value), `; ${m1.value.minima?.length ?? 0} minima`);

  // Monte Carlo sizing of the case of bench/mc-sizing.ts, every pass of the tube design
  const root = new URL('../tests/design/fixtures/', import.meta.url);
  const handoffRaw = JSON.parse(readFileSync(new URL('bed.kinetics.json', root), 'utf8'));
  const caseRaw = JSON.parse(readFileSync(new URL('bed.case.json', root), 'utf8'));
  const h = parseHandoff(handoffRaw);
  const dk = kineticsFromHandoff(h);
  const kase = loadCase(caseRaw, dk.kinetics.speciesNames, dk.kinetics.reactionIds);
  const draws = serialMc?.draws ?? (quick ? 1000 : 10000);
  const input = { handoff: h, kinetics: dk.kinetics, kase, molarMasses: dk.molarMasses!, options: { draws } };
  const s1 = await time(() => sizeReactor(input));
  const s2 = await time(() => sizeReactorParallel(input, { handoff: handoffRaw, case: caseRaw }, { workers: 2 }));
  const u = s2.value.uncertainty!;
  const p = (l: number) => u.percentiles.find((x) => Math.abs(x.level - l) < 1e-9)?.value ?? NaN;
  const matchesSize = serialMc ? u.median === serialMc.medianKg && p(0.9) === serialMc.p90Kg && p(0.95) === serialMc.p95Kg : undefined;
  report(
    'monteCarlo',
    `${draws} draws, ${s2.value.tubes?.count ?? '-'} tubes`,
    s1,
    s2,
    toJson(s1.value) === toJson(s2.value),
    `; median ${u.median.toFixed(3)} kg, P90 ${p(0.9).toFixed(3)}, P95 ${p(0.95).toFixed(3)}, failed ${u.failed.count}` +
      (matchesSize !== undefined ? `; equal to section (f)'s serial percentiles: ${matchesSize}` : ''),
  );
  results.monteCarlo = { ...out.monteCarlo, draws, matchesSizeReactor: matchesSize, median: u.median, p90: p(0.9), p95: p(0.95) };
  results.batches = out;
  return { lines, results };
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
  const r = await runParallelBench(process.argv.includes('--quick'));
  for (const l of r.lines) console.log(l);
}
