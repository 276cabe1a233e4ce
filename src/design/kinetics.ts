/**
 * From a validated hand-off to the objects the design needs: the chemistry (stoichiometry, molar
 * masses, reversibility), the compiled kinetics (parameters in the hand-off order) and the molar
 * masses per species (undefined entries when neither molarMass nor formula was given).
 */
import { buildChemistry, type Chemistry } from '../chemistry/mechanism.js';
import { compileKinetics } from '../kinetics/compile.js';
import type { CompiledKinetics } from '../kinetics/compiled.js';
import type { FittedKinetics } from './handoff.js';
import { checkArgs, is } from '../core/args.js';
import { parseHandoff } from './handoff-load.js';

export interface DesignKinetics {
  chemistry: Chemistry;
  kinetics: CompiledKinetics;
  /** kg/mol per species, or undefined when every species' molar mass is not known. */
  molarMasses?: Float64Array;
}

/** Compile the hand-off's rate laws (throws RateloomError for bad chemistry or rate laws). */
export function kineticsFromHandoff(h: FittedKinetics): DesignKinetics {
  checkArgs('kineticsFromHandoff', [h], [{ name: 'handoff', check: is.object }]);
  parseHandoff(h);
  const chemistry = buildChemistry(h.species, h.reactions, []);
  const kinetics = compileKinetics(
    {
      chemistry,
      rates: h.reactions.map((r) => r.rate),
      parameterNames: h.parameters.map((p) => p.name),
      referenceTemperature: h.referenceTemperature,
    },
    [],
  );
  const known = chemistry.molarMass.every((m) => m !== undefined && m > 0);
  return { chemistry, kinetics, ...(known ? { molarMasses: Float64Array.from(chemistry.molarMass as number[]) } : {}) };
}
