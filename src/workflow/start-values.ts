/**
 * Starting values for parameters the study left open (value omitted or "auto").
 *
 * Method: the differential method of rate analysis (differential reactor; see Weekman 1974,
 * "Laboratory reactors and their limitations", AIChE J. 20, 833-840; reference from memory). A run
 * (or profile point) with a low conversion of the key reactant gives the reaction's rate directly:
 *   packed bed (mass basis)       r = (F_A0 - F_A) / (|nu_A| W)
 *   plug flow, stirred tank       r = (F_A0 - F_A) / (|nu_A| V)
 *   batch (constant volume)       r = (C_A0 - C_A) / (|nu_A| t)
 * with F_A from the measured outlet flow, conversion or concentration; measured 'rate' data give r
 * directly. The rate is taken at the mean of the inlet and outlet compositions (stirred tank: the
 * outlet, where it operates exactly). For a power-law rate law r = k_ref exp(-E/R (1/T - 1/T_ref))
 * prod_j X_j^a_j of the single reaction consuming the key reactant, the linearised model
 *   ln r = ln k_ref - (E/R)(1/T - 1/T_ref) + sum_j a_j ln X_j
 * is fitted by linear least squares (linear-regression.ts) for whichever of ln k_ref, E and the
 * fitted orders are open; the others enter as known offsets. A reversible reaction contributes
 * only its forward term: the low-conversion rule keeps the points far from equilibrium.
 *
 * Rule for the points: conversion of the key reactant above 0 and below `maxConversion` (default
 * 15%). When fewer than (open unknowns + 2) such points exist, points up to `fallbackConversion`
 * (default 40%) are taken, and the notes say so. When the design cannot separate a column
 * (one temperature for E, one concentration level for an order) that parameter keeps its default.
 *
 * Every other open parameter keeps the documented default of study/parameters.ts
 * (defaultStartValue), except an adsorption constant without finite bounds, which starts at
 * 1 / (mean inlet concentration, or partial pressure, of its species) so that its term in the
 * denominator is of order 1. Estimates are put inside the parameter bounds. Pure: no I/O.
 */
import type { Parameter } from '../core/parameter.js';
import { compileKinetics } from '../kinetics/compile.js';
import type { RateLawSpec } from '../kinetics/spec.js';
import { weightedLinearLeastSquares } from '../estimation/linear-regression.js';
import { parameterRoles } from '../study/parameters.js';
import type { Observation, Study, StudyRun } from '../study/types.js';
import { inletConcentrations, rateConcentrations, type ModelVariant } from './study-model.js';
import { GAS_CONSTANT } from '../core/constants.js';

/** How one open starting value was obtained. */
export interface EstimatedStart {
  name: string;
  /** The starting value, SI. */
  value: number;
  /** SI unit of value. */
  unit: string;
  /** 'differential': from the linearised rate regression; 'default': the documented default. */
  method: 'differential' | 'default';
  /** One line saying how, for reports. */
  detail: string;
}

export interface StartValueOptions {
  /** Largest conversion (fraction) of the key reactant for a point of the differential method; default 0.15. */
  maxConversion?: number;
  /** Conversion limit (fraction) used when too few points lie below maxConversion; default 0.4. */
  fallbackConversion?: number;
}

export interface StartValues {
  /** The variant's parameters with the open starts filled in (new objects). */
  parameters: Parameter[];
  /** One entry per open parameter, in the order of the parameters. */
  estimated: EstimatedStart[];
  /** Points used by the differential method (0 when it did not run). */
  points: number;
  /** Why the differential method was skipped or limited, and what it assumed. */
  notes: string[];
}

/** One rate point of the differential method. */
interface RatePoint {
  run: StudyRun;
  /** Reaction rate r in the reaction's basis (> 0). */
  rate: number;
  /** Concentrations (mol/m3) where the rate applies. */
  C: Float64Array;
  conversion: number;
}

const fmt = (v: number): string => (v !== 0 && (Math.abs(v) >= 1e5 || Math.abs(v) < 1e-3) ? v.toExponential(3) : v.toPrecision(4));

const pct = (x: number): string => `${+(x * 100).toPrecision(3)}%`;

/** Base name of a parameter: 'k@c1' -> 'k'. */
const baseOf = (name: string): string => name.split('@')[0];

/**
 * Estimate the open starting values of a rate-law set. `open` lists the parameter names (as in
 * variant.parameters) whose start the study left to rateloom. Never throws for data that do not
 * allow the differential method: those parameters keep their defaults and `notes` says why.
 */
export function estimateStartValues(study: Study, variant: ModelVariant, open: readonly string[], options: StartValueOptions = {}): StartValues {
  const rates = variant.reactions.map((r) => r.rate as RateLawSpec);
  const openSet = new Set(open);
  const values = new Map(variant.parameters.map((p) => [p.name, p.value]));
  const notes: string[] = [];
  const units = rateLawUnits(study, variant, rates);
  const differential = differentialStarts(study, variant, rates, openSet, values, options, notes);
  const adsorptionHow = adsorptionStarts(study, variant, rates, openSet, values);
  const roles = parameterRoles(rates, reactionSideCoefficient(study.chemistry));
  const estimated: EstimatedStart[] = [];
  const parameters = variant.parameters.map((p) => {
    if (!openSet.has(p.name)) return p;
    const unit = p.unit === '1' && units[baseOf(p.name)] ? units[baseOf(p.name)] : p.unit;
    const how = differential.method.get(p.name);
    const start =
      how !== undefined
        ? insideBounds(p, values.get(p.name) as number, how, unit)
        : { value: values.get(p.name) as number, detail: adsorptionHow.get(p.name) ?? defaultDetail(p, roles.get(baseOf(p.name))?.role) };
    estimated.push({ name: p.name, value: start.value, unit, method: how !== undefined ? 'differential' : 'default', detail: start.detail });
    return { ...p, value: start.value, unit };
  });
  return { parameters, estimated, points: differential.points, notes };
}

/** SI units the rate-law forms fix, by base parameter name (used when the study gave no unit). */
function rateLawUnits(study: Study, variant: ModelVariant, rates: RateLawSpec[]): Record<string, string> {
  const parameterNames = [...new Set(variant.parameters.map((p) => baseOf(p.name)))];
  const units: Record<string, string> = {};
  try {
    const kin = compileKinetics({ chemistry: study.chemistry, rates, parameterNames, referenceTemperature: study.referenceTemperature });
    for (const d of kin.describe()) Object.assign(units, d.parameterUnits);
  } catch {
    // The fit itself reports a kinetics problem; units then stay as declared.
  }
  return units;
}

/** Coefficient of a species on the forward (reactant) or reverse (product) side of reaction i. */
function reactionSideCoefficient(chem: Study['chemistry']): (i: number, sp: string, side: 'forward' | 'reverse') => number {
  const nS = chem.speciesNames.length;
  return (i, sp, side) => {
    const j = chem.speciesNames.indexOf(sp);
    const nu = j < 0 ? 0 : chem.stoich[i * nS + j];
    return side === 'forward' ? Math.max(0, -nu) : Math.max(0, nu);
  };
}

/** How the differential method set its estimates: points used (0 when it did not run), and how, by name. */
interface DifferentialResult {
  points: number;
  method: Map<string, string>;
}

const NOT_RUN = (): DifferentialResult => ({ points: 0, method: new Map() });

/**
 * The differential method, when exactly one reaction consumes the key reactant and it has a power
 * law; otherwise a note says why it was skipped. Estimates go into `values`.
 */
function differentialStarts(
  study: Study,
  variant: ModelVariant,
  rates: RateLawSpec[],
  open: ReadonlySet<string>,
  values: Map<string, number>,
  options: StartValueOptions,
  notes: string[],
): DifferentialResult {
  const chem = study.chemistry;
  const nS = chem.speciesNames.length;
  const key = study.keyReactantIndex;
  const consuming = [...Array(chem.reactionIds.length).keys()].filter((i) => chem.stoich[i * nS + key] < 0);
  if (consuming.length !== 1) {
    notes.push(`differential method skipped: ${consuming.length ? `${consuming.length} reactions consume` : 'no reaction consumes'} the key reactant ${study.keyReactant}`);
    return NOT_RUN();
  }
  const target = consuming[0];
  const rate = rates[target];
  if (!rate || (rate.form !== 'power-law' && rate.form !== 'reversible-power-law')) {
    notes.push(`differential method skipped: reaction ${chem.reactionIds[target]} has a ${rate?.form} rate law (power laws only)`);
    return NOT_RUN();
  }
  const limits = { maxX: options.maxConversion ?? 0.15, fallbackX: options.fallbackConversion ?? 0.4 };
  return differential(study, regressionSetup(study, variant, rate, target, open), values, limits, notes);
}

/**
 * Adsorption constants without finite bounds: K = 1 / (mean inlet X of the species), so K X ~ 1.
 * Sets them in `values`; returns how, by parameter name.
 */
function adsorptionStarts(study: Study, variant: ModelVariant, rates: RateLawSpec[], open: ReadonlySet<string>, values: Map<string, number>): Map<string, string> {
  const chem = study.chemistry;
  const how = new Map<string, string>();
  const C = new Float64Array(chem.speciesNames.length);
  for (const r of rates) {
    if (r.form !== 'lhhw') continue;
    for (const [sp, ref] of Object.entries(r.adsorption)) {
      const j = chem.speciesNames.indexOf(sp);
      let sum = 0;
      for (const run of study.runs) sum += inletConcentrations(run, study, C)[j] * (r.pressureBasis ? GAS_CONSTANT * run.temperature : 1);
      const mean = study.runs.length && j >= 0 ? sum / study.runs.length : 0;
      for (const p of variant.parameters) {
        if (baseOf(p.name) !== ref.K || !open.has(p.name) || (p.lower > 0 && Number.isFinite(p.upper)) || !(mean > 0)) continue;
        values.set(p.name, Math.min(p.upper, Math.max(1 / mean, p.lower)));
        how.set(p.name, `default: 1 / mean inlet ${r.pressureBasis ? 'partial pressure' : 'concentration'} of ${sp} (${fmt(mean)} ${r.pressureBasis ? 'Pa' : 'mol/m3'}), so that K X is about 1`);
      }
    }
  }
  return how;
}

/** A differential estimate put inside the parameter's bounds; the detail says when it was moved (value in `unit`). */
function insideBounds(p: Parameter, estimate: number, how: string, unit: string): { value: number; detail: string } {
  const lo = p.transform === 'log' ? Math.max(p.lower, 0) : p.lower;
  if (estimate < lo || (p.transform === 'log' && !(estimate > 0))) {
    const value = p.transform === 'log' && !(p.lower > 0) ? p.value : p.lower;
    return { value, detail: `${how}; the estimate lay below the lower bound, start put at ${fmt(value)}${unit === '1' || unit === '' ? '' : ` ${unit}`}` };
  }
  if (estimate > p.upper) return { value: p.upper, detail: `${how}; the estimate lay above the upper bound, start put at the bound` };
  return { value: estimate, detail: how };
}

function defaultDetail(p: Parameter, role: string | undefined): string {
  const finite = Number.isFinite(p.lower) && Number.isFinite(p.upper);
  if (p.transform === 'log') return p.lower > 0 && Number.isFinite(p.upper) ? 'default: geometric middle of its bounds' : 'default: 1 (SI), inside its bounds';
  if (role === 'energy') return p.value === 0 ? 'default: 0 J/mol' : 'default: middle of its bounds (0 lies outside)';
  if (role === 'order') return 'default: stoichiometric coefficient of the species';
  return finite ? 'default: middle of its bounds' : 'default: 1, inside its bounds';
}

/** The concrete name of a kinetics parameter for a run ('k' or 'k@group'). */
function runName(name: string, run: StudyRun, byName: ReadonlySet<string>): string {
  const member = run.group !== undefined ? `${name}@${run.group}` : undefined;
  return member && byName.has(member) ? member : name;
}

type PowerLaw = Extract<RateLawSpec, { form: 'power-law' | 'reversible-power-law' }>;

/** What the ln r regression of the target reaction's power law works with. */
interface RegressionSetup {
  rate: PowerLaw;
  /** Index of the reaction consuming the key reactant. */
  target: number;
  /** Concrete parameter names of the variant ('k', 'k@group', ...). */
  names: ReadonlySet<string>;
  /** Concrete names whose start is open. */
  open: ReadonlySet<string>;
  kName: string;
  eName: string | undefined;
  /** Orders of the forward term: species index and a fixed number or an order parameter's name. */
  orders: { j: number; order: number | string }[];
  /** Names of the order parameters. */
  orderBases: ReadonlySet<string>;
  /** Base names the regression can estimate: k, E (when the law has one) and the order parameters. */
  bases: string[];
}

function regressionSetup(study: Study, variant: ModelVariant, rate: PowerLaw, target: number, open: ReadonlySet<string>): RegressionSetup {
  const chem = study.chemistry;
  const nS = chem.speciesNames.length;
  // Orders of the forward term: listed ones (unlisted = 0), or the reactant coefficients.
  const orders: RegressionSetup['orders'] = [];
  for (let j = 0; j < nS; j++) {
    const o = rate.orders ? rate.orders[chem.speciesNames[j]] : Math.max(0, -chem.stoich[target * nS + j]);
    if (o !== undefined && o !== 0) orders.push({ j, order: o });
  }
  const orderNames = orders.flatMap((o) => (typeof o.order === 'string' ? [o.order] : []));
  const kName = rate.rateConstant.k;
  const eName = rate.rateConstant.activationEnergy;
  const names = new Set(variant.parameters.map((p) => p.name));
  return { rate, target, names, open, kName, eName, orders, orderBases: new Set(orderNames), bases: [kName, ...(eName ? [eName] : []), ...orderNames] };
}

/** True when the run's concrete parameter of `base` is open. */
const isOpen = (s: RegressionSetup, base: string, run: StudyRun): boolean => s.open.has(runName(base, run, s.names));

/**
 * Fit ln r on the low-conversion points; while the design cannot separate the columns, drop the
 * orders, then E, and keep their starts. Estimates go into `values`.
 */
function differential(study: Study, s: RegressionSetup, values: Map<string, number>, limits: { maxX: number; fallbackX: number }, notes: string[]): DifferentialResult {
  if (!study.runs.some((r) => s.bases.some((b) => isOpen(s, b, r)))) return NOT_RUN();
  const chosen = lowConversionPoints(study, s, limits, notes);
  if (!chosen) return NOT_RUN();
  const { pts, rule } = chosen;
  const chem = study.chemistry;
  if (chem.reversible[s.target]) notes.push(`reaction ${chem.reactionIds[s.target]} is reversible: only its forward term was regressed, on low-conversion points far from equilibrium`);
  const attempts: ((b: string) => boolean)[] = [() => true, (b) => !s.orderBases.has(b), (b) => b === s.kName];
  for (const allowed of attempts) {
    const cols = openColumns(s, pts, allowed);
    if (!cols.length) break;
    if (pts.length < cols.length + 1) continue;
    const coefficients = regressLogRate(s, pts, cols, values, study.referenceTemperature);
    if (!coefficients) continue;
    const method = storeEstimates(s, pts, cols, coefficients, rule, values);
    const dropped = s.bases.filter((b) => !allowed(b));
    if (dropped.length) notes.push(`the low-conversion points cannot separate ${[...new Set(dropped)].join(', ')} (too little spread in temperature or concentration): default start kept`);
    return { points: pts.length, method };
  }
  notes.push(`differential method skipped: the ${pts.length} low-conversion point(s) cannot determine ${s.kName}`);
  return NOT_RUN();
}

/**
 * The rate points below the conversion limit (below the fallback limit when fewer than open
 * unknowns + 2 lie below it), and the rule in words; undefined, with a note, when there are none.
 */
function lowConversionPoints(study: Study, s: RegressionSetup, limits: { maxX: number; fallbackX: number }, notes: string[]): { pts: RatePoint[]; rule: string } | undefined {
  const { maxX, fallbackX } = limits;
  const usable = ratePoints(study, s.target, s.rate.basis ?? 'volume', notes).filter((p) => s.orders.every((o) => p.C[o.j] > 0));
  let pts = usable.filter((p) => p.conversion < maxX);
  let rule = `conversion of ${study.keyReactant} below ${pct(maxX)}`;
  const nOpen = new Set(study.runs.flatMap((r) => s.bases.filter((b) => isOpen(s, b, r)).map((b) => runName(b, r, s.names)))).size;
  if (pts.length < nOpen + 2) {
    const more = usable.filter((p) => p.conversion < fallbackX);
    if (more.length > pts.length) {
      notes.push(`only ${pts.length} point(s) below ${pct(maxX)} conversion; points up to ${pct(fallbackX)} were used`);
      pts = more;
      rule = `conversion of ${study.keyReactant} below ${pct(fallbackX)}`;
    }
  }
  if (!pts.length) {
    notes.push(`differential method skipped: no run or profile point of ${study.keyReactant} with ${rule}`);
    return undefined;
  }
  return { pts, rule };
}

/** The open concrete names of the allowed bases met by the points, in order of first appearance. */
function openColumns(s: RegressionSetup, pts: readonly RatePoint[], allowed: (base: string) => boolean): string[] {
  const cols: string[] = [];
  for (const p of pts) {
    for (const b of s.bases) {
      if (!allowed(b) || !isOpen(s, b, p.run)) continue;
      const n = runName(b, p.run, s.names);
      if (!cols.includes(n)) cols.push(n);
    }
  }
  return cols;
}

/**
 * Linear least squares of ln r on the columns (ln k, E, orders); the known parameters enter as
 * offsets. Undefined when the columns are ill-conditioned (condition number 1e6 or more).
 */
function regressLogRate(s: RegressionSetup, pts: readonly RatePoint[], cols: readonly string[], values: ReadonlyMap<string, number>, Tref: number): number[] | undefined {
  const m = pts.length;
  const p = cols.length;
  const X = new Float64Array(m * p);
  const y = new Float64Array(m);
  pts.forEach((pt, i) => {
    y[i] = Math.log(pt.rate) - fillRegressionRow(s, pt, cols, values, Tref, X.subarray(i * p, (i + 1) * p));
  });
  const fit = weightedLinearLeastSquares(X, m, p, y);
  if (!(fit.conditionNumber < 1e6) || fit.coefficients.some((c) => !Number.isFinite(c))) return undefined;
  return fit.coefficients;
}

/** One point's row of the design matrix (zeroed on entry); returns the known part of ln r. */
function fillRegressionRow(s: RegressionSetup, pt: RatePoint, cols: readonly string[], values: ReadonlyMap<string, number>, Tref: number, row: Float64Array): number {
  const T = pt.run.temperature;
  let offset = 0;
  const term = (base: string, coef: number) => {
    const n = runName(base, pt.run, s.names);
    const c = cols.indexOf(n);
    if (c >= 0) row[c] += coef;
    else offset += coef * (values.get(n) as number);
  };
  const kn = runName(s.kName, pt.run, s.names);
  if (cols.includes(kn)) row[cols.indexOf(kn)] = 1;
  else offset += Math.log(values.get(kn) as number);
  if (s.eName) term(s.eName, -(1 / T - 1 / Tref) / GAS_CONSTANT);
  for (const o of s.orders) {
    const lnX = Math.log(s.rate.pressureBasis ? pt.C[o.j] * GAS_CONSTANT * T : pt.C[o.j]);
    if (typeof o.order === 'number') offset += o.order * lnX;
    else term(o.order, lnX);
  }
  return offset;
}

/**
 * Put the fitted values into `values` (k = exp of its coefficient); per-group rate constants of
 * groups without points get the geometric mean of the estimated ones. Returns how, by name.
 */
function storeEstimates(
  s: RegressionSetup,
  pts: readonly RatePoint[],
  cols: readonly string[],
  coefficients: readonly number[],
  rule: string,
  values: Map<string, number>,
): Map<string, string> {
  const method = new Map<string, string>();
  const runsUsed = [...new Set(pts.map((q) => q.run.id))];
  const how = `differential method: ln r regression on ${pts.length} point(s) (${rule}; runs ${runsUsed.slice(0, 6).join(', ')}${runsUsed.length > 6 ? ', ...' : ''})`;
  cols.forEach((n, c) => {
    values.set(n, baseOf(n) === s.kName ? Math.exp(coefficients[c]) : coefficients[c]);
    method.set(n, how);
  });
  const kCols = cols.filter((n) => baseOf(n) === s.kName);
  if (!kCols.length) return method;
  for (const n of s.names) {
    if (baseOf(n) !== s.kName || !s.open.has(n) || method.has(n)) continue;
    values.set(n, Math.exp(kCols.reduce((sum, c) => sum + Math.log(values.get(c) as number), 0) / kCols.length));
    method.set(n, `${how}; no points of its group: geometric mean of the other groups`);
  }
  return method;
}

/** What turns an observation of the key reactant into a rate of the target reaction. */
interface RateBasis {
  study: Study;
  target: number;
  /** Rate per reactor volume or per catalyst mass. */
  basis: 'volume' | 'mass';
  /** -nu of the key reactant in the target reaction (> 0). */
  nuA: number;
  /** Sum of the target reaction's coefficients (mole change per extent). */
  delta: number;
}

/** Observed responses of the key reactant the differential method reads. */
const KEY_RESPONSES: ReadonlySet<string> = new Set(['outlet-flow', 'conversion', 'outlet-concentration']);

/** Rate points from the observations of the key reactant (and measured rates). */
function ratePoints(study: Study, target: number, basis: 'volume' | 'mass', notes: string[]): RatePoint[] {
  const chem = study.chemistry;
  const nS = chem.speciesNames.length;
  const key = study.keyReactantIndex;
  let delta = 0;
  for (let j = 0; j < nS; j++) delta += chem.stoich[target * nS + j];
  const rb: RateBasis = { study, target, basis, nuA: -chem.stoich[target * nS + key], delta };
  const kind = study.reactor.kind;
  const flowKind = kind === 'packed-bed' || kind === 'plug-flow' || kind === 'stirred-tank';
  const out: RatePoint[] = [];
  let skippedKind = false;
  for (const o of study.observations) {
    const run = study.runs[o.runIndex];
    let point: RatePoint | undefined;
    if (o.response === 'rate') point = measuredRatePoint(rb, o, run);
    else if (o.speciesIndex === key && KEY_RESPONSES.has(o.response)) {
      const size = o.position ?? run.size;
      if (!(size > 0)) continue;
      if (kind === 'batch') point = batchRatePoint(rb, o, run, size);
      else if (flowKind) point = flowRatePoint(rb, o, run, size);
      else skippedKind = true;
    }
    if (point) out.push(point);
  }
  if (skippedKind) notes.push(`${study.reactor.kind} outlet data are not used by the differential method (only packed-bed, plug-flow, stirred-tank, batch and measured rates)`);
  return out.filter((p) => p.rate > 0 && Number.isFinite(p.rate) && p.conversion < 1 && p.C.every((c) => Number.isFinite(c)));
}

/** A measured rate of a species only the target reaction changes, as the reaction's rate. */
function measuredRatePoint(rb: RateBasis, o: Observation, run: StudyRun): RatePoint | undefined {
  const { chemistry: chem, keyReactantIndex: key } = rb.study;
  const nS = chem.speciesNames.length;
  const j = o.speciesIndex ?? key;
  const nu = chem.stoich[rb.target * nS + j];
  let other = false;
  for (let i = 0; i < chem.reactionIds.length; i++) if (i !== rb.target && chem.stoich[i * nS + j] !== 0) other = true;
  const r = nu !== 0 && !other ? o.value / -nu : NaN;
  if (!(r > 0 && Number.isFinite(r))) return undefined;
  return { run, rate: r, C: rateConcentrations(run, rb.study, new Float64Array(nS)), conversion: 0 };
}

/** Batch (constant volume): r = (C_A0 - C_A) / (|nu_A| t), at the mean of the initial and measured compositions. */
function batchRatePoint(rb: RateBasis, o: Observation, run: StudyRun, time: number): RatePoint | undefined {
  const { chemistry: chem, keyReactantIndex: key } = rb.study;
  const nS = chem.speciesNames.length;
  const Cin = run.initialConcentrations;
  if (!Cin) return undefined;
  const V = run.initialVolume ?? 1;
  const CA = o.response === 'outlet-concentration' ? o.value : o.response === 'conversion' ? Cin[key] * (1 - o.value) : o.value / V;
  const xi = (Cin[key] - CA) / rb.nuA;
  const conversion = (Cin[key] - CA) / Cin[key];
  const per = rb.basis === 'volume' ? 1 : run.catalystMass !== undefined ? V / run.catalystMass : NaN;
  const C = new Float64Array(nS);
  for (let j = 0; j < nS; j++) C[j] = Cin[j] + (chem.stoich[rb.target * nS + j] * xi) / 2;
  return { run, rate: (xi / time) * per, C, conversion };
}

/**
 * Flow reactors: r = (F_A0 - F_A) / (|nu_A| W or V), at the outlet of a stirred tank, else at the
 * mean of the inlet and outlet compositions.
 */
function flowRatePoint(rb: RateBasis, o: Observation, run: StudyRun, size: number): RatePoint | undefined {
  const study = rb.study;
  const chem = study.chemistry;
  const nS = chem.speciesNames.length;
  const key = study.keyReactantIndex;
  const F0 = run.feed;
  if (!F0 || !(F0[key] > 0)) return undefined;
  const FA = keyOutletFlow(rb, o, run, F0);
  if (!Number.isFinite(FA)) return undefined;
  const xi = (F0[key] - FA) / rb.nuA;
  const conversion = (F0[key] - FA) / F0[key];
  const amount = basisAmount(study, rb.basis, run, size);
  if (!Number.isFinite(amount)) return undefined;
  const f = study.reactor.kind === 'stirred-tank' ? 1 : 0.5;
  const F = new Float64Array(nS);
  let FT = 0;
  for (let j = 0; j < nS; j++) {
    F[j] = F0[j] + chem.stoich[rb.target * nS + j] * xi * f;
    FT += F[j];
  }
  const C = new Float64Array(nS);
  if (study.reactor.phase === 'gas') {
    const CT = (run.pressure ?? NaN) / (GAS_CONSTANT * run.temperature);
    for (let j = 0; j < nS; j++) C[j] = (CT * F[j]) / FT;
  } else for (let j = 0; j < nS; j++) C[j] = F[j] / (run.volumetricFlow ?? NaN);
  return { run, rate: xi / amount, C, conversion };
}

/** Outlet molar flow of the key reactant (mol/s) from an outlet flow, conversion or concentration. */
function keyOutletFlow(rb: RateBasis, o: Observation, run: StudyRun, F0: ArrayLike<number>): number {
  const key = rb.study.keyReactantIndex;
  if (o.response === 'outlet-flow') return o.value;
  if (o.response === 'conversion') return F0[key] * (1 - o.value);
  if (rb.study.reactor.phase !== 'gas') return o.value * (run.volumetricFlow ?? NaN);
  // C_A = C_T0 F_A / F_T, F_T = F_T0 + delta xi, pressure ratio taken as 1 (differential bed).
  let FT0 = 0;
  for (let j = 0; j < rb.study.chemistry.speciesNames.length; j++) FT0 += F0[j];
  const yA = o.value / ((run.pressure ?? NaN) / (GAS_CONSTANT * run.temperature));
  return (yA * (FT0 + (rb.delta * F0[key]) / rb.nuA)) / (1 + (yA * rb.delta) / rb.nuA);
}

/** Catalyst mass (kg) or reactor volume (m3) the rate is per, from the run's size; NaN when unknown. */
function basisAmount(study: Study, basis: 'volume' | 'mass', run: StudyRun, size: number): number {
  const kind = study.reactor.kind;
  const rho = study.reactor.bulkDensity;
  if (kind === 'packed-bed') return basis === 'mass' ? size : rho !== undefined ? size / rho : NaN;
  if (basis === 'volume') return size;
  return kind === 'stirred-tank' ? (run.catalystMass ?? size) : rho !== undefined ? size * rho : NaN;
}
