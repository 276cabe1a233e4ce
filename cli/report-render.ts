/**
 * Helpers for commands that write reports: render a fit or sizing view-model and write the HTML
 * document and Markdown summary next to each other (atomically, refusing to overwrite without
 * --force). Returns the paths written and the drawing warnings for the command's output.
 */
import { join } from 'node:path';
import { renderFitReport, renderSizingReport, type FitReportData, type ReportWarning, type SizingReportData } from '../src/index.js';
import { writeAll } from './io.js';
import type { OutputFile } from './output.js';

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

/** Rendered report files, not yet written (to be written with the command's other outputs). */
export interface RenderedReportFiles {
  files: OutputFile[];
  warnings: ReportWarning[];
}

function filesOf(rendered: Awaited<ReturnType<typeof renderFitReport>>, defaultBase: string, opts: ReportWriteOptions): RenderedReportFiles {
  const dir = opts.outDir ?? 'reports';
  const base = opts.baseName ?? defaultBase;
  const files: OutputFile[] = [
    { path: join(dir, `${base}.html`), content: rendered.html },
    { path: join(dir, `${base}.md`), content: rendered.markdown },
  ];
  if (opts.svgFiles) for (const c of rendered.charts) if (c.svg) files.push({ path: join(dir, `${base}-charts`, `${c.id}.svg`), content: c.svg });
  return { files, warnings: rendered.warnings };
}

/** Render a fit report into files (HTML, Markdown, optional SVGs) without writing them. */
export async function renderFitFiles(data: FitReportData, opts: ReportWriteOptions = {}): Promise<RenderedReportFiles> {
  // renderFitReport loads the chart libraries on first use (src/report/lazy.ts): every other path
  // of a command (errors, --help, --no-report) does not pay for them.
  return filesOf(await renderFitReport(data), 'fit-report', opts);
}

/** Render a sizing report into files without writing them. */
export async function renderSizingFiles(data: SizingReportData, opts: ReportWriteOptions = {}): Promise<RenderedReportFiles> {
  return filesOf(await renderSizingReport(data), 'sizing-report', opts);
}

/** Write rendered report files as one transaction. */
function write(r: RenderedReportFiles, opts: ReportWriteOptions): ReportWriteResult {
  const paths = writeAll(r.files, { force: opts.force });
  return { html: paths[0], markdown: paths[1], svg: paths.slice(2), warnings: r.warnings };
}

/** Render and write a fit report (HTML + Markdown). */
export async function writeFitReport(data: FitReportData, opts: ReportWriteOptions = {}): Promise<ReportWriteResult> {
  return write(await renderFitFiles(data, opts), opts);
}

/** Render and write a sizing report (HTML + Markdown). */
export async function writeSizingReport(data: SizingReportData, opts: ReportWriteOptions = {}): Promise<ReportWriteResult> {
  return write(await renderSizingFiles(data, opts), opts);
}
