/**
 * Spawning the real command line for the robustness tests: node with the tsx loader on
 * cli/main.ts, in a scratch folder holding a copy of the fixture study, a fitted-kinetics file made
 * from it and a production case that matches its species.
 */
import { spawn } from 'node:child_process';
import { cpSync, mkdtempSync, readdirSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { loadStudy } from '../../src/study';
import { buildHandoff, fitStudy } from '../../src/workflow/fit-study';
import { toJson } from '../../cli/run';
import { readFileSync } from 'node:fs';

export const ROOT = resolve(import.meta.dirname, '../..');
const TSX = join(ROOT, 'node_modules', 'tsx', 'dist', 'loader.mjs');
const MAIN = join(ROOT, 'cli', 'main.ts');

export interface CliRun {
  args: string[];
  code: number | null;
  stdout: string;
  stderr: string;
}

/** Run `rateloom ...args` in `cwd` (no terminal, no stdin). */
export function runCli(args: string[], cwd: string): Promise<CliRun> {
  return new Promise((done, fail) => {
    const child = spawn(process.execPath, ['--import', TSX, MAIN, ...args], { cwd, stdio: ['ignore', 'pipe', 'pipe'], env: { ...process.env, NO_COLOR: '1' } });
    let stdout = '';
    let stderr = '';
    child.stdout.on('data', (d) => (stdout += d));
    child.stderr.on('data', (d) => (stderr += d));
    child.on('error', fail);
    child.on('close', (code) => done({ args, code, stdout, stderr }));
  });
}

/** Run many command lines, at most `parallel` at a time, results in input order. */
export async function runMany(list: string[][], cwd: string, parallel = 3): Promise<CliRun[]> {
  const out: CliRun[] = new Array(list.length);
  let next = 0;
  const worker = async () => {
    while (next < list.length) {
      const i = next++;
      out[i] = await runCli(list[i], cwd);
    }
  };
  await Promise.all(Array.from({ length: Math.min(parallel, list.length) }, worker));
  return out;
}

/** The one JSON document on stdout (fails the test when there is not exactly one). */
export function oneJson(r: CliRun): any {
  const text = r.stdout.trim();
  if (!text.startsWith('{')) throw new Error(`no JSON on stdout of ${r.args.join(' ')}: ${r.stdout.slice(0, 200)} / ${r.stderr.slice(0, 300)}`);
  return JSON.parse(text); // throws on a second document or trailing text
}

/** Temporary-file leftovers of atomic writes under `dir`. */
export function tmpLeftovers(dir: string): string[] {
  const found: string[] = [];
  const walk = (d: string) => {
    for (const name of readdirSync(d)) {
      const p = join(d, name);
      if (statSync(p).isDirectory()) walk(p);
      else if (/\.tmp$/.test(name)) found.push(p);
    }
  };
  walk(dir);
  return found;
}

/**
 * A scratch folder with: study.json (+ runs.csv, profile.csv), bad.json (a syntax error on line 3,
 * column 8), kinetics.json (hand-off of a fit of the study) and plant.case.json.
 */
export function workspace(): { dir: string; cleanup: () => void } {
  const dir = mkdtempSync(join(tmpdir(), 'rateloom-robust-'));
  const fixtures = join(ROOT, 'tests', 'data', 'fixtures');
  for (const f of ['study.json', 'runs.csv', 'profile.csv']) cpSync(join(fixtures, f), join(dir, f));
  writeFileSync(join(dir, 'bad.json'), '{\n  "a": 1,\n  "b": x\n}\n');
  const studyPath = join(dir, 'study.json');
  const { study } = loadStudy(readFileSync(studyPath, 'utf8'), studyPath, (p) => readFileSync(p, 'utf8'));
  writeFileSync(join(dir, 'kinetics.json'), toJson(buildHandoff(study, fitStudy(study, { profile: false }))) + '\n');
  writeFileSync(
    join(dir, 'plant.case.json'),
    JSON.stringify({
      name: 'invented robustness plant',
      reactor: { kind: 'packed-bed', phase: 'gas' },
      feed: { totalFlow: '20 mol/s', moleFractions: { A: 0.3, H2: 0.6, N2: 0.1 } },
      temperature: '490 K',
      pressure: '3 bar',
      target: { conversion: 0.5, species: 'A' },
      tubes: {
        innerDiameter: '25 mm', particleDiameter: '3 mm', voidFraction: 0.4, bulkDensity: '800 kg/m3',
        particleDensity: '1333 kg/m3', viscosity: '2.5e-5 Pa s', allowedPressureDrop: '0.5 bar',
      },
      uncertainty: { draws: 200, seed: 5, levels: [0.9] },
    }),
  );
  return { dir, cleanup: () => rmSync(dir, { recursive: true, force: true }) };
}
