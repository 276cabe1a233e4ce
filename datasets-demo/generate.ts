/**
 * Generator of the invented demo data sets (datasets-demo/). Deterministic: the same truth.json
 * (true parameter values, noise models, seeds, flaws) gives byte-identical CSV files.
 *
 * Method: each study file is loaded with rateloom's own loader from in-memory CSV text holding only
 * the run conditions, every run is solved with simulateStudy at the TRUE parameter values (the code
 * path of `rateloom simulate`), and independent normal noise with
 * sigma^2 = absolute^2 + (relative * y)^2 is added from a seeded generator (xoshiro128** with
 * Marsaglia's polar method, src/design/random.ts). Then the flaws listed in truth.json are applied.
 *
 * Run:   npx tsx datasets-demo/generate.ts           (writes the CSV files)
 *        npx tsx datasets-demo/generate.ts --check   (exit 1 if a committed file differs)
 */
import { readFileSync, writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { loadStudy } from '../src/study/load';
import { applyParameterValues, simulateStudy, type SimulationResult } from '../src/study/simulate';
import { SeededRandom } from '../src/design/random';
import { compoundToSI } from '../src/units';
import { gcCampaignCsv, type GcTruth } from './generate-gc';

/** Folder of this script (datasets-demo/). */
export const DEMO_DIR = dirname(fileURLToPath(import.meta.url));

interface NoiseSpec {
  absolute: { value: number; unit: string };
  relative: number;
}
interface FlawSpec {
  kind: 'non-numeric' | 'scale';
  run: string;
  column: string;
  text?: string;
  factor?: number;
}
interface DatasetTruth {
  study: string;
  seed: number;
  parameters: Record<string, { value: number; unit: string }>;
  noise: NoiseSpec;
  flaws: FlawSpec[];
}
export interface DemoTruth {
  pbr: DatasetTruth;
  batch: DatasetTruth;
  cstr: DatasetTruth;
  gc: GcTruth;
}

/** One generated file: path relative to datasets-demo/ and its text. */
export interface GeneratedFile {
  path: string;
  content: string;
}

export function readTruth(dir = DEMO_DIR): DemoTruth {
  return JSON.parse(readFileSync(join(dir, 'truth.json'), 'utf8')) as DemoTruth;
}

/** A table of rows, written as CSV with a comment header. */
class Table {
  readonly rows: string[][] = [];
  constructor(readonly header: string[]) {}
  add(cells: (string | number)[]): void {
    this.rows.push(cells.map(String));
  }
  set(runId: string, column: string, value: string): void {
    const c = this.header.indexOf(column);
    const row = this.rows.find((r) => r[0] === runId);
    if (c < 0 || !row) throw new Error(`generate: no cell ${runId}/${column}`);
    row[c] = value;
  }
  get(runId: string, column: string): string {
    const c = this.header.indexOf(column);
    const row = this.rows.find((r) => r[0] === runId);
    if (c < 0 || !row) throw new Error(`generate: no cell ${runId}/${column}`);
    return row[c];
  }
  csv(comments: string[]): string {
    return [...comments.map((c) => `# ${c}`), this.header.join(','), ...this.rows.map((r) => r.join(','))].join('\n') + '\n';
  }
}

/** Load a study with the given in-memory CSV files (by base name) and solve it at the truth. */
function simulateAtTruth(dir: string, t: DatasetTruth, raw: Record<string, unknown>, files: Record<string, string>): SimulationResult {
  const studyPath = join(dir, t.study);
  const { study } = loadStudy(JSON.stringify(raw), studyPath, (abs) => {
    const name = abs.slice(dirname(studyPath).length + 1);
    const text = files[name];
    if (text === undefined) throw new Error(`generate: no in-memory file '${name}'`);
    return text;
  });
  const params = applyParameterValues(study.parameters, t.parameters, 'truth.json');
  const sim = simulateStudy(study, params);
  const bad = sim.runs.find((r) => !r.success);
  if (bad) throw new Error(`generate: run ${bad.runId} failed at the true values: ${bad.message}`);
  return sim;
}

/** The noise of one value (in the unit of the value, which must be the noise's unit). */
function noisy(rng: SeededRandom, y: number, noise: NoiseSpec, decimals: number): string {
  const sd = Math.sqrt(noise.absolute.value ** 2 + (noise.relative * y) ** 2);
  const v = y + sd * rng.normal();
  if (!(v > 0)) throw new Error(`generate: a noisy value came out non-positive (${v}); change the design, not the noise`);
  return v.toFixed(decimals);
}

function applyFlaws(table: Table, flaws: readonly FlawSpec[]): void {
  for (const f of flaws) {
    if (f.kind === 'non-numeric') table.set(f.run, f.column, f.text ?? 'n.d.');
    else {
      const v = Number(table.get(f.run, f.column));
      const decimals = (table.get(f.run, f.column).split('.')[1] ?? '').length;
      table.set(f.run, f.column, (v * (f.factor ?? 1)).toFixed(decimals));
    }
  }
}

function studyJson(dir: string, t: DatasetTruth): Record<string, unknown> & { data: Array<Record<string, unknown>> } {
  return JSON.parse(readFileSync(join(dir, t.study), 'utf8'));
}

const PROVENANCE = 'INVENTED data for the rateloom demo, written by datasets-demo/generate.ts from datasets-demo/truth.json; do not edit by hand.';

/** Packed bed: 4 temperatures x 3 pressures x 2 catalyst masses x 2 of 3 water/ethylene ratios + 4 centre-point replicates. */
function packedBed(dir: string, t: DatasetTruth): GeneratedFile[] {
  const header = ['run', 'T_C', 'P_bar', 'W_g', 'F_C2H4_in', 'F_H2O_in', 'F_N2_in'];
  const measured = ['F_C2H4', 'F_H2O', 'F_EtOH', 'F_DEE'];
  const species = ['C2H4', 'H2O', 'EtOH', 'DEE'];
  const cond = new Table(header);
  const ratios = [0.6, 1.0, 1.6];
  let i = 0;
  for (const T of [200, 215, 230, 245]) {
    for (const P of [12, 20, 30]) {
      for (const W of [10, 30]) {
        for (const k of [0, 1]) {
          const ratio = ratios[(i + k) % 3];
          const F = 2.0;
          cond.add([`P${++i}`, T, P, W, F.toFixed(2), (F * ratio).toFixed(2), '0.40']);
        }
      }
    }
  }
  for (let r = 1; r <= 4; r++) cond.add([`C${r}`, 222, 20, 20, '2.00', '2.00', '0.40']);
  const condCsv = cond.csv([]);
  const raw = studyJson(dir, t);
  const src = raw.data[0] as { columns: Record<string, unknown> };
  const columns = { ...src.columns };
  delete columns.measured;
  const genRaw = { ...raw, data: [{ ...src, columns }] };
  const sim = simulateAtTruth(dir, t, genRaw, { 'runs.csv': condCsv });

  const rng = new SeededRandom(t.seed);
  const perMin = compoundToSI(1, t.noise.absolute.unit).value; // SI flow of 1 unit
  const noise: NoiseSpec = { ...t.noise, absolute: { value: t.noise.absolute.value, unit: t.noise.absolute.unit } };
  const out = new Table([...header, ...measured]);
  cond.rows.forEach((row, r) => {
    const run = sim.runs[r];
    out.add([...row, ...species.map((s) => noisy(rng, run.outlet[s] / perMin, noise, 5))]);
  });
  applyFlaws(out, t.flaws);
  return [
    {
      path: 'pbr/runs.csv',
      content: out.csv([PROVENANCE, 'Pilot packed bed, ethylene hydration; flows in mmol/min, absolute pressure in bar, catalyst mass in g.']),
    },
  ];
}

/** Batch: two runs at each of 50, 65, 80 degC, concentrations sampled at seven times. */
function batch(dir: string, t: DatasetTruth): GeneratedFile[] {
  const header = ['run', 'T_C', 'C_AcOH_0', 'C_EtOH_0', 'C_EtOAc_0', 'C_H2O_0'];
  const cond = new Table(header);
  const starts = [
    ['5.00', '5.00', '0.00', '2.00'],
    ['4.00', '7.00', '0.00', '1.50'],
  ];
  let i = 0;
  for (const T of [50, 65, 80]) for (const s of starts) cond.add([`B${++i}`, T, ...s]);
  const times = [15, 30, 60, 120, 180, 240, 360];
  // Generation: one run per (run, sample time), the time as the batch time of the run.
  const genHeader = [...header, 't_min'];
  const gen = new Table(genHeader);
  for (const row of cond.rows) for (const tm of times) gen.add([`${row[0]}_${tm}`, ...row.slice(1), tm]);
  const raw = studyJson(dir, t);
  const src = raw.data[0] as { columns: Record<string, unknown> };
  const genRaw = { ...raw, data: [{ ...src, columns: { ...src.columns, time: { column: 't_min', unit: 'min' } } }] };
  const sim = simulateAtTruth(dir, t, genRaw, { 'runs.csv': gen.csv([]) });
  const rng = new SeededRandom(t.seed);
  const perL = compoundToSI(1, t.noise.absolute.unit).value;
  const samples = new Table(['run', 't_min', 'species', 'C_molL']);
  for (const run of sim.runs) {
    const [id, tm] = run.runId.split('_');
    for (const s of ['AcOH', 'EtOAc']) samples.add([id, tm, s, noisy(rng, run.concentrations[s] / perL, t.noise, 3)]);
  }
  applyFlaws(samples, t.flaws);
  return [
    { path: 'batch/runs.csv', content: cond.csv([PROVENANCE, 'Batch esterification runs: temperature and initial concentrations (mol/L).']) },
    { path: 'batch/samples.csv', content: samples.csv([PROVENANCE, 'Samples: time in min, concentration in mol/L (titration for AcOH, GC for EtOAc).']) },
  ];
}

/** Stirred tank: 30, 40, 50 degC x four feed flows, two inlet PO concentrations. */
function stirredTank(dir: string, t: DatasetTruth): GeneratedFile[] {
  const header = ['run', 'T_C', 'Q_mL_min', 'C_PO_in'];
  const cond = new Table(header);
  let i = 0;
  for (const T of [30, 40, 50]) for (const Q of [4, 8, 16, 32]) cond.add([`S${++i}`, T, Q.toFixed(1), i % 2 ? '1.00' : '1.50']);
  const raw = studyJson(dir, t);
  const src = raw.data[0] as { columns: Record<string, unknown> };
  const columns = { ...src.columns };
  delete columns.measured;
  const sim = simulateAtTruth(dir, t, { ...raw, data: [{ ...src, columns }] }, { 'runs.csv': cond.csv([]) });
  const rng = new SeededRandom(t.seed);
  const perL = compoundToSI(1, t.noise.absolute.unit).value;
  const out = new Table([...header, 'C_PO', 'C_PG']);
  cond.rows.forEach((row, r) => {
    const run = sim.runs[r];
    out.add([...row, ...['PO', 'PG'].map((s) => noisy(rng, run.concentrations[s] / perL, t.noise, 4))]);
  });
  applyFlaws(out, t.flaws);
  return [{ path: 'cstr/runs.csv', content: out.csv([PROVENANCE, 'Continuous stirred tank, 1 L; feed flow in mL/min, concentrations in mol/L.']) }];
}

/** Gas-analyser campaign with catalyst decay (datasets-demo/generate-gc.ts). */
function gasAnalyser(dir: string, t: GcTruth): GeneratedFile {
  const studyPath = join(dir, t.study);
  const raw = JSON.parse(readFileSync(studyPath, 'utf8')) as Record<string, unknown>;
  const comments = [PROVENANCE, 'Bench packed bed, ethane oxidative dehydrogenation; feed in mmol/min, catalyst mass in g, time on stream in h, dry-basis outlet mole fractions in %.'];
  return { path: 'gc/runs.csv', content: gcCampaignCsv(studyPath, raw, t, t.seed, comments) };
}

/** All generated files, in a fixed order. */
export function generateDemoData(dir = DEMO_DIR): GeneratedFile[] {
  const truth = readTruth(dir);
  return [...packedBed(dir, truth.pbr), ...batch(dir, truth.batch), ...stirredTank(dir, truth.cstr), gasAnalyser(dir, truth.gc)];
}

const isMain = process.argv[1] !== undefined && fileURLToPath(import.meta.url) === process.argv[1];
if (isMain) {
  const check = process.argv.includes('--check');
  let differs = 0;
  for (const f of generateDemoData()) {
    const abs = join(DEMO_DIR, f.path);
    if (check) {
      let old = '';
      try {
        old = readFileSync(abs, 'utf8');
      } catch {
        /* missing counts as different */
      }
      if (old !== f.content) {
        differs++;
        console.log(`differs: ${f.path}`);
      }
    } else {
      writeFileSync(abs, f.content);
      console.log(`wrote ${f.path}`);
    }
  }
  if (check) {
    console.log(differs ? `${differs} file(s) differ from the generator` : 'all files match the generator');
    process.exitCode = differs ? 1 : 0;
  }
}
