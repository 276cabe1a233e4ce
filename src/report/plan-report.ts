/**
 * The report of a run plan: the planned runs with why each was chosen, the expected precision
 * after them beside today's, the model probabilities (discrimination), and the charts of old and
 * new runs in the condition space (charts/plan.ts). One self-contained HTML document and a
 * Markdown summary with the same numbers.
 */
import { planCharts } from './charts/plan.js';
import { escapeMarkdown as md, formatNumber } from './format.js';
import { chartGrid, headerBlock, htmlDocument, numCell, statusBlock, table, textCell, warningsBlock } from './html-parts.js';
import { mdTable, q, statusLine, warningLines } from './markdown.js';
import { renderCharts } from './svg.js';
import type { PlanResult, RenderedChart, RenderedReport } from './types.js';

/** What the report says about where the plan came from. */
export interface PlanReportMeta {
  /** Report title; default 'Next lab runs'. */
  title?: string;
  /** Study name shown in the header. */
  studyName: string;
  /** Program and version. */
  generatedBy: string;
  /** Path of the planned-runs CSV, when written. */
  csvPath?: string;
}

function runText(run: PlanResult['runs'][number]): string {
  return run.conditions.filter((c) => c.varied).map((c) => `${c.column} ${formatNumber(c.shown, 4)} ${c.shownUnit}`).join(', ');
}

function modeText(r: PlanResult): string {
  const averaged = r.draws ? `averaged over ${r.draws} parameter draws` : 'local at the estimate';
  return r.mode === 'precision' ? `precision, ${r.criterion}-optimal${r.subset ? ` on ${r.subset.join(', ')}` : ''}, ${averaged}` : `discrimination, ${r.criterion} criterion`;
}

function htmlBody(r: PlanResult, meta: PlanReportMeta, charts: RenderedChart[]): string {
  const parts = [
    headerBlock(meta.title ?? 'Next lab runs', [meta.studyName, modeText(r), meta.generatedBy]),
    statusBlock(r.success, r.status, r.message),
    warningsBlock(r.warnings.map((w) => ({ code: w.code, message: w.message, ...(w.path ? { path: w.path.map(String) } : {}) }))),
    '<h2>Planned runs</h2>',
    `<p>${r.candidates.count} candidates on the grid, ${r.candidates.usable} runnable${r.candidates.excluded.map((e) => `; ${e.count} excluded: ${e.reason}`).join('')}.${meta.csvPath ? ` The runs are in ${meta.csvPath}, in the study's own column layout.` : ''}</p>`,
    table(['Run', 'Conditions', 'Predicted conversion', 'Why'], r.runs.map((run) => [textCell(run.id), textCell(runText(run)), numCell(run.predictedConversion === null ? null : 100 * run.predictedConversion, '%', 3), textCell(run.reason)])),
  ];
  if (r.precision.length) {
    parts.push(`<h2>Expected precision of '${r.model}'</h2>`, table(['Parameter', 'Value', 'Std. error today', 'after', 'Interval width today', 'after', 'Narrower by'], r.precision.map((p) => [textCell(p.name), numCell(p.value, p.unit), numCell(p.stdErrorNow, p.unit, 3), numCell(p.stdErrorAfter, p.unit, 3), numCell(p.widthNow, p.unit, 3), numCell(p.widthAfter, p.unit, 3), numCell(p.shrink === null ? null : 100 * p.shrink, '%', 3)]), `${Math.round(100 * r.level)} % linear intervals at today's estimate, SI units`));
  }
  if (r.discrimination) {
    parts.push('<h2>Model probabilities</h2>', table(['Rate-law set', 'Today (Akaike weight)', 'Expected after the runs if it is the true one'], r.discrimination.models.map((m) => [textCell(m.model), numCell(m.now, '1', 3), numCell(m.expectedIfTrue, '1', 3)]), `${r.discrimination.draws} simulated outcomes per rate-law set`));
  }
  parts.push('<h2>Charts</h2>', chartGrid(charts));
  return parts.join('\n');
}

function markdown(r: PlanResult, meta: PlanReportMeta): string {
  const parts = [
    `# ${md(meta.title ?? 'Next lab runs')}`,
    `Study: ${md(meta.studyName)} · ${md(modeText(r))} · ${md(meta.generatedBy)}`,
    '## Summary',
    statusLine(r.success, r.status, r.message),
    warningLines(r.warnings.map((w) => ({ code: w.code, message: w.message }))),
    '## Planned runs',
    mdTable(['Run', 'Conditions', 'Predicted conversion', 'Why'], r.runs.map((run) => [md(run.id), md(runText(run)), run.predictedConversion === null ? 'not computed' : q(100 * run.predictedConversion, '%', 3), md(run.reason)])),
  ];
  if (r.precision.length) {
    parts.push(`## Expected precision of '${md(r.model)}' (${Math.round(100 * r.level)} % linear intervals)`, mdTable(['Parameter', 'Value', 'Std. error today', 'after', 'Width today', 'after', 'Narrower by'], r.precision.map((p) => [md(p.name), q(p.value, p.unit), q(p.stdErrorNow, p.unit, 3), q(p.stdErrorAfter, p.unit, 3), q(p.widthNow, p.unit, 3), q(p.widthAfter, p.unit, 3), p.shrink === null ? 'not computed' : q(100 * p.shrink, '%', 3)])));
  }
  if (r.discrimination) {
    parts.push('## Model probabilities', mdTable(['Rate-law set', 'Today', 'Expected after, if true'], r.discrimination.models.map((m) => [md(m.model), formatNumber(m.now, 3), formatNumber(m.expectedIfTrue, 3)])));
  }
  return `${parts.join('\n\n')}\n`;
}

/** Render a plan report: HTML document with charts, Markdown summary, the charts and drawing warnings. */
export async function renderPlanReport(r: PlanResult, meta: PlanReportMeta): Promise<RenderedReport> {
  const charts = await renderCharts(planCharts(r));
  const warnings = charts.filter((c) => c.error).map((c) => ({ code: 'W_CHART_FAILED', message: `chart '${c.title}' could not be drawn: ${c.error}`, path: ['charts', c.id] }));
  return { html: htmlDocument(meta.title ?? 'Next lab runs', htmlBody(r, meta, charts)), markdown: markdown(r, meta), charts, warnings };
}
