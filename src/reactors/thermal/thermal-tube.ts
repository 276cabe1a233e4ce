/**
 * Solving the non-isothermal tube of tube-balances.ts: one integration from the inlet for the
 * adiabatic, constant-coolant and co-current modes (an initial-value problem); the counter-current
 * mode is a two-point boundary-value problem handed to counter-current.ts (shooting).
 *
 * Method: numerics/integrate (Dormand-Prince 5(4), switching to RODAS4 on detected stiffness, with
 * the difference Jacobian of tube-balances.ts). The hot spot is located as a non-terminal event
 * where dT/dx changes sign from + to - (a local maximum of T), together with the inlet and outlet
 * temperatures. Terminal events stop the march where the target is met (sizing), where the
 * temperature passes the runaway cap (status 'runaway') and where the pressure runs out.
 * Numerical trouble is a status on the result, never a throw.
 */
import { outcome, type Outcome, type StatusTable } from '../../core/outcome.js';
import type { CompiledKinetics } from '../../kinetics/compiled.js';
import { OdeWorkspace } from '../../numerics/integrate.js';
import type { OdeEvent, OdeOptions, OdeResult } from '../../numerics/ode-types.js';
import { TubeBalances, type ThermalTubeSpec } from './tube-balances.js';
import { shootCounterCurrent, type ShootingReport } from './counter-current.js';

export type ThermalStatus = 'success' | 'target-reached' | 'runaway' | 'pressure-exhausted' | 'integration-failed' | 'bvp-not-converged';

export const THERMAL_STATUS: StatusTable<ThermalStatus> = {
  success: { success: true, message: 'tube solved to its end' },
  'target-reached': { success: true, message: 'the target was reached inside the tube' },
  runaway: { success: false, message: 'the temperature ran away (passed the runaway cap) inside the tube' },
  'pressure-exhausted': { success: false, message: 'the pressure ran out inside the tube' },
  'integration-failed': { success: false, message: 'the tube balances could not be integrated' },
  'bvp-not-converged': { success: false, message: 'the counter-current boundary-value problem did not converge' },
};

export interface ThermalSolveOptions {
  /** Positions (kg or m3, ascending, within the size) at which to record the profile; default none. */
  profile?: ArrayLike<number>;
  /** Relative tolerance; default 1e-8. */
  rtol?: number;
  /** Absolute tolerance relative to each state's scale (F_T0, 1, T0); default 1e-10. */
  atolScale?: number;
  /** Step budget; default 100000. */
  maxSteps?: number;
  /** Integrator; default 'auto'. */
  method?: 'auto' | 'nonstiff' | 'stiff';
  /** Terminal target event: the march stops where g(y) rises through 0 (sizing); default none. */
  target?: (y: Float64Array) => number;
  /** Temperature (K) taken as runaway; default T0 + 1000 K. */
  runawayTemperature?: number;
  /** Counter-current shooting: tolerance on the coolant temperature, K; default 1e-7. */
  shootingTolerance?: number;
}

export interface ThermalProfile {
  /** Position, kg (packed bed) or m3 (plug flow). */
  x: number[];
  /** Molar flows per position, mol/s. */
  F: Float64Array[];
  /** Temperature, K. */
  T: number[];
  /** Coolant temperature, K (null when adiabatic). */
  Ta: (number | null)[];
  /** p = P/P0. */
  p: number[];
}

export interface ThermalTubeSolution extends Outcome<ThermalStatus> {
  /** Position reached (kg or m3): the size, or where the march stopped. */
  x: number;
  /** Outlet (or stop) molar flows, mol/s. */
  outlet: Float64Array;
  /** Outlet temperature, K. */
  outletTemperature: number;
  /** Outlet p = P/P0. */
  outletPressureRatio: number;
  /** Coolant temperature at x = 0 and at the end of the march, K (null when adiabatic). */
  coolant: { atInlet: number | null; atOutlet: number | null };
  /** Highest temperature along the tube and where, K and kg (or m3). */
  hotSpot: { position: number; temperature: number };
  profile?: ThermalProfile;
  /** Counter-current mode: how the boundary-value problem converged. */
  bvp?: ShootingReport;
  stats: { rhsEvaluations: number; steps: number; method: string };
}

/** A non-isothermal tube bound to one kinetics and parameter vector (theta may be overwritten). */
export class ThermalTube {
  readonly balances: TubeBalances;
  private readonly ws = new OdeWorkspace();
  private readonly y0: Float64Array;
  private readonly dT: Float64Array;
  private readonly atol: Float64Array;

  constructor(spec: ThermalTubeSpec, kinetics: CompiledKinetics, theta: Float64Array) {
    this.balances = new TubeBalances(spec, kinetics, theta);
    const n = this.balances.layout.n;
    this.y0 = new Float64Array(n);
    this.dT = new Float64Array(n);
    this.atol = new Float64Array(n);
  }

  get spec(): ThermalTubeSpec {
    return this.balances.spec;
  }

  /** Solve a tube of the given size (kg or m3) in the spec's mode. */
  solve(size: number, options: ThermalSolveOptions = {}): ThermalTubeSolution {
    if (this.spec.mode === 'counter-current') return shootCounterCurrent(this, size, options);
    return this.march(size, this.spec.coolantTemperature, options);
  }

  /** One initial-value march from the inlet with coolant temperature taStart at x = 0. */
  march(size: number, taStart: number, options: ThermalSolveOptions = {}): ThermalTubeSolution {
    const b = this.balances;
    const L = b.layout;
    this.spec.beforeMarch?.();
    b.inlet(this.y0, taStart);
    const sc = options.atolScale ?? 1e-10;
    for (let k = 0; k < L.n; k++) this.atol[k] = sc * b.scale[k];
    const res = this.ws.integrate(b.rhs, 0, this.y0, size, this.odeOptions(options));
    return this.describe(res, size, options);
  }

  private odeOptions(options: ThermalSolveOptions): OdeOptions {
    const b = this.balances;
    const L = b.layout;
    const events: OdeEvent[] = [];
    if (L.T >= 0) {
      const cap = options.runawayTemperature ?? this.spec.T0 + 1000;
      events.push({ name: 'hot-spot', terminal: false, direction: -1, g: (x, y) => (b.rhs(x, y, this.dT), this.dT[L.T]) });
      events.push({ name: 'runaway', terminal: true, direction: 1, g: (_x, y) => y[L.T] - cap });
    }
    if (L.p >= 0) events.push({ name: 'pressure', terminal: true, direction: -1, g: (_x, y) => y[L.p] - 1e-3 });
    const target = options.target;
    if (target) events.push({ name: 'target', terminal: true, direction: 1, g: (_x, y) => target(y) });
    return {
      rtol: options.rtol ?? 1e-8,
      atol: this.atol,
      jac: b.jac,
      method: options.method ?? 'auto',
      maxSteps: options.maxSteps ?? 100000,
      autonomous: true,
      events,
      ...(options.profile ? { tEval: options.profile } : {}),
    };
  }

  /** The solution of one march: status, outlet, hot spot and profile. */
  private describe(res: OdeResult, size: number, options: ThermalSolveOptions): ThermalTubeSolution {
    const b = this.balances;
    const L = b.layout;
    const T0 = this.spec.T0;
    const y = res.y;
    const hot = { position: 0, temperature: T0 };
    const consider = (x: number, yy: ArrayLike<number>): void => {
      const T = b.temperature(yy);
      if (T > hot.temperature) {
        hot.temperature = T;
        hot.position = x;
      }
    };
    for (const e of res.events) if (e.name === 'hot-spot') consider(e.t, e.y);
    for (let i = 0; i < res.tOut.length; i++) consider(res.tOut[i], res.yOut[i]);
    consider(res.t, y);
    const fired = res.events.length > 0 ? res.events[res.events.length - 1].name : '';
    let status: ThermalStatus;
    if (!res.success) status = 'integration-failed';
    else if (fired === 'runaway') status = 'runaway';
    else if (fired === 'pressure') status = 'pressure-exhausted';
    else if (fired === 'target') status = 'target-reached';
    else status = 'success';
    const detail = status === 'integration-failed' ? res.message : status === 'runaway' ? `at ${res.t.toPrecision(5)} of ${size}` : undefined;
    const sol: ThermalTubeSolution = {
      ...outcome(THERMAL_STATUS, status, [], detail),
      x: res.t,
      outlet: y.slice(0, L.nS),
      outletTemperature: b.temperature(y),
      outletPressureRatio: L.p >= 0 ? y[L.p] : 1,
      coolant: { atInlet: L.Ta >= 0 ? this.y0[L.Ta] : this.coolantConst(), atOutlet: L.Ta >= 0 ? y[L.Ta] : this.coolantConst() },
      hotSpot: hot,
      stats: { rhsEvaluations: res.stats.rhsEvaluations, steps: res.stats.steps, method: res.stats.method },
    };
    if (options.profile) sol.profile = this.profileOf(res);
    return sol;
  }

  private coolantConst(): number | null {
    return this.spec.mode === 'constant-coolant' ? this.spec.coolantTemperature : null;
  }

  private profileOf(res: OdeResult): ThermalProfile {
    const b = this.balances;
    const L = b.layout;
    return {
      x: [...res.tOut],
      F: res.yOut.map((r) => r.slice(0, L.nS)),
      T: res.yOut.map((r) => b.temperature(r)),
      Ta: res.yOut.map((r) => (L.Ta >= 0 ? r[L.Ta] : this.coolantConst())),
      p: res.yOut.map((r) => (L.p >= 0 ? r[L.p] : 1)),
    };
  }
}
