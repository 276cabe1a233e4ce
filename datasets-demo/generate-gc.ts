/**
 * The invented gas-analyser campaign of the demo (datasets-demo/gc/): an ethane oxidative
 * dehydrogenation bench run as an online analyser reports it, dry-basis mole fractions in % with
 * N2 as internal standard, a reference condition repeated every fourth run, and a catalyst that
 * loses activity slowly, a = exp(-kd t) over time on stream.
 *
 * Method: the study is loaded with rateloom's loader from in-memory CSV text holding the run
 * conditions, the runs are given their time on stream and the activity model, every run is solved
 * at the TRUE values (simulateStudy, the code path of `rateloom simulate`), the dry-basis fractions
 * of the outlet flows are computed (water condensed) and independent normal noise with
 * sigma^2 = absolute^2 + (relative y)^2 on each fraction is added from a seeded generator.
 * Used by datasets-demo/generate.ts (the committed demo) and by the coverage tests (other seeds).
 */
import { fractionsFromFlows } from '../src/data/lab-arithmetic';
import { SeededRandom } from '../src/design/random';
import { activityParameters } from '../src/study/activity-params';
import type { ActivitySpec } from '../src/study/lab-types';
import { loadStudy } from '../src/study/load';
import { applyParameterValues, simulateStudy } from '../src/study/simulate';

export interface GcTruth {
  study: string;
  seed: number;
  parameters: Record<string, { value: number; unit: string }>;
  /** Noise on each dry-basis mole fraction (mol/mol). */
  noise: { absolute: number; relative: number };
  /** Hours on stream between two runs. */
  hoursPerRun: number;
}

/** Conditions of the campaign: 18 design runs, the reference repeated before every third design run. */
export function gcDesign(): string[][] {
  const rows: string[][] = [];
  const ref = ['525', '1.00', '10.0', '10.0', '80.0'];
  let d = 0;
  let r = 0;
  const design: string[][] = [];
  for (const T of ['500', '525', '550']) for (const W of ['0.50', '1.00', '2.00']) for (const O2 of ['10.0', '20.0']) design.push([T, W, '10.0', O2, O2 === '10.0' ? '80.0' : '70.0']);
  for (let k = 0; k < design.length; k++) {
    if (k % 3 === 0) rows.push([`REF${++r}`, ...ref]);
    rows.push([`D${++d}`, ...design[(k * 7) % design.length]]);
  }
  rows.push([`REF${++r}`, ...ref]);
  return rows;
}

const COND_HEADER = ['run', 'T_C', 'W_g', 'F_C2H6_in', 'F_O2_in', 'F_N2_in'];
const SPECIES = ['C2H6', 'O2', 'C2H4', 'CO2', 'N2'];

/** The CSV text of one campaign (fractions in %, time on stream in h) for a seed. */
export function gcCampaignCsv(studyPath: string, studyRaw: Record<string, unknown>, truth: GcTruth, seed: number, comments: string[] = []): string {
  const rows = gcDesign();
  const cond = [COND_HEADER.join(','), ...rows.map((r) => r.join(','))].join('\n') + '\n';
  const { labData: _lab, activity, ...plain } = studyRaw as { labData?: unknown; activity?: ActivitySpec };
  const loaded = loadStudy(JSON.stringify(plain), studyPath, () => cond).study;
  const timed = { ...loaded, runs: loaded.runs.map((run, i) => ({ ...run, timeOnStream: i * truth.hoursPerRun * 3600 })) };
  const study = activity ? activityParameters(timed, activity) : timed;
  const params = applyParameterValues(study.parameters, truth.parameters, 'truth.json');
  const sim = simulateStudy(study, params);
  const bad = sim.runs.find((r) => !r.success);
  if (bad) throw new Error(`generate: run ${bad.runId} failed at the true values: ${bad.message}`);
  const names = study.chemistry.speciesNames;
  const removed = names.map((n) => n === 'H2O');
  const rng = new SeededRandom(seed);
  const lines = rows.map((row, i) => {
    const y = fractionsFromFlows(names.map((n) => sim.runs[i].outlet[n]), removed);
    const cells = SPECIES.map((s) => {
      const v = y[names.indexOf(s)];
      const sd = Math.hypot(truth.noise.absolute, truth.noise.relative * v);
      return (100 * (v + sd * rng.normal())).toFixed(4);
    });
    return [...row, (i * truth.hoursPerRun).toFixed(1), ...cells].join(',');
  });
  const header = [...COND_HEADER, 'tos_h', ...SPECIES.map((s) => `y_${s}`)].join(',');
  return [...comments.map((c) => `# ${c}`), header, ...lines].join('\n') + '\n';
}
