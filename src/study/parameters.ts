/**
 * Study parameters -> core Parameter objects in SI. Units are converted with the compound-unit
 * parser (value and bounds alike); the transform defaults to 'log' for parameters used as rate,
 * equilibrium or adsorption constants and 'none' otherwise; a 'per-run-group' parameter becomes
 * one copy per group, named '<base>@<group>'. Every name a rate law references must be declared.
 */
import { RateloomError, closestName, type FieldPath } from '../core/errors';
import { makeParameter, type Parameter, type Transform } from '../core/parameter';
import type { RateLawSpec } from '../kinetics/spec';
import { compoundToSI } from '../units';
import type { ParameterScope } from './types';

/** A parameter as written in the study file. */
export interface ParameterSpec {
  name: string;
  /** Initial (or fixed) value in `unit`. */
  value: number;
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

export function buildParameters(
  specs: readonly ParameterSpec[],
  rates: readonly RateLawSpec[],
  groups: readonly string[],
  hasGroupColumn: boolean,
  path: FieldPath,
): { parameters: Parameter[]; scopes: ParameterScope[] } {
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
  const seen = new Set<string>();
  specs.forEach((s, i) => {
    const p = [...path, i];
    if (seen.has(s.name)) throw new RateloomError('E_VALUE', `parameter '${s.name}' is declared twice`, { path: [...p, 'name'] });
    seen.add(s.name);
    const unit = s.unit ?? '1';
    const conv = compoundToSI(1, unit, { path: [...p, 'unit'] });
    const transform: Transform = s.transform ?? (constants.has(s.name) && s.value > 0 ? 'log' : 'none');
    const init = {
      value: s.value * conv.value,
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
    }
    scopes.push({ base: s.name, scope: 'per-run-group', members });
  });
  return { parameters, scopes };
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
