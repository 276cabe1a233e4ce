/**
 * Public entry of the report layer: render a fit or a sizing view-model into one self-contained
 * HTML document plus a Markdown summary. Charts are built as vega-lite specs and drawn to SVG
 * headless. The functions do no file I/O; cli/report-render.ts writes the files.
 */
import { RateloomError } from '../core/errors.js';
import { fitCharts, sizingCharts, type FitChartGroups, type SizingChartGroups } from './charts/index.js';
import { renderFitHtml, renderSizingHtml, type RenderedFitCharts, type RenderedSizingCharts } from './html.js';
import { renderFitMarkdown, renderSizingMarkdown } from './markdown.js';
import { renderCharts } from './svg.js';
import type { ChartSpec, FitReportData, RenderedChart, RenderedReport, ReportWarning, SizingReportData } from './types.js';

export type * from './types.js';
export { fitCharts, sizingCharts } from './charts/index.js';
export { renderSvg, renderCharts, compileToVega } from './svg.js';
export { renderFitHtml, renderSizingHtml } from './html.js';
export { renderFitMarkdown, renderSizingMarkdown } from './markdown.js';

function need(ok: boolean, what: string, path: string[]): void {
  if (!ok) throw new RateloomError('E_VALUE', `report data: ${what}`, { path, fix: 'Fill the report view-model completely (see src/report/types.ts).' });
}

function checkCommon(d: { title?: unknown; warnings?: unknown; status?: unknown; message?: unknown; success?: unknown }): void {
  need(typeof d.title === 'string', 'title must be a string', ['title']);
  need(typeof d.status === 'string', 'status must be a string', ['status']);
  need(typeof d.message === 'string', 'message must be a string', ['message']);
  need(typeof d.success === 'boolean', 'success must be true or false', ['success']);
  need(Array.isArray(d.warnings), 'warnings must be an array', ['warnings']);
}

/** Render groups of chart specs in one pass, keeping the grouping. */
async function renderGroups<K extends string>(groups: Record<K, ChartSpec[]>): Promise<{ rendered: Record<K, RenderedChart[]>; all: RenderedChart[] }> {
  const keys = Object.keys(groups) as K[];
  const rendered = {} as Record<K, RenderedChart[]>;
  const all: RenderedChart[] = [];
  for (const k of keys) {
    rendered[k] = await renderCharts(groups[k]);
    all.push(...rendered[k]);
  }
  return { rendered, all };
}

function chartWarnings(charts: RenderedChart[]): ReportWarning[] {
  const out: ReportWarning[] = [];
  for (const c of charts) {
    if (c.error) out.push({ code: 'W_CHART_FAILED', message: `chart '${c.title}' could not be drawn: ${c.error}`, path: ['charts', c.id] });
    if (c.caption && /not shown \(value not finite\)/.test(c.caption)) {
      out.push({ code: 'W_CHART_POINTS_DROPPED', message: `chart '${c.title}': ${c.caption.match(/\d+ points? not shown[^.]*\./)?.[0] ?? 'points dropped'}`, path: ['charts', c.id] });
    }
  }
  return out;
}

/** Render a fit report: HTML document, Markdown summary, the rendered charts and drawing warnings. */
export async function renderFitReport(data: FitReportData): Promise<RenderedReport> {
  checkCommon(data);
  need(Array.isArray(data.parameters), 'parameters must be an array', ['parameters']);
  need(Array.isArray(data.runs), 'runs must be an array', ['runs']);
  need(typeof data.statistics === 'object' && data.statistics !== null, 'statistics are missing', ['statistics']);
  const groups: FitChartGroups = fitCharts(data);
  const { rendered, all } = await renderGroups(groups as unknown as Record<keyof RenderedFitCharts, ChartSpec[]>);
  return {
    html: renderFitHtml(data, rendered),
    markdown: renderFitMarkdown(data),
    charts: all,
    warnings: chartWarnings(all),
  };
}

/** Render a sizing report: HTML document, Markdown summary, the rendered charts and drawing warnings. */
export async function renderSizingReport(data: SizingReportData): Promise<RenderedReport> {
  checkCommon(data);
  need(typeof data.size === 'object' && data.size !== null, 'size is missing', ['size']);
  need(Array.isArray(data.outlet), 'outlet must be an array', ['outlet']);
  need(Array.isArray(data.cautions), 'cautions must be an array (may be empty)', ['cautions']);
  const groups: SizingChartGroups = sizingCharts(data);
  const { rendered, all } = await renderGroups(groups as unknown as Record<keyof RenderedSizingCharts, ChartSpec[]>);
  return {
    html: renderSizingHtml(data, rendered),
    markdown: renderSizingMarkdown(data),
    charts: all,
    warnings: chartWarnings(all),
  };
}
