/**
 * The inline stylesheet of the HTML reports: system fonts only, the Okabe & Ito colours of the
 * charts for status accents, a readable measure on laptops, and an @media print block for A4.
 */
import { FONT_STACK, OKABE_ITO } from './theme.js';

export const REPORT_CSS = `
:root {
  --ink: #1f2328; --muted: #57606a; --line: #d0d7de; --soft: #f6f8fa;
  --ok: ${OKABE_ITO[2]}; --bad: ${OKABE_ITO[1]}; --warn: ${OKABE_ITO[4]}; --accent: ${OKABE_ITO[0]};
}
* { box-sizing: border-box; }
html { -webkit-text-size-adjust: 100%; }
body {
  margin: 0; padding: 0 1.25rem 3rem; color: var(--ink); background: #fff;
  font-family: ${FONT_STACK}; font-size: 15px; line-height: 1.5;
}
main { max-width: 1180px; margin: 0 auto; }
header.report { padding: 1.6rem 0 0.8rem; border-bottom: 3px solid var(--accent); margin-bottom: 1.2rem; }
header.report h1 { font-size: 1.7rem; line-height: 1.25; margin: 0 0 0.35rem; }
header.report .meta { color: var(--muted); font-size: 0.92rem; margin: 0; }
h2 { font-size: 1.25rem; margin: 2.2rem 0 0.7rem; padding-bottom: 0.25rem; border-bottom: 1px solid var(--line); }
h3 { font-size: 1.02rem; margin: 1.4rem 0 0.5rem; color: var(--ink); }
p { margin: 0.4rem 0 0.8rem; }
code, .mono { font-family: ui-monospace, 'SFMono-Regular', Menlo, Consolas, 'Liberation Mono', monospace; font-size: 0.9em; }
.status { display: flex; gap: 0.9rem; align-items: flex-start; padding: 0.9rem 1.1rem; border-radius: 8px;
  border: 1px solid var(--line); border-left: 7px solid var(--ok); background: var(--soft); }
.status.bad { border-left-color: var(--bad); }
.status .badge { font-weight: 700; font-size: 0.8rem; letter-spacing: 0.04em; text-transform: uppercase; padding: 0.2rem 0.6rem;
  border-radius: 999px; color: #fff; background: var(--ok); white-space: nowrap; }
.status.bad .badge { background: var(--bad); }
.status .msg { margin: 0; }
.status .code { color: var(--muted); font-size: 0.88rem; }
.notes { margin: 0.8rem 0; padding: 0.7rem 1.1rem; border-radius: 8px; border: 1px solid var(--line); }
.notes h3 { margin: 0 0 0.35rem; font-size: 0.98rem; }
.notes ul { margin: 0; padding-left: 1.2rem; }
.notes li { margin: 0.2rem 0; }
.notes.warnings { border-left: 7px solid var(--warn); background: #fffaf0; }
.notes.cautions { border: 2px solid var(--bad); border-left-width: 7px; background: #fff5ef; }
.notes.cautions h3 { color: #8a3500; }
.notes .code { color: var(--muted); font-size: 0.85rem; }
.cards { display: grid; grid-template-columns: repeat(auto-fit, minmax(190px, 1fr)); gap: 0.8rem; margin: 1rem 0; }
.card { border: 1px solid var(--line); border-radius: 8px; padding: 0.7rem 0.9rem; background: #fff; }
.card .label { color: var(--muted); font-size: 0.82rem; text-transform: uppercase; letter-spacing: 0.04em; }
.card .value { font-size: 1.45rem; font-weight: 650; font-variant-numeric: tabular-nums; }
.card .value .unit { font-size: 0.95rem; }
.card.primary { border-color: var(--accent); box-shadow: inset 0 3px 0 var(--accent); }
.table-wrap { overflow-x: auto; margin: 0.4rem 0 1rem; }
table { border-collapse: collapse; font-size: 0.9rem; min-width: 50%; }
caption { text-align: left; color: var(--muted); font-size: 0.85rem; padding-bottom: 0.3rem; caption-side: top; }
th, td { padding: 0.32rem 0.7rem; border-bottom: 1px solid var(--line); text-align: left; vertical-align: top; }
thead th { background: var(--soft); border-bottom: 2px solid #afb8c1; font-weight: 600; white-space: nowrap; }
tbody tr:nth-child(even) { background: #fbfcfd; }
td.num { text-align: right; font-variant-numeric: tabular-nums; white-space: nowrap; }
td.na { color: var(--muted); font-style: italic; text-align: right; }
.unit { color: var(--muted); font-size: 0.86em; margin-left: 0.2em; }
.flag { display: inline-block; font-size: 0.78rem; padding: 0 0.45rem; margin: 0 0.2rem 0.1rem 0; border-radius: 4px;
  background: #fff1e5; border: 1px solid #f0c9a8; color: #6b2f00; white-space: nowrap; }
.kinetics { background: var(--soft); border: 1px solid var(--line); border-radius: 8px; padding: 0.6rem 1rem; margin: 0.6rem 0; }
.kinetics div { font-family: ui-monospace, 'SFMono-Regular', Menlo, Consolas, 'Liberation Mono', monospace; font-size: 0.92rem; }
.charts { display: grid; grid-template-columns: repeat(auto-fill, minmax(440px, 1fr)); gap: 1.1rem 1.4rem; margin: 0.6rem 0 1rem; }
figure.chart { margin: 0; padding: 0.6rem 0.7rem 0.5rem; border: 1px solid var(--line); border-radius: 8px; background: #fff; }
figure.chart h3 { margin: 0 0 0.3rem; font-size: 0.95rem; }
figure.chart .plot { overflow-x: auto; }
figure.chart svg { display: block; max-width: 100%; height: auto; }
figure.chart figcaption { color: var(--muted); font-size: 0.84rem; margin-top: 0.3rem; }
figure.chart .chart-error { color: var(--bad); font-weight: 600; }
footer { margin-top: 2.5rem; padding-top: 0.7rem; border-top: 1px solid var(--line); color: var(--muted); font-size: 0.85rem; }
@media (max-width: 560px) { .charts { grid-template-columns: 1fr; } body { padding: 0 0.7rem 2rem; } }
@media print {
  @page { size: A4; margin: 14mm 12mm; }
  body { font-size: 10pt; padding: 0; }
  main { max-width: none; }
  * { -webkit-print-color-adjust: exact; print-color-adjust: exact; }
  h2 { break-after: avoid; page-break-after: avoid; margin-top: 1.2rem; }
  .charts { grid-template-columns: 1fr 1fr; gap: 0.5rem; }
  figure.chart, .card, .status, .notes, tr { break-inside: avoid; page-break-inside: avoid; }
  figure.chart { border-color: #bbb; }
  .table-wrap { overflow: visible; }
  table { font-size: 8.5pt; }
  thead { display: table-header-group; }
}
`;
