/**
 * `rateloom check STUDY [--strict] [--json]`: load a study and its CSV data, and say what was
 * read (runs, responses, ranges with units), what was rejected and why (file:line:column),
 * replicates found and the degrees of freedom left for fitting.
 * Exit 0 data usable, 1 nothing to fit (no observations or no degrees of freedom), 2 bad input
 * (or any rejected row under --strict).
 */
import type { Command } from 'commander';
import { CELSIUS_ZERO, loadStudy, summarizeStudy, type Range, type StudySummary, formatRejection, type ValidationReport, checkLabTransport } from '../src/index.js';
import { readText } from './io.js';
import { runCommand } from './run.js';
import { studyLoadOptions } from './study-input.js';
import { g } from './format.js';
import { formatTransport } from './transport-text.js';
import { formatLabCheck } from './check-lab.js';

const EXAMPLE = `
Example:
  rateloom check lab/hydrogenation.study.json
  rateloom check lab/hydrogenation.study.json --strict --json > check.json

The study file names its CSV files (relative to the study file), their columns and units; see
schema/study.schema.json. Rejected rows are listed as file:line:column with the reason; --strict
turns any rejected row into an error (exit 2).
Exit codes: 0 data usable, 1 nothing left to fit, 2 bad input.`;


function fmtRange(r: Range | undefined, extra?: (x: number) => string): string {
  if (!r) return 'n/a';
  const u = r.unit === '1' ? '' : ` ${r.unit}`;
  const base = r.min === r.max ? `${g(r.min)}${u}` : `${g(r.min)} to ${g(r.max)}${u}`;
  return extra ? `${base} (${r.min === r.max ? extra(r.min) : `${extra(r.min)} to ${extra(r.max)}`})` : base;
}

/** Human-readable check report. */
export function formatCheck(s: StudySummary, report: ValidationReport): string {
  const L: string[] = [];
  if (s.title) L.push(s.title);
  L.push(`Reactor: ${s.reactor.kind}, ${s.reactor.phase} phase; species ${s.species.join(', ')}; key reactant ${s.keyReactant}`);
  L.push('');
  L.push('Read:');
  for (const src of report.sources) L.push(`  ${src.file} (${src.layout}): ${src.rowsIn} rows in, ${src.rowsUsed} used, ${src.rowsRejected} rejected`);
  L.push(`  total: ${s.rowsIn} rows in = ${s.rowsUsed} used + ${s.rowsRejected} rejected`);
  L.push(`  runs: ${s.runs}${s.groups.length ? ` in ${s.groups.length} group(s): ${s.groups.join(', ')}` : ''}`);
  L.push(`  observations: ${s.observations}`);
  for (const r of s.responses) L.push(`    ${r.response}${r.species ? ` of ${r.species}` : ''}: ${r.count} (${r.unit})`);
  L.push('Ranges:');
  L.push(`  temperature: ${fmtRange(s.ranges.temperature, (x) => `${g(x - CELSIUS_ZERO)} degC`)}`);
  if (s.ranges.pressure) L.push(`  pressure: ${fmtRange(s.ranges.pressure, (x) => `${g(x / 1e5)} bar`)}`);
  if (s.ranges.size) L.push(`  ${s.ranges.size.quantity}: ${fmtRange(s.ranges.size)}`);
  if (s.ranges.spaceTime) L.push(`  space time ${s.ranges.spaceTime.definition}: ${fmtRange(s.ranges.spaceTime)}`);
  if (s.ranges.conversion) L.push(`  conversion of ${s.ranges.conversion.species} (measured, ${s.ranges.conversion.n} runs): ${fmtRange(s.ranges.conversion, (x) => `${g(100 * x, 3)} %`)}`);
  else L.push(`  conversion of ${s.keyReactant}: not computable from the measurements`);
  for (const n of s.rateNotes ?? []) L.push(`  rates: ${n}`);
  if (s.referenceTemperature.applies) L.push(`  reference temperature: ${g(s.referenceTemperature.value)} K (${s.referenceTemperature.source === 'study' ? 'from the study' : 'picked near the middle of the data'})`);
  L.push('');
  if (report.rejections.length) {
    L.push(`Rejected (${s.rowsRejected} rows, ${report.rejections.length} problems):`);
    for (const r of report.rejections) L.push(`  ${formatRejection(r)}`);
  } else L.push('Rejected: none');
  if (s.consistency.length) {
    L.push('Warnings (study constants against the runs):');
    for (const w of s.consistency) L.push(`  - ${w}`);
  }
  L.push('Rules applied:');
  for (const r of report.rules) L.push(`  - ${r}`);
  L.push('');
  if (report.replicateGroups.length) {
    L.push(`Replicates: ${report.replicateGroups.length} group(s)`);
    for (const gr of report.replicateGroups) L.push(`  ${gr.id}: ${gr.runIds.join(', ')}`);
    for (const p of report.pureError) L.push(`  pure error of ${p.response}${p.species ? ` of ${p.species}` : ''}: sigma ${g(p.sigma, 3)} ${p.unit} (${p.dof} degrees of freedom)`);
  } else L.push('Replicates: none found');
  L.push(`Degrees of freedom: ${s.observations} observations - ${s.freeParameters} free parameters = ${s.degreesOfFreedom}`);
  for (const c of s.candidates) L.push(`  candidate ${c.name}: ${s.observations} - ${c.freeParameters} = ${c.degreesOfFreedom}`);
  return L.join('\n');
}

export function registerCheck(program: Command): void {
  program
    .command('check')
    .description('Read a study and its lab data, and report what was read, rejected and left to fit')
    .argument('<study>', 'study file (JSON)')
    .option('--strict', 'fail on any rejected row (exit 2)')
    .option('--json', 'print one JSON document')
    .addHelpText('after', EXAMPLE)
    .action(async (studyPath: string, flags: { strict?: boolean; json?: boolean }) => {
      await runCommand(flags.json === true, () => {
        const text = readText(studyPath, 'study file');
        const { study, report } = loadStudy(text, studyPath, (abs) => readText(abs, 'data file'), studyLoadOptions(!!flags.strict));
        const summary = summarizeStudy(study, report);
        const transport = checkLabTransport(study);
        const ok = summary.observations > 0 && summary.degreesOfFreedom > 0;
        return {
          json: { status: ok ? 'ok' : 'nothing-to-fit', summary, report, ...(transport ? { transport } : {}), ...(study.lab ? { lab: study.lab } : {}) },
          text: formatCheck(summary, report) + (transport ? `\n\n${formatTransport(transport)}` : '') + (study.lab ? `\n\n${formatLabCheck(study.lab)}` : '') + (study.activity && report.replicateGroups.length ? `\n  Under the ${study.activity.model} activity model the runs of the replicate groups listed under Replicates differ in time on stream (their activity differs): the fit does not pool them for the lack-of-fit test; their spread is the drift check's evidence.` : '') + (ok ? '' : '\nNothing left to fit: add observations or fix parameters.'),
          trustworthy: ok,
        };
      });
    });
}
