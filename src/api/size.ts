/**
 * Sizing entry point of the public API: fitted-kinetics hand-off + production case -> sized
 * reactor with the kinetic uncertainty carried through (Monte Carlo and delta method).
 */
import { parseHandoff } from '../design/handoff-load.js';
import { kineticsFromHandoff, type DesignKinetics } from '../design/kinetics.js';
import { loadCase, type DesignCase } from '../design/case.js';
import type { FittedKinetics } from '../design/handoff.js';
import { sizeReactor as sizeInput, type SizingInput, type SizingOptions, type SizingResult } from '../design/size.js';
import { readJson, withFile } from './files.js';
import { checkArgs, is, options as optionsArg, type ArgSpec } from '../core/args.js';

/** The arguments of the sizing entry points. */
export const SIZING_ARGS: readonly ArgSpec[] = [{ name: 'handoff', check: is.pathOrObject }, { name: 'designCase', check: is.pathOrObject }, optionsArg('options', ['draws', 'seed'])];

/** A sizing input read and checked: the parsed JSON (for worker threads) and the typed input. */
export interface SizingSetup {
  /** The hand-off and case documents as parsed JSON. */
  sources: { handoff: unknown; case: unknown };
  handoff: FittedKinetics;
  kinetics: DesignKinetics;
  kase: DesignCase;
}

/** A JSON document given as a file path or as the parsed value. */
const documentOf = (v: unknown, what: string): { raw: unknown; file: string } =>
  typeof v === 'string' ? { raw: readJson(v, what), file: v } : { raw: v, file: `${what} (in memory)` };

/**
 * Read and check a hand-off and a production case (paths or parsed JSON); errors name the file.
 * The case is checked against the hand-off's species and reactions.
 */
export function prepareSizing(handoff: unknown, designCase: unknown): SizingSetup {
  checkArgs('prepareSizing', [handoff, designCase], SIZING_ARGS.slice(0, 2));
  const h = documentOf(handoff, 'fitted-kinetics file');
  const parsed = withFile(h.file, () => parseHandoff(h.raw));
  const kinetics = kineticsFromHandoff(parsed);
  const c = documentOf(designCase, 'case file');
  const kase = withFile(c.file, () => loadCase(c.raw, kinetics.kinetics.speciesNames, kinetics.kinetics.reactionIds));
  return { sources: { handoff: h.raw, case: c.raw }, handoff: parsed, kinetics, kase };
}

/** The SizingInput of a prepared setup with the given options. */
export function sizingInput(setup: SizingSetup, options: SizingOptions = {}): SizingInput {
  checkArgs('sizingInput', [setup, options], [{ name: 'setup', check: is.sizingSetup }, SIZING_ARGS[2]]);
  const { kinetics: dk } = setup;
  return { handoff: setup.handoff, kinetics: dk.kinetics, kase: setup.kase, ...(dk.molarMasses ? { molarMasses: dk.molarMasses } : {}), options };
}

/**
 * Size the production reactor from fitted kinetics, on this thread.
 *
 * @param handoff - Fitted-kinetics hand-off written by `rateloom fit` / buildHandoff: a file path or
 *   the parsed JSON.
 * @param designCase - Production case (reactor kind, feed, temperature, pressure, target, tubes,
 *   heat, uncertainty): a file path or the parsed JSON; units as in the case-file format.
 * @param options - Monte Carlo `draws` (default the case's, 10000; 0 = delta method only), `seed`,
 *   confidence `levels`, `designLevel`, `onProgress`.
 * @returns Size with units, percentiles, tubes, outlet, warnings and the cautions; a target that
 *   cannot be reached is a status, not an exception.
 */
export function sizeReactor(handoff: unknown, designCase: unknown, options: SizingOptions = {}): SizingResult {
  checkArgs('sizeReactor', [handoff, designCase, options], SIZING_ARGS);
  return sizeInput(sizingInput(prepareSizing(handoff, designCase), options));
}
