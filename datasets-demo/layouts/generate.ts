/**
 * Generator of the invented lab exports in datasets-demo/layouts/: the same kind of data in the
 * three shapes engineers export (wide: one column per species; stacked: one row per run and
 * species; one file per batch run), for `rateloom new`. Deterministic: truth.json (true values,
 * noise, seeds) gives byte-identical CSV files.
 *
 * Method: as datasets-demo/generate.ts. A study holding the TRUE model is loaded with rateloom's
 * loader from in-memory CSV text with the run conditions only, every run is solved with
 * simulateStudy at the true values, and normal noise with sigma^2 = absolute^2 + (relative y)^2
 * is added from a seeded generator (src/design/random.ts).
 *
 * Run:   npx tsx datasets-demo/layouts/generate.ts           (writes the CSV files)
 *        npx tsx datasets-demo/layouts/generate.ts --check   (exit 1 if a committed file differs)
 */
import { readFileSync, writeFileSync, mkdirSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { loadStudy } from '../../src/study/load';
import { applyParameterValues, simulateStudy, type SimulationResult } from '../../src/study/simulate';
import { SeededRandom } from '../../src/design/random';
import { compoundToSI } from '../../src/units';

/** Folder of this script (datasets-demo/layouts/). */
export const LAYOUTS_DIR = dirname(fileURLToPath(import.meta.url));

interface Noise {
  absolute: { value: number; unit: string };
  relative: number;
}
/** One invented data set: the true model (a study) and how its data were made noisy. */
export interface LayoutTruth {
  seed: number;
  /** The true rate law as `rateloom new --rate` takes it. */
  rate: string;
  parameters: Record<string, { value: number; unit: string }>;
  referenceTemperature: { value: number; unit: string };
  noise: Noise;
  study: Record<string, unknown>;
}
export interface LayoutsTruth {
  wide: LayoutTruth;
  stacked: LayoutTruth;
  runFile: LayoutTruth;
}

export interface GeneratedFile {
  path: string;
  content: string;
}

export function readLayoutsTruth(dir = LAYOUTS_DIR): LayoutsTruth {
  return JSON.parse(readFileSync(join(dir, 'truth.json'), 'utf8')) as LayoutsTruth;
}

const PROVENANCE = '# INVENTED data for rateloom, written by datasets-demo/layouts/generate.ts from datasets-demo/layouts/truth.json; do not edit by hand.';

/** Solve the true study for the given per-run condition CSV. */
function simulate(t: LayoutTruth, csv: string): SimulationResult {
  const raw = { ...t.study, referenceTemperature: t.referenceTemperature };
  const studyPath = join(LAYOUTS_DIR, 'truth.study.json');
  const { study } = loadStudy(JSON.stringify(raw), studyPath, () => csv);
  const sim = simulateStudy(study, applyParameterValues(study.parameters, t.parameters, 'truth.json'));
  const bad = sim.runs.find((r) => !r.success);
  if (bad) throw new Error(`generate: run ${bad.runId} failed at the true values: ${bad.message}`);
  return sim;
}

function noisy(rng: SeededRandom, y: number, noise: Noise, decimals: number): string {
  const sd = Math.sqrt(noise.absolute.value ** 2 + (noise.relative * y) ** 2);
  const v = y + sd * rng.normal();
  if (!(v > 0)) throw new Error(`generate: a noisy value came out non-positive (${v}); change the design, not the noise`);
  return v.toFixed(decimals);
}

const csvText = (header: string[], rows: (string | number)[][]) => [header.join(','), ...rows.map((r) => r.join(','))].join('\n') + '\n';

/** Wide: gas packed bed, A + B -> C with N2 as diluent; 3 T x 2 P x 2 W x 3 B feeds + 3 centre replicates. */
function wide(t: LayoutTruth): GeneratedFile {
  const cond: (string | number)[][] = [];
  let i = 0;
  for (const T of [230, 250, 270]) for (const P of [3, 6]) for (const W of [2, 5]) for (const FB of ['0.50', '1.00', '1.50']) cond.push([`W${++i}`, T, P, W, '1.00', FB, '2.00', '']);
  for (let r = 1; r <= 3; r++) cond.push([`C${r}`, 250, 6, 5, '1.00', '1.00', '2.00', 'c']);
  const sim = simulate(t, csvText(['run', 'T', 'P', 'W', 'FA', 'FB', 'FN2', 'rep'], cond));
  const rng = new SeededRandom(t.seed);
  const unit = compoundToSI(1, t.noise.absolute.unit).value;
  const rows = cond.map((c, r) => [...c.slice(0, 7), ...['A', 'B', 'C'].map((s) => noisy(rng, sim.runs[r].outlet[s] / unit, t.noise, 4)), c[7]]);
  const header = ['Run', 'T [degC]', 'P [bar]', 'W / g', '"F_A,in (mmol/min)"', '"F_B,in (mmol/min)"', '"F_N2,in (mmol/min)"', '"F_A,out (mmol/min)"', '"F_B,out (mmol/min)"', '"F_C,out (mmol/min)"', 'Rep'];
  return { path: 'wide/bench-runs.csv', content: `${PROVENANCE}\n# Gas packed bed, one row per run, one column per species; Rep marks the repeated centre point.\n${csvText(header, rows)}` };
}

/** Stacked: liquid stirred tank, A -> B; 3 T x 4 flows, two inlet concentrations, one row per run and species. */
function stacked(t: LayoutTruth): GeneratedFile {
  const cond: (string | number)[][] = [];
  let i = 0;
  for (const T of [40, 55, 70]) for (const Q of [2, 5, 10, 20]) cond.push([`S${++i}`, T, '0.50', Q, i % 2 ? '1.00' : '2.00']);
  const sim = simulate(t, csvText(['run', 'T', 'V', 'Q', 'CA'], cond));
  const rng = new SeededRandom(t.seed);
  const unit = compoundToSI(1, t.noise.absolute.unit).value;
  const rows: (string | number)[][] = [];
  cond.forEach((c, r) => {
    const [id, T, V, Q, CA] = c;
    for (const [s, cin] of [['A', CA], ['B', '0.00']] as const) rows.push([id, T, V, Q, s, cin, noisy(rng, sim.runs[r].concentrations[s] / unit, t.noise, 4)]);
  });
  const header = ['run', 'T (degC)', 'V (L)', 'Q (mL/min)', 'species', 'C_in (mol/L)', 'C_out (mol/L)'];
  return { path: 'stacked/tank-runs.csv', content: `${PROVENANCE}\n# Liquid stirred tank, one row per run and species.\n${csvText(header, rows)}` };
}

/** One file per run: liquid batch, A -> B; four runs, samples at seven times after the charge. */
function runFiles(t: LayoutTruth): GeneratedFile[] {
  const runs: [string, number, string][] = [['B1', 50, '1.00'], ['B2', 60, '1.00'], ['B3', 70, '1.00'], ['B4', 60, '2.00']];
  const times = [10, 20, 40, 60, 90, 120];
  const cond = runs.flatMap(([id, T, CA]) => times.map((tm) => [`${id}_${tm}`, T, CA, tm]));
  const sim = simulate(t, csvText(['run', 'T', 'CA0', 't'], cond));
  const rng = new SeededRandom(t.seed);
  const unit = compoundToSI(1, t.noise.absolute.unit).value;
  return runs.map(([id, T, CA], k) => {
    const rows: (string | number)[][] = [[0, T, CA, '0.0000']];
    times.forEach((tm, n) => {
      const run = sim.runs[k * times.length + n];
      rows.push([tm, T, ...['A', 'B'].map((s) => noisy(rng, run.concentrations[s] / unit, t.noise, 4))]);
    });
    return { path: `run-files/${id}.csv`, content: `${PROVENANCE}\n# Batch run ${id}: samples; the row at time 0 is the charge.\n${csvText(['t [min]', 'T [degC]', 'C_A [mol/L]', 'C_B [mol/L]'], rows)}` };
  });
}

/** All generated files, in a fixed order. */
export function generateLayouts(dir = LAYOUTS_DIR): GeneratedFile[] {
  const truth = readLayoutsTruth(dir);
  return [wide(truth.wide), stacked(truth.stacked), ...runFiles(truth.runFile)];
}

const isMain = process.argv[1] !== undefined && fileURLToPath(import.meta.url) === process.argv[1];
if (isMain) {
  const check = process.argv.includes('--check');
  let differs = 0;
  for (const f of generateLayouts()) {
    const abs = join(LAYOUTS_DIR, f.path);
    if (check) {
      let old = '';
      try {
        old = readFileSync(abs, 'utf8');
      } catch {
        /* missing counts as different */
      }
      if (old !== f.content) differs++;
    } else {
      mkdirSync(dirname(abs), { recursive: true });
      writeFileSync(abs, f.content);
      console.log(`wrote ${f.path}`);
    }
  }
  if (check) process.exitCode = differs ? 1 : 0;
}
