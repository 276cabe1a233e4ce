/**
 * `rateloom compare STUDY`: fit every rate-law set of the study (its own and each candidate) and
 * rank them: SSR, degrees of freedom, AICc, BIC, Akaike weights and F tests for declared nested
 * pairs, saying which the data support and which they cannot tell apart. Writes the report of the
 * best-supported set with the rival-model table.
 * Exit 0 ranked with a trustworthy best fit, 1 the best-ranked fit is not trustworthy (its verdict), 2 bad input.
 */
import type { Command } from 'commander';
import { compareStudyParallel, AUTO_RULE_TEXT, fitReportData, type Comparison, type WorkersSetting, shownParameters, studyDisplay, criterionText, criterionDeltaText } from '../src/index.js';
import { WORKERS_OPTION } from './fit.js';
import { join } from 'node:path';
import { writeFitReport } from './report-render.js';
import { assertWritable, checkStem } from './io.js';
import { g, table } from './format.js';
import { progressReporter, runCommand } from './run.js';
import { readStudy, studyStem } from './study-input.js';

const EXAMPLE = `
Example:
  rateloom compare datasets-demo/pbr/pbr.study.json --out reports/pbr

The study lists rival rate-law sets under "candidates"; each replaces the rate laws of some
reactions and may bring its own parameters. Akaike weights say how strongly the data prefer each
set; sets within 2 AICc units of the best cannot be told apart by these data.
Worker threads (multistart starts of a set whose starting values rateloom estimates): ${AUTO_RULE_TEXT}
Exit codes: 0 ranked and the best fit trustworthy, 1 the best-ranked fit is not trustworthy
(its verdict says why), 2 bad input.`;

export function formatComparison(c: Comparison): string {
  const L: string[] = [];
  const crit = c.criterion === 'aicc' ? 'AICc' : 'AIC';
  const rows = [['rank', 'rate-law set', 'weighted SSR', 'params', 'dof', crit, `delta ${crit}`, 'Akaike weight', 'ranked', 'verdict']];
  for (const r of c.ranking) {
    rows.push([String(r.rank), r.name, g(r.ssr, 5), String(r.p), String(r.dof), criterionText(r.criterion), criterionDeltaText(r.criterion, c.ranking[0].criterion), g(r.akaikeWeight, 3), r.converged ? 'yes' : 'no', r.verdict]);
  }
  L.push(table(rows));
  for (const t of c.nestedTests) {
    L.push(`Nested test ${t.simpler} inside ${t.larger}: ${t.test} = ${g(t.statistic)} (dof ${t.dof1}${t.dof2 !== null ? `, ${t.dof2}` : ''}), p = ${g(t.pValue, 3)}${t.largerSignificantlyBetter ? ' - the larger set fits significantly better' : ' - the extra terms are not needed'}`);
  }
  L.push('', c.verdict);
  for (const w of c.warnings) L.push(`warning [${w.code}] ${w.message}`);
  return L.join('\n');
}

interface CompareFlags {
  out?: string;
  name?: string;
  report?: boolean;
  strict?: boolean;
  force?: boolean;
  json?: boolean;
  workers?: WorkersSetting;
}

export function registerCompare(program: Command): void {
  program
    .command('compare')
    .description('Fit every candidate rate-law set of a study and rank them')
    .argument('<study>', 'study file (JSON)')
    .option('--out <dir>', 'folder for the report', 'reports')
    .option('--name <stem>', 'file-name stem of the report (default: from the study file name)')
    .option('--no-report', 'skip the HTML and Markdown report')
    .option('--strict', 'fail on any rejected data row')
    .option('--force', 'overwrite existing output files')
    .option('--json', 'print one JSON document on stdout')
    .option(...WORKERS_OPTION)
    .addHelpText('after', EXAMPLE)
    .action(async (studyPath: string, flags: CompareFlags) => {
      await runCommand(!!flags.json, async () => {
        const workers = flags.workers ?? 'auto';
        const stem = flags.name !== undefined ? checkStem(flags.name) : studyStem(studyPath);
        const outDir = flags.out ?? 'reports';
        const { study } = readStudy(studyPath, !!flags.strict);
        if (flags.report !== false) assertWritable([join(outDir, `${stem}-compare.html`), join(outDir, `${stem}-compare.md`)], { force: !!flags.force });
        const progress = progressReporter(!!flags.json, 'fitting rival rate laws');
        const { fits, comparison } = await compareStudyParallel(study, { profile: false, workers, ...(progress ? { progress } : {}) });
        const best = fits.find((f) => f.variant === comparison.ranking[0].name)!;
        let reportPaths: { html: string; markdown: string } | undefined;
        if (flags.report !== false) {
          const r = await writeFitReport(fitReportData(study, best, comparison), { outDir, baseName: `${stem}-compare`, force: !!flags.force });
          reportPaths = { html: r.html, markdown: r.markdown };
        }
        return {
          trustworthy: comparison.ranking[0].converged && best.fit.verdict.trustworthy,
          json: {
            status: !comparison.ranking[0].converged ? 'best-not-converged' : best.fit.verdict.trustworthy ? 'ranked' : 'best-not-trustworthy',
            verdict: best.fit.verdict,
            comparison,
            displayUnits: studyDisplay(study).units,
            fits: fits.map((f) => ({ model: f.variant, status: f.fit.status, verdict: f.fit.verdict, parameters: shownParameters(studyDisplay(study), f.fit.parameters), statistics: f.fit.statistics })),
            ...(reportPaths ? { outputs: reportPaths } : {}),
          },
          text: formatComparison(comparison),
        };
      });
    });
}
