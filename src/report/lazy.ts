/**
 * The report renderers of the public API, loaded on first call: the chart libraries (vega,
 * vega-lite) take about a second to load and use top-level await, so importing rateloom must not
 * load them; only rendering a report does.
 */
import type { PlanReportMeta } from './plan-report.js';
import type { FitReportData, PlanResult, RenderedReport, SizingReportData } from './types.js';
import { checkArgs, is } from '../core/args.js';

/** Render a fit report: self-contained HTML (charts as inline SVG) and Markdown. */
export async function renderFitReport(data: FitReportData): Promise<RenderedReport> {
  checkArgs('renderFitReport', [data], [{ name: 'data', check: is.reportData('studyName') }]);
  return (await import('./index.js')).renderFitReport(data);
}

/** Render a sizing report: self-contained HTML (charts as inline SVG, cautions) and Markdown. */
export async function renderSizingReport(data: SizingReportData): Promise<RenderedReport> {
  checkArgs('renderSizingReport', [data], [{ name: 'data', check: is.reportData('caseName') }]);
  return (await import('./index.js')).renderSizingReport(data);
}

/** Render a run-plan report: self-contained HTML (charts of old and planned runs as inline SVG) and Markdown. */
export async function renderPlanReport(plan: PlanResult, meta: PlanReportMeta): Promise<RenderedReport> {
  checkArgs('renderPlanReport', [plan, meta], [{ name: 'plan', check: is.object }, { name: 'meta', check: is.object }]);
  return (await import('./plan-report.js')).renderPlanReport(plan, meta);
}
