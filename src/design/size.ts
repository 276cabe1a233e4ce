/**
 * Sizing the production reactor from fitted kinetics, with the uncertainty carried through: the one
 * entry point of the design module. It checks feasibility (equilibrium conversion), sizes the
 * reactor for the target (terminal event on the mole balances, or the stirred-tank balance solved
 * for the size), designs the tube bundle of a packed bed, propagates the parameter covariance
 * (Monte Carlo and delta method), compares the case with the data coverage, checks the isothermal
 * assumption, and attaches the cautions. Numerical trouble is a status, never a throw.
 */
import type { CompiledKinetics } from '../kinetics/compiled.js';
import { outcome, type Outcome, type StatusTable, type Warning } from '../core/outcome.js';
import type { FittedKinetics } from './handoff.js';
import type { DesignCase } from './case.js';
import { buildSystem, type DesignSystem } from './system.js';
import { Sizer, fmt, type SizeOnce } from './sizer.js';
import { equilibriumConversion, type EquilibriumLimit } from './feasibility.js';
import { designTubes, type TubeDesign } from './tubes.js';
import { designTubesForPercentileSteps, type PercentileTubeResult, type TubePass } from './tube-percentile.js';
import { DEFAULT_DESIGN_LEVEL } from './case.js';
import { parameterMap, type ParameterMap } from './handoff-load.js';
import { propagate, type UncertaintyResult } from './uncertainty.js';
import { extrapolationWarnings } from './extrapolation.js';
import { heatCheck, type HeatCheck } from './heat.js';
import { cautions } from './cautions.js';
import { PELLET_CAUTIONS, pelletSizing, systemWithPellet, type PelletSizing } from './pellet-sizing.js';
import { sizeCooledBed, type ThermalSizing } from './heat-design.js';
import type { HandoffVerdict } from './handoff-verdict.js';
import { finishGated, gateSizing, type SizingVerdict } from './size-gate.js';
import { GAS_CONSTANT } from '../core/constants.js';
import { ROUND_OFF_NOTE, ROUND_OFF_TOLERANCE, shownAmounts } from '../reactors/round-off.js';

/** A sizing result before the hand-off gate adds its verdict (size-gate.ts). */
export type UngatedSizing = Omit<SizingResult, 'kinetics' | 'verdict'>;

/** The fields every sizing result carries, whatever its status (the cautions among them). */
export type SizingBase = Pick<SizingResult, 'case' | 'reactor' | 'target' | 'cautions'>;

/** Why a tube design cannot start (the Ergun mass flux needs the molar masses). */
const MOLAR_MASSES_NEEDED = 'the tube design needs the molar masses of all species (give molarMass or formula per species in the hand-off)';

export type SizingStatus =
  | 'sized'
  | 'rated'
  | 'target-unreachable'
  | 'pressure-exhausted'
  | 'too-many-tubes'
  | 'integration-failed'
  | 'draws-failed'
  | 'hot-spot-exceeded'
  | 'limits-not-met'
  | 'runaway'
  | 'bvp-not-converged';

export const SIZING_STATUS: StatusTable<SizingStatus> = {
  sized: { success: true, message: 'reactor sized for the target' },
  rated: { success: true, message: 'given reactor rated' },
  'target-unreachable': { success: false, message: 'the target cannot be reached' },
  'pressure-exhausted': { success: false, message: 'the pressure runs out before the target is reached' },
  'too-many-tubes': { success: false, message: 'no tube count keeps the pressure drop within the allowed value' },
  'integration-failed': { success: false, message: 'the reactor model could not be solved' },
  'draws-failed': { success: false, message: 'too many Monte Carlo draws failed for the percentiles to be trusted' },
  'hot-spot-exceeded': { success: false, message: 'the hot spot exceeds the allowed temperature (heat.maxTemperature)' },
  'limits-not-met': { success: false, message: 'no tube count meets the pressure-drop and tube-length limits' },
  runaway: { success: false, message: 'the tube runs away thermally before the target is reached' },
  'bvp-not-converged': { success: false, message: 'the counter-current coolant problem did not converge' },
};

export interface SizingOptions {
  /** Monte Carlo draws; default from the case (10000). 0 skips Monte Carlo (delta method only). */
  draws?: number;
  /**
   * Size even from a hand-off whose verdict is not trustworthy (untrustworthy fit, changed content,
   * singular covariance); the result then says so in its cautions and is not trustworthy. Default
   * false: such a hand-off is refused (size-gate.ts).
   */
  acceptUntrustworthy?: boolean;
  /** PRNG seed; default from the case. */
  seed?: number;
  /** Confidence levels (fractions); default from the case ([0.9, 0.95]). */
  levels?: number[];
  /** Draws used for the conversion band; default 200. */
  profileDraws?: number;
  /** Fraction of failed draws above which the result is 'draws-failed'; default 0.01. */
  maxFailedFraction?: number;
  /** Progress of the Monte Carlo draws (done, total); with a tube bundle a second pass may follow. */
  onProgress?: (done: number, total: number) => void;
  /**
   * Percentile of the required catalyst mass the tube bundle is designed for (fraction); default
   * the case's uncertainty.designLevel, else 0.95.
   */
  designLevel?: number;
}

export interface SizingInput {
  handoff: FittedKinetics;
  /** Kinetics compiled from the hand-off (species and parameter order). */
  kinetics: CompiledKinetics;
  kase: DesignCase;
  /** Molar masses per species, kg/mol (needed for tubes: Ergun mass flux). */
  molarMasses?: ArrayLike<number>;
  options?: SizingOptions;
}

export interface SizingResult extends Outcome<SizingStatus> {
  case: string;
  reactor: { kind: DesignCase['reactor']['kind']; phase: 'gas' | 'liquid' };
  target: DesignCase['target'];
  /** Catalyst mass (kg), volume (m3) or batch time (s) for the target, nominal fit. */
  size?: { value: number; unit: 'kg' | 'm3' | 's'; quantity: 'catalyst mass' | 'volume' | 'batch time' };
  /** W/F_A0 (kg s/mol) for a packed bed, V/v0 (s) for plug flow and stirred tank, t (s) for batch. */
  spaceTime?: { value: number; unit: 'kg s/mol' | 's'; definition: string };
  outlet?: {
    /** mol/s (flow reactors) or mol/m3 (batch). */
    amounts: Record<string, number>;
    amountUnit: 'mol/s' | 'mol/m3';
    moleFractions: Record<string, number>;
    /** Conversion of the key species (target species), 0..1. */
    conversion?: { species: string; value: number };
    /**
     * Band of the outlet amounts at the nominal size over the parameter uncertainty: P5 (`lo`) and
     * P95 (`hi`) per species over the first Monte Carlo draws (`band.draws` that reached the size).
     */
    lo?: Record<string, number>;
    hi?: Record<string, number>;
    band?: { lower: number; upper: number; draws: number };
    /** The round-off rule, stated when a tiny negative amount was shown as 0. */
    roundOff?: string;
  };
  pressure?: { inlet: number; outlet: number; drop: number; dropBar: number; unit: 'Pa' };
  tubes?: TubeDesign;
  equilibrium?: EquilibriumLimit;
  heat?: HeatCheck;
  uncertainty?: UncertaintyResult;
  /** The plant pellet: eta along the bed, film at the inlet, diameter trade-off (case with a pellet). */
  pellet?: PelletSizing;
  /** Energy balance, hot spot, binding constraint and runaway margin (cases with heat.mode). */
  thermal?: ThermalSizing;
  /** Always present, whatever the status. */
  cautions: string[];
  /** The hand-off's verdict (handoff-verdict.ts). */
  kinetics: HandoffVerdict;
  /** Whether the sizing may be trusted: sized, and from a trustworthy hand-off (size-gate.ts). Decides the exit code and the report badge. */
  verdict: SizingVerdict;
}

const QUANTITY = { kg: 'catalyst mass', m3: 'volume', s: 'batch time' } as const;

/** A Monte Carlo pass the sizing needs: `draws` draws from `seed`, sized with `tubeCount` tubes (a bundle). */
export interface DrawRequest {
  draws: number;
  seed: number;
  /** Tube count of the bundle for this pass (absent: no bundle). */
  tubeCount?: number;
}

/** Precomputed Monte Carlo draws (worker threads), in draw order; see drawEvaluator. */
export interface DrawValues {
  /** Propagated quantity per draw (size, or conversion for a rating); NaN when the draw failed. */
  values: ArrayLike<number>;
  /** Status per draw ('sized' or the failure). */
  statuses: readonly string[];
  /** Size each draw needs (NaN failed, Infinity pressure exhausted; NaN for a rating). */
  sizes: ArrayLike<number>;
  /** Pressure drop at that size, Pa (same conventions). */
  drops: ArrayLike<number>;
}

/** What one Monte Carlo draw gives (see DrawValues). */
export interface DrawEval {
  value: number;
  status: string;
  size: number;
  drop: number;
}

/** Computes Monte Carlo draws for a request, or undefined to let the sizing draw them itself. */
export type DrawProvider = (request: DrawRequest) => Promise<DrawValues | undefined>;

/**
 * The evaluation of one Monte Carlo draw for the sizer's current theta: for a sizing target the
 * size and the pressure drop it needs, for a rating (target size) the conversion of the key species.
 */
export function drawEvaluator(sizer: Sizer): (s: Sizer) => DrawEval {
  const sys = sizer.sys;
  const kase = sys.kase;
  const t = kase.target;
  const key = keySpecies(sys).index;
  const P0 = kase.pressure ?? NaN;
  if (t.kind === 'size') {
    return (s) => {
      const r = s.rate(t.value);
      return { value: r.status === 'sized' && key >= 0 ? s.conversion(r.y, key) : NaN, status: r.status, size: NaN, drop: NaN };
    };
  }
  return (s) => {
    const r = s.size();
    const exhausted = r.status === 'pressure-exhausted';
    return {
      value: r.status === 'sized' ? r.size : NaN,
      status: r.status,
      size: r.status === 'sized' ? r.size : exhausted ? Infinity : NaN,
      drop: r.status === 'sized' && sys.hasPressure ? P0 * (1 - Math.sqrt(Math.max(r.y[sys.nS], 0))) : exhausted ? Infinity : NaN,
    };
  };
}

/** Size (or rate) the production reactor of a case. */
export function sizeReactor(input: SizingInput): SizingResult {
  const gate = gateSizing(input);
  const steps = sizingSteps(gate.input);
  let next = steps.next();
  while (!next.done) next = steps.next(undefined);
  return finishGated(next.value, gate.kinetics);
}

/**
 * sizeReactor with the Monte Carlo draws computed by `provider` (worker threads, see
 * src/parallel/size-parallel.ts); the same result as sizeReactor when the provider's draws equal
 * the serial ones. A pass the provider leaves undefined is drawn here.
 */
export async function sizeReactorWith(input: SizingInput, provider: DrawProvider): Promise<SizingResult> {
  const gate = gateSizing(input);
  const steps = sizingSteps(gate.input);
  let next = steps.next();
  while (!next.done) next = steps.next(await provider(next.value));
  return finishGated(next.value, gate.kinetics);
}

/** The sizing, yielding each Monte Carlo pass it needs (answered with precomputed draws or undefined). */
function* sizingSteps(input: SizingInput): Generator<DrawRequest, UngatedSizing, DrawValues | undefined> {
  const run = startSizing(input);
  const thermalBed = thermalRoute(input);
  if (thermalBed === true) return sizeCooledBed(input, run.map, run.sys, run.key.index, (input.kase.target as { value: number }).value, run.warnings, run.base);
  if (thermalBed) return failed(run, 'integration-failed', thermalBed);
  const feasible = checkFeasibility(run);
  if ('status' in feasible) return feasible;
  const nominal = sizeNominal(run, feasible.equilibrium);
  if ('status' in nominal) return nominal;
  const mc = yield* uncertaintyPasses(run, nominal.sizing, nominal.tubes);
  const result = nominalResult(run, mc, feasible.equilibrium);
  addModelChecks(run, result, mc);
  addDrawWarnings(run, result, mc);
  result.warnings = run.warnings;
  return result;
}

/** What every step of one sizing shares. */
interface SizingRun {
  input: SizingInput;
  opts: SizingOptions;
  map: ParameterMap;
  /** The case's mole balances at the nominal fit (with the plant pellet when the case has one). */
  sys: DesignSystem;
  sizer: Sizer;
  withPellet: ReturnType<typeof systemWithPellet> | undefined;
  key: KeySpecies;
  /** Collected by every step; the result's warnings. */
  warnings: Warning[];
  /** Fields every result carries, whatever its status (the cautions among them). */
  base: SizingBase;
}

/** The system at the nominal fit, its sizer, the key species and the fields every result carries. */
function startSizing(input: SizingInput): SizingRun {
  const { handoff, kinetics, kase } = input;
  const map = parameterMap(handoff, kinetics.parameterNames);
  const withPellet = kase.pellet ? systemWithPellet(kinetics, kase, map.theta, kase.pellet, handoff.species) : undefined;
  const sys = withPellet ? withPellet.sys : buildSystem(kinetics, kase, map.theta);
  const base: SizingBase = {
    case: kase.name,
    reactor: { ...kase.reactor },
    target: kase.target,
    cautions: [...cautions(handoff, kase.heat?.thermal !== undefined), ...(kase.pellet ? PELLET_CAUTIONS : [])],
  };
  return { input, opts: input.options ?? {}, map, sys, sizer: new Sizer(sys), withPellet, key: keySpecies(sys), warnings: [], base };
}

/** A failed sizing: the status with its detail, the warnings so far and the cautions. */
function failed(run: SizingRun, status: SizingStatus, detail: string, extra: Partial<UngatedSizing> = {}): UngatedSizing {
  return { ...outcome(SIZING_STATUS, status, run.warnings, detail), ...run.base, ...extra };
}

/** Feasibility of a conversion target: below the equilibrium (or limiting-reactant) conversion. */
function checkFeasibility(run: SizingRun): { equilibrium?: EquilibriumLimit } | UngatedSizing {
  const { kinetics, kase } = run.input;
  const t = kase.target;
  if (t.kind !== 'conversion') return {};
  const equilibrium = equilibriumConversion(kinetics, kase, run.map.theta, t.species);
  if (t.value >= equilibrium.conversion - 1e-9) {
    const limit = equilibrium.method === 'limiting-reactant' ? 'largest conversion the limiting reactant allows' : 'equilibrium conversion';
    const where = `${fmt(kase.temperature, 5)} K${kase.pressure !== undefined ? ` and ${fmt(kase.pressure / 1e5, 5)} bar` : ''}`;
    return failed(
      run,
      'target-unreachable',
      `target conversion of ${t.species} ${fmt(t.value, 4)} is at or beyond the ${limit} ${fmt(equilibrium.conversion, 6)} at ${where}; ` +
        `lower the target below ${fmt(equilibrium.conversion, 4)} or change the temperature, pressure or feed`,
      { equilibrium },
    );
  }
  if (!equilibrium.settled) run.warnings.push({ code: 'W_EQUILIBRIUM', message: 'the equilibrium (plateau) conversion had not settled; the feasibility check is approximate' });
  return { equilibrium };
}

/** The nominal size (and for a packed bed with tubes the nominal tube layout), or why there is none. */
function sizeNominal(run: SizingRun, equilibrium: EquilibriumLimit | undefined): { sizing: SizeOnce; tubes?: TubeDesign } | UngatedSizing {
  const { kase, molarMasses } = run.input;
  const { sizer, sys } = run;
  let sizing: SizeOnce;
  let tubes: TubeDesign | undefined;
  if (kase.tubes && kase.target.kind !== 'size') {
    if (!molarMasses) return failed(run, 'integration-failed', MOLAR_MASSES_NEEDED);
    const ts = designTubes(sizer, molarMasses);
    sizing = ts.sizing;
    if (ts.status === 'too-many-tubes') return failed(run, 'too-many-tubes', ts.detail ?? '');
    if (ts.design) tubes = ts.design;
  } else {
    sizing = sizer.size();
  }
  if (sizing.status === 'pressure-exhausted') {
    const conv = run.key.index >= 0 ? sizer.conversion(sizing.y, run.key.index) : NaN;
    const P0 = kase.pressure!;
    return failed(
      run,
      'pressure-exhausted',
      `the pressure falls to zero at ${fmt(sizing.exhaustedAt!, 5)} ${sys.unit}${sys.unit === 'kg' ? ' of catalyst' : ''}` +
        (Number.isFinite(conv) ? `, where the conversion of ${run.key.name} is only ${fmt(conv, 4)}` : '') +
        '; use wider or more tubes, larger particles or a smaller pressure-drop parameter',
      { ...(equilibrium ? { equilibrium } : {}), pressure: { inlet: P0, outlet: 0, drop: P0, dropBar: P0 / 1e5, unit: 'Pa' } },
    );
  }
  if (sizing.status !== 'sized') return failed(run, sizing.status, sizing.detail ?? '', equilibrium ? { equilibrium } : {});
  return { sizing, ...(tubes ? { tubes } : {}) };
}

/** The Monte Carlo behind the result: its last pass, the final nominal sizing and tube layout, and the percentile design when there was one. */
interface UncertaintyPasses {
  pass: TubePass;
  sizing: SizeOnce;
  tubes: TubeDesign | undefined;
  designed: PercentileTubeResult | undefined;
  /** Monte Carlo draws per pass (0: delta method only). */
  draws: number;
  /** Design percentile of the catalyst mass (fraction). */
  level: number;
}

/** The uncertainty; for a tube bundle also the tube count designed for the design percentile (a Monte Carlo pass per count tried). */
function* uncertaintyPasses(run: SizingRun, sizing: SizeOnce, tubes: TubeDesign | undefined): Generator<DrawRequest, UncertaintyPasses, DrawValues | undefined> {
  const { kase } = run.input;
  const draws = run.opts.draws ?? kase.uncertainty.draws;
  const level = run.opts.designLevel ?? kase.uncertainty.designLevel ?? DEFAULT_DESIGN_LEVEL;
  const monteCarlo = monteCarloPass(run, draws);
  const t = kase.target;
  if (tubes && draws > 0) {
    const designed = yield* designTubesForPercentileSteps({
      sizer: run.sizer,
      molarMasses: run.input.molarMasses!,
      start: tubes,
      startSizing: sizing,
      level,
      draws,
      monteCarlo: function* (count: number) {
        const r0 = run.sizer.size();
        return yield* monteCarlo(r0.size, r0.size, count);
      },
    });
    return { pass: designed.pass, sizing: designed.sizing, tubes: designed.tubes, designed, draws, level };
  }
  const pass = t.kind === 'size' ? yield* monteCarlo(NaN, t.value) : yield* monteCarlo(sizing.size, sizing.size);
  const nominalTubes = tubes ? { ...tubes, designedFor: { level: null, basis: 'nominal fit (no Monte Carlo draws to design for a percentile)' } } : undefined;
  return { pass, sizing, tubes: nominalTubes, designed: undefined, draws, level };
}

/**
 * One Monte Carlo pass of `draws` draws (set up once per sizing): asks for precomputed draws first
 * (tubeCount: the bundle's current count), else draws here and records each draw's size and
 * pressure drop in the pass's arrays.
 */
function monteCarloPass(run: SizingRun, draws: number): (nominalQuantity: number, bandSize: number, tubeCount?: number) => Generator<DrawRequest, TubePass, DrawValues | undefined> {
  const { kase } = run.input;
  const { opts, sizer, sys } = run;
  const seed = opts.seed ?? kase.uncertainty.seed;
  const rating = kase.target.kind === 'size';
  let lastSize = NaN;
  let lastDrop = NaN;
  const evalDraw = drawEvaluator(sizer);
  const quantityFn = (s: Sizer) => {
    const e = evalDraw(s);
    lastSize = e.size;
    lastDrop = e.drop;
    return { value: e.value, status: e.status };
  };
  return function* (nominalQuantity, bandSize, tubeCount) {
    const given = draws > 0 ? yield { draws, seed, ...(tubeCount !== undefined ? { tubeCount } : {}) } : undefined;
    const pre = given && given.values.length === draws && given.statuses.length === draws ? given : undefined;
    const sizes = pre ? Float64Array.from(pre.sizes) : new Float64Array(draws).fill(NaN);
    const drops = pre ? Float64Array.from(pre.drops) : new Float64Array(draws).fill(NaN);
    const unc = propagate(sizer, run.map, quantityFn, nominalQuantity, rating ? 'conversion' : 'size', rating ? '1' : sys.unit, run.key.index >= 0 ? run.key.index : undefined, {
      draws,
      seed,
      levels: opts.levels ?? kase.uncertainty.levels,
      bandSize,
      ...(opts.profileDraws !== undefined ? { profileDraws: opts.profileDraws } : {}),
      ...(pre
        ? { precomputed: { values: pre.values, statuses: pre.statuses } }
        : {
            onDraw: (d: number) => {
              sizes[d] = lastSize;
              drops[d] = lastDrop;
            },
            ...(opts.onProgress ? { onProgress: opts.onProgress } : {}),
          }),
    });
    return { unc, sizes, drops };
  };
}

/** The sized (or rated) result at the nominal fit with the final tube layout: size, space time, outlet with its band, pressure. */
function nominalResult(run: SizingRun, mc: UncertaintyPasses, equilibrium: EquilibriumLimit | undefined): UngatedSizing {
  const { kase } = run.input;
  const { sys, sizer } = run;
  const t = kase.target;
  const y = mc.sizing.y;
  const nominal = t.kind === 'size' ? t.value : mc.sizing.size;
  const outlet = describeOutlet(sys, sizer, y, run.key.index, run.warnings);
  const outletBand = mc.pass.unc.outletBand;
  if (outletBand) Object.assign(outlet, describeOutletBand(sys, outletBand));
  const result: UngatedSizing = {
    ...outcome(SIZING_STATUS, t.kind === 'size' ? 'rated' : 'sized', run.warnings),
    ...run.base,
    size: { value: nominal, unit: sys.unit, quantity: QUANTITY[sys.unit] },
    spaceTime: spaceTime(sys, nominal, run.key.index),
    outlet,
    ...(equilibrium ? { equilibrium } : {}),
    ...(mc.tubes ? { tubes: mc.tubes } : {}),
  };
  if (kase.pressure !== undefined && kase.reactor.kind !== 'batch') {
    const P = kase.pressure * (sys.hasPressure ? Math.sqrt(Math.max(y[sys.nS], 0)) : 1);
    result.pressure = { inlet: kase.pressure, outlet: P, drop: kase.pressure - P, dropBar: (kase.pressure - P) / 1e5, unit: 'Pa' };
  }
  result.uncertainty = mc.pass.unc;
  return result;
}

/** P5/P95 of the outlet amounts over the band draws, with the outlet's round-off rule. */
function describeOutletBand(sys: DesignSystem, band: NonNullable<UncertaintyResult['outletBand']>): Pick<NonNullable<SizingResult['outlet']>, 'lo' | 'hi' | 'band'> {
  const species = sys.kase.species;
  const nS = species.length;
  const scale = feedScale(sys);
  const p5 = shownAmounts(band.p5.slice(0, nS), band.p5.slice(0, nS), scale).amounts;
  const p95 = shownAmounts(band.p95.slice(0, nS), band.p95.slice(0, nS), scale).amounts;
  const lo: Record<string, number> = {};
  const hi: Record<string, number> = {};
  species.forEach((sp, j) => {
    lo[sp] = p5[j];
    hi[sp] = p95[j];
  });
  return { lo, hi, band: { lower: 0.05, upper: 0.95, draws: band.draws } };
}

/** The checks of the model's assumptions at the nominal size: heat (isothermal), extrapolation beyond the data, the plant pellet. */
function addModelChecks(run: SizingRun, result: UngatedSizing, mc: UncertaintyPasses): void {
  const { handoff, kinetics, kase, molarMasses } = run.input;
  const { sys, sizer, warnings } = run;
  const y = mc.sizing.y;
  const heat = heatCheck(sys, y);
  if (heat.check) result.heat = heat.check;
  warnings.push(...heat.warnings);
  const covered = handoff.coverage.conversion;
  warnings.push(...extrapolationWarnings(handoff, kase, covered ? conversionOf(sizer, y, covered.species) : undefined));
  if (run.withPellet && kase.target.kind !== 'size') {
    result.pellet = pelletSizing({
      kinetics, kase, pellet: kase.pellet!, species: handoff.species, theta: run.map.theta, sys, hook: run.withPellet.hook, size: result.size!.value,
      ...(molarMasses ? { molarMasses } : {}),
      ...(mc.tubes ? { tubeCount: mc.tubes.count } : {}),
    });
    warnings.push(...result.pellet.warnings);
  }
}

/** What the Monte Carlo draws say: bundle draws over the allowed pressure drop, failed draws ('draws-failed' beyond the allowed share), a missing delta method. */
function addDrawWarnings(run: SizingRun, result: UngatedSizing, mc: UncertaintyPasses): void {
  const { warnings } = run;
  const { unc } = mc.pass;
  const pressure = drawPressureWarning(mc);
  if (pressure) warnings.push(pressure);
  if (unc.failed.count > 0) {
    const reasons = Object.entries(unc.failed.reasons).map(([r, n]) => `${n} ${r}`).join(', ');
    warnings.push({
      code: 'W_DRAWS_FAILED',
      message: `${unc.failed.count} of ${unc.draws} Monte Carlo draws failed (${reasons}); percentiles use the ${unc.succeeded} that succeeded`,
      path: ['uncertainty'],
    });
  }
  const maxFail = run.opts.maxFailedFraction ?? 0.01;
  if (mc.draws > 0 && unc.failed.count > maxFail * mc.draws) {
    Object.assign(result, outcome(SIZING_STATUS, 'draws-failed', warnings, `${unc.failed.count} of ${mc.draws} draws failed`));
  }
  if (!Number.isFinite(unc.deltaMethod.sd)) {
    warnings.push({ code: 'W_DELTA', message: 'the delta-method standard deviation could not be computed (a perturbed parameter set failed)' });
  }
}

/** W_DRAWS_PRESSURE for a bundle whose Monte Carlo parameter sets exceed the allowed pressure drop, or whose percentile design was not met. */
function drawPressureWarning({ tubes, designed, level }: UncertaintyPasses): Warning | undefined {
  const P = `P${fmt(level * 100, 3)}`;
  if (tubes?.draws && tubes.draws.overAllowed > 0) {
    const d = tubes.draws;
    const share = `${d.overAllowed} of ${d.of} Monte Carlo parameter sets (${fmt((100 * d.overAllowed) / d.of, 3)}%) need a pressure drop above the allowed ${fmt(tubes.allowedPressureDrop / 1e5, 4)} bar with ${tubes.count} tubes`;
    return {
      code: 'W_DRAWS_PRESSURE',
      message: designed?.met
        ? `${share}; the tubes are designed for ${P} of the catalyst mass, so these are parameter sets beyond the design percentile (at most ${fmt(100 * (1 - level), 3)}% by design); raise uncertainty.designLevel for a larger margin`
        : `${share}; the tubes could not be designed for ${P} of the catalyst mass after ${designed?.passes ?? 0} Monte Carlo passes${designed?.detail ? ` (${designed.detail})` : ''}; use wider tubes, larger particles or a larger allowed pressure drop`,
      path: ['tubes'],
    };
  }
  if (designed && !designed.met) {
    return {
      code: 'W_DRAWS_PRESSURE',
      message: `the bed of the ${P} catalyst mass with ${tubes!.count} tubes exceeds the allowed pressure drop${designed.detail ? ` (${designed.detail})` : ''}`,
      path: ['tubes'],
    };
  }
  return undefined;
}

/**
 * Whether the case is sized with the energy balance: true for a gas packed bed with tubes, a
 * conversion target and heat.mode; a message when heat.mode is given for a case this release
 * cannot size under heat (never a silent isothermal sizing); false without heat.mode.
 */
function thermalRoute(input: SizingInput): boolean | string {
  const k = input.kase;
  if (!k.heat?.thermal) return false;
  if (k.reactor.kind !== 'packed-bed' || !k.tubes || k.target.kind !== 'conversion') {
    return 'sizing under heat (heat.mode) needs a gas packed bed with "tubes" and a conversion target; remove heat.mode for an isothermal estimate';
  }
  if (!input.molarMasses) return MOLAR_MASSES_NEEDED;
  return true;
}

/** The species a conversion is reported for: the target's species, else the first reactant fed. */
interface KeySpecies {
  name: string | undefined;
  /** Index in the case's species; -1 when there is none. */
  index: number;
}

function keySpecies(sys: DesignSystem): KeySpecies {
  const t = sys.kase.target;
  const name = t.kind === 'conversion' ? t.species : firstReactant(sys);
  return { name, index: name !== undefined ? sys.kase.species.indexOf(name) : -1 };
}

function firstReactant(sys: DesignSystem): string | undefined {
  for (let j = 0; j < sys.nS; j++) if (sys.kinetics.stoich[j] < 0 && sys.y0[j] > 0) return sys.kase.species[j];
  return undefined;
}

function conversionOf(sizer: Sizer, y: Float64Array, species: string): number | undefined {
  const j = sizer.sys.kase.species.indexOf(species);
  return j >= 0 && sizer.sys.y0[j] > 0 ? sizer.conversion(y, j) : undefined;
}

/**
 * The outlet as shown: round-off negatives (above -ROUND_OFF_TOLERANCE of the total feed) as 0
 * with the rule stated (`roundOff`); a more negative amount is kept as computed and warned.
 */
function describeOutlet(sys: DesignSystem, sizer: Sizer, y: Float64Array, key: number, warnings: Warning[]): NonNullable<SizingResult['outlet']> {
  const amounts: Record<string, number> = {};
  const moleFractions: Record<string, number> = {};
  const shown = shownAmounts(y.subarray(0, sys.nS), y.subarray(0, sys.nS), feedScale(sys));
  let total = 0;
  for (let j = 0; j < sys.nS; j++) total += Math.max(shown.amounts[j], 0);
  sys.kase.species.forEach((s, j) => {
    amounts[s] = shown.amounts[j];
    moleFractions[s] = total > 0 ? Math.max(shown.amounts[j], 0) / total : 0;
  });
  if (shown.negative) warnings.push({ code: 'W_NEGATIVE_OUTLET', message: `${shown.negative} outlet amount(s) are negative beyond the round-off tolerance (${ROUND_OFF_TOLERANCE} of the total feed); they are shown as computed`, path: ['outlet'] });
  return {
    amounts,
    amountUnit: sys.kase.reactor.kind === 'batch' ? 'mol/m3' : 'mol/s',
    moleFractions,
    ...(key >= 0 ? { conversion: { species: sys.kase.species[key], value: sizer.conversion(y, key) } } : {}),
    ...(shown.clamped ? { roundOff: ROUND_OFF_NOTE } : {}),
  };
}

/** Total feed (sum of the positive inlet amounts): the scale of the round-off rule. */
function feedScale(sys: DesignSystem): number {
  let total = 0;
  for (let j = 0; j < sys.nS; j++) total += Math.max(sys.y0[j], 0);
  return total;
}

function spaceTime(sys: DesignSystem, size: number, key: number): SizingResult['spaceTime'] {
  const k = sys.kase;
  if (k.reactor.kind === 'batch') return { value: size, unit: 's', definition: 'batch time t' };
  if (k.reactor.kind === 'packed-bed') {
    const FA0 = key >= 0 ? k.feed[key] : k.feed.reduce((a, b) => a + b, 0);
    const name = key >= 0 ? k.species[key] : 'total';
    return { value: size / FA0, unit: 'kg s/mol', definition: `W/F_${name},0` };
  }
  const FT0 = k.feed.reduce((a, b) => a + b, 0);
  const v0 = k.reactor.phase === 'liquid' ? k.volumetricFlow! : (FT0 * GAS_CONSTANT * k.temperature) / k.pressure!;
  return { value: size / v0, unit: 's', definition: 'V/v0 (inlet volumetric flow)' };
}
