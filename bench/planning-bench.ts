/**
 * Benchmark: planning 8 runs for the demo packed bed (datasets-demo/pbr, limits
 * datasets-demo/pbr/lab.limits.json: 5 levels of 4 factors, 625 candidates) against one fit of the
 * same study measured in the same run (the baseline: the work the engineer already waits for).
 * Timed: the D-optimal plan at the estimate, the Ds plan averaged over 10 parameter draws, and the
 * Box-Hill discrimination plan of the three rate-law sets (fits given; their fitting is not timed).
 * Run: npx tsx bench/planning-bench.ts
 */
import { median } from 'simple-statistics';
import { readFileSync } from 'node:fs';
import { pathToFileURL } from 'node:url';
import { loadStudy } from '../src/study/load';
import { fitStudy, studyVariants } from '../src/workflow/fit-study';
import { parseLimits } from '../src/planning/limits';
import { planRuns } from '../src/planning/plan';

export interface PlanningBench {
  fitMs: number;
  planMs: number;
  drawsMs: number;
  discriminationMs: number;
  /** planMs / fitMs. */
  ratio: number;
  lines: string[];
}

/** Median wall time (ms) of n calls of f. */
function medianOf(f: () => void, n: number): number {
  const t: number[] = [];
  for (let i = 0; i < n; i++) {
    const t0 = performance.now();
    f();
    t.push(performance.now() - t0);
  }
  return median(t);
}

export function runPlanningBench(repeats: number): PlanningBench {
  const path = new URL('../datasets-demo/pbr/pbr.study.json', import.meta.url);
  const study = loadStudy(readFileSync(path, 'utf8'), path.pathname, (p) => readFileSync(p, 'utf8')).study;
  const limits = parseLimits(JSON.parse(readFileSync(new URL('../datasets-demo/pbr/lab.limits.json', import.meta.url), 'utf8')), study);
  const fits = studyVariants(study).map((v) => fitStudy(study, { variant: v.name, profile: false }));
  const fitMs = medianOf(() => fitStudy(study, { profile: false }), repeats);
  let planned = 0;
  const planMs = medianOf(() => {
    planned = planRuns(study, limits, [fits[0]], { runs: 8 }).runs.length;
  }, repeats);
  const drawsMs = medianOf(() => planRuns(study, limits, [fits[0]], { runs: 8, criterion: 'Ds', subset: ['E1', 'E2'], draws: 10 }), 1);
  const discriminationMs = medianOf(() => planRuns(study, limits, fits, { runs: 8, mode: 'discrimination' }), 1);
  const ratio = planMs / fitMs;
  const s = (ms: number) => `${(ms / 1000).toFixed(2)} s`;
  const lines = [
    `baseline: one fit of the demo packed bed (6 parameters, 54 runs, profiles off): ${s(fitMs)} (median of ${repeats})`,
    `D-optimal plan of ${planned} runs over 625 candidates: ${s(planMs)} = ${ratio.toFixed(2)}x the fit`,
    `Ds plan (E1, E2) averaged over 10 parameter draws: ${s(drawsMs)}; Box-Hill plan of the 3 rate-law sets: ${s(discriminationMs)}`,
  ];
  return { fitMs, planMs, drawsMs, discriminationMs, ratio, lines };
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? '').href) {
  for (const l of runPlanningBench(3).lines) console.log(l);
}
