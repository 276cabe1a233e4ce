/**
 * HTML writers: one self-contained document per fit and per sizing. Sections of the fit report:
 * summary (status, warnings, kinetics), parameters with both interval kinds, statistics, charts,
 * rival models, observations. Sections of the sizing report: summary, cautions (always, up front),
 * warnings, size cards, outlet and design tables, charts, sensitivity. Charts arrive rendered.
 */
import { criterionDeltaText, criterionText } from '../core/criterion.js';
import { escapeHtml, formatNumber, formatUnit, paToKPa } from './format.js';
import {
  cautionsBlock,
  chartGrid,
  countCell,
  headerBlock,
  htmlDocument,
  intervalCell,
  keyValueTable,
  levelText,
  numCell,
  statusBlock,
  table,
  textCell,
  unitSpan,
  warningsBlock,
} from './html-parts.js';
import type { FitReportData, RenderedChart, SizingReportData } from './types.js';
import { pelletHtml, transportHtml } from './pellet-html.js';

/** Rendered fit charts by section (same keys as FitChartGroups). */
export interface RenderedFitCharts {
  parity: RenderedChart[];
  residuals: RenderedChart[];
  profiles: RenderedChart[];
  correlation: RenderedChart[];
  likelihood: RenderedChart[];
  rivals: RenderedChart[];
  drift?: RenderedChart[];
}

/** Rendered sizing charts by section (same keys as SizingChartGroups). */
export interface RenderedSizingCharts {
  production: RenderedChart[];
  distribution: RenderedChart[];
  sensitivity: RenderedChart[];
  pellet: RenderedChart[];
  thermal: RenderedChart[];
}

function flagsHtml(flags: string[] | undefined, fixed: boolean | undefined): string {
  const all = [...(fixed && !(flags ?? []).includes('fixed') ? ['fixed'] : []), ...(flags ?? [])];
  return `<td>${all.map((f) => `<span class="flag">${escapeHtml(f)}</span>`).join('')}</td>`;
}

function parameterTable(data: FitReportData): string {
  const level = data.parameters.find((p) => p.ciLevel !== undefined)?.ciLevel;
  const lv = levelText(level);
  const rows = data.parameters.map((p) => [
    `<th scope="row"><code>${escapeHtml(p.name)}</code></th>`,
    numCell(p.value, p.unit),
    p.fixed ? `<td class="na">fixed</td>` : numCell(p.stdError, p.unit, 3),
    p.fixed ? `<td class="na">fixed</td>` : intervalCell(p.linearCI ?? null, p.unit),
    p.fixed ? `<td class="na">fixed</td>` : intervalCell(p.profileCI ?? null, p.unit),
    flagsHtml(p.flags, p.fixed),
  ]);
  return table(
    ['Parameter', 'Estimate', 'Std. error', `${lv}linear CI`, `${lv}profile CI`, 'Flags'],
    rows,
    'Linear intervals come from the covariance; profile intervals from re-optimising the objective ("open" = not closed within the bounds).',
  );
}

/** The influential observations: their count and a table of the most extreme few; '' when there are none. */
function influentialBlock(data: FitReportData): string {
  const inf = data.influential;
  if (!inf || inf.count === 0) return '';
  const rows = inf.rows.map((r) => [
    `<th scope="row">${escapeHtml(r.runId)}</th>`,
    textCell(r.response),
    textCell(r.line),
    numCell(r.studentizedResidual, '1', 3),
    numCell(r.cooksDistance, '1', 3),
    textCell(r.movesEstimates ? 'yes' : 'little'),
  ]);
  const shown = inf.count > inf.rows.length ? `the ${inf.rows.length} with the largest |studentized residual| of ${inf.count}` : `all ${inf.count}`;
  return `<h3>Influential observations (${inf.count})</h3>` + table(['Run', 'Response', 'CSV line', 'Studentized residual', "Cook's distance", 'Moves the estimates'], rows, `Observations beyond the Bonferroni bound of the outlier test; ${shown}. A warning only: the verdict does not depend on it.`);
}

/** Starting values rateloom estimated (study left them open); '' when there are none. */
function startValuesBlock(data: FitReportData): string {
  const sv = data.startValues;
  if (!sv || sv.rows.length === 0) return '';
  const rows = sv.rows.map((r) => [
    `<th scope="row"><code>${escapeHtml(r.parameter)}</code></th>`,
    numCell(r.value, r.unit),
    textCell(r.method),
    textCell(r.how),
  ]);
  const used = sv.points !== null && sv.points !== undefined ? `<p>${escapeHtml(`The differential method used ${sv.points} rate points.`)}</p>` : '';
  const notes = sv.notes && sv.notes.length ? `<div class="notes"><ul>${sv.notes.map((n) => `<li>${escapeHtml(n)}</li>`).join('')}</ul></div>` : '';
  return (
    '<h3>Starting values estimated by rateloom</h3>' +
    table(['Parameter', 'Start', 'Method', 'How'], rows, 'The study left these starting values open; the fit began from them.') +
    used +
    notes
  );
}

function statisticsTable(data: FitReportData): string {
  const s = data.statistics;
  const rows: [string, string][] = [
    ['Observations n', countCell(s.n, 'obs.')],
    ['Estimated parameters p', countCell(s.p, 'par.')],
    ['Degrees of freedom n − p', countCell(s.dof, 'dof')],
    ['Sum of squared residuals', numCell(s.ssr, s.ssrUnit ?? '1')],
    ['Residual standard deviation', numCell(s.residualStdDev, s.residualUnit ?? '1')],
    ['AICc', criterionCell(criterionText(s.aicc))],
    ['BIC', criterionCell(criterionText(s.bic))],
    ['Covariance basis', textCell(s.covarianceBasis)],
  ];
  const lof = s.lackOfFit;
  if (lof) {
    rows.push(
      ['Lack of fit F', numCell(lof.F, '1')],
      ['Lack of fit / pure error dof', `<td class="num">${escapeHtml(`${lof.dofLackOfFit} / ${lof.dofPureError}`)}${unitSpan('dof')}</td>`],
      ['Lack of fit p value', numCell(lof.pValue, '1', 3)],
    );
    if (lof.conclusion) rows.push(['Lack of fit reading', textCell(lof.conclusion)]);
  } else {
    rows.push(['Lack of fit', textCell('not tested (no replicates)')]);
  }
  return keyValueTable(rows);
}

/** A criterion cell: the printed text of src/core/criterion.ts, unit 1. */
function criterionCell(text: string): string {
  return text === 'n/a' ? '<td class="na">n/a</td>' : `<td class="num">${escapeHtml(text)}${unitSpan('1')}</td>`;
}

function rivalTable(data: FitReportData): string {
  const models = data.rivalModels ?? [];
  if (models.length === 0) return '<p>No rival models were compared.</p>';
  const best = Math.min(...models.map((m) => m.aicc).filter(Number.isFinite));
  const rows = models.map((m) => [
    `<th scope="row">${escapeHtml(m.name)}</th>`,
    numCell(m.ssr, m.ssrUnit ?? '1'),
    countCell(m.dof, 'dof'),
    criterionCell(criterionText(m.aicc)),
    criterionCell(criterionDeltaText(m.aicc, best)),
    criterionCell(criterionText(m.bic)),
    numCell(m.akaikeWeight, '1', 3),
    textCell(m.verdict),
  ]);
  return table(['Model', 'SSR', 'dof', 'AICc', 'ΔAICc', 'BIC', 'Akaike weight', 'Verdict'], rows);
}

function observationTable(data: FitReportData): string {
  if (data.runs.length === 0) return '<p>No observations.</p>';
  const st = data.runs.find((r) => r.conditions.spaceTime)?.conditions.spaceTime;
  const fr = data.runs.find((r) => r.conditions.feedRatio)?.conditions.feedRatio;
  const head = ['Run', 'T', 'P', ...(st ? [st.label] : []), ...(fr ? [fr.label] : []), 'Response', 'Measured', 'Predicted', 'Residual', 'Studentized'];
  const rows: string[][] = [];
  for (const run of data.runs) {
    const c = run.conditions;
    for (const r of run.responses) {
      rows.push([
        `<th scope="row">${escapeHtml(run.runId)}</th>`,
        numCell(c.temperature, c.temperatureUnit ?? 'K'),
        c.pressureUnit ? numCell(c.pressure, c.pressureUnit) : numCell(paToKPa(c.pressure), 'kPa'),
        ...(st ? [c.spaceTime ? numCell(c.spaceTime.value, c.spaceTime.unit) : numCell(null, '')] : []),
        ...(fr ? [c.feedRatio ? numCell(c.feedRatio.value, c.feedRatio.unit, 3) : numCell(null, '')] : []),
        textCell(r.response),
        numCell(r.measured, r.unit),
        numCell(r.predicted, r.unit),
        numCell(r.residual, r.unit, 3),
        numCell(r.studentized, '1', 3),
      ]);
    }
  }
  return table(head, rows);
}

function section(id: string, title: string, body: string): string {
  return `<section id="${id}"><h2>${escapeHtml(title)}</h2>${body}</section>`;
}

/** The fit report as one HTML document. */
export function renderFitHtml(data: FitReportData, charts: RenderedFitCharts): string {
  const kinetics = data.kinetics && data.kinetics.length
    ? `<div class="kinetics" aria-label="rate laws">${data.kinetics.map((k) => `<div>${escapeHtml(k)}</div>`).join('')}</div>`
    : '';
  const body = [
    headerBlock(data.title, [`Study: ${data.studyName}`, data.generatedBy, data.generatedAt ?? '']),
    section('summary', 'Summary', statusBlock(data.success, data.status, data.message) + warningsBlock(data.warnings) + kinetics),
    section('parameters', 'Parameters', parameterTable(data) + startValuesBlock(data)),
    section('statistics', 'Statistics', statisticsTable(data)),
    section(
      'fit-quality',
      'Fit quality',
      `<h3>Parity</h3>${chartGrid(charts.parity)}<h3>Residuals</h3>${chartGrid(charts.residuals)}` +
        (charts.profiles.length ? `<h3>Profiles along the reactor</h3>${chartGrid(charts.profiles)}` : ''),
    ),
    section(
      'identifiability',
      'Identifiability',
      (charts.correlation.length ? chartGrid(charts.correlation) : '<p>No correlation matrix was computed.</p>') +
        (charts.likelihood.length ? `<h3>Profile likelihood</h3>${chartGrid(charts.likelihood)}` : ''),
    ),
    section('rival-models', 'Rival models', rivalTable(data) + chartGrid(charts.rivals)),
    data.transport ? section('transport', 'Transport checks of the lab runs', transportHtml(data.transport)) : '',
    ...(data.lab ? [section('lab-data', 'Lab data and catalyst activity', data.lab.notes.map((n) => `<p>${escapeHtml(n)}</p>`).join('') + chartGrid(charts.drift ?? []))] : []),
    section('observations', 'Observations', influentialBlock(data) + observationTable(data)),
    `<footer>Generated by ${escapeHtml(data.generatedBy)}. Numbers are in the units the study wrote for them (or its displayUnits); “1” marks a dimensionless quantity.</footer>`,
  ].join('\n');
  return htmlDocument(data.title, body);
}

function card(label: string, value: number | null | undefined, unit: string, primary = false): string {
  const v = value === null || value === undefined ? 'not computed' : formatNumber(value);
  return `<div class="card${primary ? ' primary' : ''}"><div class="label">${escapeHtml(label)}</div><div class="value">${escapeHtml(v)}${unitSpan(unit)}</div></div>`;
}

function designTable(data: SizingReportData): string {
  const rows: [string, string][] = [
    ['Target', `<td class="num">${escapeHtml(`${data.target.description}: ${formatNumber(data.target.value)}`)}${unitSpan(data.target.unit)}</td>`],
  ];
  if (data.reactor) rows.push(['Reactor', textCell(data.reactor)]);
  if (data.size.nominal !== undefined && data.size.nominal !== null) rows.push([`Nominal ${data.size.label} (best estimate)`, numCell(data.size.nominal, data.size.unit)]);
  const dp = data.pressureDrop;
  if (dp) {
    rows.push(['Pressure drop', numCell(paToKPa(dp.value), 'kPa')]);
    if (dp.lo !== null && dp.lo !== undefined && dp.hi !== null && dp.hi !== undefined) {
      rows.push(['Pressure drop band', intervalCell([paToKPa(dp.lo), paToKPa(dp.hi)], 'kPa')]);
    }
    if (dp.fractionOfInlet !== null && dp.fractionOfInlet !== undefined) rows.push(['Pressure drop / inlet pressure', numCell(dp.fractionOfInlet * 100, '%', 3)]);
  } else {
    rows.push(['Pressure drop', textCell('not modelled')]);
  }
  const t = data.tubes;
  if (t) {
    const has = (x: number | null | undefined): x is number => x !== null && x !== undefined;
    const install = has(t.installCatalyst) || has(t.installLength) || has(t.installPressureDrop);
    rows.push(
      ['Tubes', countCell(t.count, 'tubes')],
      ['Tube inner diameter', numCell(t.diameter * 1000, 'mm', 3)],
      [install ? 'Tube length (nominal catalyst)' : 'Tube length', numCell(t.length, 'm', 3)],
    );
    if (has(t.sizePerTube)) rows.push([`Per tube: ${data.size.label}`, numCell(t.sizePerTube, data.size.unit)]);
    const p = has(t.designLevel) ? `P${formatNumber(t.designLevel * 100, 3)}` : 'design percentile';
    if (has(t.designLevel)) rows.push(['Tube count designed for percentile', numCell(t.designLevel * 100, '%', 3)]);
    if (has(t.installCatalyst)) rows.push([`Catalyst to install (${p})`, numCell(t.installCatalyst, 'kg')]);
    if (has(t.installLength)) rows.push([`Tube length to install (${p})`, numCell(t.installLength, 'm', 3)]);
    if (has(t.installPressureDrop)) rows.push([`Pressure drop of the installed bed (${p}, nominal kinetics)`, numCell(paToKPa(t.installPressureDrop), 'kPa')]);
  }
  if (data.draws) {
    rows.push(['Monte Carlo draws', countCell(data.draws.total, 'draws')], ['Failed draws', countCell(data.draws.failed, 'draws')]);
  }
  return keyValueTable(rows);
}

function outletTable(data: SizingReportData): string {
  if (data.outlet.length === 0) return '<p>No outlet composition was passed.</p>';
  const rows = data.outlet.map((o) => [
    `<th scope="row">${escapeHtml(o.species)}</th>`,
    numCell(o.value, o.unit),
    numCell(o.lo, o.unit),
    numCell(o.hi, o.unit),
  ]);
  return table(['Species', 'Median', 'Low', 'High'], rows, 'Outlet at the P50 size; low/high span the uncertainty band.');
}

function sensitivityTable(data: SizingReportData): string {
  const rows = [...(data.sensitivity ?? [])]
    .sort((a, b) => Math.abs(b.effect) - Math.abs(a.effect))
    .map((r) => [`<th scope="row"><code>${escapeHtml(r.parameter)}</code></th>`, numCell(r.effect, data.sensitivityUnit ?? '1', 3)]);
  if (rows.length === 0) return '';
  return table(['Parameter', 'Effect'], rows, data.sensitivityMeasure);
}

/** The sizing report as one HTML document; cautions are always shown right after the status. */
export function renderSizingHtml(data: SizingReportData, charts: RenderedSizingCharts): string {
  const s = data.size;
  const failed = data.draws && data.draws.failed > 0 ? `<p>${escapeHtml(`${data.draws.failed} of ${data.draws.total} draws failed and are not in the percentiles.`)}</p>` : '';
  const body = [
    headerBlock(data.title, [`Case: ${data.caseName}`, data.generatedBy, data.generatedAt ?? '']),
    section(
      'summary',
      'Summary',
      statusBlock(data.success, data.status, data.message) +
        cautionsBlock(data.cautions) +
        warningsBlock(data.warnings) +
        `<div class="cards">${card(`${s.label} P50`, s.median, s.unit, true)}${card(`${s.label} P90`, s.p90, s.unit)}${card(`${s.label} P95`, s.p95, s.unit)}${card(data.target.description, data.target.value, data.target.unit)}</div>` +
        failed,
    ),
    section('design', 'Design', designTable(data)),
    section('outlet', 'Outlet composition', outletTable(data)),
    section('uncertainty', 'Uncertainty', chartGrid([...charts.production, ...charts.distribution, ...charts.sensitivity]) + sensitivityTable(data)),
    data.pellet ? section('pellet', 'Plant pellet', pelletHtml(data.pellet) + chartGrid(charts.pellet)) : '',
    data.thermal ? section('thermal', 'Energy balance', `<p>${escapeHtml(`${data.thermal.mode}; binding constraint: ${data.thermal.binding}${data.thermal.met ? '' : ' (not met)'}; hot spot ${data.thermal.hotSpot.value.toFixed(1)} K at ${data.thermal.hotSpot.position.toFixed(2)} m.`)}</p>` + chartGrid(charts.thermal ?? [])) : '',
    `<footer>Generated by ${escapeHtml(data.generatedBy)}. Size unit: ${escapeHtml(formatUnit(s.unit))}. Pressures in kPa; “1” marks a dimensionless quantity.</footer>`,
  ].join('\n');
  return htmlDocument(data.title, body);
}
