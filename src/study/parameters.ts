/**
 * Study parameters -> core Parameter objects in SI. Units are converted with the compound-unit
 * parser (value and bounds alike); the transform defaults to 'log' for parameters used as rate,
 * equilibrium or adsorption constants and 'none' otherwise; a 'per-run-group' parameter becomes
 * one copy per group, named '<base>@<group>'. Every name a rate law references must be declared.
 */
import { RateloomError, closestName, type FieldPath } from '../core/errors.js';
import { makeParameter, type Parameter, type Transform } from '../core/parameter.js';
import type { RateLawSpec } from '../kinetics/spec.js';
import { compoundToSI } from '../units/index.js';
import type { ParameterScope } from './types.js';
import { checkRoleUnit } from './guards.js';

/** A parameter as written in the study file. */
export interface ParameterSpec {
  name: string;
  /**
   * Initial (or fixed) value in `unit`. Omitted or 'auto': rateloom picks the start (see
   * defaultStartValue here, and the differential method of src/workflow/start-values.ts).
   */
  value?: number | 'auto';
  /** Unit of value and bounds; default '1'. */
  unit?: string;
  lower?: number;
  upper?: number;
  fixed?: boolean;
  transform?: Transform;
  scope?: 'global' | 'per-run-group';
  description?: string;
}

/** Names a rate law references: constants (log by default) and the others. */
export function referencedNames(rate: RateLawSpec): { constants: string[]; others: string[] } {
  const constants: string[] = [];
  const others: string[] = [];
  if (rate.form === 'expression') return { constants, others };
  constants.push(rate.rateConstant.k);
  if (rate.rateConstant.activationEnergy) others.push(rate.rateConstant.activationEnergy);
  if ('equilibriumConstant' in rate && rate.equilibriumConstant) {
    constants.push(rate.equilibriumConstant.K);
    if (rate.equilibriumConstant.enthalpy) others.push(rate.equilibriumConstant.enthalpy);
  }
  if (rate.form === 'lhhw') {
    for (const a of Object.values(rate.adsorption)) {
      constants.push(a.K);
      if (a.enthalpy) others.push(a.enthalpy);
    }
  }
  for (const orders of [rate.orders, 'reverseOrders' in rate ? rate.reverseOrders : undefined]) {
    for (const o of Object.values(orders ?? {})) if (typeof o === 'string') others.push(o);
  }
  return { constants, others };
}

/** What a parameter is to the rate laws, which decides its default start. */
export type ParameterRole = 'constant' | 'energy' | 'order' | 'other';

/** True when the study file leaves the start of this parameter to rateloom. */
export function isAutoValue(s: Pick<ParameterSpec, 'value'>): boolean {
  return s.value === undefined || s.value === 'auto';
}

/**
 * The documented default start of a parameter without a value, in SI (bounds in SI):
 *   constant (rate, equilibrium, adsorption; log transform): the geometric middle sqrt(lo hi) of
 *     finite positive bounds; else 1 (SI), moved inside a one-sided bound (10 lo, or hi / 10);
 *   energy (activation energy, enthalpy): 0 J/mol when inside the bounds, else the middle of finite
 *     bounds (or the one finite bound);
 *   order: `order` (the species' stoichiometric coefficient in its term), put inside the bounds;
 *   other: the middle of finite bounds; else 1, put inside a one-sided bound (lo + 1, hi - 1).
 * Common practice, no source: these only seed the multistart that follows.
 */
export function defaultStartValue(role: ParameterRole, lower: number, upper: number, order = 1): number {
  const lo = Number.isFinite(lower) ? lower : -Infinity;
  const hi = Number.isFinite(upper) ? upper : Infinity;
  const inside = (v: number) => v >= lo && v <= hi;
  const mid = () => (Number.isFinite(lo) && Number.isFinite(hi) ? (lo + hi) / 2 : Number.isFinite(lo) ? lo : hi);
  switch (role) {
    case 'constant': {
      if (lo > 0 && Number.isFinite(hi)) return Math.sqrt(lo * hi);
      if (inside(1)) return 1;
      return hi < 1 ? hi / 10 : lo * 10;
    }
    case 'energy':
      return inside(0) ? 0 : mid();
    case 'order':
      return inside(order) ? order : Math.min(hi, Math.max(lo, order));
    default:
      if (Number.isFinite(lo) && Number.isFinite(hi)) return (lo + hi) / 2;
      if (inside(1)) return 1;
      return hi < 1 ? hi - 1 : lo + 1;
  }
}

/**
 * Role of every parameter a set of rate laws references, and for orders the default: the
 * stoichiometric coefficient of the species in its term (reactant for forward orders, product for
 * reverse orders). `coefficient(i, species, side)` gives |nu| of the species in reaction i.
 */
export function parameterRoles(
  rates: readonly RateLawSpec[],
  coefficient: (reaction: number, species: string, side: 'forward' | 'reverse') => number,
): Map<string, { role: ParameterRole; order?: number }> {
  const roles = new Map<string, { role: ParameterRole; order?: number }>();
  rates.forEach((rate, i) => {
    if (rate.form === 'expression') return;
    const { constants } = referencedNames(rate);
    for (const n of constants) roles.set(n, { role: 'constant' });
    if (rate.rateConstant.activationEnergy) roles.set(rate.rateConstant.activationEnergy, { role: 'energy' });
    if ('equilibriumConstant' in rate && rate.equilibriumConstant?.enthalpy) roles.set(rate.equilibriumConstant.enthalpy, { role: 'energy' });
    if (rate.form === 'lhhw') for (const a of Object.values(rate.adsorption)) if (a.enthalpy) roles.set(a.enthalpy, { role: 'energy' });
    const sides: ['forward' | 'reverse', Record<string, number | string> | undefined][] = [['forward', rate.orders], ['reverse', 'reverseOrders' in rate ? rate.reverseOrders : undefined]];
    for (const [side, orders] of sides) {
      for (const [sp, o] of Object.entries(orders ?? {})) if (typeof o === 'string' && !roles.has(o)) roles.set(o, { role: 'order', order: coefficient(i, sp, side) });
    }
  });
  return roles;
}

export function buildParameters(
  specs: readonly ParameterSpec[],
  rates: readonly RateLawSpec[],
  groups: readonly string[],
  hasGroupColumn: boolean,
  path: FieldPath,
  roles: ReadonlyMap<string, { role: ParameterRole; order?: number }> = parameterRoles(rates, () => 1),
): { parameters: Parameter[]; scopes: ParameterScope[]; autoStart: string[] } {
  const declared = specs.map((s) => s.name);
  const constants = new Set<string>();
  rates.forEach((r, i) => {
    const refs = referencedNames(r);
    for (const n of [...refs.constants, ...refs.others]) {
      if (!declared.includes(n)) {
        const near = closestName(n, declared);
        throw new RateloomError('E_UNKNOWN_PARAMETER', `rate law ${i + 1} uses parameter '${n}', which is not declared${near ? ` (did you mean '${near}'?)` : ''}`, {
          path: [...path.slice(0, -1), 'reactions', i, 'rate'],
          details: { parameter: n, ...(near ? { closest: near } : {}) },
        });
      }
    }
    refs.constants.forEach((n) => constants.add(n));
  });
  const parameters: Parameter[] = [];
  const scopes: ParameterScope[] = [];
  const autoStart: string[] = [];
  const seen = new Set<string>();
  specs.forEach((s, i) => {
    const p = [...path, i];
    if (seen.has(s.name)) throw new RateloomError('E_VALUE', `parameter '${s.name}' is declared twice`, { path: [...p, 'name'] });
    seen.add(s.name);
    const unit = s.unit ?? '1';
    const conv = compoundToSI(1, unit, { path: [...p, 'unit'] });
    if (s.unit !== undefined) checkRoleUnit(s.name, roles.get(s.name)?.role, unit, [...p, 'unit']);
    const auto = isAutoValue(s);
    if (auto && s.fixed) {
      throw new RateloomError('E_MISSING_FIELD', `parameter '${s.name}' is fixed but has no value`, {
        path: [...p, 'value'],
        fix: 'Give the value to hold it at, or remove "fixed": true to let rateloom estimate a start.',
      });
    }
    const transform: Transform = s.transform ?? (constants.has(s.name) && (auto || (s.value as number) > 0) ? 'log' : 'none');
    const lo = s.lower !== undefined ? s.lower * conv.value : transform === 'log' ? 0 : -Infinity;
    const hi = s.upper !== undefined ? s.upper * conv.value : Infinity;
    const role = roles.get(s.name);
    const value = auto ? defaultStartValue(transform === 'log' ? 'constant' : role?.role === 'constant' ? 'other' : (role?.role ?? 'other'), lo, hi, role?.order) : (s.value as number) * conv.value;
    const init = {
      value,
      unit: conv.unit,
      transform,
      fixed: s.fixed ?? false,
      ...(s.lower !== undefined ? { lower: s.lower * conv.value } : {}),
      ...(s.upper !== undefined ? { upper: s.upper * conv.value } : {}),
      ...(s.description !== undefined ? { description: s.description } : {}),
    };
    if ((s.scope ?? 'global') === 'global') {
      parameters.push(makeParameter({ name: s.name, ...init }, p));
      scopes.push({ base: s.name, scope: 'global' });
      if (auto) autoStart.push(s.name);
      return;
    }
    if (!hasGroupColumn) {
      throw new RateloomError('E_VALUE', `parameter '${s.name}' is per-run-group but no data source has a 'group' column`, {
        path: [...p, 'scope'],
        fix: "Add \"group\": \"<column>\" to the per-run columns, or use scope 'global'.",
      });
    }
    const members: Record<string, string> = {};
    for (const g of groups) {
      const name = `${s.name}@${g}`;
      members[g] = name;
      parameters.push(makeParameter({ name, ...init }, p));
      if (auto) autoStart.push(name);
    }
    scopes.push({ base: s.name, scope: 'per-run-group', members });
  });
  return { parameters, scopes, autoStart };
}

/**
 * The parameter names a run uses, in the order of `baseNames` (the kinetics' parameter names):
 * a per-run-group parameter maps to its copy for the run's group.
 */
export function runParameterNames(baseNames: readonly string[], scopes: readonly ParameterScope[], group: string | undefined): string[] {
  const byBase = new Map(scopes.map((s) => [s.base, s]));
  return baseNames.map((n) => {
    const s = byBase.get(n);
    if (!s || s.scope === 'global') return n;
    const m = group !== undefined ? s.members?.[group] : undefined;
    if (!m) throw new RateloomError('E_VALUE', `parameter '${n}' is per-run-group but the run has no group`, { path: ['parameters'] });
    return m;
  });
}
