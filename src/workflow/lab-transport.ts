/**
 * Transport diagnostics of a study's lab runs (src/pellets/diagnostics.ts) when the study describes
 * the lab pellet (`transport`): per packed-bed run the Weisz-Prater number, the Mears numbers for
 * the external film (Wakao-Funazkri coefficients from the lab tube's flow) and the internal
 * temperature rise, with warnings naming the runs where the kinetics may not be intrinsic.
 *
 * The observed rate of a run: after a fit, the fitted rate of the key reactant at the run's inlet
 * (the largest in the bed for rates that fall with conversion, so the check errs on the safe
 * side); before a fit (`rateloom check`), the mean rate F_A0 X / W from the measured conversion.
 */
import type { Study, StudyRun } from '../study/types.js';
import type { CompiledKinetics } from '../kinetics/compiled.js';
import type { Warning } from '../core/outcome.js';
import type { FitResult } from '../estimation/fit-types.js';
import type { StudyModel } from './study-model.js';
import { molarMassOf } from '../chemistry/formula.js';
import { measuredConversions } from '../study/summary.js';
import { pelletGeometry } from '../pellets/geometry.js';
import { effectiveDiffusivities, molecularDiffusivities } from '../pellets/diffusivity.js';
import { HEAT_TRANSFER, MASS_TRANSFER, heatTransfer, massTransfer, rangeWarning } from '../pellets/external.js';
import {
  ACTIVATION_ENERGY_NOTE, MEARS_LIMIT, WEISZ_PRATER_LIMIT, diagnosticsWarnings, runDiagnostics,
  type RunDiagnostics, type TransportContext,
} from '../pellets/diagnostics.js';
import { GAS_CONSTANT, STANDARD_ATMOSPHERE } from '../core/constants.js';

export interface LabTransport {
  /** Where the observed rates came from. */
  rateSource: 'fitted rate at the inlet' | 'measured mean rate F_A0 X / W';
  keyReactant: string;
  /** Reaction the key reactant is consumed by, whose order, enthalpy and activation energy are used. */
  reaction: string;
  rows: RunDiagnostics[];
  /** Runs left out, and why. */
  skipped: { runId: string; reason: string }[];
  limits: { weiszPrater: number; mears: number };
  correlations: string[];
  note: string;
  warnings: Warning[];
}

/** Parameter values by name: fitted values after a fit, start values before. */
export type ParameterValues = ReadonlyMap<string, number>;

/** What the diagnostics read of the reactions: names and stoichiometry (chemistry or compiled kinetics). */
type Stoichiometry = Pick<CompiledKinetics, 'speciesNames' | 'reactionIds' | 'stoich'>;

/** Index of the first reaction consuming species j. */
function consumingReaction(kin: Stoichiometry, j: number): number {
  const nS = kin.speciesNames.length;
  for (let i = 0; i < kin.reactionIds.length; i++) if (kin.stoich[i * nS + j] < 0) return i;
  return -1;
}

/** Inlet concentrations of a flow run, mol/m3. */
function inletConcentrations(study: Study, run: StudyRun): Float64Array | undefined {
  const F = run.feed;
  if (!F) return undefined;
  let FT = 0;
  for (const f of F) FT += f;
  if (study.reactor.phase === 'gas') {
    if (run.pressure === undefined || !(FT > 0)) return undefined;
    const cT = run.pressure / (GAS_CONSTANT * run.temperature);
    return Float64Array.from(F, (f) => (cT * f) / FT);
  }
  return run.volumetricFlow ? Float64Array.from(F, (f) => f / run.volumetricFlow!) : undefined;
}

/** Order of the key reactant in the reaction's rate law (stoichiometric coefficient by default). */
function keyOrder(study: Study, i: number, key: string, values: ParameterValues): number {
  const rate = study.reactions[i].rate as { orders?: Record<string, number | string> };
  const o = rate.orders?.[key];
  if (typeof o === 'number') return o;
  if (typeof o === 'string') return values.get(o) ?? 1;
  const nS = study.species.length;
  return Math.abs(study.chemistry.stoich[i * nS + study.keyReactantIndex] || 1);
}

/** Activation energy of reaction i (J/mol), when its rate law names one. */
function activationEnergy(study: Study, i: number, values: ParameterValues): number | undefined {
  const name = (study.reactions[i].rate as { rateConstant?: { activationEnergy?: string } }).rateConstant?.activationEnergy;
  return name !== undefined ? values.get(name) : undefined;
}

/**
 * Diagnostics of every packed-bed run. `rates`, when given, returns the fitted rate of the key
 * reactant (mol/(kg s)) at a run's inlet; without it the measured mean rate is used.
 */
export function labTransport(study: Study, kinetics: Stoichiometry, values: ParameterValues, rates?: (runIndex: number, C: Float64Array) => number): LabTransport | undefined {
  const tr = study.transport;
  if (!tr || study.reactor.kind !== 'packed-bed') return undefined;
  const key = study.keyReactantIndex;
  const i = consumingReaction(kinetics, key);
  if (i < 0) return undefined;
  const geo = pelletGeometry(tr.pellet);
  const enthalpy = tr.reactionEnthalpy[kinetics.reactionIds[i]];
  const E = activationEnergy(study, i, values);
  const ctx: TransportContext = {
    radius: 3 * geo.volumeToSurface,
    pelletDensity: tr.pellet.density,
    order: keyOrder(study, i, study.keyReactant, values),
    ...(study.reactor.bulkDensity !== undefined ? { bulkDensity: study.reactor.bulkDensity } : {}),
    ...(enthalpy !== undefined ? { enthalpy } : {}),
    ...(E !== undefined ? { activationEnergy: E } : {}),
    ...(tr.pellet.thermalConductivity !== undefined ? { conductivity: tr.pellet.thermalConductivity } : {}),
  };
  const measured = rates ? undefined : measuredConversions(study);
  const rows: RunDiagnostics[] = [];
  const skipped: LabTransport['skipped'] = [];
  const warnings: Warning[] = [];
  study.runs.forEach((run, r) => {
    const C = inletConcentrations(study, run);
    const F0 = run.feed?.[key];
    if (!C || !(F0 && F0 > 0)) return void skipped.push({ runId: run.id, reason: 'no inlet composition of the key reactant' });
    const X = measured?.get(run.id);
    const rate = rates ? rates(r, C) : X !== undefined ? (F0 * X) / run.size : NaN;
    if (!Number.isFinite(rate)) return void skipped.push({ runId: run.id, reason: 'no measured conversion of the key reactant' });
    const film = filmOf(study, run, geo.equivalentDiameter, key, warnings);
    const De = effectiveDiffusivities(tr.pellet, study.species, run.temperature, run.pressure ?? STANDARD_ATMOSPHERE, ['transport', 'pellet'])[key];
    rows.push(runDiagnostics({ runId: run.id, observedRate: rate, bulkConcentration: C[key], temperature: run.temperature, effectiveDiffusivity: De, ...film }, ctx));
  });
  warnings.push(...diagnosticsWarnings(rows));
  return {
    rateSource: rates ? 'fitted rate at the inlet' : 'measured mean rate F_A0 X / W',
    keyReactant: study.keyReactant,
    reaction: kinetics.reactionIds[i],
    rows,
    skipped,
    limits: { weiszPrater: WEISZ_PRATER_LIMIT, mears: MEARS_LIMIT },
    correlations: [MASS_TRANSFER.name, HEAT_TRANSFER.name],
    note: ACTIVATION_ENERGY_NOTE,
    warnings: dedupe(warnings),
  };
}

/** Film coefficients of a run's lab tube (gas with tube diameter and viscosity), else none. */
function filmOf(study: Study, run: StudyRun, dp: number, key: number, warnings: Warning[]): { kc?: number; h?: number } {
  const tr = study.transport!;
  const mu = tr.fluid.viscosity;
  if (study.reactor.phase !== 'gas' || tr.tubeDiameter === undefined || mu === undefined || run.pressure === undefined || !run.feed) return {};
  let m = 0;
  let FT = 0;
  study.species.forEach((s, j) => {
    m += run.feed![j] > 0 ? run.feed![j] * (s.molarMass ?? (s.formula ? molarMassOf(s.formula) : NaN)) : 0;
    FT += run.feed![j];
  });
  if (!Number.isFinite(m)) return {};
  const rho = (run.pressure * (m / FT)) / (GAS_CONSTANT * run.temperature);
  const flow = { particleDiameter: dp, massFlux: m / ((Math.PI * tr.tubeDiameter ** 2) / 4), density: rho, viscosity: mu };
  const Dm = molecularDiffusivities(tr.pellet, study.species, run.temperature, run.pressure, ['transport', 'pellet']);
  const out: { kc?: number; h?: number } = {};
  if (Dm) {
    const mt = massTransfer(flow, Dm[key]);
    out.kc = mt.kc;
    warnings.push(...rangeWarning(MASS_TRANSFER, mt.Re, 'lab film mass transfer'));
  }
  if (tr.fluid.thermalConductivity !== undefined && tr.fluid.heatCapacity !== undefined) {
    const ht = heatTransfer(flow, tr.fluid.thermalConductivity, tr.fluid.heatCapacity);
    out.h = ht.h;
    warnings.push(...rangeWarning(HEAT_TRANSFER, ht.Re, 'lab film heat transfer'));
  }
  return out;
}

/** One warning per distinct message start (range warnings repeat per run). */
function dedupe(ws: Warning[]): Warning[] {
  const seen = new Set<string>();
  return ws.filter((w) => {
    const k = w.code === 'correlation-range' ? w.message.split(':')[0] : w.message;
    if (seen.has(k)) return false;
    seen.add(k);
    return true;
  });
}

/**
 * Diagnostics after a fit: the observed rate of each run is the fitted rate of the key reactant at
 * its inlet (per kg catalyst), with the fitted parameter values (per run group where they differ).
 */
export function fittedLabTransport(study: Study, model: StudyModel, fit: FitResult): LabTransport | undefined {
  if (!study.transport || study.reactor.kind !== 'packed-bed') return undefined;
  const byName = new Map(fit.parameters.map((p) => [p.name, p.value]));
  const external = Float64Array.from(model.parameters, (p) => byName.get(p.name) ?? p.value);
  const kin = model.kinetics;
  const nS = kin.speciesNames.length;
  const key = study.keyReactantIndex;
  const r = new Float64Array(kin.reactionIds.length);
  const rb = study.reactor.bulkDensity;
  const rate = (runIndex: number, C: Float64Array): number => {
    kin.rates(C, study.runs[runIndex].temperature, model.kineticsTheta(runIndex, external), r);
    let s = 0;
    for (let i = 0; i < r.length; i++) {
      const w = kin.basis[i] === 'mass' ? 1 : rb !== undefined ? 1 / rb : NaN;
      s -= kin.stoich[i * nS + key] * w * r[i];
    }
    return s;
  };
  return labTransport(study, kin, byName, rate);
}

/**
 * Diagnostics before a fit (`rateloom check`): measured mean rates, and the start values of the
 * study's parameters where a number is needed (activation energy, a fitted order).
 */
export function checkLabTransport(study: Study): LabTransport | undefined {
  if (!study.transport || study.reactor.kind !== 'packed-bed') return undefined;
  return labTransport(study, study.chemistry, new Map(study.parameters.map((p) => [p.name, p.value])));
}
