/**
 * Study side of run-level parameters (src/data/run-parameters.ts): the start value a mapping
 * uses for a field held by a parameter, checked against the field's unit, and the names such
 * parameters have so that candidate rate-law sets keep them.
 */
import { RateloomError, closestName, type FieldPath } from '../core/errors.js';
import { compoundToSI } from '../units/index.js';
import type { ParameterSpec } from './parameters.js';

/** The mapping's parameterStart for the study's declared parameters. */
export function parameterStartFor(specs: readonly ParameterSpec[]): (name: string, siUnit: string, path: FieldPath) => number {
  return (name, siUnit, path) => {
    const spec = specs.find((s) => s.name === name);
    if (!spec) {
      const near = closestName(name, specs.map((s) => s.name));
      throw new RateloomError('E_UNKNOWN_PARAMETER', `parameter '${name}' is not declared${near ? ` (did you mean '${near}'?)` : ''}`, { path, fix: `Declare '${name}' in the parameters list with a start value and a ${siUnit} unit.` });
    }
    if (typeof spec.value !== 'number') {
      throw new RateloomError('E_MISSING_FIELD', `parameter '${name}' holds a run value and needs a numeric start value`, { path, fix: `Give '${name}' a value (its best guess, in ${spec.unit ?? siUnit}).` });
    }
    const si = compoundToSI(spec.value, spec.unit ?? '1', { path });
    if (si.unit !== siUnit) {
      throw new RateloomError('E_UNIT', `parameter '${name}' is in ${spec.unit ?? '1'} (${si.unit} in SI) but the field it fills needs ${siUnit}`, { path, fix: `Give '${name}' a unit of ${siUnit}.` });
    }
    return si.value;
  };
}

/** Names of the parameters that fields of the data sources refer to. */
export function runParameterNames(runs: readonly { runParameters?: readonly { parameter: string }[] }[]): Set<string> {
  const out = new Set<string>();
  for (const r of runs) for (const ref of r.runParameters ?? []) out.add(ref.parameter);
  return out;
}
