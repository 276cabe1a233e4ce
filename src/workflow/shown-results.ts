/**
 * Fit results in the user's units, SI beside (the JSON shape of docs/display-units.md): every
 * shown quantity carries `value` and `unit` in the unit the study used for it (or its
 * `displayUnits`), and `valueSI` and `unitSI`; a parameter's standard error and intervals follow
 * the same rule (`stdError`/`stdErrorSI`, `ci`/`ciSI`, `lower`/`lowerSI`). The conversions come
 * from src/study/display.ts; the numbers themselves are the fit's own, converted once here.
 */
import type { FittedParameter, ObservationDiagnostics, ParameterInterval } from '../estimation/fit-types.js';
import { shownDifference, shownQuantity, shownValue, type DisplayConversion } from '../units/index.js';
export { shownQuantity, type ShownQuantity } from '../units/index.js';
import { studyDisplay, type StudyDisplay } from '../study/display.js';
import type { Study } from '../study/types.js';
import type { DerivedQuantity } from './derived.js';


/** An interval end pair converted; null ends (open profile sides) stay null. */
function shownPair<T extends number | null>(c: DisplayConversion, pair: readonly [T, T]): [T, T] {
  return [shownValue(c, pair[0]) as T, shownValue(c, pair[1]) as T];
}

function shownInterval(c: DisplayConversion, ci: ParameterInterval): ParameterInterval {
  return { ...ci, linear: ci.linear ? shownPair(c, ci.linear) : null, ...(ci.profile ? { profile: shownPair(c, ci.profile) } : {}) };
}


/** A fitted parameter as it appears in JSON results: shown values, SI beside. */
export type ShownParameter = Omit<FittedParameter, 'lower' | 'upper'> & {
  valueSI: number;
  unitSI: string;
  stdErrorSI: number | null;
  ciSI: ParameterInterval;
  lower: number;
  upper: number;
  lowerSI: number;
  upperSI: number;
};

/** Fitted parameters in the units of their start values (or the study's displayUnits), SI beside. */
export function shownParameters(display: StudyDisplay, parameters: readonly FittedParameter[]): ShownParameter[] {
  return parameters.map((p) => {
    const c = display.parameter(p.name, p.unit);
    return {
      ...p,
      value: shownValue(c, p.value) as number,
      unit: c.unit,
      stdError: shownDifference(c, p.stdError),
      ci: shownInterval(c, p.ci),
      lower: shownValue(c, p.lower) as number,
      upper: shownValue(c, p.upper) as number,
      valueSI: p.value,
      unitSI: p.unit,
      stdErrorSI: p.stdError,
      ciSI: p.ci,
      lowerSI: p.lower,
      upperSI: p.upper,
    };
  });
}

/** A derived quantity (pre-exponential factor) shown like the parameter it is named after. */
export type ShownDerived = DerivedQuantity & { valueSI: number; unitSI: string; stdErrorSI: number | null; ciSI: DerivedQuantity['ci'] };

export function shownDerived(display: StudyDisplay, derived: readonly DerivedQuantity[]): ShownDerived[] {
  return derived.map((q) => {
    const c = display.parameter(q.name, q.unit);
    return {
      ...q,
      value: shownValue(c, q.value) as number,
      unit: c.unit,
      stdError: shownDifference(c, q.stdError),
      ci: { ...q.ci, linear: q.ci.linear ? shownPair(c, q.ci.linear) : null },
      valueSI: q.value,
      unitSI: q.unit,
      stdErrorSI: q.stdError,
      ciSI: q.ci,
    };
  });
}

/** Observation diagnostics with the measured, predicted and residual values in the unit of the CSV column, SI beside. */
export type ShownObservation = ObservationDiagnostics & { unit: string; unitSI: string; measuredSI: number; predictedSI: number; residualSI: number };

export function shownObservations(study: Study, display: StudyDisplay, observations: readonly ObservationDiagnostics[]): ShownObservation[] {
  return observations.map((d) => {
    const o = study.observations[d.index];
    const c = o ? display.observation(o) : { unit: '1', factor: 1, shift: 0 };
    return {
      ...d,
      unit: c.unit,
      measured: shownValue(c, d.measured) as number,
      predicted: shownValue(c, d.predicted) as number,
      residual: shownDifference(c, d.residual) as number,
      unitSI: o?.unit ?? '1',
      measuredSI: d.measured,
      predictedSI: d.predicted,
      residualSI: d.residual,
    };
  });
}

/** The parts of a fit's JSON that carry units, shown in the user's units with SI beside. */
export function shownFitParts(study: Study, fit: { parameters: readonly FittedParameter[]; observations: readonly ObservationDiagnostics[] }, derived: readonly DerivedQuantity[]) {
  const display = studyDisplay(study);
  return {
    parameters: shownParameters(display, fit.parameters),
    observations: shownObservations(study, display, fit.observations),
    derived: shownDerived(display, derived),
    referenceTemperature: shownQuantity(display.referenceTemperature(), study.referenceTemperature, 'K'),
    displayUnits: display.units,
  };
}
