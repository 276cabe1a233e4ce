/**
 * `rateloom plan STUDY --limits FILE --runs N [--mode precision|discrimination] [--criterion D|Ds|A]
 * [--subset E1,E2] [--draws K] [--out FILE.csv] [--json]`: fit the study (or every rival rate-law
 * set), then propose the next N lab runs inside the limits: the CSV in the study's own layout
 * (measured columns empty), why each run, and the expected precision (or model probabilities)
 * after them. Exit 0 planned on a trustworthy fit, 1 planned but not to be trusted (fit not
 * trustworthy, fewer runs than asked, no runnable candidate), 2 bad input.
 */
import type { Command } from 'commander';
import { basename, dirname, join } from 'node:path';
import { RateloomError, VERSION, checkDistinctRivals, renderPlanReport, fitStudy, studyVariants, parseLimits, planRuns, type PlanOptions, type PlanResult, type CriterionKind } from '../src/index.js';
import { assertWritable, readJson, writeAll } from './io.js';
import { runCommand } from './run.js';
import { readStudy, studyStem } from './study-input.js';
import { g, table, withUnit } from './format.js';

const EXAMPLE = `
Example:
  rateloom plan datasets-demo/pbr/pbr.study.json --limits datasets-demo/pbr/lab.limits.json --runs 8
  rateloom plan datasets-demo/pbr/pbr.study.json --limits datasets-demo/pbr/lab.limits.json --runs 8 --criterion Ds --subset E1,E2
  rateloom plan datasets-demo/pbr/pbr.study.json --limits datasets-demo/pbr/lab.limits.json --runs 4 --mode discrimination

The limits file (schema/limits.schema.json) names the run conditions to vary as in the study's
column mapping, with min, max and unit, and what the lab cannot reach:
  { "factors": { "temperature": { "min": 190, "max": 260, "unit": "degC" },
                 "feed": { "H2O": { "min": 1, "max": 4, "unit": "mmol/min" } } },
    "levels": 5, "minSpacing": 0.1, "maxConversion": 0.6 }
Exit codes: 0 planned on a trustworthy fit, 1 planned but not to be trusted, 2 bad input.`;

interface PlanFlags {
  limits: string;
  /** Numbers checked against OPTION_RANGES by cli/options.ts before the command runs. */
  runs: number;
  mode?: string;
  criterion?: string;
  subset?: string;
  discrimination?: string;
  model?: string;
  draws?: number;
  posteriorDraws?: number;
  seed?: number;
  level?: number;
  out?: string;
  force?: boolean;
  report?: boolean;
  json?: boolean;
}

export function formatPlan(r: PlanResult, csvPath: string): string {
  const L: string[] = [];
  L.push(`Plan (${r.mode}, ${r.criterion}${r.subset ? ` on ${r.subset.join(', ')}` : ''}${r.draws ? `, averaged over ${r.draws} parameter draws` : ', local at the estimate'}): ${r.status} - ${r.message}`);
  L.push(`Candidates: ${r.candidates.count} on the grid, ${r.candidates.usable} runnable${r.candidates.excluded.map((e) => `; ${e.count} excluded: ${e.reason}`).join('')}`);
  L.push('', `Proposed runs (written to ${csvPath}):`);
  for (const run of r.runs) {
    L.push(`  ${run.id}: ${run.conditions.filter((c) => c.varied).map((c) => `${c.column} ${withUnit(c.shown, c.shownUnit)}`).join(', ')}${run.predictedConversion !== null ? `; predicted conversion ${g(100 * run.predictedConversion, 3)} %` : ''}`);
    L.push(`      ${run.reason}`);
  }
  if (r.precision.length) {
    L.push('', `Expected precision of '${r.model}' (${Math.round(100 * r.level)} % linear intervals, SI):`);
    L.push(table([['parameter', 'value', 'std. error now', 'after', 'interval width now', 'after', 'shrink'], ...r.precision.map((p) => [p.name, withUnit(p.value, p.unit), withUnit(p.stdErrorNow, p.unit, 3), withUnit(p.stdErrorAfter, p.unit, 3), withUnit(p.widthNow, p.unit, 3), withUnit(p.widthAfter, p.unit, 3), p.shrink === null ? 'n/a' : `${g(100 * p.shrink, 3)} %`])]));
  }
  if (r.discrimination) {
    const d = r.discrimination;
    L.push('', `Model probabilities (Akaike weight now; expected posterior after the planned runs if the model is true, ${d.draws} simulated outcomes):`);
    L.push(table([['model', 'now', 'expected if true'], ...d.models.map((m) => [m.model, g(m.now, 3), g(m.expectedIfTrue, 3)])]));
  }
  for (const w of r.warnings) L.push(`warning [${w.code}]: ${w.message}`);
  return L.join('\n');
}

function planOptions(flags: PlanFlags): PlanOptions {
  const { runs, draws, posteriorDraws, seed, level } = flags;
  const mode = flags.mode ?? 'precision';
  if (mode !== 'precision' && mode !== 'discrimination') throw new RateloomError('E_USAGE', `--mode must be 'precision' or 'discrimination', not '${mode}'`, { path: ['--mode'], fix: 'Give --mode precision (narrow the intervals of one rate-law set) or --mode discrimination (tell rival sets apart).' });
  const criterion = flags.criterion ?? 'D';
  if (!['D', 'Ds', 'A'].includes(criterion)) throw new RateloomError('E_USAGE', `--criterion must be D, Ds or A, not '${criterion}'`, { path: ['--criterion'], fix: 'Give --criterion D (all parameters), Ds (with --subset) or A.' });
  const disc = flags.discrimination ?? 'box-hill';
  if (disc !== 'box-hill' && disc !== 'hunter-reiner') throw new RateloomError('E_USAGE', `--discrimination must be 'box-hill' or 'hunter-reiner', not '${disc}'`, { path: ['--discrimination'], fix: 'Give --discrimination box-hill or --discrimination hunter-reiner.' });
  return {
    runs,
    mode,
    criterion: criterion as CriterionKind,
    discrimination: disc,
    ...(flags.subset ? { subset: flags.subset.split(',').map((s) => s.trim()).filter(Boolean) } : {}),
    ...(draws !== undefined ? { draws } : {}),
    ...(posteriorDraws !== undefined ? { posteriorDraws } : {}),
    ...(seed !== undefined ? { seed } : {}),
    ...(level !== undefined ? { level } : {}),
  };
}

export function registerPlan(program: Command): void {
  program
    .command('plan')
    .description('Propose the next lab runs: the runs that shrink the intervals most, or tell rival rate laws apart')
    .argument('<study>', 'study file (JSON)')
    .requiredOption('--limits <file>', 'lab limits (JSON, schema/limits.schema.json)')
    .requiredOption('--runs <n>', 'number of runs to plan')
    .option('--mode <mode>', "'precision' or 'discrimination'", 'precision')
    .option('--criterion <c>', 'precision criterion: D, Ds (with --subset) or A', 'D')
    .option('--subset <names>', 'Ds: comma-separated parameters of interest, e.g. E1,E2')
    .option('--discrimination <c>', "discrimination criterion: 'box-hill' or 'hunter-reiner'", 'box-hill')
    .option('--model <name>', "rate-law set to plan precision for: 'base' or a candidate name", 'base')
    .option('--draws <k>', 'average the criterion over k parameter draws from the covariance (0 = local design)', '0')
    .option('--posterior-draws <k>', 'discrimination: simulated outcomes per rival behind the expected posterior probabilities', '400')
    .option('--seed <n>', 'seed of the draws and simulated outcomes', '1')
    .option('--level <p>', 'confidence level of the interval widths', '0.95')
    .option('--out <file>', 'CSV of the planned runs (default reports/<study>-plan.csv)')
    .option('--no-report', 'skip the HTML and Markdown report (<out without .csv>.html and .md, with the charts of old and planned runs)')
    .option('--force', 'overwrite an existing output file')
    .option('--json', 'print one JSON document (the plan) on stdout')
    .addHelpText('after', EXAMPLE)
    .action(async (studyPath: string, flags: PlanFlags) => {
      await runCommand(!!flags.json, async () => {
        const options = planOptions(flags);
        const csvPath = flags.out ?? join('reports', `${studyStem(studyPath)}-plan.csv`);
        const reportBase = join(dirname(csvPath), basename(csvPath).replace(/\.csv$/i, ''));
        const paths = [csvPath, ...(flags.report !== false ? [`${reportBase}.html`, `${reportBase}.md`] : [])];
        const { study } = readStudy(studyPath);
        const limits = parseLimits(readJson(flags.limits, 'limits file'), study, flags.limits);
        assertWritable(paths, { force: !!flags.force });
        if (options.mode === 'discrimination') checkDistinctRivals(studyVariants(study));
        const variants = options.mode === 'discrimination' ? studyVariants(study).map((v) => v.name) : [flags.model ?? 'base'];
        const fits = variants.map((v) => fitStudy(study, { variant: v, profile: false }));
        const result = planRuns(study, limits, fits, options);
        const files = [{ path: csvPath, content: result.csv }];
        if (flags.report !== false) {
          const rendered = await renderPlanReport(result, { studyName: study.title ?? studyStem(studyPath), generatedBy: `rateloom ${VERSION}`, csvPath });
          files.push({ path: paths[1], content: rendered.html }, { path: paths[2], content: rendered.markdown });
        }
        const written = writeAll(files, { force: !!flags.force });
        const outputs = { csv: written[0], ...(written.length > 1 ? { html: written[1], markdown: written[2] } : {}) };
        return { json: { ...result, outputs }, text: formatPlan(result, written[0]), trustworthy: result.success };
      });
    });
}
