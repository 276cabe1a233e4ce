/**
 * Browser check of the HTML reports: Debian's chromium (driven by playwright-core) opens the
 * generated fit and sizing reports from file:// URLs. The page must log no console errors, make no
 * request other than the file itself, and show marks in every chart's SVG. Screenshots go to
 * reports/. If chromium is missing the test FAILS (CI installs it in .ci/run); it never skips.
 */
import { execSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { pathToFileURL } from 'node:url';
import { chromium, type BrowserContext } from 'playwright-core';
import { afterAll, describe, expect, it } from 'vitest';
import { renderFitReport, renderSizingReport } from '../../src/report';
import { sampleFitReportData, sampleSizingReportData } from '../report/fixtures/sample-data';

const REPORTS = resolve(__dirname, '../../reports');

function chromiumPath(): string {
  try {
    const p = execSync('which chromium', { encoding: 'utf8', stdio: ['ignore', 'pipe', 'ignore'] }).trim();
    if (p) return p;
  } catch {
    /* fall through to the clear failure below */
  }
  throw new Error(
    "chromium is not installed (no 'chromium' on PATH). Install it with `apt-get install -y chromium` " +
      '(CI does this in .ci/run); the browser test of the HTML report cannot run without it.',
  );
}

let context: Promise<BrowserContext> | undefined;
let userDataDir = '';

/**
 * Start chromium once, on first use inside a test, so that a missing chromium makes each test
 * fail (a failing beforeAll would only mark the tests as skipped).
 */
function browser(): Promise<BrowserContext> {
  if (!context) {
    const executablePath = chromiumPath();
    userDataDir = mkdtempSync(join(tmpdir(), 'rateloom-chromium-'));
    // playwright refuses --user-data-dir in args; launchPersistentContext passes the fresh folder as that flag.
    context = chromium.launchPersistentContext(userDataDir, {
      executablePath,
      headless: true,
      args: [
        '--headless',
        '--no-sandbox',
        '--disable-gpu',
        '--disable-quic',
        '--no-first-run',
        '--disable-background-networking',
        '--disable-component-update',
        '--disable-sync',
      ],
      viewport: { width: 1280, height: 900 },
    });
  }
  return context;
}

afterAll(async () => {
  if (context) await (await context.catch(() => undefined))?.close();
  if (userDataDir) rmSync(userDataDir, { recursive: true, force: true });
});

async function checkInBrowser(html: string, file: string, screenshot: string, expectedCharts: number): Promise<void> {
  const ctx = await browser();
  mkdirSync(REPORTS, { recursive: true });
  const path = join(REPORTS, file);
  writeFileSync(path, html);
  const url = pathToFileURL(path).href;
  const page = await ctx.newPage();
  const errors: string[] = [];
  const requests: string[] = [];
  page.on('console', (m) => {
    if (m.type() === 'error') errors.push(m.text());
  });
  page.on('pageerror', (e) => errors.push(e.message));
  page.on('request', (r) => requests.push(r.url()));
  await page.goto(url, { waitUntil: 'load' });
  await page.waitForTimeout(200);

  expect(errors).toEqual([]);
  expect(requests).toEqual([url]);

  const marks = await page.$$eval('figure.chart', (figs) =>
    figs.map((f) => ({
      id: f.id,
      svg: f.querySelector('svg') !== null,
      marks: f.querySelectorAll(
        'svg g.role-mark.mark-symbol > path, svg g.role-mark.mark-rect > path, svg g.role-mark.mark-line > path, svg g.role-mark.mark-area > path',
      ).length,
      width: f.querySelector('svg')?.getBoundingClientRect().width ?? 0,
    })),
  );
  expect(marks.length).toBe(expectedCharts);
  for (const m of marks) {
    expect(m.svg, `chart ${m.id} has an svg`).toBe(true);
    expect(m.marks, `chart ${m.id} has data marks`).toBeGreaterThan(0);
    expect(m.width, `chart ${m.id} is laid out`).toBeGreaterThan(100);
  }
  await page.screenshot({ path: join(REPORTS, screenshot), fullPage: true });
  await page.close();
}

describe('HTML report in a headless browser', () => {
  it('fit report opens from file:// with no errors, no network and marks in every chart', async () => {
    const rendered = await renderFitReport(sampleFitReportData());
    await checkInBrowser(rendered.html, 'sample-fit-report.html', 'report-screenshot.png', rendered.charts.length);
  });

  it('sizing report opens from file:// with no errors, no network and marks in every chart', async () => {
    const rendered = await renderSizingReport(sampleSizingReportData());
    await checkInBrowser(rendered.html, 'sample-sizing-report.html', 'sizing-report-screenshot.png', rendered.charts.length);
  });
});
