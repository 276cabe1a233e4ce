/**
 * Helpers for commands that write reports: render a fit or sizing view-model and write the HTML
 * document and Markdown summary next to each other (atomically, refusing to overwrite without
 * --force). Returns the paths written and the drawing warnings for the command's output.
 */
import { join } from 'node:path';
import type { renderFitReport } from '../src/report';
import type { FitReportData, ReportWarning, SizingReportData } from '../src/report/types';
import { writeAtomic } from './io';

export interface ReportWriteOptions {
  /** Folder for the files; default 'reports'. */
  outDir?: string;
  /** File name without extension; default 'fit-report' or 'sizing-report'. */
  baseName?: string;
  /** Replace existing files; default false. */
  force?: boolean;
  /** Also write each chart as a separate .svg file into <outDir>/<baseName>-charts/; default false. */
  svgFiles?: boolean;
}

export interface ReportWriteResult {
  /** Path of the HTML document (relative to the current folder). */
  html: string;
  /** Path of the Markdown summary (relative to the current folder). */
  markdown: string;
  /** Paths of separate SVG files, relative to the current folder (empty unless svgFiles). */
  svg: string[];
  /** Problems met while drawing charts. */
  warnings: ReportWarning[];
}

async function write(
  rendered: Awaited<ReturnType<typeof renderFitReport>>,
  defaultBase: string,
  opts: ReportWriteOptions,
): Promise<ReportWriteResult> {
  const dir = opts.outDir ?? 'reports';
  const base = opts.baseName ?? defaultBase;
  const html = writeAtomic(join(dir, `${base}.html`), rendered.html, { force: opts.force });
  const markdown = writeAtomic(join(dir, `${base}.md`), rendered.markdown, { force: opts.force });
  const svg: string[] = [];
  if (opts.svgFiles) {
    for (const c of rendered.charts) {
      if (c.svg) svg.push(writeAtomic(join(dir, `${base}-charts`, `${c.id}.svg`), c.svg, { force: opts.force }));
    }
  }
  return { html, markdown, svg, warnings: rendered.warnings };
}

/** Render and write a fit report (HTML + Markdown). */
export async function writeFitReport(data: FitReportData, opts: ReportWriteOptions = {}): Promise<ReportWriteResult> {
  // Loaded on first use: the chart libraries take about a second to load, which every other path
  // of a command (errors, --help, --no-report) should not pay.
  const { renderFitReport } = await import('../src/report');
  return write(await renderFitReport(data), 'fit-report', opts);
}

/** Render and write a sizing report (HTML + Markdown). */
export async function writeSizingReport(data: SizingReportData, opts: ReportWriteOptions = {}): Promise<ReportWriteResult> {
  const { renderSizingReport } = await import('../src/report');
  return write(await renderSizingReport(data), 'sizing-report', opts);
}
