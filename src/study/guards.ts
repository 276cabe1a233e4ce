/**
 * Input guards of the study file that the schema cannot express: names that would shadow the
 * built-in properties of JavaScript objects, reaction orders on species outside their reaction,
 * and parameter units whose dimension does not match what the rate law needs. Each refuses with a
 * RateloomError naming the field (the loader adds the file, line and column).
 */
import { RateloomError, type FieldPath } from '../core/errors.js';
import type { Chemistry as ChemistryModel } from '../chemistry/mechanism.js';
import type { RateLawSpec } from '../kinetics/spec.js';
import type { PressureDropSpec } from '../reactors/types.js';
import { unitFor } from '../units/index.js';
import type { ParameterRole } from './parameters.js';

/**
 * True for a name that is a property of every plain object ('constructor', '__proto__',
 * 'toString', 'hasOwnProperty', ...): used as a key it could shadow a built-in.
 */
export function isHostileName(name: string): boolean {
  return Object.prototype.hasOwnProperty.call(Object.prototype, name) || name === 'prototype';
}

function hostile(name: string, path: FieldPath, what: string): RateloomError {
  return new RateloomError('E_VALUE', `${what} '${name}' is the name of a built-in property of JavaScript objects and is not allowed`, {
    path,
    fix: `Rename '${name}' (for example '${name.replace(/_/g, '')}X'); names such as constructor, __proto__, toString and prototype are reserved.`,
  });
}

/**
 * Refuse object keys and name fields that shadow object built-ins anywhere in a parsed JSON
 * document. The walk uses an explicit stack (no recursion); the JSON depth limit bounds it.
 */
export function checkHostileNames(doc: unknown): void {
  const stack: { v: unknown; path: FieldPath }[] = [{ v: doc, path: [] }];
  while (stack.length) {
    const { v, path } = stack.pop() as { v: unknown; path: FieldPath };
    if (v === null || typeof v !== 'object') continue;
    if (Array.isArray(v)) {
      v.forEach((x, i) => stack.push({ v: x, path: [...path, i] }));
      continue;
    }
    for (const key of Object.keys(v)) {
      if (isHostileName(key)) throw hostile(key, [...path, key], 'key');
      const x = (v as Record<string, unknown>)[key];
      if ((key === 'name' || key === 'id') && typeof x === 'string' && isHostileName(x)) throw hostile(x, [...path, key], key);
      stack.push({ v: x, path: [...path, key] });
    }
  }
}

/** Species of reaction i (non-zero coefficient on either side). */
function reactionSpecies(chem: ChemistryModel, i: number): Set<string> {
  const nS = chem.speciesNames.length;
  const out = new Set<string>();
  for (let j = 0; j < nS; j++) if (chem.stoich[i * nS + j] !== 0 || chem.reactantCoefficients[i * nS + j] !== 0 || chem.productCoefficients[i * nS + j] !== 0) out.add(chem.speciesNames[j]);
  return out;
}

/**
 * Orders (forward and reverse) may name only species of their own reaction's equation; adsorption
 * terms may name any declared species. `at(i)` is the path of reaction i's rate law.
 */
export function checkOrderSpecies(rates: readonly RateLawSpec[], chem: ChemistryModel, at: (i: number) => FieldPath): void {
  rates.forEach((rate, i) => {
    if (rate.form === 'expression') return;
    const inReaction = reactionSpecies(chem, i);
    const sides: [string, Record<string, unknown> | undefined][] = [['orders', rate.orders], ['reverseOrders', 'reverseOrders' in rate ? rate.reverseOrders : undefined]];
    for (const [key, orders] of sides) {
      for (const sp of Object.keys(orders ?? {})) {
        if (inReaction.has(sp)) continue;
        const declared = chem.speciesNames.includes(sp);
        throw new RateloomError('E_UNKNOWN_SPECIES', `the ${key} of reaction '${chem.reactionIds[i]}' name '${sp}', which ${declared ? 'is not in that reaction\'s equation' : 'is not a declared species'}`, {
          path: [...at(i), key, sp],
          fix: `Give orders only for species of the equation (${[...inReaction].join(', ')}); for a dependence on another species use an LHHW adsorption term or an expression rate law.`,
        });
      }
    }
    if (rate.form === 'lhhw') {
      for (const sp of Object.keys(rate.adsorption)) {
        if (!chem.speciesNames.includes(sp)) throw new RateloomError('E_UNKNOWN_SPECIES', `adsorption term names '${sp}', which is not a declared species`, { path: [...at(i), 'adsorption', sp] });
      }
    }
  });
}

/**
 * A parameter's unit must have the dimension its role needs: an activation energy or enthalpy a
 * molar energy (J/mol), a fitted order a pure number. Constants are checked when the rate law is
 * compiled (their dimension depends on the orders).
 */
export function checkRoleUnit(name: string, role: ParameterRole | undefined, unit: string, path: FieldPath): void {
  if (role !== 'energy' && role !== 'order') return;
  const quantity = role === 'energy' ? 'molar-energy' : 'dimensionless';
  try {
    unitFor(quantity, unit, { path });
  } catch (e) {
    throw new RateloomError('E_UNIT', `parameter '${name}' is ${role === 'energy' ? 'an activation energy or enthalpy' : 'a reaction order'}, but its unit '${unit}' is not ${role === 'energy' ? 'a molar energy' : 'dimensionless'}`, {
      path,
      fix: role === 'energy' ? "Give the unit as a molar energy: 'J/mol', 'kJ/mol' or 'kcal/mol'." : "Give an order without a unit (or '1').",
      ...(e instanceof RateloomError && e.details ? { details: e.details } : {}),
    });
  }
}

/**
 * Pressure-drop inputs must be physical: alpha not negative (zero means no drop), every Ergun
 * quantity above zero and the void fraction strictly between 0 and 1.
 */
export function checkPressureDrop(pd: PressureDropSpec | undefined, path: FieldPath): void {
  if (!pd) return;
  if (pd.alpha !== undefined && !(pd.alpha >= 0 && Number.isFinite(pd.alpha))) {
    throw new RateloomError('E_VALUE', `pressure-drop parameter alpha is ${pd.alpha}; it must be zero or above`, { path: [...path, 'alpha', 'value'], fix: 'Give alpha >= 0 (a pressure drop lowers the pressure along the bed; zero means none).' });
  }
  const e = pd.ergun;
  if (!e) return;
  for (const [k, v] of Object.entries(e)) {
    const ok = k === 'voidFraction' ? v > 0 && v < 1 : v > 0 && Number.isFinite(v);
    if (!ok) {
      throw new RateloomError('E_VALUE', `Ergun input ${k} is ${v}; it must be ${k === 'voidFraction' ? 'between 0 and 1' : 'above zero'}`, { path: [...path, 'ergun', k, ...(k === 'voidFraction' ? [] : ['value'])] });
    }
  }
}
