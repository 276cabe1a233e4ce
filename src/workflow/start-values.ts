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
import type { Study, StudyRun } from '../study/types.js';
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
  const maxX = options.maxConversion ?? 0.15;
  const fallbackX = options.fallbackConversion ?? 0.4;
  const rates = variant.reactions.map((r) => r.rate as RateLawSpec);
  const chem = study.chemistry;
  const nS = chem.speciesNames.length;
  const nR = chem.reactionIds.length;
  const openSet = new Set(open);
  const values = new Map(variant.parameters.map((p) => [p.name, p.value]));
  const method = new Map<string, string>();
  const notes: string[] = [];

  // SI units the rate-law forms fix (used when the study gave no unit).
  const kinNames = [...new Set(variant.parameters.map((p) => baseOf(p.name)))];
  const units: Record<string, string> = {};
  try {
    const kin = compileKinetics({ chemistry: chem, rates, parameterNames: kinNames, referenceTemperature: study.referenceTemperature });
    for (const d of kin.describe()) Object.assign(units, d.parameterUnits);
  } catch {
    // The fit itself reports a kinetics problem; units then stay as declared.
  }

  let points = 0;
  const key = study.keyReactantIndex;
  const consuming = [...Array(nR).keys()].filter((i) => chem.stoich[i * nS + key] < 0);
  const target = consuming.length === 1 ? consuming[0] : -1;
  const rate = target >= 0 ? rates[target] : undefined;
  if (target < 0) {
    notes.push(`differential method skipped: ${consuming.length ? `${consuming.length} reactions consume` : 'no reaction consumes'} the key reactant ${study.keyReactant}`);
  } else if (!rate || (rate.form !== 'power-law' && rate.form !== 'reversible-power-law')) {
    notes.push(`differential method skipped: reaction ${chem.reactionIds[target]} has a ${rate?.form} rate law (power laws only)`);
  } else {
    const result = differential(study, variant, rate, target, openSet, values, maxX, fallbackX, notes);
    points = result.points;
    for (const [n, how] of result.method) method.set(n, how);
  }

  // Adsorption constants without finite bounds: K = 1 / (mean inlet X of the species), so K X ~ 1.
  const defaultHow = new Map<string, string>();
  const C = new Float64Array(nS);
  rates.forEach((r) => {
    if (r.form !== 'lhhw') return;
    for (const [sp, ref] of Object.entries(r.adsorption)) {
      const j = chem.speciesNames.indexOf(sp);
      let sum = 0;
      for (const run of study.runs) sum += inletConcentrations(run, study, C)[j] * (r.pressureBasis ? GAS_CONSTANT * run.temperature : 1);
      const mean = study.runs.length && j >= 0 ? sum / study.runs.length : 0;
      for (const p of variant.parameters) {
        if (baseOf(p.name) !== ref.K || !openSet.has(p.name) || (p.lower > 0 && Number.isFinite(p.upper)) || !(mean > 0)) continue;
        values.set(p.name, Math.min(p.upper, Math.max(1 / mean, p.lower)));
        defaultHow.set(p.name, `default: 1 / mean inlet ${r.pressureBasis ? 'partial pressure' : 'concentration'} of ${sp} (${fmt(mean)} ${r.pressureBasis ? 'Pa' : 'mol/m3'}), so that K X is about 1`);
      }
    }
  });

  // Report, with values put inside the bounds.
  const coefficient = (i: number, sp: string, side: 'forward' | 'reverse'): number => {
    const j = chem.speciesNames.indexOf(sp);
    const nu = j < 0 ? 0 : chem.stoich[i * nS + j];
    return side === 'forward' ? Math.max(0, -nu) : Math.max(0, nu);
  };
  const roles = parameterRoles(rates, coefficient);
  const estimated: EstimatedStart[] = [];
  const parameters = variant.parameters.map((p) => {
    if (!openSet.has(p.name)) return p;
    const unit = p.unit === '1' && units[baseOf(p.name)] ? units[baseOf(p.name)] : p.unit;
    let value = values.get(p.name) as number;
    let detail = method.get(p.name);
    if (detail !== undefined) {
      const lo = p.transform === 'log' ? Math.max(p.lower, 0) : p.lower;
      if (value < lo || (p.transform === 'log' && !(value > 0))) {
        value = p.transform === 'log' && !(p.lower > 0) ? p.value : p.lower;
        detail += `; the estimate lay below the lower bound, start put at ${fmt(value)}`;
      } else if (value > p.upper) {
        value = p.upper;
        detail += '; the estimate lay above the upper bound, start put at the bound';
      }
    } else detail = defaultHow.get(p.name) ?? defaultDetail(p, roles.get(baseOf(p.name))?.role);
    estimated.push({ name: p.name, value, unit, method: method.has(p.name) ? 'differential' : 'default', detail });
    return { ...p, value, unit };
  });
  return { parameters, estimated, points, notes };
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

function differential(
  study: Study,
  variant: ModelVariant,
  rate: Extract<RateLawSpec, { form: 'power-law' | 'reversible-power-law' }>,
  target: number,
  open: ReadonlySet<string>,
  values: Map<string, number>,
  maxX: number,
  fallbackX: number,
  notes: string[],
): { points: number; method: Map<string, string> } {
  const method = new Map<string, string>();
  const chem = study.chemistry;
  const nS = chem.speciesNames.length;
  const names = new Set(variant.parameters.map((p) => p.name));
  const kName = rate.rateConstant.k;
  const eName = rate.rateConstant.activationEnergy;
  // Orders of the forward term: listed ones (unlisted = 0), or the reactant coefficients.
  const orders: { j: number; order: number | string }[] = [];
  for (let j = 0; j < nS; j++) {
    const sp = chem.speciesNames[j];
    const o = rate.orders ? rate.orders[sp] : Math.max(0, -chem.stoich[target * nS + j]);
    if (o !== undefined && o !== 0) orders.push({ j, order: o });
  }
  const isOpen = (base: string, run: StudyRun) => open.has(runName(base, run, names));
  const openBases = [kName, ...(eName ? [eName] : []), ...orders.filter((o) => typeof o.order === 'string').map((o) => o.order as string)];
  if (!study.runs.some((r) => openBases.some((b) => isOpen(b, r)))) return { points: 0, method };

  const all = ratePoints(study, target, rate.basis ?? 'volume', notes);
  const usable = all.filter((p) => orders.every((o) => p.C[o.j] > 0));
  let pts = usable.filter((p) => p.conversion < maxX);
  let rule = `conversion of ${study.keyReactant} below ${pct(maxX)}`;
  const nOpen = new Set(study.runs.flatMap((r) => openBases.filter((b) => isOpen(b, r)).map((b) => runName(b, r, names)))).size;
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
    return { points: 0, method };
  }
  if (chem.reversible[target]) notes.push(`reaction ${chem.reactionIds[target]} is reversible: only its forward term was regressed, on low-conversion points far from equilibrium`);

  const Tref = study.referenceTemperature;
  // Columns: open concrete names; drop orders, then E, while the design cannot separate them.
  const columnsOf = (allowed: (base: string) => boolean): string[] => {
    const cols: string[] = [];
    for (const p of pts) for (const b of openBases) if (allowed(b) && isOpen(b, p.run)) {
      const n = runName(b, p.run, names);
      if (!cols.includes(n)) cols.push(n);
    }
    return cols;
  };
  const orderBases = new Set(orders.filter((o) => typeof o.order === 'string').map((o) => o.order as string));
  const attempts: ((b: string) => boolean)[] = [() => true, (b) => !orderBases.has(b), (b) => b === kName];
  for (const allowed of attempts) {
    const cols = columnsOf(allowed);
    if (!cols.length) break;
    const m = pts.length;
    const p = cols.length;
    if (m < p + 1) continue;
    const X = new Float64Array(m * p);
    const y = new Float64Array(m);
    pts.forEach((pt, i) => {
      const T = pt.run.temperature;
      const X_ = (j: number) => (rate.pressureBasis ? pt.C[j] * GAS_CONSTANT * T : pt.C[j]);
      const arr = -(1 / T - 1 / Tref) / GAS_CONSTANT;
      let off = 0;
      const term = (base: string, coef: number) => {
        const n = runName(base, pt.run, names);
        const c = cols.indexOf(n);
        if (c >= 0) X[i * p + c] += coef;
        else off += coef * (values.get(n) as number);
      };
      const kn = runName(kName, pt.run, names);
      if (cols.includes(kn)) X[i * p + cols.indexOf(kn)] = 1;
      else off += Math.log(values.get(kn) as number);
      if (eName) term(eName, arr);
      for (const o of orders) {
        if (typeof o.order === 'number') off += o.order * Math.log(X_(o.j));
        else term(o.order, Math.log(X_(o.j)));
      }
      y[i] = Math.log(pt.rate) - off;
    });
    const fit = weightedLinearLeastSquares(X, m, p, y);
    if (!(fit.conditionNumber < 1e6) || fit.coefficients.some((c) => !Number.isFinite(c))) continue;
    const runsUsed = [...new Set(pts.map((q) => q.run.id))];
    const how = `differential method: ln r regression on ${m} point(s) (${rule}; runs ${runsUsed.slice(0, 6).join(', ')}${runsUsed.length > 6 ? ', ...' : ''})`;
    cols.forEach((n, c) => {
      const v = baseOf(n) === kName ? Math.exp(fit.coefficients[c]) : fit.coefficients[c];
      values.set(n, v);
      method.set(n, how);
    });
    // Per-group rate constants of groups without points: the geometric mean of the estimated ones.
    const kCols = cols.filter((n) => baseOf(n) === kName);
    for (const n of names) {
      if (baseOf(n) !== kName || !open.has(n) || method.has(n) || !kCols.length) continue;
      values.set(n, Math.exp(kCols.reduce((s, c) => s + Math.log(values.get(c) as number), 0) / kCols.length));
      method.set(n, `${how}; no points of its group: geometric mean of the other groups`);
    }
    const dropped = openBases.filter((b) => !allowed(b));
    if (dropped.length) notes.push(`the low-conversion points cannot separate ${[...new Set(dropped)].join(', ')} (too little spread in temperature or concentration): default start kept`);
    return { points: m, method };
  }
  notes.push(`differential method skipped: the ${pts.length} low-conversion point(s) cannot determine ${kName}`);
  return { points: 0, method };
}

/** Rate points from the observations of the key reactant (and measured rates). */
function ratePoints(study: Study, target: number, basis: 'volume' | 'mass', notes: string[]): RatePoint[] {
  const chem = study.chemistry;
  const nS = chem.speciesNames.length;
  const nR = chem.reactionIds.length;
  const key = study.keyReactantIndex;
  const nuA = -chem.stoich[target * nS + key];
  const kind = study.reactor.kind;
  const rb = study.reactor.bulkDensity;
  const gas = study.reactor.phase === 'gas';
  let delta = 0;
  for (let j = 0; j < nS; j++) delta += chem.stoich[target * nS + j];
  const out: RatePoint[] = [];
  const C0 = new Float64Array(nS);
  let skippedKind = false;
  for (const o of study.observations) {
    const run = study.runs[o.runIndex];
    if (o.response === 'rate') {
      const j = o.speciesIndex ?? key;
      const nu = chem.stoich[target * nS + j];
      let other = false;
      for (let i = 0; i < nR; i++) if (i !== target && chem.stoich[i * nS + j] !== 0) other = true;
      const r = nu !== 0 && !other ? o.value / -nu : NaN;
      if (r > 0 && Number.isFinite(r)) out.push({ run, rate: r, C: rateConcentrations(run, study, new Float64Array(nS)), conversion: 0 });
      continue;
    }
    if (o.speciesIndex !== key || (o.response !== 'outlet-flow' && o.response !== 'conversion' && o.response !== 'outlet-concentration')) continue;
    const size = o.position ?? run.size;
    if (!(size > 0)) continue;
    if (kind === 'batch') {
      const Cin = run.initialConcentrations;
      if (!Cin) continue;
      const V = run.initialVolume ?? 1;
      const CA = o.response === 'outlet-concentration' ? o.value : o.response === 'conversion' ? Cin[key] * (1 - o.value) : o.value / V;
      const xi = (Cin[key] - CA) / nuA;
      const conversion = (Cin[key] - CA) / Cin[key];
      const per = basis === 'volume' ? 1 : run.catalystMass !== undefined ? V / run.catalystMass : NaN;
      const C = new Float64Array(nS);
      for (let j = 0; j < nS; j++) C[j] = Cin[j] + (chem.stoich[target * nS + j] * xi) / 2;
      out.push({ run, rate: (xi / size) * per, C, conversion });
      continue;
    }
    if (kind !== 'packed-bed' && kind !== 'plug-flow' && kind !== 'stirred-tank') {
      skippedKind = true;
      continue;
    }
    const F0 = run.feed;
    if (!F0 || !(F0[key] > 0)) continue;
    inletConcentrations(run, study, C0);
    let FA: number;
    if (o.response === 'outlet-flow') FA = o.value;
    else if (o.response === 'conversion') FA = F0[key] * (1 - o.value);
    else if (!gas) FA = o.value * (run.volumetricFlow ?? NaN);
    else {
      // C_A = C_T0 F_A / F_T, F_T = F_T0 + delta xi, pressure ratio taken as 1 (differential bed).
      let FT0 = 0;
      for (let j = 0; j < nS; j++) FT0 += F0[j];
      const yA = o.value / ((run.pressure ?? NaN) / (GAS_CONSTANT * run.temperature));
      FA = (yA * (FT0 + (delta * F0[key]) / nuA)) / (1 + (yA * delta) / nuA);
    }
    if (!Number.isFinite(FA)) continue;
    const xi = (F0[key] - FA) / nuA;
    const conversion = (F0[key] - FA) / F0[key];
    // Rate per unit of the reaction's basis.
    let amount: number;
    if (kind === 'packed-bed') amount = basis === 'mass' ? size : rb !== undefined ? size / rb : NaN;
    else if (basis === 'volume') amount = size;
    else amount = kind === 'stirred-tank' ? (run.catalystMass ?? size) : rb !== undefined ? size * rb : NaN;
    if (!Number.isFinite(amount)) continue;
    // Composition where the rate applies: the outlet for a stirred tank, else the inlet-outlet mean.
    const f = kind === 'stirred-tank' ? 1 : 0.5;
    const F = new Float64Array(nS);
    let FT = 0;
    for (let j = 0; j < nS; j++) {
      F[j] = F0[j] + chem.stoich[target * nS + j] * xi * f;
      FT += F[j];
    }
    const C = new Float64Array(nS);
    if (gas) {
      const CT = (run.pressure ?? NaN) / (GAS_CONSTANT * run.temperature);
      for (let j = 0; j < nS; j++) C[j] = (CT * F[j]) / FT;
    } else for (let j = 0; j < nS; j++) C[j] = F[j] / (run.volumetricFlow ?? NaN);
    out.push({ run, rate: xi / amount, C, conversion });
  }
  if (skippedKind) notes.push(`${study.reactor.kind} outlet data are not used by the differential method (only packed-bed, plug-flow, stirred-tank, batch and measured rates)`);
  return out.filter((p) => p.rate > 0 && Number.isFinite(p.rate) && p.conversion < 1 && p.C.every((c) => Number.isFinite(c)));
}
