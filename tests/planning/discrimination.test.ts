/**
 * Discrimination mode beyond the SciPy case (tests/reference/planning-discrimination.test.ts):
 * the many-run, many-parameter divergence against a dense computation of the multivariate normal
 * J-divergence, rivals that predict the same everywhere (status 'indistinguishable', exit 1),
 * and bad input (identical rivals or a single rate-law set: exit 2, also on the command line).
 */
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { isRateloomError } from '../../src/core/errors';
import { SeededRandom } from '../../src/numerics/random';
import { fitStudy, studyVariants } from '../../src/workflow/fit-study';
import { parseLimits } from '../../src/planning/limits';
import { planRuns } from '../../src/planning/plan';
import { checkDistinctRivals } from '../../src/planning/rivals';
import { discriminationValue, type DiscriminationBlocks } from '../../src/planning/divergence';
import { oneJson, runCli } from '../robustness/cli-helpers';
import { batchDecayStudy, studyFromText } from './helpers';

/** Inverse of a small dense matrix by Gauss-Jordan with partial pivoting (test-only, independent of the code under test). */
function invert(A: number[][]): number[][] {
  const n = A.length;
  const M = A.map((row, i) => [...row, ...Array.from({ length: n }, (_, j) => (i === j ? 1 : 0))]);
  for (let c = 0; c < n; c++) {
    let piv = c;
    for (let r = c + 1; r < n; r++) if (Math.abs(M[r][c]) > Math.abs(M[piv][c])) piv = r;
    [M[c], M[piv]] = [M[piv], M[c]];
    const d = M[c][c];
    for (let k = 0; k < 2 * n; k++) M[c][k] /= d;
    for (let r = 0; r < n; r++) if (r !== c) {
      const f = M[r][c];
      for (let k = 0; k < 2 * n; k++) M[r][k] -= f * M[c][k];
    }
  }
  return M.map((row) => row.slice(n));
}

const mul = (A: number[][], B: number[][]) => A.map((row) => B[0].map((_, j) => row.reduce((s, v, k) => s + v * B[k][j], 0)));
const tr = (A: number[][]) => A.reduce((s, row, i) => s + row[i], 0);

describe('discrimination criterion', () => {
  it('equals 2 P_i P_j J_ij of the dense predictive normals N(mu, I + U U\') for several runs and parameters (Kullback 1959, ch. 9)', () => {
    const rng = new SeededRandom(7);
    const q = 3;
    const p = [2, 3];
    const nCand = 4;
    const mu = p.map(() => Array.from({ length: nCand }, () => Array.from({ length: q }, () => 3 * rng.normal())));
    const U = p.map((pm) => Array.from({ length: nCand }, () => Array.from({ length: q }, () => Array.from({ length: pm }, () => rng.normal()))));
    const AtB = (A: number[][], B: number[][]) => Float64Array.from(A[0].flatMap((_, a) => B[0].map((_, b) => A.reduce((s, row, r) => s + row[a] * B[r][b], 0))));
    const d = Array.from({ length: nCand }, (_, c) => mu[0][c].map((v, r) => v - mu[1][c][r]));
    const blocks: DiscriminationBlocks = {
      p,
      prior: [0.7, 0.3],
      own: p.map((_, m) => U[m].map((Uc) => AtB(Uc, Uc))),
      pairs: [{
        i: 0,
        j: 1,
        delta: Float64Array.from(d, (dc) => dc.reduce((s, v) => s + v * v, 0)),
        wi: d.map((dc, c) => AtB(U[0][c], dc.map((v) => [v]))),
        wj: d.map((dc, c) => AtB(U[1][c], dc.map((v) => [v]))),
        cross: d.map((_, c) => AtB(U[0][c], U[1][c])),
      }],
    };
    const set = [0, 2, 3];
    // Dense: stack the runs, V_m = I + U_m U_m', J = 1/2 tr(V_i^-1 V_j + V_j^-1 V_i - 2I) + 1/2 d'(V_i^-1 + V_j^-1) d.
    const stackU = (m: number) => set.flatMap((c) => U[m][c]);
    const V = [0, 1].map((m) => {
      const S = stackU(m);
      return S.map((ra, a) => S.map((rb, b) => (a === b ? 1 : 0) + ra.reduce((s, v, k) => s + v * rb[k], 0)));
    });
    const Vi = V.map(invert);
    const dv = set.flatMap((c) => d[c]);
    const quad = (A: number[][]) => dv.reduce((s, x, a) => s + x * A[a].reduce((t, y, b) => t + y * dv[b], 0), 0);
    const J = 0.5 * (tr(mul(Vi[0], V[1])) + tr(mul(Vi[1], V[0])) - 2 * V[0].length) + 0.5 * (quad(Vi[0]) + quad(Vi[1]));
    expect(discriminationValue('box-hill', blocks, set)).toBeCloseTo(2 * 0.7 * 0.3 * J, 9);
    expect(discriminationValue('hunter-reiner', blocks, set)).toBeCloseTo(set.reduce((s, c) => s + blocks.pairs[0].delta[c], 0), 12);
  });
});

const base = batchDecayStudy({ c0: 1, unit: 'mol/L', k: 2e-3, sigma: 0.01 });
const CSV = ['run,t_s,CA', ...[100, 300, 600, 900].map((t, i) => `S${i + 1},${t},${(Math.exp(-1e-3 * t) + 0.004 * (i % 2 ? 1 : -1)).toFixed(5)}`)].join('\n') + '\n';
const rival = (name: string, kName: string, order: number) => ({
  name,
  reactions: { r: { form: 'power-law', basis: 'volume', rateConstant: { k: kName }, orders: { A: order } } },
  ...(kName === 'k' ? {} : { parameters: [{ name: kName, value: 2e-3, unit: order === 1 ? '1/s' : 'L/(mol s)', lower: 1e-9, upper: 1 }] }),
});
const studyWith = (candidates: unknown[]) => studyFromText({ ...base, candidates }, CSV);

function errorOf(f: () => unknown): string {
  try {
    f();
  } catch (e) {
    if (isRateloomError(e)) return `${e.code}: ${e.message}`;
    throw e;
  }
  return 'no error';
}

describe('discrimination planning: status and bad input', () => {
  it('rivals that predict alike everywhere: status indistinguishable, not a success', () => {
    const study = studyWith([rival('renamed', 'kk', 1)]);
    const fits = studyVariants(study).map((v) => fitStudy(study, { variant: v.name, profile: false }));
    const limits = parseLimits({ factors: { time: { min: 0, max: 3000, unit: 's', levels: 61 } } }, study);
    const plan = planRuns(study, limits, fits, { runs: 2, mode: 'discrimination', posteriorDraws: 50 });
    expect(plan.status).toBe('indistinguishable');
    expect(plan.success).toBe(false);
    // Nothing separates them, so the expected posterior equals today's weight.
    expect(plan.discrimination!.models[0].expectedIfTrue).toBeCloseTo(plan.discrimination!.models[0].now, 6);
  });

  it('identical rival sets and a single rate-law set are refused with E_VALUE', () => {
    expect(errorOf(() => checkDistinctRivals(studyVariants(studyWith([rival('copy', 'k', 1)]))))).toMatch(/^E_VALUE: .*the rival rate-law sets 'base' and 'copy' are identical/);
    expect(errorOf(() => checkDistinctRivals(studyVariants(studyWith([]))))).toMatch(/^E_VALUE: .*discrimination needs two or more rival rate-law sets/);
    expect(errorOf(() => checkDistinctRivals(studyVariants(studyWith([rival('second', 'k2', 2)]))))).toBe('no error');
  });

  it('on the command line: a discrimination plan as JSON (exit 0), identical rivals exit 2', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'rl-disc-'));
    writeFileSync(join(dir, 'runs.csv'), CSV);
    writeFileSync(join(dir, 'good.study.json'), JSON.stringify({ ...base, candidates: [rival('second', 'k2', 2)] }));
    writeFileSync(join(dir, 'same.study.json'), JSON.stringify({ ...base, candidates: [rival('copy', 'k', 1)] }));
    writeFileSync(join(dir, 'limits.json'), JSON.stringify({ factors: { time: { min: 0, max: 5000, unit: 's' } }, levels: 101 }));
    const [good, same] = await Promise.all([
      runCli(['plan', 'good.study.json', '--limits', 'limits.json', '--runs', '2', '--mode', 'discrimination', '--out', 'plan.csv', '--json'], dir),
      runCli(['plan', 'same.study.json', '--limits', 'limits.json', '--runs', '2', '--mode', 'discrimination', '--json'], dir),
    ]);
    expect(good.code, good.stderr).toBe(0);
    const doc = oneJson(good);
    expect(doc.mode).toBe('discrimination');
    expect(doc.criterion).toBe('box-hill');
    expect(doc.runs).toHaveLength(2);
    expect(doc.discrimination.models.map((m: { model: string }) => m.model)).toEqual(['base', 'second']);
    expect(same.code).toBe(2);
    expect(oneJson(same).error.code).toBe('E_VALUE');
  }, 120_000);
});
