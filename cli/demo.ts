/**
 * `rateloom demo [--out DIR] [--force] [--json]`: the whole workflow on the invented demo data in
 * datasets-demo/ — check the pilot packed-bed data, rank the rival rate laws, fit the chosen one
 * with confidence intervals, size two production cases (one inside the data range, one that
 * extrapolates), fit the liquid batch and stirred-tank studies, and write every report plus one
 * index page. Calls the same library functions as check, compare, fit and size.
 *
 * Overwriting: the demo owns its output folder. It writes a marker file (.rateloom-demo) there and
 * replaces its own files on a later run; a folder that exists, is not empty and has no marker is
 * refused unless --force. Files the demo does not write are never touched or deleted.
 * Exit 0 every fit converged and the in-range case was sized, 1 otherwise, 2 bad input.
 */
import { writeLines } from './stderr-lines.js';
import type { Command } from 'commander';
import { existsSync, readdirSync } from 'node:fs';
import { join, relative, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { RateloomError, summarizeStudy, type StudySummary, applyParameterValues, type Study, type ValidationReport, buildHandoff, type StudyFit, compareStudyParallel, fitStudyParallel, sizeReactorParallel, AUTO_RULE_TEXT, type WorkersSetting, fitReportData, sizingReportData, type Comparison, parseHandoff, kineticsFromHandoff, loadCase, type SizingResult, criterionText, criterionDeltaText } from '../src/index.js';
import { formatCheck } from './check.js';
import { formatComparison } from './compare.js';
import { formatFit, WORKERS_OPTION } from './fit.js';
import { formatSizing } from './size.js';
import { g } from './format.js';
import { readJson, writeAtomic } from './io.js';
import { writeFitReport, writeSizingReport } from './report-render.js';
import { runCommand, toJson } from './run.js';
import { readStudy } from './study-input.js';

/**
 * datasets-demo/ of this checkout or package: beside cli/ when run from source, two levels up when
 * run compiled from dist/cli/.
 */
export const DEMO_DATA_DIR = fileURLToPath(new URL(/\/dist\/cli\/[^/]*$/.test(import.meta.url) ? '../../datasets-demo/' : '../datasets-demo/', import.meta.url));
const MARKER = '.rateloom-demo';
/**
 * The production cases the demo sizes (datasets-demo/pbr/<name>.case.json): the cooled multitubular
 * plant (energy balance), its adiabatic variant, and the hotter isothermal option that extrapolates.
 */
export const DEMO_CASES = ['plant', 'plant-adiabatic', 'hot'] as const;

export interface DemoOptions {
  /** Output folder; default 'reports/demo'. */
  outDir?: string;
  /** Write into a non-empty folder without the demo marker; default false. */
  force?: boolean;
  /** Folder with the demo data; default datasets-demo/ of this checkout. */
  dataDir?: string;
  /** Also fit the batch and stirred-tank studies; default true. */
  liquids?: boolean;
  /** Monte Carlo draws of each sizing; default: the case files' value. */
  draws?: number;
  /** Progress lines (one per step), for the terminal; default none. */
  log?: (line: string) => void;
  /** Worker threads for profiles, multistart and Monte Carlo (1 = serial); default 'auto' (src/parallel/auto.ts). */
  workers?: WorkersSetting;
}

/** A fitted parameter next to the recorded true value of the generator. */
export interface ParameterVsTruth {
  name: string;
  unit: string;
  fitted: number;
  truth: number;
  linear: [number, number] | null;
  profile: [number | null, number | null] | null;
  /** The true value lies inside the linear (and, where computed, profile) 95% interval. */
  covered: boolean;
}

export interface DemoStudyResult {
  study: string;
  status: string;
  converged: boolean;
  parameters: ParameterVsTruth[];
  report: { html: string; markdown: string };
}

export interface DemoResult {
  outDir: string;
  seconds: number;
  check: { rowsIn: number; rowsUsed: number; rowsRejected: number; rejections: { line: number; reason: string; message: string }[]; replicateGroups: number; observations: number; degreesOfFreedom: number };
  comparison: { best: string; ranking: { name: string; criterion: number | null; delta: number | null; weight: number | null; converged: boolean }[]; verdict: string; report: { html: string; markdown: string } };
  fit: DemoStudyResult & { handoff: string; lackOfFitP: number | null };
  sizing: { case: string; status: string; success: boolean; size: number | null; unit: string | null; p90: number | null; p95: number | null; thermal: string | null; warnings: string[]; cautions: string[]; report: { html: string; markdown: string }; json: string }[];
  liquids: DemoStudyResult[];
  index: string;
  /** Every file written, absolute. */
  files: string[];
  /** Narrated summary (the text the command prints). */
  text: string;
}

/** Refuse a foreign non-empty output folder unless forced; then mark it as the demo's. */
function claimOutDir(outDir: string, force: boolean): void {
  if (existsSync(outDir) && !existsSync(join(outDir, MARKER)) && readdirSync(outDir).length > 0 && !force) {
    throw new RateloomError('E_EXISTS', `output folder '${outDir}' is not empty and was not written by the demo`, {
      location: { file: outDir },
      fix: 'Choose another folder with --out, or pass --force to write the demo files into it (other files are left alone).',
    });
  }
  writeAtomic(join(outDir, MARKER), 'This folder holds the outputs of `rateloom demo`; a later demo run replaces them.\n', { force: true });
}

function vsTruth(study: Study, sf: StudyFit, truth: Record<string, { value: number; unit: string }>, file: string): ParameterVsTruth[] {
  const trueParams = applyParameterValues(study.parameters, truth, file);
  return sf.fit.parameters.map((p) => {
    const t = trueParams.find((q) => q.name === p.name)?.value ?? NaN;
    const lin = p.ci.linear;
    const pro = p.ci.profile ?? null;
    const inLin = !!lin && t >= lin[0] && t <= lin[1];
    const inPro = !pro || ((pro[0] === null || t >= pro[0]) && (pro[1] === null || t <= pro[1]));
    return { name: p.name, unit: p.unit, fitted: p.value, truth: t, linear: lin, profile: pro, covered: inLin && inPro };
  });
}

const esc = (s: string) => s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;');

function indexPage(r: Omit<DemoResult, 'index' | 'files' | 'text' | 'seconds'>, outDir: string, summary: string): string {
  const link = (abs: string, label: string) => `<a href="${esc(relative(outDir, abs))}">${esc(label)}</a>`;
  const items = [
    `<li>${link(r.comparison.report.html, 'Rival rate laws')} — ranking of the packed-bed rate-law sets (best: ${esc(r.comparison.best)})</li>`,
    `<li>${link(r.fit.report.html, 'Packed-bed fit')} — parameters with linear and profile-likelihood intervals, parity and residual charts; hand-off ${link(r.fit.handoff, 'pbr-kinetics.json')}</li>`,
    ...r.sizing.map((s) => `<li>${link(s.report.html, `Sizing: ${s.case}`)} (${esc(s.status)})</li>`),
    ...r.liquids.map((l) => `<li>${link(l.report.html, `Fit: ${l.study}`)}</li>`),
  ];
  return `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><title>rateloom demo</title>
<style>body{font-family:system-ui,sans-serif;max-width:60rem;margin:2rem auto;padding:0 1rem;line-height:1.45}pre{background:#f5f5f5;padding:1rem;overflow-x:auto;font-size:.85rem}</style>
</head><body>
<h1>rateloom demo</h1>
<p>Invented data (datasets-demo/): a pilot packed bed for ethylene hydration with an ether side reaction, a liquid batch esterification and a liquid stirred tank. The data were generated from recorded true parameter values (datasets-demo/truth.json), so the fitted values can be checked against the truth.</p>
<h2>Reports</h2>
<ul>
${items.join('\n')}
</ul>
<h2>Summary</h2>
<pre>${esc(summary)}</pre>
</body></html>
`;
}

/** Run the demo in-process; writes the reports and returns what happened. */
export async function runDemo(options: DemoOptions = {}): Promise<DemoResult> {
  const t0 = performance.now();
  const run = startDemo(options);
  const { study, report, summary } = checkPilotData(run);
  const comparison = await compareRateLaws(run, study);
  const fit = await fitBestRateLaw(run, study, comparison.best);
  const sizing = await sizeDemoCases(run, fit.handoffText);
  const liquids = options.liquids !== false ? await fitLiquidStudies(run) : [];
  const base = {
    outDir: run.outDir,
    check: {
      rowsIn: report.rowsIn,
      rowsUsed: report.rowsUsed,
      rowsRejected: report.rowsRejected,
      rejections: report.rejections.map((r) => ({ line: r.line, reason: r.reason, message: r.message })),
      replicateGroups: report.replicateGroups.length,
      observations: summary.observations,
      degreesOfFreedom: summary.degreesOfFreedom,
    },
    comparison,
    fit: fit.result,
    sizing,
    liquids,
  };
  const rel = (p: string) => relative(process.cwd(), p) || '.';
  const text = narrate(base, study, report, rel);
  const index = run.write('index.html', indexPage(base, run.outDir, text));
  const seconds = (performance.now() - t0) / 1000;
  return { ...base, index, files: run.files, seconds, text: `${text}\n\nDemo finished in ${g(seconds, 3)} s. Open ${rel(index)} for all reports.` };
}

/** Recorded true values of the generator per study (datasets-demo/truth.json). */
type DemoTruth = Record<string, { study: string; parameters: Record<string, { value: number; unit: string }> }>;

/** What every step of the demo shares: the folders, the settings and the files written so far. */
interface DemoRun {
  dataDir: string;
  outDir: string;
  log: (line: string) => void;
  workers: WorkersSetting;
  /** Monte Carlo draws of each sizing (undefined: the case file's). */
  draws: number | undefined;
  truth: DemoTruth;
  /** Every file written, absolute, in writing order. */
  files: string[];
  /** Write a file into the output folder (replacing the demo's own) and record it; returns its path. */
  write: (name: string, content: string) => string;
}

/** Claim the output folder, read the truth file. */
function startDemo(options: DemoOptions): DemoRun {
  const dataDir = resolve(options.dataDir ?? DEMO_DATA_DIR);
  const outDir = resolve(options.outDir ?? 'reports/demo');
  claimOutDir(outDir, !!options.force);
  const files = [join(outDir, MARKER)];
  const write = (name: string, content: string) => {
    const path = writeAtomic(join(outDir, name), content, { force: true });
    files.push(path);
    return path;
  };
  const truth = readJson(join(dataDir, 'truth.json'), 'truth file') as DemoTruth;
  return { dataDir, outDir, log: options.log ?? (() => {}), workers: options.workers ?? 'auto', draws: options.draws, truth, files, write };
}

/** Record a written report's HTML and Markdown files; returns their paths. */
function keepReport(run: DemoRun, r: { html: string; markdown: string }): { html: string; markdown: string } {
  run.files.push(r.html, r.markdown);
  return { html: r.html, markdown: r.markdown };
}

/** 1. check: read and validate the pilot packed-bed data. */
function checkPilotData(run: DemoRun): { study: Study; report: ValidationReport; summary: StudySummary } {
  run.log('1/5 check: reading the pilot packed-bed data ...');
  const { study, report } = readStudy(join(run.dataDir, 'pbr', 'pbr.study.json'));
  const summary = summarizeStudy(study, report);
  run.write('pbr-check.txt', formatCheck(summary, report) + '\n');
  return { study, report, summary };
}

/** 2. compare: fit the rival rate-law sets and rank them. */
async function compareRateLaws(run: DemoRun, study: Study): Promise<DemoResult['comparison']> {
  run.log('2/5 compare: fitting the three rival rate-law sets ...');
  const cmp = await compareStudyParallel(study, { profile: false, workers: run.workers });
  const comparison: Comparison = cmp.comparison;
  const best = comparison.ranking[0].name;
  const bestFit = cmp.fits.find((f) => f.variant === best)!;
  const report = keepReport(run, await writeFitReport(fitReportData(study, bestFit, comparison), { outDir: run.outDir, baseName: 'pbr-compare', force: true }));
  run.write('pbr-compare.txt', formatComparison(comparison) + '\n');
  return {
    best,
    ranking: comparison.ranking.map((r) => ({ name: r.name, criterion: r.criterion, delta: r.delta, weight: r.akaikeWeight, converged: r.converged })),
    verdict: comparison.verdict,
    report,
  };
}

/** 3. fit the best-supported set with profile intervals and write the hand-off file. */
async function fitBestRateLaw(run: DemoRun, study: Study, best: string): Promise<{ result: DemoResult['fit']; handoffText: string }> {
  run.log(`3/5 fit: '${best}' with profile-likelihood intervals ...`);
  const sf = await fitStudyParallel(study, { variant: best, profile: true, workers: run.workers });
  const handoffText = toJson(buildHandoff(study, sf)) + '\n';
  const handoff = run.write('pbr-kinetics.json', handoffText);
  const report = keepReport(run, await writeFitReport(fitReportData(study, sf), { outDir: run.outDir, baseName: 'pbr-fit', force: true }));
  run.write('pbr-fit.txt', formatFit(study, sf) + '\n');
  return {
    result: {
      study: study.title ?? 'packed bed',
      status: sf.fit.status,
      converged: sf.fit.success,
      parameters: vsTruth(study, sf, run.truth.pbr.parameters, 'truth.json'),
      report,
      handoff,
      lackOfFitP: sf.fit.statistics.lackOfFit?.pValue ?? null,
    },
    handoffText,
  };
}

/** 4. size the production cases from the hand-off file as written. */
async function sizeDemoCases(run: DemoRun, handoffText: string): Promise<DemoResult['sizing']> {
  run.log('4/5 size: production cases with Monte Carlo uncertainty ...');
  const h = parseHandoff(JSON.parse(handoffText));
  const dk = kineticsFromHandoff(h);
  const sizing: DemoResult['sizing'] = [];
  for (const name of DEMO_CASES) {
    const caseRaw = readJson(join(run.dataDir, 'pbr', `${name}.case.json`), 'case file');
    const kase = loadCase(caseRaw, dk.kinetics.speciesNames, dk.kinetics.reactionIds);
    const result: SizingResult = await sizeReactorParallel(
      {
        handoff: h,
        kinetics: dk.kinetics,
        kase,
        ...(dk.molarMasses ? { molarMasses: dk.molarMasses } : {}),
        options: run.draws !== undefined ? { draws: run.draws } : {},
      },
      { handoff: JSON.parse(handoffText), case: caseRaw },
      { workers: run.workers },
    );
    const json = run.write(`${name}-sizing.json`, toJson(result) + '\n');
    run.write(`${name}-sizing.txt`, formatSizing(result) + '\n');
    const report = keepReport(run, await writeSizingReport(sizingReportData(result), { outDir: run.outDir, baseName: `${name}-sizing`, force: true }));
    sizing.push(sizingLine(result, report, json));
  }
  return sizing;
}

/** The demo's summary of one sizing (its cautions and warnings kept whole). */
function sizingLine(result: SizingResult, report: { html: string; markdown: string }, json: string): DemoResult['sizing'][number] {
  const pct = (l: number) => result.uncertainty?.percentiles.find((p) => Math.abs(p.level - l) < 1e-9)?.value ?? null;
  return {
    case: result.case,
    status: result.status,
    success: result.success,
    size: result.size?.value ?? null,
    unit: result.size?.unit ?? null,
    p90: pct(0.9),
    p95: pct(0.95),
    thermal: thermalLine(result),
    warnings: result.warnings.map((x) => `[${x.code}] ${x.message}`),
    cautions: result.cautions,
    report,
    json,
  };
}

/** 5. fit the liquid batch and stirred-tank studies. */
async function fitLiquidStudies(run: DemoRun): Promise<DemoStudyResult[]> {
  run.log('5/5 fit: liquid batch and stirred-tank studies ...');
  const liquids: DemoStudyResult[] = [];
  for (const key of ['batch', 'cstr']) {
    const ls = readStudy(join(run.dataDir, run.truth[key].study)).study;
    const lf = await fitStudyParallel(ls, { profile: true, workers: run.workers });
    const report = keepReport(run, await writeFitReport(fitReportData(ls, lf), { outDir: run.outDir, baseName: `${key}-fit`, force: true }));
    run.write(`${key}-fit.txt`, formatFit(ls, lf) + '\n');
    liquids.push({ study: ls.title ?? key, status: lf.fit.status, converged: lf.fit.success, parameters: vsTruth(ls, lf, run.truth[key].parameters, 'truth.json'), report });
  }
  return liquids;
}

/** One line on the energy-balance design of a sizing (null for an isothermal case). */
function thermalLine(r: SizingResult): string | null {
  const th = r.thermal;
  if (!th) return null;
  const d = th.design;
  const margin = th.runaway?.margin;
  return `${th.mode}: ${d.count} tubes x ${g(d.innerDiameter * 1000, 3)} mm x ${g(d.length, 3)} m, binding ${d.binding}${d.met ? '' : ' (NOT MET)'}; hot spot ${g(th.hotSpot.temperature, 4)} K (limit ${th.hotSpot.limit === null ? 'none' : `${g(th.hotSpot.limit, 4)} K`})` +
    (margin !== undefined && margin !== null ? `; runaway margin ${g(margin, 3)} K` : '');
}

function fmtTruthTable(ps: ParameterVsTruth[]): string[] {
  return ps.map((p) => {
    const ci = p.linear ? `[${g(p.linear[0])}, ${g(p.linear[1])}]` : 'n/a';
    return `    ${p.name.padEnd(4)} fitted ${g(p.fitted, 5).padStart(11)}  95% ${ci.padEnd(24)} true ${g(p.truth, 4).padStart(9)} ${p.unit === '1' ? '' : p.unit}${p.covered ? '' : '  <- true value outside the interval'}`;
  });
}

function narrate(r: Omit<DemoResult, 'index' | 'files' | 'text' | 'seconds'>, study: Study, report: ValidationReport, rel: (p: string) => string): string {
  const L: string[] = [];
  L.push('rateloom demo: invented ethylene hydration C2H4 + H2O <=> EtOH (side reaction 2 EtOH -> DEE + H2O) in a pilot packed bed.');
  L.push('');
  L.push(`1. check  ${r.check.rowsIn} rows read, ${r.check.rowsUsed} used, ${r.check.rowsRejected} rejected; ${r.check.observations} observations, ${r.check.degreesOfFreedom} degrees of freedom; ${r.check.replicateGroups} replicate group(s).`);
  for (const x of report.rejections) L.push(`         rejected ${x.file}:${x.line}${x.column ? `:${x.column}` : ''} (${x.reason}): ${x.message}`);
  L.push(`2. compare  ${r.comparison.ranking.map((x) => `${x.name} (AICc ${criterionText(x.criterion)}, delta ${criterionDeltaText(x.criterion, r.comparison.ranking[0].criterion)}, weight ${g(x.weight, 2)})`).join('; ')}`);
  L.push(`         ${r.comparison.verdict}`);
  L.push(`3. fit  '${r.comparison.best}': ${r.fit.status}; lack-of-fit p = ${r.fit.lackOfFitP === null ? 'n/a' : g(r.fit.lackOfFitP, 3)} (replicates). Fitted vs the recorded truth of the generator (SI units):`);
  L.push(...fmtTruthTable(r.fit.parameters));
  L.push(`         reference temperature ${g(study.referenceTemperature, 4)} K; hand-off file ${rel(r.fit.handoff)}`);
  for (const s of r.sizing) {
    L.push(`4. size  ${s.case}: ${s.status}${s.size !== null ? `, ${g(s.size, 4)} ${s.unit} catalyst (nominal), P90 ${g(s.p90 ?? NaN, 4)}, P95 ${g(s.p95 ?? NaN, 4)} ${s.unit}` : ''}`);
    if (s.thermal) L.push(`         ${s.thermal}`);
    for (const w of s.warnings.filter((x) => x.startsWith('[W_EXTRAPOLATION]'))) L.push(`         ${w}`);
  }
  if (r.sizing.length) {
    L.push('         CAUTIONS for every size above:');
    for (const c of r.sizing[0].cautions) L.push(`         * ${c}`);
  }
  for (const l of r.liquids) {
    L.push(`5. fit  ${l.study}: ${l.status}`);
    L.push(...fmtTruthTable(l.parameters));
  }
  L.push('');
  L.push(`Reports in ${rel(r.fit.report.html).replace(/[^/\\]*$/, '')}: index.html, pbr-compare.html, pbr-fit.html, ${DEMO_CASES.map((c) => `${c}-sizing.html`).join(', ')}${r.liquids.length ? ', batch-fit.html, cstr-fit.html' : ''} (each with a .md twin).`);
  return L.join('\n');
}

export function registerDemo(program: Command): void {
  program
    .command('demo')
    .description('Run check, compare, fit, size and the reports on the invented demo data (datasets-demo/)')
    .option('--out <dir>', 'output folder (the demo replaces its own earlier outputs there)', 'reports/demo')
    .option('--force', 'write into a non-empty folder that the demo did not create')
    .option('--no-liquids', 'skip the batch and stirred-tank fits')
    .option('--json', 'print one JSON document')
    .option(...WORKERS_OPTION)
    .addHelpText(
      'after',
      `
Example:
  npm run demo
  rateloom demo --out /tmp/rateloom-demo --json > demo.json

The data are invented (datasets-demo/README.md); the true parameter values are recorded in
datasets-demo/truth.json, and the demo prints the fitted values beside them.
Worker threads (profiles, multistart, Monte Carlo): ${AUTO_RULE_TEXT}
Exit codes: 0 all fits converged and the in-range case was sized, 1 otherwise, 2 bad input.`,
    )
    .action(async (flags: { out?: string; force?: boolean; liquids?: boolean; json?: boolean; workers?: WorkersSetting }) => {
      await runCommand(!!flags.json, async () => {
        const workers = flags.workers ?? 'auto';
        const r = await runDemo({
          workers,
          outDir: flags.out ?? 'reports/demo',
          force: !!flags.force,
          liquids: flags.liquids !== false,
          ...(!flags.json && process.stderr.isTTY ? { log: (l: string) => writeLines(process.stderr, l) } : {}),
        });
        const trustworthy = r.fit.converged && r.liquids.every((l) => l.converged) && r.sizing[0]?.success === true;
        const { text, ...json } = r;
        return { json: { status: trustworthy ? 'ok' : 'untrustworthy', ...json }, text, trustworthy };
      });
    });
}

