import { existsSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { writeFitReport, writeSizingReport } from '../../cli/report-render';
import { sampleFitReportData, sampleSizingReportData } from './fixtures/sample-data';

const dir = mkdtempSync(join(tmpdir(), 'rateloom-report-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('cli/report-render', () => {
  it('writes HTML and Markdown (and SVG files on request) and refuses to overwrite without force', async () => {
    const r = await writeFitReport(sampleFitReportData(), { outDir: dir, baseName: 'fit', svgFiles: true });
    expect(readFileSync(r.html, 'utf8')).toContain('<!DOCTYPE html>');
    expect(readFileSync(r.markdown, 'utf8')).toContain('## Parameters');
    expect(r.svg.length).toBeGreaterThan(10);
    expect(r.svg.every((p) => existsSync(p) && readFileSync(p, 'utf8').startsWith('<svg'))).toBe(true);
    await expect(writeFitReport(sampleFitReportData(), { outDir: dir, baseName: 'fit' })).rejects.toThrow(/already exists?; nothing was written/);
    await expect(writeFitReport(sampleFitReportData(), { outDir: dir, baseName: 'fit', force: true })).resolves.toBeTruthy();
  });

  it('writes the sizing report under its default name', async () => {
    const r = await writeSizingReport(sampleSizingReportData(), { outDir: dir });
    expect(r.html.endsWith('sizing-report.html')).toBe(true);
    expect(r.warnings).toEqual([]);
  });
});
