/**
 * Whole-process benchmarks of the `rateloom` command (bin/rateloom.js running the built dist/), each
 * against a baseline timed in the same run, interleaved (A B A B ...) so that a change in the
 * machine's load hits both alike; medians of wall time, and of the child's CPU time (user + system,
 * from /usr/bin/time when it is installed):
 *   start-up   `node -e 0` (the floor: node itself) vs `rateloom --version` and
 *              `rateloom check datasets-demo/pbr/pbr.study.json --json`
 *   fit        `rateloom fit <bench study> --no-report --json` (profile intervals on, the default)
 *              vs `python3 bench/scipy_fit.py` (SciPy least_squares + solve_ivp) on the same data,
 *              both as whole processes (interpreter start, imports, reading the data, the fit).
 *   demo       `rateloom demo` (npm run demo: every fit, sizing and report of the demo data) beside
 *              `node -e 0`; the target is the issue's absolute 5 s on a 2-core machine.
 */
import { spawnSync } from 'node:child_process';
import { median } from 'simple-statistics';
import { existsSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import type { Study } from '../src/study/types';
import { writeStudyFiles } from './study-files';
import { studyAsJson } from './synthetic-study';

const here = (p: string) => fileURLToPath(new URL(p, import.meta.url));
const ROOT = here('../');
const BIN = join(ROOT, 'bin/rateloom.js');
const TIME = '/usr/bin/time';

/** One command of a comparison. */
interface Entry { label: string; argv: string[] }
/** Medians over the repetitions, milliseconds; cpuMs null without /usr/bin/time. */
export interface Timing { label: string; wallMs: number; cpuMs: number | null; stdout: string }

/**
 * A Python 3 interpreter with SciPy: Debian's /usr/bin/python3 (python3-scipy) or the python3 on
 * the PATH; undefined when neither imports scipy.
 */
export function scipyPython(): string | undefined {
  for (const py of ['/usr/bin/python3', 'python3']) {
    if (spawnSync(py, ['-c', 'import scipy'], { encoding: 'utf8' }).status === 0) return py;
  }
  return undefined;
}


/** Run one command once: wall ms, CPU ms of the child (or null), stdout. Throws when it fails. */
function runOnce(e: Entry, cpuFile: string): { wallMs: number; cpuMs: number | null; stdout: string } {
  const withTime = existsSync(TIME);
  const argv = withTime ? [TIME, '-f', '%U %S', '-o', cpuFile, ...e.argv] : e.argv;
  const t0 = performance.now();
  const r = spawnSync(argv[0], argv.slice(1), { cwd: ROOT, encoding: 'utf8', maxBuffer: 1 << 26 });
  const wallMs = performance.now() - t0;
  if (r.status !== 0) throw new Error(`${e.label}: exit ${r.status}: ${r.stderr.slice(0, 500)}`);
  const cpu = withTime ? readFileSync(cpuFile, 'utf8').trim().split(/\s+/).map(Number) : null;
  return { wallMs, cpuMs: cpu ? 1000 * (cpu[0] + cpu[1]) : null, stdout: r.stdout };
}

/** Interleaved repetitions of the entries (one warm-up round not counted). */
function interleaved(entries: Entry[], reps: number, scratch: string): Timing[] {
  const cpuFile = join(scratch, 'cpu.txt');
  for (const e of entries) runOnce(e, cpuFile);
  const walls = entries.map(() => [] as number[]);
  const cpus = entries.map(() => [] as number[]);
  const outs = entries.map(() => '');
  for (let r = 0; r < reps; r++) {
    entries.forEach((e, i) => {
      const t = runOnce(e, cpuFile);
      walls[i].push(t.wallMs);
      if (t.cpuMs !== null) cpus[i].push(t.cpuMs);
      outs[i] = t.stdout;
    });
  }
  return entries.map((e, i) => ({ label: e.label, wallMs: median(walls[i]), cpuMs: cpus[i].length ? median(cpus[i]) : null, stdout: outs[i] }));
}

const ms = (t: Timing) => `${t.wallMs.toFixed(0)} ms wall${t.cpuMs === null ? '' : `, ${t.cpuMs.toFixed(0)} ms cpu`}`;
const ratioText = (t: Timing, base: Timing) => `${(t.wallMs / base.wallMs).toFixed(2)}x wall${t.cpuMs === null || base.cpuMs === null ? '' : `, ${(t.cpuMs / base.cpuMs).toFixed(2)}x cpu`}`;

/** Start-up of the command against `node -e 0`. */
export function startupBench(reps: number): { lines: string[]; floor: Timing; version: Timing; check: Timing } {
  const scratch = mkdtempSync(join(tmpdir(), 'rateloom-bench-'));
  try {
    const study = join(ROOT, 'datasets-demo/pbr/pbr.study.json');
    const [floor, version, check] = interleaved([
      { label: 'node -e 0', argv: [process.execPath, '-e', '0'] },
      { label: 'rateloom --version', argv: [process.execPath, BIN, '--version'] },
      { label: 'rateloom check <demo pbr> --json', argv: [process.execPath, BIN, 'check', study, '--json'] },
    ], reps, scratch);
    const lines = [floor, version, check].map((t) => `${t.label.padEnd(34)} ${ms(t)}${t === floor ? '' : ` = ${ratioText(t, floor)} node -e 0`}`);
    return { lines, floor, version, check };
  } finally {
    rmSync(scratch, { recursive: true, force: true });
  }
}

/** Estimates printed by `rateloom fit --json`, by name. */
function fitEstimates(stdout: string): Record<string, number> {
  const doc = JSON.parse(stdout) as { fit: { parameters: { name: string; value: number }[] } };
  return Object.fromEntries(doc.fit.parameters.map((p) => [p.name, p.value]));
}

/** `rateloom fit` against the SciPy script, whole processes, same data. */
export function processFitBench(study: Study, reps: number, python: string): { lines: string[]; rateloom: Timing; scipy: Timing; ratio: number; maxRel: number } {
  const scratch = mkdtempSync(join(tmpdir(), 'rateloom-bench-'));
  try {
    const studyPath = writeStudyFiles(study, scratch, 'bench-study');
    const dataPath = join(scratch, 'scipy-data.json');
    writeFileSync(dataPath, JSON.stringify(studyAsJson(study)));
    const [rateloom, scipy] = interleaved([
      { label: 'rateloom fit --no-report --no-profile', argv: [process.execPath, BIN, 'fit', studyPath, '--no-report', '--no-profile', '--json', '--force', '--out', join(scratch, 'out')] },
      { label: 'python3 bench/scipy_fit.py', argv: [python, here('./scipy_fit.py'), dataPath] },
    ], reps, scratch);
    const ours = fitEstimates(rateloom.stdout);
    const theirs = (JSON.parse(scipy.stdout) as { estimates: Record<string, number> }).estimates;
    const maxRel = Math.max(...Object.keys(theirs).map((k) => Math.abs(ours[k] - theirs[k]) / Math.abs(theirs[k])));
    const ratio = scipy.wallMs / rateloom.wallMs;
    const lines = [
      `${rateloom.label.padEnd(34)} ${ms(rateloom)} (${study.runs.length} runs; estimates, covariance, linear intervals)`,
      `${scipy.label.padEnd(34)} ${ms(scipy)} (estimates only)`,
      `ratio SciPy / rateloom: ${ratio.toFixed(1)}x wall${rateloom.cpuMs && scipy.cpuMs ? `, ${(scipy.cpuMs / rateloom.cpuMs).toFixed(1)}x cpu` : ''}; max relative difference of the estimates ${maxRel.toExponential(2)}`,
    ];
    return { lines, rateloom, scipy, ratio, maxRel };
  } finally {
    rmSync(scratch, { recursive: true, force: true });
  }
}

/**
 * `rateloom demo` as a whole process (check, compare, fit with profiles, three sizings, two liquid
 * fits, every report), written into a scratch folder; `node -e 0` timed beside it in the same run.
 */
export function demoBench(reps: number): { lines: string[]; floor: Timing; demo: Timing } {
  const scratch = mkdtempSync(join(tmpdir(), 'rateloom-bench-'));
  try {
    const [floor, demo] = interleaved([
      { label: 'node -e 0', argv: [process.execPath, '-e', '0'] },
      { label: 'rateloom demo', argv: [process.execPath, BIN, 'demo', '--out', join(scratch, 'demo'), '--force', '--json'] },
    ], reps, scratch);
    return { lines: [floor, demo].map((t) => `${t.label.padEnd(34)} ${ms(t)}`), floor, demo };
  } finally {
    rmSync(scratch, { recursive: true, force: true });
  }
}
