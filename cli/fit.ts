/**
 * `rateloom fit STUDY`: fit the study's rate laws (or one candidate set) to its data; print the
 * parameter table with both interval kinds and units, the statistics and the warnings; write the
 * fitted-kinetics hand-off file and the HTML + Markdown report.
 * Exit code from the fit's verdict (src/estimation/verdict.ts): 0 trustworthy, 1 finished but not
 * to be trusted, 2 bad input.
 */
import { formatTransport } from './transport-text.js';
import type { Command } from 'commander';
import { join } from 'node:path';
import { DEFAULT_VERDICT_RULES, buildHandoff, type StudyFit, fitStudyParallel, AUTO_RULE_TEXT, type WorkersSetting, fitReportData, type Study, crossCheckStudyFit, shownFitParts, criterionText, influentialTable, studyDisplay, shownValue } from '../src/index.js';
import { formatCrossCheck } from './cross-check-text.js';
import { renderFitFiles } from './report-render.js';
import { assertWritable, checkStem, writeAll } from './io.js';
import type { OutputFile } from './output.js';
import { g, table, withUnit } from './format.js';
import { progressReporter, runCommand, toJson } from './run.js';
import { readStudy, studyStem } from './study-input.js';

const EXAMPLE = `
Example:
  rateloom fit datasets-demo/pbr/pbr.study.json --out reports/pbr
  rateloom fit lab/study.json --model adsorption --starts 20 --seed 3 --json > fit.json

Writes <out>/<name>-kinetics.json (the hand-off file for 'rateloom size') and
<out>/<name>-fit.html + .md (the report). Existing files are kept unless --force.
Worker threads (multistart starts and profiles): ${AUTO_RULE_TEXT}
Exit codes: 0 trustworthy (converged after a real search, model evaluated at every run,
positive-definite covariance, no misfit beyond the stated error, every parameter identifiable);
1 the fit finished but must not be trusted (the verdict says which rule failed); 2 bad input.`;

export interface FitFlags {
  model?: string;
  out?: string;
  name?: string;
  profile?: boolean;
  report?: boolean;
  /** Numbers checked against OPTION_RANGES by cli/options.ts before the command runs. */
  starts?: number;
  seed?: number;
  maxIterations?: number;
  level?: number;
  strict?: boolean;
  force?: boolean;
  json?: boolean;
  workers?: WorkersSetting;
  crossCheck?: boolean;
}

/** The --workers option line of a command's help. */
export const WORKERS_OPTION = ['--workers <n>', "worker threads: 'auto' or a number (1 = serial); see below", 'auto'] as const;

/** Human-readable fit summary. */
export function formatFit(study: Study, sf: StudyFit): string {
  const { fit } = sf;
  const s = fit.statistics;
  const shown = shownFitParts(study, fit, sf.derived);
  const L: string[] = [];
  L.push(`Study: ${study.title ?? study.studyPath}`);
  const tref = study.referenceTemperatureApplies === false ? '' : `; reference temperature ${withUnit(shown.referenceTemperature.value, shown.referenceTemperature.unit, 5)} (${study.referenceTemperatureSource === 'data' ? 'picked from the data' : 'from the study'})`;
  L.push(`Rate-law set: ${sf.variant}${tref}`);
  L.push(`Status: ${fit.status} - ${fit.message}`);
  L.push(`Verdict: ${fit.verdict.trustworthy ? 'trustworthy' : 'NOT TRUSTWORTHY'} (${fit.verdict.status})`);
  for (const r of fit.verdict.reasons) L.push(`  - [${r.code}] ${r.message}`);
  L.push(`Observations ${s.n}, free parameters ${s.p}, degrees of freedom ${s.dof}; ${s.iterations} iterations, ${s.evaluations} evaluations`);
  L.push(`Weighted SSR ${g(s.ssr)}; residual std dev ${g(s.residualStdDev)} (in units of sigma); AICc ${criterionText(s.aicc)}; BIC ${criterionText(s.bic)}`);
  const weights = sf.data.weightsOnly?.length ? ` (error model ${sf.data.weightsOnly.join(', ')} gives relative weights only)` : '';
  L.push(`Covariance: ${s.covarianceBasis === 'known-sigma' ? "(J'J)^-1, measurement sigma taken as known; chi-square test of the fit" : `s^2 (J'J)^-1, sigma scale estimated from the residuals${weights}`}`);
  if (s.chiSquarePValue !== null) L.push(`Chi-square: ${g(s.chiSquare)} on ${s.dof} dof, p = ${g(s.chiSquarePValue, 3)} (misfit below p = ${DEFAULT_VERDICT_RULES.misfitPValue})`);
  if (s.lackOfFit) {
    const l = s.lackOfFit;
    L.push(`Lack of fit: F = ${g(l.F)} on (${l.dofLack}, ${l.dofPure}) dof, p = ${g(l.pValue, 3)}${l.pValue < 0.05 ? ' - the rate law misses something the replicates can see' : ' - no evidence of lack of fit'}`);
  }
  const level = fit.parameters[0]?.ci.level ?? 0.95;
  const pc = `${g(level * 100, 3)}%`;
  const rows = [['parameter', 'value', 'std error', `${pc} linear interval`, `${pc} profile interval`, 'unit', 'note']];
  for (const p of shown.parameters) {
    const lin = p.ci.linear ? `[${g(p.ci.linear[0])}, ${g(p.ci.linear[1])}]` : 'n/a';
    const pro = p.ci.profile ? `[${p.ci.profile[0] === null ? 'open' : g(p.ci.profile[0])}, ${p.ci.profile[1] === null ? 'open' : g(p.ci.profile[1])}]` : p.fixed ? '' : 'not computed';
    rows.push([p.name, g(p.value, 5), p.fixed ? 'fixed' : g(p.stdError, 3), p.fixed ? '' : lin, pro, p.unit, p.atBound ? 'at a bound' : '']);
  }
  L.push('', table(rows));
  if (sf.derived.length) {
    const d = [['derived', 'value', 'std error', `${pc} interval`, 'unit', 'definition']];
    for (const q of shown.derived) d.push([q.name, g(q.value, 5), g(q.stdError, 3), q.ci.linear ? `[${g(q.ci.linear[0])}, ${g(q.ci.linear[1])}]` : 'n/a', q.unit, q.definition]);
    L.push('', table(d));
  }
  const c = fit.correlation;
  if (c.matrix && c.names.length > 1) {
    L.push('', 'Correlation of the estimates:');
    L.push(table([['', ...c.names], ...c.matrix.map((r, i) => [c.names[i], ...r.map((v) => v.toFixed(3))])]));
  }
  if (sf.startValues) {
    const sv = sf.startValues;
    L.push('', `Starting values estimated by rateloom (the study gave none); then ${sf.minima ? `a multistart fit (${sf.minima.reduce((n, m) => n + m.count, 0)} starts converged; change with --starts)` : 'a single fit'}:`);
    const display = studyDisplay(study);
    const startRow = (e: (typeof sv.estimated)[number]) => {
      const c = display.parameter(e.name, e.unit);
      return [e.name, g(shownValue(c, e.value), 4), c.unit, e.detail];
    };
    L.push(table([['parameter', 'start', 'unit', 'how'], ...sv.estimated.map(startRow)]));
    for (const n of sv.notes) L.push(`  note: ${n}`);
  }
  if (sf.starts) L.push('', ...formatStarts(sf));
  if (fit.influential.length) L.push('', ...formatInfluential(study, sf));
  if (fit.warnings.length) {
    L.push('', 'Warnings:');
    for (const w of fit.warnings) L.push(`  [${w.code}] ${w.message}`);
  }
  return L.join('\n');
}

/** The influential observations: the count, then a table of the most extreme few. */
function formatInfluential(study: Study, sf: StudyFit): string[] {
  const t = influentialTable(sf.fit, study);
  const head = t.count > t.rows.length ? `Influential observations: ${t.count}; the ${t.rows.length} with the largest |studentized residual|:` : `Influential observations: ${t.count}:`;
  const rows = [['run', 'response', 'CSV line', 'studentized residual', "Cook's distance", 'moves the estimates']];
  for (const r of t.rows) rows.push([r.runId, r.response, r.line, g(r.studentizedResidual, 3), g(r.cooksDistance, 3), r.movesEstimates ? 'yes' : 'little']);
  return [head, table(rows)];
}

/** The multistart: every start with its end SSR, status and the minimum it reached. */
function formatStarts(sf: StudyFit): string[] {
  const starts = sf.starts ?? [];
  const minima = sf.minima ?? [];
  const L = [`Multistart: ${starts.length} starts (start 0 is the given values; the others are a Latin hypercube, see --starts); ${minima.length} distinct minim${minima.length === 1 ? 'um' : 'a'} (weighted SSR): ${minima.map((m) => `${g(m.ssr, 6)} (${m.count} starts)`).join(', ') || 'none'}`];
  const rows = [['start', 'end SSR', 'status', 'iterations', 'minimum']];
  for (const r of starts) rows.push([String(r.index), g(r.ssr, 6), r.status, String(r.iterations), r.minimum === null ? 'not chosen' : `#${r.minimum + 1}`]);
  L.push(table(rows));
  return L;
}

export function registerFit(program: Command): void {
  program
    .command('fit')
    .description('Fit the rate laws of a study to its data, with confidence intervals; write the hand-off file and the report')
    .argument('<study>', 'study file (JSON)')
    .option('--model <name>', "rate-law set to fit: 'base' or a candidate name", 'base')
    .option('--out <dir>', 'folder for the hand-off file and the report', 'reports')
    .option('--name <stem>', 'file-name stem of the outputs (default: from the study file name)')
    .option('--no-profile', 'skip the profile-likelihood intervals')
    .option('--no-report', 'skip the HTML and Markdown report')
    .option('--starts <n>', 'multistart: Latin-hypercube starts in addition to the given start (default 0, or 20 when a starting value was estimated)')
    .option('--seed <n>', 'seed of the multistart design', '1')
    .option('--max-iterations <n>', 'largest number of accepted solver steps per start (default 200)')
    .option('--level <p>', 'confidence level of the intervals', '0.95')
    .option('--strict', 'fail on any rejected data row')
    .option('--force', 'overwrite existing output files')
    .option('--json', 'print one JSON document (the fit result) on stdout')
    .option(...WORKERS_OPTION)
    .option('--cross-check', 're-solve the optimum with ml-levenberg-marquardt and re-integrate every run with odex; print the agreement (docs/cross-check.md)')
    .addHelpText('after', EXAMPLE)
    .action(async (studyPath: string, flags: FitFlags) => {
      await runCommand(!!flags.json, async () => {
        const { starts, maxIterations, seed = 1, level = 0.95, workers = 'auto' } = flags;
        const stem = flags.name !== undefined ? checkStem(flags.name) : studyStem(studyPath);
        const outDir = flags.out ?? 'reports';
        const planned = [join(outDir, `${stem}-kinetics.json`), ...(flags.report !== false ? [join(outDir, `${stem}-fit.html`), join(outDir, `${stem}-fit.md`)] : [])];
        const { study, report } = readStudy(studyPath, !!flags.strict);
        assertWritable(planned, { force: !!flags.force });
        const progress = progressReporter(!!flags.json, 'multistart');
        const profileProgress = progressReporter(!!flags.json, 'profile intervals');
        const sf = await fitStudyParallel(study, { variant: flags.model ?? 'base', profile: flags.profile !== false, ...(starts !== undefined ? { starts } : {}), ...(maxIterations !== undefined ? { maxIterations } : {}), seed, level, workers, ...(progress ? { progress } : {}), ...(profileProgress ? { profileProgress } : {}) });
        const crossCheck = flags.crossCheck ? crossCheckStudyFit(study, sf) : undefined;
        const handoff = buildHandoff(study, sf);
        // Everything is rendered first, then written together: a kill or a failure leaves no partial set.
        const files: OutputFile[] = [{ path: planned[0], content: toJson(handoff) + '\n' }];
        if (flags.report !== false) files.push(...(await renderFitFiles(fitReportData(study, sf), { outDir, baseName: `${stem}-fit` })).files);
        const paths = writeAll(files, { force: !!flags.force });
        const handoffPath = paths[0];
        const reportPaths = flags.report !== false ? { html: paths[1], markdown: paths[2] } : undefined;
        const trustworthy = sf.fit.verdict.trustworthy;
        const shown = shownFitParts(study, sf.fit, sf.derived);
        return {
          trustworthy,
          json: {
            status: sf.fit.status,
            success: sf.fit.success,
            message: sf.fit.message,
            verdict: sf.fit.verdict,
            model: sf.variant,
            displayUnits: shown.displayUnits,
            referenceTemperature: shown.referenceTemperature,
            fit: { ...sf.fit, parameters: shown.parameters, observations: shown.observations },
            derived: shown.derived,
            ...(sf.minima ? { minima: sf.minima } : {}),
            ...(sf.starts ? { starts: sf.starts } : {}),
            ...(sf.startValues ? { startValues: { estimated: sf.startValues.estimated, points: sf.startValues.points, notes: sf.startValues.notes } } : {}),
            ...(sf.transport ? { transport: sf.transport } : {}),
            ...(sf.steadyStates ? { steadyStates: sf.steadyStates } : {}),
            ...(sf.roundOff ? { roundOff: sf.roundOff } : {}),
            ...(crossCheck ? { crossCheck } : {}),
            data: { rowsIn: report.rowsIn, rowsUsed: report.rowsUsed, rowsRejected: report.rowsRejected },
            outputs: { handoff: handoffPath, ...(reportPaths ?? {}) },
          },
          text: formatFit(study, sf) + (sf.transport ? `\n\n${formatTransport(sf.transport)}` : '') + (crossCheck ? `\n\n${formatCrossCheck(crossCheck)}` : ''),
        };
      });
    });
}
