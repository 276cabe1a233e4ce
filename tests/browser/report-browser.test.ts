/**
 * Browser check of the HTML reports: the demo is run (packed-bed study only, fewer Monte Carlo
 * draws), then Debian's chromium (driven by playwright-core) opens the demo's index page and its
 * fit, comparison and sizing reports from file:// URLs. The page must log no console errors, make no
 * request other than the file itself, and show marks in every chart's SVG. Screenshots go to
 * reports/. If chromium is missing the test FAILS (CI installs it in .ci/run); it never skips.
 */
import { execSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { pathToFileURL } from 'node:url';
import { chromium, type BrowserContext } from 'playwright-core';
import { afterAll, describe, expect, it } from 'vitest';
import { runDemo, type DemoResult } from '../../cli/demo';

const REPORTS = resolve(__dirname, '../../reports');
const DEMO_OUT = join(REPORTS, 'demo-browser');

let demo: Promise<DemoResult> | undefined;
/** Run the demo once for all tests of this file (packed bed only; 300 draws per sizing). */
const demoReports = (): Promise<DemoResult> => (demo ??= runDemo({ outDir: DEMO_OUT, liquids: false, draws: 300, force: true }));

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

async function checkInBrowser(path: string, screenshot: string): Promise<void> {
  const ctx = await browser();
  const html = readFileSync(path, 'utf8');
  const expectedCharts = (html.match(/<figure class="chart/g) ?? []).length;
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
  it('demo fit report opens from file:// with no errors, no network and marks in every chart', async () => {
    const r = await demoReports();
    await checkInBrowser(join(r.outDir, 'pbr-fit.html'), 'report-screenshot.png');
  });

  it('demo comparison report shows the rival models', async () => {
    const r = await demoReports();
    await checkInBrowser(r.comparison.report.html, 'compare-report-screenshot.png');
  });

  it('demo sizing report opens with its charts and the cautions', async () => {
    const r = await demoReports();
    const html = r.sizing[0].report.html;
    expect(readFileSync(html, 'utf8')).toMatch(/licensed engineers/);
    await checkInBrowser(html, 'sizing-report-screenshot.png');
  });

  it('demo index page links the reports', async () => {
    const r = await demoReports();
    await checkInBrowser(r.index, 'index-screenshot.png');
  });
});
