/**
 * Building blocks of the HTML reports: the document shell, status banner, warning and caution
 * boxes, tables whose number cells always carry a unit, and chart figures with inline SVG.
 * Every piece of text passes through escapeHtml; SVG comes only from our own renderer.
 */
import { DIMENSIONLESS, escapeHtml, formatInterval, formatNumber, formatUnit, NOT_COMPUTED, SIG_VALUE } from './format.js';
import { REPORT_CSS } from './style.js';
import type { RenderedChart, ReportWarning } from './types.js';

/** A complete self-contained document: inline CSS, no scripts, no external references. */
export function htmlDocument(title: string, body: string): string {
  return [
    '<!DOCTYPE html>',
    '<html lang="en">',
    '<head>',
    '<meta charset="utf-8">',
    '<meta name="viewport" content="width=device-width, initial-scale=1">',
    // forbid every load: the report is complete in itself
    `<meta http-equiv="Content-Security-Policy" content="default-src 'none'; style-src 'unsafe-inline'; img-src data:">`,
    `<title>${escapeHtml(title)}</title>`,
    `<style>${REPORT_CSS}</style>`,
    '</head>',
    '<body>',
    '<main>',
    body,
    '</main>',
    '</body>',
    '</html>',
    '',
  ].join('\n');
}

/** Report header with title and meta line. */
export function headerBlock(title: string, metaParts: string[]): string {
  const meta = metaParts.filter(Boolean).map(escapeHtml).join(' · ');
  return `<header class="report"><h1>${escapeHtml(title)}</h1><p class="meta">${meta}</p></header>`;
}

/** Status banner: green-accented when the result can be trusted, vermillion otherwise. */
export function statusBlock(success: boolean, status: string, message: string): string {
  const badge = success ? 'Trustworthy' : 'Not trustworthy';
  return (
    `<section class="status${success ? '' : ' bad'}" aria-label="status">` +
    `<span class="badge">${badge}</span>` +
    `<div><p class="msg">${escapeHtml(message)}</p><p class="msg code">status: <code>${escapeHtml(status)}</code></p></div>` +
    `</section>`
  );
}

function warningItem(w: ReportWarning): string {
  const path = w.path && w.path.length ? ` <span class="code">(${escapeHtml(w.path.join('.'))})</span>` : '';
  return `<li>${escapeHtml(w.message)} <span class="code">[${escapeHtml(w.code)}]</span>${path}</li>`;
}

/** Warning box; says explicitly when there are none. */
export function warningsBlock(warnings: ReportWarning[]): string {
  if (warnings.length === 0) return `<p class="code">No warnings.</p>`;
  return `<section class="notes warnings" aria-label="warnings"><h3>Warnings (${warnings.length})</h3><ul>${warnings.map(warningItem).join('')}</ul></section>`;
}

/** Caution box, always shown; says explicitly when none were passed. */
export function cautionsBlock(cautions: string[]): string {
  const items = cautions.length ? cautions.map((c) => `<li>${escapeHtml(c)}</li>`).join('') : '<li>No cautions were passed with this case.</li>';
  return `<section class="notes cautions" aria-label="cautions"><h3>Read before using this size</h3><ul>${items}</ul></section>`;
}

/** Unit span (dimensionless shows '1' with a tooltip). */
export function unitSpan(unit: string | null | undefined): string {
  const u = formatUnit(unit);
  const title = u === DIMENSIONLESS ? ' title="dimensionless"' : '';
  return `<span class="unit"${title}>${escapeHtml(u)}</span>`;
}

/** A table cell holding a number with its unit; missing values read "not computed". */
export function numCell(x: number | null | undefined, unit: string | null | undefined, sig = SIG_VALUE): string {
  if (x === null || x === undefined) return `<td class="na">${NOT_COMPUTED}</td>`;
  return `<td class="num">${escapeHtml(formatNumber(x, sig))}${unitSpan(unit)}</td>`;
}

/** A count cell (integer) with its unit word. */
export function countCell(x: number | null | undefined, unit: string): string {
  if (x === null || x === undefined) return `<td class="na">${NOT_COMPUTED}</td>`;
  return `<td class="num">${escapeHtml(formatNumber(Math.round(x), 12))}${unitSpan(unit)}</td>`;
}

/** A cell holding an interval with its unit. */
export function intervalCell(iv: readonly [number | null, number | null] | null | undefined, unit: string): string {
  if (!iv) return `<td class="na">${NOT_COMPUTED}</td>`;
  return `<td class="num">${escapeHtml(formatInterval(iv))}${unitSpan(unit)}</td>`;
}

/** A plain text cell. */
export function textCell(s: unknown): string {
  return `<td>${escapeHtml(s)}</td>`;
}

/** A table from a header row and pre-built cell rows. */
export function table(head: string[], rows: string[][], captionText?: string): string {
  const cap = captionText ? `<caption>${escapeHtml(captionText)}</caption>` : '';
  const thead = `<thead><tr>${head.map((h) => `<th scope="col">${escapeHtml(h)}</th>`).join('')}</tr></thead>`;
  const tbody = `<tbody>${rows.map((r) => `<tr>${r.join('')}</tr>`).join('')}</tbody>`;
  return `<div class="table-wrap"><table>${cap}${thead}${tbody}</table></div>`;
}

/** A two-column key/value table; `rows` are [label, cell html]. */
export function keyValueTable(rows: [string, string][], captionText?: string): string {
  const cap = captionText ? `<caption>${escapeHtml(captionText)}</caption>` : '';
  const body = rows.map(([k, cell]) => `<tr><th scope="row">${escapeHtml(k)}</th>${cell}</tr>`).join('');
  return `<div class="table-wrap"><table class="kv">${cap}<tbody>${body}</tbody></table></div>`;
}

/** One chart figure with inline SVG, or the reason it could not be drawn. */
export function chartFigure(c: RenderedChart): string {
  const body = c.svg ?? `<p class="chart-error">Chart could not be drawn: ${escapeHtml(c.error ?? 'unknown reason')}</p>`;
  const cap = c.caption ? `<figcaption>${escapeHtml(c.caption)}</figcaption>` : '';
  return `<figure class="chart" id="chart-${escapeHtml(c.id)}"><h3>${escapeHtml(c.title)}</h3><div class="plot">${body}</div>${cap}</figure>`;
}

/** A grid of chart figures, or nothing when there are none. */
export function chartGrid(charts: RenderedChart[]): string {
  if (charts.length === 0) return '';
  return `<div class="charts">${charts.map(chartFigure).join('')}</div>`;
}

/** Confidence level as text, '95 %'. */
export function levelText(level: number | undefined): string {
  return level === undefined ? '' : `${formatNumber(level * 100, 3)} % `;
}
