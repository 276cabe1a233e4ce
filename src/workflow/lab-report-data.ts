/**
 * The lab-data and catalyst-activity section of a fit report: notes on how the analyser's numbers
 * were fitted (fractions or ratios directly, not hand-converted flows), the fresh-catalyst basis of
 * the rate constants with the fitted decay rate and its interval, and the repeated reference
 * conditions against time on stream (src/workflow/drift.ts).
 */
import type { LabReportData } from '../report/types.js';
import type { Study } from '../study/types.js';
import { driftCheck } from './drift.js';
import type { StudyFit } from './fit-study.js';
import { responseLabel } from './labels.js';

/** Why the fractions are fitted as measured (shown whenever a study has lab data). */
export const FRACTIONS_NOTE =
  'The analyser fractions were fitted as measured (or as ratios to the internal standard), each with the error model of the fractions carried through by the delta method. Converting them to flows by hand first, F_i = F_s,0 y_i / y_s, spreads the error of the standard\'s peak over every flow of a run; a fit that then treats those flows as independent measurements weights the runs wrongly and states intervals that ignore the shared error. With small errors both give the same estimates; only the direct fit gives intervals with the stated coverage. Ratios to the standard (and a conversion, selectivity or yield) of one run share fraction errors; the fit carries these correlations (generalised least squares, one block per run), so their intervals too have the stated coverage.';

const PER_HOUR = 3600;

function activityNotes(study: Study, sf: StudyFit): string[] {
  const act = study.activity;
  if (!act) return [];
  const notes = [`Catalyst activity model: ${act.model}. The rate constants are those of the fresh catalyst (activity 1); a sizing from this hand-off uses the fresh-catalyst kinetics and must allow for deactivation separately.`];
  for (const name of act.parameters) {
    const p = sf.fit.parameters.find((q) => q.name === name);
    if (!p) continue;
    const scale = p.unit === '1/s' ? PER_HOUR : 1;
    const unit = p.unit === '1/s' ? '1/h' : act.timeUnit === 'run' ? '1 per run' : p.unit;
    const ci = p.ci.profile && p.ci.profile[0] !== null && p.ci.profile[1] !== null ? p.ci.profile : p.ci.linear;
    const fmt = (x: number) => Number((x * scale).toPrecision(3)).toString();
    notes.push(`${name} = ${fmt(p.value)} ${unit}${ci ? ` (${Math.round(100 * p.ci.level)} % interval ${fmt(ci[0] as number)} to ${fmt(ci[1] as number)} ${unit})` : ' (no interval computed)'}.`);
  }
  return notes;
}

function driftData(study: Study, sf: StudyFit): LabReportData['drift'] {
  const predicted = sf.fit.observations.map((o) => o.predicted);
  const d = driftCheck(study, predicted);
  if (!d) return null;
  const hours = d.timeUnit === 's';
  const first = d.series[0];
  const label = responseLabel({ response: first.response, ...(first.species !== undefined ? { species: first.species } : {}) } as Parameters<typeof responseLabel>[0], study);
  const verdict = d.pValue === null
    ? 'The measurement error is not known, so the spread was not tested.'
    : `Spread about each reference mean: chi-square ${d.chi2?.toFixed(1)} on ${d.dof} degrees of freedom, p = ${d.pValue.toPrecision(2)}${d.exceeds ? ' (more than the measurement error explains' + (d.activityModel === 'none' ? '; no activity model is used)' : `; explained by the ${d.activityModel} activity model if the line follows the points)`) : ' (within the measurement error)'}.`;
  return {
    timeLabel: hours ? 'time on stream' : 'run number',
    timeUnit: hours ? 'h' : '1',
    responseTitle: label.unit === '1' ? label.label : `${label.label} (${label.unit})`,
    verdict,
    points: d.series.flatMap((s) => s.points.map((p) => ({ group: s.group, run: p.runId, time: hours ? p.time / 3600 : p.time, measured: p.measured, sigma: p.sigma ?? null, predicted: p.predicted ?? null }))),
  };
}

/** The lab section of a fit report, or null when the study has neither lab data nor an activity model. */
export function labReportData(study: Study, sf: StudyFit): LabReportData | null {
  if (!study.lab && !study.activity) return null;
  const notes: string[] = [];
  if (study.lab) {
    const l = study.lab;
    notes.push(`Analyser data: ${l.basis} basis${l.removed.length ? ` (${l.removed.join(', ')} removed before the analyser)` : ''}, internal standard ${l.standard ?? 'none'}; fitted responses: ${l.fit.join(', ')}.`);
    notes.push(FRACTIONS_NOTE);
    for (const w of l.warnings) notes.push(`Balance: ${w}`);
  }
  notes.push(...activityNotes(study, sf));
  return { notes, drift: driftData(study, sf) };
}
