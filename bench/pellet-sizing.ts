/**
 * Benchmark: plant sizing with a numerically solved pellet against the same sizing without
 * pellets (invented tube bundle of tests/design/fixtures, plus a 3 mm spherical pellet). The pellet
 * is solved by collocation at the ends of the learning pass's error-controlled conversion segments
 * (design/pellet-learn.ts, design/pellet-hook.ts); for scale, one bed integration with the pellet solved at every
 * right-hand-side call (no table) is timed too. The two sizings are timed in interleaved rounds
 * after a warm-up and the ratio is the median of the per-round ratios: timing each side in its own
 * block let the (JIT-cold, load-sensitive) 1-2 ms baseline swing the ratio from 5x to 24x.
 * Run: npx tsx bench/pellet-sizing.ts
 */
import { readFileSync } from 'node:fs';
import { pathToFileURL } from 'node:url';
import { parseHandoff } from '../src/design/handoff-load';
import { kineticsFromHandoff } from '../src/design/kinetics';
import { loadCase } from '../src/design/case';
import { sizeReactor } from '../src/design/size';
import { buildSystem, type RateHook } from '../src/design/system';
import { Sizer } from '../src/design/sizer';
import { bundleAlpha } from '../src/design/tubes';
import { casePelletModel } from '../src/design/pellet-hook';
import { EffectivenessEvaluator } from '../src/pellets/effectiveness';

const root = new URL('../tests/design/fixtures/', import.meta.url);
const h = parseHandoff(JSON.parse(readFileSync(new URL('bed.kinetics.json', root), 'utf8')));
const dk = kineticsFromHandoff(h);
const rawCase = JSON.parse(readFileSync(new URL('bed.case.json', root), 'utf8'));
const pellet = { shape: 'sphere', diameter: '3 mm', porosity: 0.4, effectiveDiffusivity: '1e-6 m2/s', density: '1333 kg/m3', tradeOff: ['3 mm'] };
const load = (raw: unknown) => loadCase(raw, dk.kinetics.speciesNames, dk.kinetics.reactionIds);
const plain = load(rawCase);
const withPellet = load({ ...rawCase, pellet });

const mid = (v: number[]): number => [...v].sort((a, b) => a - b)[Math.floor(v.length / 2)];

/** CPU time (user + system) of the process, ms: less sensitive than wall time to other jobs on a shared machine. */
const cpuMs = (): number => {
  const u = process.cpuUsage();
  return (u.user + u.system) / 1000;
};

/**
 * Interleaved timing: after one warm-up of each, `n` rounds each time a then b back to back, so a
 * load change on the machine hits both alike; the ratio is the median of the per-round ratios.
 * Wall and CPU time are both taken.
 */
function pairedMedian(a: () => void, b: () => void, n: number): { aMs: number; bMs: number; ratio: number; ratioRange: [number, number]; cpuRatio: number; aCpuMs: number; bCpuMs: number } {
  a();
  b();
  const ta: number[] = [];
  const tb: number[] = [];
  const ca: number[] = [];
  const cb: number[] = [];
  const ratios: number[] = [];
  const cpuRatios: number[] = [];
  for (let i = 0; i < n; i++) {
    let t0 = performance.now();
    let c0 = cpuMs();
    a();
    ta.push(performance.now() - t0);
    ca.push(cpuMs() - c0);
    t0 = performance.now();
    c0 = cpuMs();
    b();
    tb.push(performance.now() - t0);
    cb.push(cpuMs() - c0);
    ratios.push(tb[i] / ta[i]);
    cpuRatios.push(cb[i] / Math.max(ca[i], 1e-3));
  }
  return { aMs: mid(ta), bMs: mid(tb), ratio: mid(ratios), ratioRange: [Math.min(...ratios), Math.max(...ratios)], cpuRatio: mid(cb) / mid(ca), aCpuMs: mid(ca), bCpuMs: mid(cb) };
}

export interface PelletBench {
  lines: string[];
  plainMs: number;
  pelletMs: number;
  ratio: number;
  /** Median CPU time with the pellet over the median CPU time without (CPU clock: about 1 ms resolution). */
  cpuRatio: number;
  plainCpuMs: number;
  pelletCpuMs: number;
  /** Smallest and largest per-round ratio. */
  ratioRange: [number, number];
  repeats: number;
  directMs: number;
  pelletSolves: number;
  sizeKg: number;
  intrinsicKg: number;
}

/** Nominal sizing (tube search, no Monte Carlo) with and without the pellet. */
export function runPelletSizing(repeats = 25): PelletBench {
  const size = (kase: typeof plain) => sizeReactor({ handoff: h, kinetics: dk.kinetics, kase, molarMasses: dk.molarMasses!, options: { draws: 0, profileDraws: 0 } });
  let res = size(withPellet);
  const timed = pairedMedian(() => size(plain), () => (res = size(withPellet)), repeats);
  const { aMs: plainMs, bMs: pelletMs, ratio } = timed;
  // one bed integration at the designed tube count with the pellet solved at every call
  const model = casePelletModel(dk.kinetics, withPellet, withPellet.pellet!, h.species);
  const ev = new EffectivenessEvaluator(model, Float64Array.from(h.parameters, (p) => p.value));
  const direct: RateHook = { apply: (_t, _y, C, T, r) => { const e = ev.evaluate(C, T).factor; for (let i = 0; i < r.length; i++) r[i] *= e[i]; } };
  const sys = buildSystem(dk.kinetics, withPellet, Float64Array.from(h.parameters, (p) => p.value), direct);
  sys.alpha = bundleAlpha(sys, dk.molarMasses!, res.tubes!.count).alpha;
  const t0 = performance.now();
  const d = new Sizer(sys).size();
  const directMs = performance.now() - t0;
  const p = res.pellet!;
  return {
    lines: [
      `case: ${withPellet.name} + 3 mm sphere; ${res.tubes?.count} tubes; W ${res.size!.value.toFixed(2)} kg with the pellet, ${p.intrinsicSize!.toFixed(2)} kg intrinsic; eta ${p.profile.eta[dk.kinetics.reactionIds[0]][0].toFixed(3)} at the inlet`,
      `nominal sizing without pellets: ${plainMs.toFixed(1)} ms; with the numerical pellet (table along the bed, eta report, intrinsic size, trade-off row): ${pelletMs.toFixed(1)} ms (median of ${repeats} interleaved rounds: ${ratio.toFixed(1)}x, rounds ${timed.ratioRange[0].toFixed(1)}-${timed.ratioRange[1].toFixed(1)}x; ${p.pelletSolves} pellet solves)`,
      `CPU time (medians): ${timed.aCpuMs.toFixed(1)} ms without pellets, ${timed.bCpuMs.toFixed(1)} ms with: ${timed.cpuRatio.toFixed(1)}x`,
      `one bed integration with the pellet solved at every call (${ev.solves} solves): ${directMs.toFixed(0)} ms; size differs from the tabled one by ${(d.size / res.size!.value - 1).toExponential(2)}`,
    ],
    plainMs, pelletMs, ratio, cpuRatio: timed.cpuRatio, plainCpuMs: timed.aCpuMs, pelletCpuMs: timed.bCpuMs, ratioRange: timed.ratioRange, repeats, directMs, pelletSolves: p.pelletSolves, sizeKg: res.size!.value, intrinsicKg: p.intrinsicSize!,
  };
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
  for (const l of runPelletSizing().lines) console.log(l);
}
