/**
 * HTML blocks of the pellet parts of the reports: the plant pellet of a sizing (design values,
 * inlet film, trade-off table) and the transport checks of the lab runs in a fit report.
 */
import { escapeHtml, formatNumber } from './format.js';
import { keyValueTable, numCell, table, textCell } from './html-parts.js';
import type { PelletReportData, TransportReportData } from './types.js';

/** Design values, inlet film and trade-off of the plant pellet. */
export function pelletHtml(p: PelletReportData): string {
  const kv = keyValueTable([
    ['Pellet', `<td>${escapeHtml(p.shape)}</td>`],
    ['Diameter', numCell(p.diameterMm, 'mm')],
    ['Diameter for bed correlations (6 Vp/Sp)', numCell(p.equivalentDiameterMm, 'mm')],
    ['Effectiveness factor from', `<td>${p.method === 'numerical' ? 'the pellet balance solved by orthogonal collocation' : "Bischoff's generalized Thiele modulus (estimate)"}</td>`],
    ['Catalyst mass with the pellet (nominal fit)', numCell(p.nominalSize, 'kg')],
    ['Catalyst mass with intrinsic kinetics', numCell(p.intrinsicSize, 'kg')],
    ['Pellet solves in the nominal sizing', `<td class="num">${p.pelletSolves}</td>`],
    ...p.effectiveDiffusivity.map((d): [string, string] => [`Effective diffusivity of ${d.species}`, numCell(d.value, 'm2/s', 3)]),
  ]);
  const film = p.film
    ? table(['Reaction', 'Internal effectiveness at the inlet', 'Overall (film + pellet)'], p.film.rows.map((r) => [textCell(r.reaction), numCell(r.internal, '1', 4), numCell(r.overall, '1', 4)]),
        `External film at the bed inlet, Re = ${formatNumber(p.film.reynolds, 3)}: ${p.film.correlations.join('; ')}. The bed balances use the internal factor.`)
    : '<p>External film: not computed (needs tubes, molecular diffusivities and the fluid viscosity).</p>';
  const rows = p.tradeOff.rows.map((r) => [numCell(r.diameterMm, 'mm'), numCell(r.catalystMass, 'kg'), numCell(r.pressureDropKPa, 'kPa'), numCell(r.etaInlet, '1', 3), textCell(r.status)]);
  const trade = table(['Pellet diameter', 'Catalyst mass', 'Pressure drop', 'Effectiveness at inlet', 'Status'], rows,
    `Pellet trade-off${p.tradeOff.tubeCount ? ` with ${p.tradeOff.tubeCount} tubes` : ''}${p.tradeOff.allowedKPa !== null ? `; allowed pressure drop ${formatNumber(p.tradeOff.allowedKPa, 4)} kPa` : ''}.`);
  return kv + film + trade;
}

/** The transport checks of the lab runs. */
export function transportHtml(t: TransportReportData): string {
  const bad = t.rows.filter((r) => !r.intrinsic);
  const head = `<p>Observed rate: ${escapeHtml(t.rateSource)} of ${escapeHtml(t.keyReactant)} (reaction ${escapeHtml(t.reaction)}). ` +
    `Limits: Weisz-Prater ${t.limits.weiszPrater}, Mears ${t.limits.mears}. ${bad.length} of ${t.rows.length} runs fail a check` +
    `${t.skipped ? `; ${t.skipped} runs could not be checked` : ''}.</p>`;
  const rows = t.rows.map((r) => [
    textCell(r.runId), numCell(r.observedRate, 'mol/(kg s)', 3), numCell(r.weiszPrater, '1', 3), numCell(r.mearsMass, '1', 3),
    numCell(r.mearsHeat, '1', 3), numCell(r.praterRise, 'K', 3), textCell(r.intrinsic ? 'yes' : `no: ${r.failed.join(', ')}`),
  ]);
  const note = bad.length ? `<p class="warning">${escapeHtml(t.note)}</p>` : '';
  return head + table(['Run', 'Observed rate', 'Weisz-Prater', 'Mears (mass)', 'Mears (heat)', 'Max. internal rise (Prater)', 'Intrinsic?'], rows, `Film correlations: ${t.correlations.join('; ')}.`) + note;
}
