/**
 * What the plant pellet does to the sizing, for the result and the report: the effectiveness
 * factor along the bed at the nominal size, the catalyst mass intrinsic kinetics alone would need,
 * the external film at the bed inlet (overall effectiveness with the Wakao-Funazkri correlations,
 * src/pellets/external.ts), and the trade-off of pellet diameter against catalyst mass and
 * pressure drop (bigger pellets: lower pressure drop, lower eta, more catalyst).
 *
 * The trade-off keeps the tube count of the nominal design (or the case's pressure-drop parameter)
 * and sizes the bed for each diameter with the pellet, and the particle diameter of the Ergun
 * equation, scaled in proportion, and with tubes the Ergun parameter of that particle size (S. Ergun, Chem. Eng. Prog. 48 (1952) 89-94).
 */
import type { CompiledKinetics } from '../kinetics/compiled.js';
import type { SpeciesSpec } from '../chemistry/spec.js';
import type { Warning } from '../core/outcome.js';
import { RateloomError } from '../core/errors.js';
import { pelletGeometry } from '../pellets/geometry.js';
import { EffectivenessEvaluator } from '../pellets/effectiveness.js';
import { HEAT_TRANSFER, MASS_TRANSFER } from '../pellets/external.js';
import type { DesignCase } from './case.js';
import type { CasePellet } from './case-pellet.js';
import { buildSystem, type DesignSystem } from './system.js';
import { Sizer } from './sizer.js';
import { Marcher } from './march.js';
import { bundleAlpha } from './tubes.js';
import { casePelletModel, keySpecies, pelletFilm, PelletRateHook, scaledPellet } from './pellet-hook.js';

/** One row of the pellet trade-off. */
export interface TradeOffRow {
  /** Pellet diameter (m) and the diameter the bed correlations use (6 Vp/Sp, m). */
  diameter: number;
  equivalentDiameter: number;
  /** Catalyst mass for the target, kg (null when the target is not reached). */
  catalystMass: number | null;
  /** Pressure drop over that bed, Pa (null without tubes, or when the pressure runs out). */
  pressureDrop: number | null;
  /** Effectiveness factor of the first reaction at the bed inlet. */
  etaInlet: number;
  status: string;
}

export interface PelletSizing {
  method: 'numerical' | 'generalized';
  shape: string;
  diameter: number;
  equivalentDiameter: number;
  volumeToSurface: number;
  /** Effective diffusivity per species, m2/s. */
  effectiveDiffusivity: Record<string, number>;
  /** eta per reaction along the bed at the nominal size: catalyst mass (kg) and key conversion. */
  profile: { size: number[]; conversion: number[]; eta: Record<string, number[]>; keySpecies: string };
  /** Catalyst mass (kg) the same target needs with intrinsic kinetics (eta = 1), for comparison. */
  intrinsicSize: number | null;
  /** Pellet solves of the nominal sizing (numerical method). */
  pelletSolves: number;
  /** The film at the bed inlet (needs tubes, molecular diffusivities and fluid properties). */
  film?: {
    massCorrelation: string;
    heatCorrelation?: string;
    reynolds: number;
    kc: Record<string, number>;
    h?: number;
    /** Internal and overall effectiveness per reaction at the inlet. */
    internal: Record<string, number>;
    overall: Record<string, number>;
  };
  tradeOff: { rows: TradeOffRow[]; tubeCount: number | null; allowedPressureDrop: number | null };
  warnings: Warning[];
}

const record = (names: readonly string[], v: ArrayLike<number>): Record<string, number> => Object.fromEntries(names.map((n, i) => [n, v[i]]));

/** Build the design system of a case with its plant pellet (a fresh hook; the table starts empty). */
export function systemWithPellet(kinetics: CompiledKinetics, kase: DesignCase, theta: ArrayLike<number>, cp: CasePellet, species: readonly SpeciesSpec[], pellet = cp.pellet): { sys: DesignSystem; hook: PelletRateHook } {
  const model = casePelletModel(kinetics, kase, cp, species, pellet);
  const key = keySpecies(kinetics, kase);
  const inlet = kase.reactor.kind === 'batch' ? kase.concentrations![key] : kase.feed[key];
  const hook = new PelletRateHook(model, kase, theta, key, inlet, cp.etaStep);
  const sys = buildSystem(kinetics, kase, theta, hook);
  hook.bind(sys);
  return { sys, hook };
}

/** eta along the bed: integrate to `size` and evaluate the pellet at 21 evenly spaced points. */
function etaProfile(sys: DesignSystem, hook: PelletRateHook, size: number, kinetics: CompiledKinetics): PelletSizing['profile'] {
  const n = 21;
  const tEval = Array.from({ length: n }, (_, k) => (size * k) / (n - 1));
  const res = new Marcher(sys.dim).integrate(sys.rhs, 0, sys.y0, size * (1 + 1e-9), { rtol: 1e-8, tEval });
  const key = keySpecies(kinetics, sys.kase);
  const C = new Float64Array(sys.nS);
  const eta: Record<string, number[]> = Object.fromEntries(kinetics.reactionIds.map((id) => [id, [] as number[]]));
  const conversion: number[] = [];
  res.yOut.forEach((y) => {
    sys.concentrations(y, C);
    const e = hook.evaluator.evaluate(C, sys.kase.temperature);
    kinetics.reactionIds.forEach((id, i) => eta[id].push(e.factor[i]));
    conversion.push(sys.y0[key] > 0 ? 1 - y[key] / sys.y0[key] : 0);
  });
  return { size: res.tOut, conversion, eta, keySpecies: kinetics.speciesNames[key] };
}

/** Film coefficients and overall effectiveness at the bed inlet, when the data allow. */
function filmAtInlet(input: PelletSizingInput, G: number, warnings: Warning[]): PelletSizing['film'] {
  const { kinetics, kase, pellet: cp, species, molarMasses, theta } = input;
  const enthalpy = kase.heat ? Float64Array.from(kinetics.reactionIds, (id) => kase.heat!.reactionEnthalpy[id] ?? 0) : undefined;
  const f = molarMasses ? pelletFilm(kase, cp, species, molarMasses, G, enthalpy) : undefined;
  if (!f) return undefined;
  warnings.push(...f.warnings);
  const model = casePelletModel(kinetics, kase, cp, species);
  model.film = f.film;
  const ev = new EffectivenessEvaluator(model, Float64Array.from(theta));
  const C = new Float64Array(kinetics.speciesNames.length);
  input.sys.concentrations(input.sys.y0, C);
  const res = ev.evaluate(C, kase.temperature);
  return {
    massCorrelation: MASS_TRANSFER.name,
    ...(f.film.h !== undefined ? { heatCorrelation: HEAT_TRANSFER.name, h: f.film.h } : {}),
    reynolds: f.reynolds,
    kc: record(kinetics.speciesNames, f.film.kc),
    internal: record(kinetics.reactionIds, res.internal),
    overall: record(kinetics.reactionIds, res.factor),
  };
}

export interface PelletSizingInput {
  kinetics: CompiledKinetics;
  kase: DesignCase;
  pellet: CasePellet;
  species: readonly SpeciesSpec[];
  molarMasses?: ArrayLike<number>;
  theta: ArrayLike<number>;
  /** The sized system (with the pellet hook) and its hook. */
  sys: DesignSystem;
  hook: PelletRateHook;
  /** Nominal size, kg. */
  size: number;
  /** Tube count of the design, when the case has tubes. */
  tubeCount?: number;
}

/** Size the bed for one pellet diameter (trade-off row). */
function tradeOffRow(input: PelletSizingInput, d: number): TradeOffRow {
  const { kinetics, kase, pellet: cp, species, theta, molarMasses, tubeCount } = input;
  const p = scaledPellet(cp.pellet, d);
  const geo = pelletGeometry(p);
  const k2: DesignCase = kase.tubes ? { ...kase, tubes: { ...kase.tubes, particleDiameter: (kase.tubes.particleDiameter * d) / cp.pellet.diameter } } : kase;
  // The plant pellet's own row reuses the sized system, whose hook keeps the table of this alpha.
  const { sys, hook } = d === cp.pellet.diameter ? { sys: input.sys, hook: input.hook } : systemWithPellet(kinetics, k2, theta, cp, species, p);
  const alpha0 = sys.alpha;
  if (k2.tubes && tubeCount !== undefined && molarMasses) sys.alpha = bundleAlpha(sys, molarMasses, tubeCount).alpha;
  const C = new Float64Array(sys.nS);
  sys.concentrations(sys.y0, C);
  const etaInlet = hook.evaluator.evaluate(C, kase.temperature).factor[0];
  const r = new Sizer(sys).size();
  sys.alpha = alpha0;
  const drop = r.status === 'sized' && sys.hasPressure && kase.pressure !== undefined ? kase.pressure * (1 - Math.sqrt(Math.max(r.y[sys.nS], 0))) : null;
  return {
    diameter: d,
    equivalentDiameter: geo.equivalentDiameter,
    catalystMass: r.status === 'sized' ? r.size : null,
    pressureDrop: k2.tubes ? drop : null,
    etaInlet,
    status: r.status,
  };
}

/** The pellet part of the sizing result. */
export function pelletSizing(input: PelletSizingInput): PelletSizing {
  const { kinetics, kase, pellet: cp, species, theta, sys, hook, size } = input;
  if (kase.reactor.kind !== 'packed-bed') {
    throw new RateloomError('E_CASE', 'a plant pellet applies to a packed bed', { path: ['pellet'], fix: 'Remove "pellet" or size a packed bed.' });
  }
  const warnings: Warning[] = [];
  const geo = pelletGeometry(cp.pellet);
  const model = casePelletModel(kinetics, kase, cp, species);
  const profile = etaProfile(sys, hook, size, kinetics);
  const plain = buildSystem(kinetics, kase, theta);
  plain.alpha = sys.alpha;
  const intrinsic = new Sizer(plain).size();
  const G = kase.tubes && input.tubeCount !== undefined && input.molarMasses ? bundleAlpha(sys, input.molarMasses, input.tubeCount).G : undefined;
  const film = G !== undefined ? filmAtInlet(input, G, warnings) : undefined;
  if (kase.tubes && Math.abs(kase.tubes.particleDiameter / geo.equivalentDiameter - 1) > 0.01) {
    warnings.push({
      code: 'W_PELLET_DIAMETER',
      message: `tubes.particleDiameter (${(kase.tubes.particleDiameter * 1000).toPrecision(3)} mm) differs from the pellet's 6 Vp/Sp (${(geo.equivalentDiameter * 1000).toPrecision(3)} mm); the pressure drop uses the former`,
      path: ['tubes', 'particleDiameter'],
    });
  }
  if (hook.direct) {
    const tops = Object.entries(profile.eta).map(([id, e]) => `${id} up to ${Math.max(...e).toPrecision(3)}`).join(', ');
    warnings.push({
      code: 'W_PELLET_ETA',
      message: `effectiveness factors well above 1 (${tops}): a species formed inside the pellet reacts further there while its bulk concentration is low, so the pellet was solved at every bed point instead of read from the table (slower, especially for Monte Carlo draws)`,
      path: ['pellet'],
    });
  }
  if (profile.size.length < 21) warnings.push({ code: 'W_PELLET_PROFILE', message: 'the bed could not be integrated to the nominal size for the eta profile; the profile stops early', path: ['pellet'] });
  if (hook.failures > 0) {
    warnings.push({ code: 'W_PELLET_SOLVE', message: `${hook.failures} pellet solves did not converge (${hook.lastFailure ?? ''}); their effectiveness factors were used as found` });
  }
  const rows = cp.tradeOff.map((d) => tradeOffRow(input, d));
  return {
    method: cp.method,
    shape: geo.rule,
    diameter: cp.pellet.diameter,
    equivalentDiameter: geo.equivalentDiameter,
    volumeToSurface: geo.volumeToSurface,
    effectiveDiffusivity: record(kinetics.speciesNames, model.De),
    profile,
    intrinsicSize: intrinsic.status === 'sized' ? intrinsic.size : null,
    pelletSolves: hook.evaluator.solves,
    ...(film ? { film } : {}),
    tradeOff: { rows, tubeCount: input.tubeCount ?? null, allowedPressureDrop: kase.tubes?.allowedPressureDrop ?? null },
    warnings,
  };
}

/** The cautions a pellet adds to a sizing. */
export const PELLET_CAUTIONS: readonly string[] = [
  'The effectiveness factors rest on the pellet description given (diffusivities, tortuosity, shape rule) and on transfer correlations that hold only within their Reynolds ranges; test the plant pellet in a pilot or single-tube reactor before design, as is usual practice.',
];
