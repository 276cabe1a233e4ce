/**
 * Sizing a cooled (or adiabatic) multitubular packed bed: the number of tubes, the catalyst per
 * tube and the tube length that meet the target conversion with the hot spot at or below
 * heat.maxTemperature, the pressure drop at or below tubes.allowedPressureDrop and the tube length
 * at or below heat.maxTubeLength; the result names the constraint that decides the design.
 *
 * Method: for a tube count N, one tube (thermal-design.ts) is marched from the inlet with a
 * terminal event at the target conversion (tube-balances.ts, thermal-tube.ts); counter-current
 * coolant solves the boundary-value problem for each trial catalyst mass and finds the mass that
 * meets the target by Brent's method. The pressure drop and the tube length fall as N grows, so the
 * smallest N meeting each is found by doubling then integer bisection (as in tubes.ts); the design
 * takes the larger of the two counts. The hot spot depends mainly on the tube diameter and the
 * coolant temperature, not on N: when it exceeds the limit the design is reported as not meeting
 * it, or, with heat.searchDiameters, the widest listed diameter that meets every limit is chosen.
 */
import type { CompiledKinetics } from '../kinetics/compiled.js';
import { brent } from '../numerics/roots.js';
import { ThermalTube, type ThermalTubeSolution } from '../reactors/thermal/thermal-tube.js';
import type { ThermalCase } from './heat-case.js';
import type { DesignSystem } from './system.js';
import { tubeThermalSpec, type TubeThermal } from './thermal-design.js';
import { MAX_TUBES } from './tubes.js';
import type { ThermalPelletBuilder } from './heat-pellet.js';

export type Binding = 'hot spot' | 'pressure drop' | 'tube length' | 'target conversion';

/** One evaluated tube count. */
export interface TubeTrial {
  N: number;
  status: 'sized' | 'target-unreachable' | 'runaway' | 'pressure-exhausted' | 'integration-failed' | 'bvp-not-converged';
  /** Catalyst per tube, kg. */
  W: number;
  /** Tube length, m. */
  length: number;
  /** Pressure drop, Pa. */
  drop: number;
  hotSpot: number;
  detail?: string;
  tube: TubeThermal;
  solution?: ThermalTubeSolution;
}

/** The tube of a trial and a march (or BVP solve) to the target. */
export class HeatSizer {
  constructor(
    readonly sys: DesignSystem,
    readonly kinetics: CompiledKinetics,
    readonly th: ThermalCase,
    readonly dH: Float64Array,
    readonly molarMasses: ArrayLike<number>,
    /** Diameter override (heat.searchDiameters), m. */
    readonly diameter = sys.kase.tubes!.innerDiameter,
    /** The plant pellet's factor for a tube of N with mass flux G (case with a pellet); none by default. */
    readonly pellet?: ThermalPelletBuilder,
  ) {}

  /** Cross-section of one tube, m2. */
  area(): number {
    return (Math.PI * this.diameter ** 2) / 4;
  }

  /** The spec of one tube of N at this diameter. */
  tubeOf(N: number): TubeThermal {
    const kase = this.sys.kase;
    const sys = this.diameter === kase.tubes!.innerDiameter ? this.sys : { ...this.sys, kase: { ...kase, tubes: { ...kase.tubes!, innerDiameter: this.diameter } } };
    const tube = tubeThermalSpec(sys, this.kinetics, this.th, this.dH, this.molarMasses, N);
    if (this.pellet) {
      const f = this.pellet(N, tube.G);
      tube.spec.rateFactor = f.factor;
      tube.spec.beforeMarch = f.reset;
      tube.pellet = f;
    }
    return tube;
  }

  /** Conversion of the key species in flows F of a tube of N. */
  conversion(F: ArrayLike<number>, N: number, key: number): number {
    const f0 = this.sys.kase.feed[key] / N;
    return (f0 - F[key]) / f0;
  }

  /**
   * Size one tube of N for the target conversion X of species `key` (theta: the sys theta); rtol is
   * the integrator's relative tolerance (default 1e-8; Monte Carlo draws use 1e-7, far below the
   * spread the draws measure).
   */
  trial(N: number, key: number, X: number, rtol = 1e-8): TubeTrial {
    const tube = this.tubeOf(N);
    const tt = new ThermalTube(tube.spec, this.kinetics, this.sys.theta);
    const bound = this.th.maxTubeLength * 20 * this.sys.kase.tubes!.bulkDensity * this.area();
    const target = (y: Float64Array): number => this.conversion(y, N, key) - X;
    let sol: ThermalTubeSolution;
    let W: number;
    if (tube.spec.mode === 'counter-current') {
      const r = this.counterCurrentSize(tt, bound, N, key, X, rtol);
      if (!r.sol) return this.failedTrial(N, tube, r.status, r.detail);
      sol = r.sol;
      W = r.W;
    } else {
      sol = tt.solve(bound, { target, rtol });
      if (sol.status !== 'target-reached') {
        const status = sol.status === 'success' ? 'target-unreachable' : sol.status;
        return this.failedTrial(N, tube, status as TubeTrial['status'], sol.message, sol);
      }
      W = sol.x;
    }
    const drop = this.sys.kase.pressure! * (1 - sol.outletPressureRatio);
    return { N, status: 'sized', W, length: W / (this.sys.kase.tubes!.bulkDensity * this.area()), drop, hotSpot: sol.hotSpot.temperature, tube, solution: sol };
  }

  private failedTrial(N: number, tube: TubeThermal, status: TubeTrial['status'], detail: string, solution?: ThermalTubeSolution): TubeTrial {
    return { N, status, W: NaN, length: NaN, drop: NaN, hotSpot: solution?.hotSpot.temperature ?? NaN, detail, tube, ...(solution ? { solution } : {}) };
  }

  /** Counter-current: the catalyst mass whose BVP solution meets the target (Brent on the mass). */
  private counterCurrentSize(tt: ThermalTube, bound: number, N: number, key: number, X: number, rtol: number): { sol?: ThermalTubeSolution; W: number; status: TubeTrial['status']; detail: string } {
    const guess = new ThermalTube({ ...tt.spec, mode: 'constant-coolant' }, this.kinetics, this.sys.theta).solve(bound, { target: (y) => this.conversion(y, N, key) - X, rtol });
    if (guess.status !== 'target-reached') return { W: NaN, status: 'target-unreachable', detail: 'the target is not reached even with the coolant held at its inlet temperature' };
    let last: ThermalTubeSolution | undefined;
    const g = (W: number): number => {
      last = tt.solve(W, { rtol });
      return last.success ? this.conversion(last.outlet, N, key) - X : NaN;
    };
    let lo = guess.x * 0.5;
    let hi = guess.x * 2;
    for (let k = 0; k < 20 && !(g(hi) > 0); k++) hi *= 2;
    for (let k = 0; k < 20 && !(g(lo) < 0); k++) lo /= 2;
    const br = brent(g, lo, hi, { xtol: 1e-9 * hi });
    if (!br.success || !last) return { W: NaN, status: last?.status === 'bvp-not-converged' ? 'bvp-not-converged' : 'target-unreachable', detail: last?.message ?? br.message };
    const sol = tt.solve(br.x, { rtol });
    return sol.success ? { sol, W: br.x, status: 'sized', detail: '' } : { W: NaN, status: 'bvp-not-converged', detail: sol.message };
  }

  /** Smallest N in [1, MAX_TUBES] for which ok(trial) holds (doubling then bisection); null if none. */
  smallest(key: number, X: number, ok: (t: TubeTrial) => boolean): TubeTrial | null {
    let hi = 1;
    let t = this.trial(hi, key, X);
    while (!ok(t)) {
      if (hi >= MAX_TUBES) return null;
      hi = Math.min(hi * 2, MAX_TUBES);
      t = this.trial(hi, key, X);
    }
    let lo = Math.floor(hi / 2);
    let best = t;
    while (hi - lo > 1) {
      const mid = Math.floor((lo + hi) / 2);
      const m = this.trial(mid, key, X);
      if (ok(m)) [hi, best] = [mid, m];
      else lo = mid;
    }
    return best;
  }
}

/** The outcome of the tube-count search at one diameter. */
export interface HeatDesignChoice {
  trial: TubeTrial;
  binding: Binding;
  met: boolean;
  /** Counts the pressure drop and the length alone would need. */
  countFor: { pressureDrop: number | null; tubeLength: number | null };
  detail?: string;
}

/** Search the tube count at the sizer's diameter (see the file header). */
export function chooseTubes(hs: HeatSizer, key: number, X: number): HeatDesignChoice {
  const kase = hs.sys.kase;
  const allowed = kase.tubes!.allowedPressureDrop;
  const forDrop = hs.smallest(key, X, (t) => t.status === 'sized' && t.drop <= allowed);
  const forLength = hs.smallest(key, X, (t) => t.status === 'sized' && t.length <= hs.th.maxTubeLength);
  const countFor = { pressureDrop: forDrop?.N ?? null, tubeLength: forLength?.N ?? null };
  if (!forDrop || !forLength) {
    const t = hs.trial(MAX_TUBES, key, X);
    return { trial: t, binding: !forDrop ? 'pressure drop' : 'tube length', met: false, countFor, detail: `no tube count up to ${MAX_TUBES} meets the ${!forDrop ? 'pressure-drop' : 'tube-length'} limit${t.detail ? ` (${t.detail})` : ''}` };
  }
  const trial = forDrop.N >= forLength.N ? forDrop : forLength;
  let binding: Binding = forDrop.N >= forLength.N ? 'pressure drop' : 'tube length';
  if (trial.N === 1) binding = 'target conversion';
  const limit = hs.th.maxTemperature;
  if (limit !== undefined && trial.hotSpot > limit) {
    return { trial, binding: 'hot spot', met: false, countFor, detail: `the hot spot ${trial.hotSpot.toFixed(1)} K exceeds heat.maxTemperature ${limit.toFixed(1)} K; use narrower tubes (heat.searchDiameters), a lower coolant temperature or a diluted feed` };
  }
  return { trial, binding, met: true, countFor };
}

