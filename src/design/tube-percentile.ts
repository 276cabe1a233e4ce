/**
 * Tube bundle designed for a percentile of the required catalyst mass, not only the nominal fit.
 *
 * Method (fixed-point iteration on the tube count, bounded): start from the smallest count for the
 * nominal fit (tubes.ts); run the Monte Carlo draws with that layout; the design-percentile size
 * W_p (type-7 percentile over the draws, a draw whose pressure runs out counting as needing more
 * than any finite mass) is the catalyst to install. The layout is accepted when (a) the bed of
 * max(W_p, W_nominal) rated with the nominal kinetics keeps the pressure drop within the limit and
 * (b) at most the fraction 1 - level of the draws need more than the allowed drop at their own
 * required size. Otherwise the count is raised to the smallest N' whose predicted drop
 * s * dp(r W(N')) is within the limit, with W(N') the nominal mass for N' tubes, r = W_p / W_nom and
 * s = max(1, percentile of the draws' drops / dp(W_p)) from the last pass (the Monte Carlo spread of
 * the size is nearly independent of the count), and the Monte Carlo is run again with that layout.
 * The last pass's Monte Carlo is the one reported, so its percentiles belong to the reported layout.
 * Pressure drop: Ergun (S. Ergun, Chem. Eng. Prog. 48 (1952) 89-94), bundle alpha from tubes.ts.
 */
import type { Sizer, SizeOnce } from './sizer.js';
import type { UncertaintyResult } from './uncertainty.js';
import { quantileSorted } from './uncertainty.js';
import { bundleAlpha, tubeLayout, tubeLength, MAX_TUBES, type TubeDesign } from './tubes.js';
import { fmt } from './sizer.js';

/** One Monte Carlo pass with the sizer's current tube layout. */
export interface TubePass {
  unc: UncertaintyResult;
  /** Required size per draw (kg); NaN for a failed draw, Infinity when the pressure ran out. */
  sizes: Float64Array;
  /** Pressure drop per draw at its required size (Pa); NaN for a failed draw, Infinity when the pressure ran out. */
  drops: Float64Array;
}

export interface PercentileTubeInput {
  sizer: Sizer;
  /** kg/mol per species (kinetics order). */
  molarMasses: ArrayLike<number>;
  /** Nominal design (designTubes) and its nominal sizing; the sizer's alpha is set for it. */
  start: TubeDesign;
  startSizing: SizeOnce;
  /** Design percentile as a fraction (0.95 = P95). */
  level: number;
  /** Monte Carlo draws used (for the wording). */
  draws: number;
  /** Runs the Monte Carlo with the sizer's current alpha (theta left at the nominal fit). */
  monteCarlo: () => TubePass;
  /** Monte Carlo passes at most (the first included); default 4. */
  maxPasses?: number;
}

export interface PercentileTubeResult {
  tubes: TubeDesign;
  /** Nominal sizing with the final count. */
  sizing: SizeOnce;
  /** The Monte Carlo of the final layout. */
  pass: TubePass;
  passes: number;
  /** Both conditions of the header hold for the final layout. */
  met: boolean;
  /** Why the count could not be raised further, when it could not. */
  detail?: string;
}

/** Pressure drop (Pa) over a bed of W kg with the current theta and alpha; Infinity when the pressure runs out. */
export function bedDrop(sizer: Sizer, W: number): number {
  const r = sizer.rate(W);
  if (r.status === 'pressure-exhausted') return Infinity;
  if (r.status !== 'sized') return NaN;
  return sizer.sys.kase.pressure! * (1 - Math.sqrt(Math.max(r.y[sizer.sys.nS], 0)));
}

/** Drop at the nominal size of a sizing (Pa). */
function nominalDrop(sizer: Sizer, res: SizeOnce): number {
  return sizer.sys.kase.pressure! * (1 - Math.sqrt(Math.max(res.y[sizer.sys.nS], 0)));
}

/** Percentile of the finite-or-infinite entries (NaN dropped), type 7. */
function levelOf(a: Float64Array, level: number): { value: number; of: number } {
  const v = Float64Array.from(a.filter((x) => !Number.isNaN(x))).sort();
  return { value: v.length ? quantileSorted(v, level) : NaN, of: v.length };
}

/**
 * Smallest count N' > N for which s * dp(r W(N')) <= allowed (doubling, then integer bisection).
 * Leaves the system's alpha set for the returned count; undefined when MAX_TUBES is not enough.
 */
export function raiseTubeCount(
  sizer: Sizer,
  molarMasses: ArrayLike<number>,
  N: number,
  ratio: number,
  scale: number,
): { count: number; sizing: SizeOnce } | undefined {
  const sys = sizer.sys;
  const allowed = sys.kase.tubes!.allowedPressureDrop;
  const tryN = (n: number): SizeOnce | undefined => {
    sys.alpha = bundleAlpha(sys, molarMasses, n).alpha;
    const res = sizer.size();
    if (res.status !== 'sized') return undefined;
    return scale * bedDrop(sizer, ratio * res.size) <= allowed ? res : undefined;
  };
  let step = 1;
  while (!tryN(N + step)) {
    if (N + step >= MAX_TUBES) return undefined;
    step = Math.min(step * 2, MAX_TUBES - N);
  }
  let lo = N + Math.floor(step / 2);
  let hi = N + step;
  while (hi - lo > 1) {
    const mid = Math.floor((lo + hi) / 2);
    if (tryN(mid)) hi = mid;
    else lo = mid;
  }
  const sizing = tryN(hi)!;
  return { count: hi, sizing };
}

/**
 * designTubesForPercentile with the Monte Carlo pass as a generator (it may yield to have its
 * draws computed elsewhere, e.g. on worker threads); `monteCarlo(count)` runs with the sizer's alpha
 * set for `count` tubes. Same iteration, same result.
 */
export function* designTubesForPercentileSteps<Y, N>(
  input: Omit<PercentileTubeInput, 'monteCarlo'> & { monteCarlo: (count: number) => Generator<Y, TubePass, N> },
): Generator<Y, PercentileTubeResult, N> {
  const { sizer, molarMasses, level } = input;
  const sys = sizer.sys;
  const allowed = sys.kase.tubes!.allowedPressureDrop;
  const maxPasses = input.maxPasses ?? 4;
  let N = input.start.count;
  let res = input.startSizing;
  let pass!: TubePass;
  let passes = 0;
  let met = false;
  let detail: string | undefined;
  let install = { W: NaN, drop: NaN };
  let over = { count: 0, of: 0, dropAtLevel: NaN };
  for (;;) {
    sys.alpha = bundleAlpha(sys, molarMasses, N).alpha;
    pass = yield* input.monteCarlo(N);
    passes++;
    const Wp = levelOf(pass.sizes, level);
    const dp = levelOf(pass.drops, level);
    let count = 0;
    for (let d = 0; d < pass.drops.length; d++) if (pass.drops[d] > allowed) count++;
    over = { count, of: dp.of, dropAtLevel: dp.value };
    install = { W: Math.max(Wp.value, res.size), drop: Number.isFinite(Wp.value) ? bedDrop(sizer, Math.max(Wp.value, res.size)) : Infinity };
    met = Wp.of > 0 && count <= (1 - level) * dp.of + 1e-9 && install.drop <= allowed;
    if (met || passes >= maxPasses || Wp.of === 0) break;
    const finite = Number.isFinite(install.W) && Number.isFinite(dp.value) && install.drop > 0 && Number.isFinite(install.drop);
    const next = finite
      ? raiseTubeCount(sizer, molarMasses, N, install.W / res.size, Math.max(1, dp.value / install.drop))
      : raiseTubeCount(sizer, molarMasses, Math.ceil(N * 1.5) - 1, 1, 1);
    if (!next) {
      detail = `no tube count up to ${MAX_TUBES} keeps the P${fmt(level * 100, 3)} catalyst mass within the allowed pressure drop`;
      break;
    }
    N = next.count;
    res = next.sizing;
  }
  sys.alpha = bundleAlpha(sys, molarMasses, N).alpha;
  const tubes: TubeDesign = {
    ...tubeLayout(sys, molarMasses, N, res.size, nominalDrop(sizer, res)),
    designedFor: { level, basis: `P${fmt(level * 100, 3)} of the required catalyst mass over ${input.draws} Monte Carlo parameter sets` },
    nominalCount: input.start.count,
  };
  if (Number.isFinite(install.W) && Number.isFinite(install.drop)) {
    tubes.install = {
      level,
      catalystMass: install.W,
      catalystPerTube: install.W / N,
      length: tubeLength(sys, N, install.W),
      pressureDrop: { pa: install.drop, bar: install.drop / 1e5 },
    };
  }
  tubes.draws = { overAllowed: over.count, of: over.of, ...(Number.isFinite(over.dropAtLevel) ? { dropAtLevel: { pa: over.dropAtLevel, bar: over.dropAtLevel / 1e5 } } : {}) };
  return { tubes, sizing: res, pass, passes, met, ...(detail ? { detail } : {}) };
}
