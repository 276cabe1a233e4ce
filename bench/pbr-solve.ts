/**
 * Benchmark: one packed-bed solve of the two-reaction gas-phase case with pressure drop
 * (A + B <=> C, C -> D, inert I; the SciPy reference case of tests/reference/scipy/reactors_multi.py),
 * and the stiff case (fast A <=> B beside slow B -> C). Prints the median wall time of many
 * repeats and the right-hand-side evaluations per solve. Run: npx tsx bench/pbr-solve.ts
 */
import { performance } from 'node:perf_hooks';
import { pathToFileURL } from 'node:url';
import { buildChemistry } from '../src/chemistry/mechanism';
import { compileKinetics } from '../src/kinetics/compile';
import type { RateLawSpec } from '../src/kinetics/spec';
import { solveReactor } from '../src/reactors';
import type { ReactorOptions, ReactorSolution } from '../src/reactors/types';

function kinetics(species: string[], eqs: [string, RateLawSpec][]) {
  const chemistry = buildChemistry(species.map((name) => ({ name, inert: name === 'I' })), eqs.map(([equation], i) => ({ id: `r${i + 1}`, equation })));
  return compileKinetics({ chemistry, rates: eqs.map(([, r]) => r), parameterNames: ['k1', 'K1', 'k2'], referenceTemperature: 500 });
}
const rev: RateLawSpec = { form: 'reversible-power-law', basis: 'mass', rateConstant: { k: 'k1' }, equilibriumConstant: { K: 'K1' } };
const fwd: RateLawSpec = { form: 'power-law', basis: 'mass', rateConstant: { k: 'k2' } };

export const cases = [
  {
    name: 'multi (2 reactions, pressure drop)',
    kin: kinetics(['A', 'B', 'C', 'D', 'I'], [['A + B <=> C', rev], ['C -> D', fwd]]),
    theta: Float64Array.from([1e-5, 0.05, 5e-4]),
    run: { id: 'bench', temperature: 500, pressure: 5e5, feed: Float64Array.from([1, 1.2, 0, 0, 0.8]), size: 50 },
    alpha: 0.012,
  },
  {
    name: 'stiff (fast A <=> B, slow B -> C)',
    kin: kinetics(['A', 'B', 'C', 'I'], [['A <=> B', rev], ['B -> C', fwd]]),
    theta: Float64Array.from([50, 1.5, 2e-4]),
    run: { id: 'bench', temperature: 450, pressure: 3e5, feed: Float64Array.from([1, 0, 0, 1]), size: 100 },
    alpha: 0.004,
  },
];

function median(v: number[]): number {
  const s = [...v].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)];
}

const variants: [string, ReactorOptions][] = [
  ['outlet, rtol 1e-8', {}],
  ['profile of 50 points', { profile: true }],
  ['with sensitivities', { sensitivities: true }],
];

/** Median times of one packed-bed solve per case and variant; returns the report lines. */
export function runPbrSolve(repeats = 200): { lines: string[] } {
  const lines: string[] = [];
  for (const c of cases) {
    for (const [label, opts] of variants) {
      let last: ReactorSolution | undefined;
      const solve = () => solveReactor({ kind: 'packed-bed', phase: 'gas', pressureDrop: { alpha: c.alpha } }, c.run, c.kin, c.theta, opts);
      for (let i = 0; i < 20; i++) solve(); // warm-up
      const times: number[] = [];
      for (let i = 0; i < repeats; i++) {
        const t0 = performance.now();
        last = solve();
        times.push(performance.now() - t0);
      }
      const s = last!;
      lines.push(
        `pbr-solve ${c.name}, ${label}: median ${median(times).toFixed(3)} ms, ` +
          `rhs evaluations ${s.stats.rhsEvaluations}, jacobians ${s.stats.jacobianEvaluations}, steps ${s.stats.steps}, ` +
          `method ${s.stats.method}, status ${s.status}`,
      );
    }
  }
  return { lines };
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
  for (const l of runPbrSolve().lines) console.log(l);
}
