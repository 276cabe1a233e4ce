/**
 * Markdown summaries of the fit and sizing reports: the same numbers as the HTML documents in
 * plain tables (every number followed by its unit), without charts.
 */
import { criterionDeltaText, criterionText } from '../core/criterion.js';
import { escapeMarkdown as md, formatInterval, formatNumber, formatUnit, NOT_COMPUTED, paToKPa, SIG_VALUE } from './format.js';
import type { FitReportData, PelletReportData, ReportWarning, SizingReportData, ThermalReportData, TransportReportData } from './types.js';

/** A number with its unit, or 'not computed'. */
export function q(x: number | null | undefined, unit: string | null | undefined, sig = SIG_VALUE): string {
  if (x === null || x === undefined) return NOT_COMPUTED;
  return `${formatNumber(x, sig)} ${md(formatUnit(unit))}`;
}

/** A Markdown table, first column left-aligned, the others right-aligned. */
export function mdTable(head: string[], rows: string[][]): string {
  const align = head.map((_, i) => (i === 0 ? '---' : '---:'));
  return [`| ${head.map(md).join(' | ')} |`, `| ${align.join(' | ')} |`, ...rows.map((r) => `| ${r.join(' | ')} |`)].join('\n');
}

/** Warnings as a Markdown list; says so when there are none. */
export function warningLines(warnings: ReportWarning[]): string {
  if (warnings.length === 0) return 'No warnings.';
  return warnings.map((w) => `- ${md(w.message)} \\[${md(w.code)}\\]`).join('\n');
}

/** The status line: trustworthy or not, status code and message. */
export function statusLine(success: boolean, status: string, message: string): string {
  return `**${success ? 'Trustworthy' : 'NOT TRUSTWORTHY'}** (status \`${status.replace(/`/g, "'")}\`): ${md(message)}`;
}

/** Rows of the statistics table (lack of fit where replicates exist). */
function statisticsRows(data: FitReportData): string[][] {
  const s = data.statistics;
  const statsRows: string[][] = [
    ['Observations n', q(s.n, 'obs.', 12)],
    ['Estimated parameters p', q(s.p, 'par.', 12)],
    ['Degrees of freedom', q(s.dof, 'dof', 12)],
    ['Sum of squared residuals', q(s.ssr, s.ssrUnit ?? '1')],
    ['Residual standard deviation', q(s.residualStdDev, s.residualUnit ?? '1')],
    ['AICc', `${criterionText(s.aicc)} 1`],
    ['BIC', `${criterionText(s.bic)} 1`],
    ['Covariance basis', md(s.covarianceBasis)],
  ];
  if (s.lackOfFit) {
    const l = s.lackOfFit;
    statsRows.push(
      ['Lack of fit F', q(l.F, '1')],
      ['Lack of fit / pure error dof', `${l.dofLackOfFit} / ${l.dofPureError} dof`],
      ['Lack of fit p value', q(l.pValue, '1', 3)],
    );
    if (l.conclusion) statsRows.push(['Lack of fit reading', md(l.conclusion)]);
  } else statsRows.push(['Lack of fit', 'not tested (no replicates)']);
  return statsRows;
}

/** The lab-data and catalyst-activity notes, with the reference points as a table. */
function labLines(data: FitReportData): string[] {
  const lab = data.lab;
  if (!lab) return [];
  const out = ['## Lab data and catalyst activity', lab.notes.map((n) => `- ${md(n)}`).join('\n')];
  const d = lab.drift;
  if (d && d.points.length) {
    out.push(md(d.verdict), mdTable(['Reference', 'Run', d.timeLabel, `Measured ${d.responseTitle}`, 'Sigma', 'Predicted'], d.points.map((p) => [md(p.group), md(p.run), q(p.time, d.timeUnit), q(p.measured, '1'), q(p.sigma, '1', 3), q(p.predicted, '1')])));
  }
  return out;
}

/** The fit summary in Markdown. */
/** The influential observations: the count and a table of the most extreme few (nothing when there are none). */
function influentialMarkdown(data: FitReportData): string[] {
  const inf = data.influential;
  if (!inf || inf.count === 0) return [];
  const shown = inf.count > inf.rows.length ? `The ${inf.rows.length} with the largest |studentized residual| of ${inf.count}` : `All ${inf.count}`;
  return [
    `## Influential observations (${inf.count})`,
    `${shown}, beyond the Bonferroni bound of the outlier test (a warning only; the verdict does not depend on it).`,
    mdTable(['Run', 'Response', 'CSV line', 'Studentized residual', "Cook's distance", 'Moves the estimates'], inf.rows.map((r) => [md(r.runId), md(r.response), md(r.line), q(r.studentizedResidual, '1', 3), q(r.cooksDistance, '1', 3), r.movesEstimates ? 'yes' : 'little'])),
  ];
}

export function renderFitMarkdown(data: FitReportData): string {
  const level = data.parameters.find((p) => p.ciLevel !== undefined)?.ciLevel;
  const lv = level === undefined ? '' : `${formatNumber(level * 100, 3)} % `;
  const params = mdTable(
    ['Parameter', 'Estimate', 'Std. error', `${lv}linear CI`, `${lv}profile CI`, 'Flags'],
    data.parameters.map((p) => [
      md(p.name),
      q(p.value, p.unit),
      p.fixed ? 'fixed' : q(p.stdError, p.unit, 3),
      p.fixed ? 'fixed' : p.linearCI ? `${formatInterval(p.linearCI)} ${md(formatUnit(p.unit))}` : NOT_COMPUTED,
      p.fixed ? 'fixed' : p.profileCI ? `${formatInterval(p.profileCI)} ${md(formatUnit(p.unit))}` : NOT_COMPUTED,
      md([...(p.fixed && !(p.flags ?? []).includes('fixed') ? ['fixed'] : []), ...(p.flags ?? [])].join(', ')),
    ]),
  );
  const statsRows = statisticsRows(data);
  const parts = [
    `# ${md(data.title)}`,
    `Study: ${md(data.studyName)} · ${md(data.generatedBy)}${data.generatedAt ? ` · ${md(data.generatedAt)}` : ''}`,
    'Numbers are in the units the study wrote for them (or its displayUnits); the unit 1 marks a dimensionless quantity.',
    '## Summary',
    statusLine(data.success, data.status, data.message),
    warningLines(data.warnings),
  ];
  if (data.kinetics && data.kinetics.length) parts.push('Rate laws:', data.kinetics.map((k) => `    ${k.replace(/\r?\n/g, ' ')}`).join('\n'));
  parts.push('## Parameters', params);
  const sv = data.startValues;
  if (sv && sv.rows.length) {
    parts.push(
      '## Starting values estimated by rateloom',
      mdTable(['Parameter', 'Start', 'Method', 'How'], sv.rows.map((r) => [md(r.parameter), q(r.value, r.unit), md(r.method), md(r.how)])),
    );
    if (sv.points !== null && sv.points !== undefined) parts.push(`The differential method used ${sv.points} rate points.`);
    if (sv.notes && sv.notes.length) parts.push(sv.notes.map((n) => `- ${md(n)}`).join('\n'));
  }
  parts.push('## Statistics', mdTable(['Quantity', 'Value'], statsRows));
  parts.push(...influentialMarkdown(data));
  const models = data.rivalModels ?? [];
  if (models.length) {
    const best = Math.min(...models.map((m) => m.aicc).filter(Number.isFinite));
    parts.push(
      '## Rival models',
      mdTable(
        ['Model', 'SSR', 'dof', 'AICc', 'ΔAICc', 'BIC', 'Akaike weight', 'Verdict'],
        models.map((m) => [
          md(m.name),
          q(m.ssr, m.ssrUnit ?? '1'),
          q(m.dof, 'dof', 12),
          `${criterionText(m.aicc)} 1`,
          `${criterionDeltaText(m.aicc, best)} 1`,
          `${criterionText(m.bic)} 1`,
          q(m.akaikeWeight, '1', 3),
          md(m.verdict),
        ]),
      ),
    );
  }
  if (data.transport) parts.push(...transportMarkdown(data.transport));
  if (data.correlation && data.correlation.names.length) {
    const c = data.correlation;
    parts.push(
      '## Parameter correlation',
      mdTable(['', ...c.names], c.names.map((n, i) => [md(n), ...c.names.map((_, j) => q(c.matrix[i]?.[j], '1', 3))])),
    );
  }
  parts.push(...labLines(data));
  return parts.join('\n\n') + '\n';
}

/** The sizing summary in Markdown; cautions come right after the status. */
export function renderSizingMarkdown(data: SizingReportData): string {
  const s = data.size;
  const cautions = data.cautions.length ? data.cautions.map((c) => `> - ${md(c)}`).join('\n') : '> No cautions were passed with this case.';
  const sizeRows: string[][] = [
    [`${md(s.label)} P50`, q(s.median, s.unit)],
    [`${md(s.label)} P90`, q(s.p90, s.unit)],
    [`${md(s.label)} P95`, q(s.p95, s.unit)],
    ['Target', `${md(data.target.description)}: ${q(data.target.value, data.target.unit)}`],
  ];
  if (s.nominal !== undefined && s.nominal !== null) sizeRows.push([`Nominal ${md(s.label)}`, q(s.nominal, s.unit)]);
  if (data.reactor) sizeRows.push(['Reactor', md(data.reactor)]);
  const dp = data.pressureDrop;
  sizeRows.push(['Pressure drop', dp ? q(paToKPa(dp.value), 'kPa') : 'not modelled']);
  if (dp && dp.fractionOfInlet !== null && dp.fractionOfInlet !== undefined) sizeRows.push(['Pressure drop / inlet pressure', q(dp.fractionOfInlet * 100, '%', 3)]);
  const t = data.tubes;
  if (t) {
    const has = (x: number | null | undefined): x is number => x !== null && x !== undefined;
    const install = has(t.installCatalyst) || has(t.installLength) || has(t.installPressureDrop);
    sizeRows.push(
      ['Tubes', q(t.count, 'tubes', 12)],
      ['Tube inner diameter', q(t.diameter * 1000, 'mm', 3)],
      [install ? 'Tube length (nominal catalyst)' : 'Tube length', q(t.length, 'm', 3)],
    );
    const p = has(t.designLevel) ? `P${formatNumber(t.designLevel * 100, 3)}` : 'design percentile';
    if (has(t.designLevel)) sizeRows.push(['Tube count designed for percentile', q(t.designLevel * 100, '%', 3)]);
    if (has(t.installCatalyst)) sizeRows.push([`Catalyst to install (${p})`, q(t.installCatalyst, 'kg')]);
    if (has(t.installLength)) sizeRows.push([`Tube length to install (${p})`, q(t.installLength, 'm', 3)]);
    if (has(t.installPressureDrop)) sizeRows.push([`Pressure drop of the installed bed (${p}, nominal kinetics)`, q(paToKPa(t.installPressureDrop), 'kPa')]);
  }
  if (data.draws) sizeRows.push(['Monte Carlo draws (failed)', `${q(data.draws.total, 'draws', 12)} (${q(data.draws.failed, 'draws', 12)})`]);
  const parts = [
    `# ${md(data.title)}`,
    `Case: ${md(data.caseName)} · ${md(data.generatedBy)}${data.generatedAt ? ` · ${md(data.generatedAt)}` : ''}`,
    'The unit 1 marks a dimensionless quantity.',
    '## Summary',
    statusLine(data.success, data.status, data.message),
    '> **Read before using this size**\n>\n' + cautions,
    warningLines(data.warnings),
    '## Size',
    mdTable(['Quantity', 'Value'], sizeRows),
  ];
  if (data.outlet.length) {
    parts.push('## Outlet composition', mdTable(['Species', 'Median', 'Low', 'High'], data.outlet.map((o) => [md(o.species), q(o.value, o.unit), q(o.lo, o.unit), q(o.hi, o.unit)])));
  }
  if (data.sensitivity && data.sensitivity.length) {
    const rows = [...data.sensitivity].sort((a, b) => Math.abs(b.effect) - Math.abs(a.effect));
    parts.push('## Sensitivity', data.sensitivityMeasure ? md(data.sensitivityMeasure) : '', mdTable(['Parameter', 'Effect'], rows.map((r) => [md(r.parameter), q(r.effect, data.sensitivityUnit ?? '1', 3)])));
  }
  if (data.thermal) parts.push(...thermalMarkdown(data.thermal));
  if (data.pellet) parts.push(...pelletMarkdown(data.pellet));
  return parts.filter((p) => p !== '').join('\n\n') + '\n';
}

/** A value with its P50/P90/P95 (or whatever levels were drawn) in one cell. */
function withPercentiles(x: number | null, unit: string, ps?: { level: number; value: number }[]): string {
  const tail = ps && ps.length ? ` (${ps.map((p) => `P${formatNumber(p.level * 100, 3)} ${q(p.value, unit, 5)}`).join(', ')})` : '';
  return `${q(x, unit, 5)}${tail}`;
}

/** The energy-balance section of a sizing summary. */
function thermalMarkdown(t: ThermalReportData): string[] {
  const rows: string[][] = [
    ['Mode', md(t.mode)],
    ['Binding constraint', `${md(t.binding)}${t.met ? '' : ' (NOT MET)'}`],
  ];
  const d = t.design;
  if (d) {
    rows.push(
      ['Tubes', `${q(d.count, 'tubes', 12)} x ${q(d.diameter * 1000, 'mm', 3)}`],
      ['Tube length (limit)', `${q(d.length, 'm', 4)} (${q(d.maxLength, 'm', 4)})`],
      ['Pressure drop (allowed)', `${q(paToKPa(d.pressureDrop), 'kPa')} (${q(paToKPa(d.allowedPressureDrop), 'kPa')})`],
      ['Overall coefficient U', d.U === null ? md(d.uSource) : `${q(d.U, 'W/(m2 K)', 4)}, ${md(d.uSource)}`],
    );
  }
  rows.push(['Hot spot (nominal; percentiles over the draws)', `${withPercentiles(t.hotSpot.value, 'K', t.hotSpotPercentiles)} at ${q(t.hotSpot.position, 'm', 3)}`]);
  rows.push(['Hot-spot limit', t.hotSpot.limit === null ? 'none given' : q(t.hotSpot.limit, 'K', 5)]);
  if (t.outletTemperature) rows.push(['Outlet temperature', withPercentiles(t.outletTemperature.value, 'K', t.outletTemperature.percentiles)]);
  if (t.runaway) rows.push(['Design / critical coolant temperature', `${q(t.runaway.design, 'K', 5)} / ${q(t.runaway.critical, 'K', 5)}`]);
  const m = t.runawayMargin;
  if (m) {
    const iv = m.interval ? `; 95 % interval of P${formatNumber(Math.min(...(m.percentiles ?? []).map((p) => p.level)) * 100, 3)}: ${q(m.interval[0], 'K', 4)} to ${q(m.interval[1], 'K', 4)}` : '';
    rows.push([`Runaway margin${m.of ? ` (percentiles over ${m.draws} of the ${m.of} draws, a random subset)` : ''}`, `${withPercentiles(m.value, 'K', m.percentiles)}${iv}`]);
  }
  for (const r of t.pellet?.rows ?? []) rows.push([`Pellet effectiveness of ${md(r.reaction)}, inlet / outlet (local temperature)`, `${q(r.inlet, '1', 4)} / ${q(r.outlet, '1', 4)}`]);
  if (t.pellet) rows.push(['Pellet film', t.pellet.film ? md(t.pellet.film) : 'not applied (internal effectiveness only)']);
  return [
    '## Energy balance',
    t.runaway ? `Runaway criterion: ${md(t.runaway.criterion)}.` : 'No coolant: no runaway margin.',
    mdTable(['Quantity', 'Value'], rows),
  ];
}

/** The plant pellet section of a sizing summary. */
function pelletMarkdown(p: PelletReportData): string[] {
  const eta = p.profile.series.map((s) => {
    const first = s.points[0]?.eta;
    const last = s.points[s.points.length - 1]?.eta;
    return [md(s.reaction), q(first, '1', 3), q(last, '1', 3)];
  });
  return [
    '## Plant pellet',
    `${md(p.shape)}, ${q(p.diameterMm, 'mm', 3)}; effectiveness from ${p.method === 'numerical' ? 'the pellet balance solved numerically' : "Bischoff's generalized modulus"}. ` +
      `Catalyst mass ${q(p.nominalSize, 'kg')} with the pellet, ${q(p.intrinsicSize, 'kg')} with intrinsic kinetics.`,
    mdTable(['Reaction', 'Effectiveness at inlet', 'Effectiveness at outlet'], eta),
    mdTable(['Pellet diameter', 'Catalyst mass', 'Pressure drop', 'Effectiveness at inlet', 'Status'],
      p.tradeOff.rows.map((r) => [q(r.diameterMm, 'mm', 3), q(r.catalystMass, 'kg'), q(r.pressureDropKPa, 'kPa'), q(r.etaInlet, '1', 3), md(r.status)])),
  ];
}

/** The transport checks of the lab runs in a fit summary. */
function transportMarkdown(t: TransportReportData): string[] {
  const bad = t.rows.filter((r) => !r.intrinsic);
  return [
    '## Transport checks of the lab runs',
    `Observed rate: ${md(t.rateSource)} of ${md(t.keyReactant)}. Limits: Weisz-Prater ${t.limits.weiszPrater}, Mears ${t.limits.mears}. ${bad.length} of ${t.rows.length} runs fail a check.`,
    mdTable(['Run', 'Observed rate', 'Weisz-Prater', 'Mears (mass)', 'Mears (heat)', 'Max. internal rise', 'Intrinsic?'],
      t.rows.map((r) => [md(r.runId), q(r.observedRate, 'mol/(kg s)', 3), q(r.weiszPrater, '1', 3), q(r.mearsMass, '1', 3), q(r.mearsHeat, '1', 3), q(r.praterRise, 'K', 3), r.intrinsic ? 'yes' : md(`no: ${r.failed.join(', ')}`)])),
    bad.length ? `> ${md(t.note)}` : '',
  ];
}
