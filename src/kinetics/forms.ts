/**
 * Rate-law forms -> expression trees. Each RateLawSpec (power-law, reversible-power-law, lhhw,
 * expression) becomes one tree in the kinetics' variable table, plus a readable text and
 * parameter-unit hints for reports.
 *
 *   power-law             r = k(T) prod_j X_j^a_j
 *   reversible-power-law  r = k(T) (prod_reactants X^a - prod_products X^b / K_eq(T))
 *   lhhw                  r = k(T) driving / (1 + sum_i K_i(T) X_i)^n
 *   expression            any expression of C_<species>, p_<species>, T, R, T_ref, parameters
 *
 * X_j is max(C_j, 0) (mol/m3), or the partial pressure p_j = max(C_j, 0) R T (Pa, ideal gas) when
 * pressureBasis is set. Powers of X are positive-part powers (ast.ts `ppow`): zero at zero
 * concentration for a positive order, with a derivative kept finite by evaluating the
 * fractional-power slope at max(C, 1e-30) (see diff.ts). A negative numeric order is refused for
 * any species that takes part in a reaction, since its concentration can reach zero.
 *
 * Orders: when `orders` (or `reverseOrders`) is given it lists every species of that term
 * (species not listed have order 0); when omitted, the stoichiometric coefficients of the reactants
 * (products) are used.
 */
import { RateloomError, closestName, type FieldPath } from '../core/errors.js';
import type { Chemistry } from '../chemistry/mechanism.js';
import type { ArrheniusRef, Order, RateBasis, RateLawSpec, VantHoffRef } from './spec.js';
import type { Node, NodeStore } from './expression/ast.js';
import { parseExpression } from './expression/parser.js';
import { temperatureFactorNode } from './temperature.js';
import { GAS_CONSTANT } from '../core/constants.js';

/** Variable layout shared by forms.ts and compile.ts: C_0..C_{nS-1}, T, theta_0..theta_{nP-1}. */
export interface VariableLayout {
  nS: number;
  nP: number;
  /** Variable index of C_j. */
  c(j: number): number;
  /** Variable index of T. */
  t(): number;
  /** Variable index of theta_k. */
  theta(k: number): number;
}

export function variableLayout(nS: number, nP: number): VariableLayout {
  return { nS, nP, c: (j) => j, t: () => nS, theta: (k) => nS + 1 + k };
}

export interface FormContext {
  store: NodeStore;
  chemistry: Chemistry;
  parameterNames: readonly string[];
  referenceTemperature: number;
  layout: VariableLayout;
}

/** One rate law turned into a tree. */
export interface BuiltRate {
  node: Node;
  basis: RateBasis;
  /** Readable formula, e.g. 'k1*exp(-E1/R*(1/T - 1/T_ref))*C_A*C_B^0.5'. */
  text: string;
  /** SI units of the parameters used, where they follow from the form (e.g. { k1: '1/s', E1: 'J/mol' }). */
  parameterUnits: Record<string, string>;
}

const FORMS = ['power-law', 'reversible-power-law', 'lhhw', 'expression'];

function fmt(x: number): string {
  return String(Number(x.toPrecision(12)));
}

/** Unit of X^n: concentrations (mol/m3) or pressures (Pa). */
function xUnitPow(pressure: boolean, n: number): string {
  if (n === 0) return '';
  const u = pressure ? 'Pa' : '(mol/m3)';
  if (n === 1) return pressure ? 'Pa' : 'mol/m3';
  return `${u}^${fmt(n)}`;
}

/** Unit of k in r = k X^n, r in mol/(m3 s) or mol/(kg s). */
export function rateConstantUnit(basis: RateBasis, pressure: boolean, n: number): string {
  const rate = basis === 'volume' ? 'mol/(m3 s)' : 'mol/(kg s)';
  if (n === 0) return rate;
  if (!pressure && basis === 'volume') {
    if (n === 1) return '1/s';
    if (n === 2) return 'm3/(mol s)';
    return `(m3/mol)^${fmt(n - 1)}/s`;
  }
  if (!pressure) {
    if (n === 1) return 'm3/(kg s)';
    return `m3^${fmt(n)} mol^${fmt(1 - n)}/(kg s)`;
  }
  return `${rate} / ${xUnitPow(true, n)}`;
}

class FormBuilder {
  private readonly s: NodeStore;
  private readonly nS: number;
  private readonly T: Node;
  private readonly units: Record<string, string> = {};

  constructor(
    private readonly ctx: FormContext,
    private readonly i: number,
  ) {
    this.s = ctx.store;
    this.nS = ctx.chemistry.speciesNames.length;
    this.T = this.s.variable(ctx.layout.t());
  }

  get parameterUnits(): Record<string, string> {
    return this.units;
  }

  param(name: unknown, path: FieldPath, unit?: string): Node {
    if (typeof name !== 'string' || name === '') {
      throw new RateloomError('E_TYPE', `expected a parameter name, got ${JSON.stringify(name) ?? String(name)}`, { path });
    }
    const k = this.ctx.parameterNames.indexOf(name);
    if (k < 0) {
      const near = closestName(name, this.ctx.parameterNames);
      throw new RateloomError('E_UNKNOWN_PARAMETER', `unknown parameter '${name}'${near ? ` (did you mean '${near}'?)` : ''}`, {
        path,
        fix: near ? `Write '${near}' or declare '${name}' in the parameters list.` : `Declare '${name}' in the parameters list.`,
        details: { parameter: name, ...(near ? { closest: near } : {}) },
      });
    }
    if (unit && this.units[name] === undefined) this.units[name] = unit;
    return this.s.variable(this.ctx.layout.theta(k));
  }

  species(name: string, path: FieldPath): number {
    const j = this.ctx.chemistry.speciesNames.indexOf(name);
    if (j < 0) {
      const near = closestName(name, this.ctx.chemistry.speciesNames);
      throw new RateloomError('E_UNKNOWN_SPECIES', `unknown species '${name}'${near ? ` (did you mean '${near}'?)` : ''}`, {
        path,
        fix: near ? `Write '${near}' or declare '${name}' in the species list.` : `Declare '${name}' in the species list.`,
        details: { species: name, ...(near ? { closest: near } : {}) },
      });
    }
    return j;
  }

  /** max(C_j, 0) or max(C_j, 0) R T. */
  x(j: number, pressure: boolean): Node {
    const c = this.s.ppow(this.s.variable(this.ctx.layout.c(j)), this.s.num(1));
    return pressure ? this.s.mul(c, this.s.mul(this.s.num(GAS_CONSTANT), this.T)) : c;
  }

  xName(j: number, pressure: boolean): string {
    return `${pressure ? 'p' : 'C'}_${this.ctx.chemistry.speciesNames[j]}`;
  }

  /** True when species j takes part in any reaction (its concentration can reach zero). */
  reacts(j: number): boolean {
    const chem = this.ctx.chemistry;
    const nR = chem.reactionIds.length;
    for (let r = 0; r < nR; r++) {
      if (chem.reactantCoefficients[r * this.nS + j] !== 0 || chem.productCoefficients[r * this.nS + j] !== 0) return true;
    }
    return false;
  }

  /** prod_j X_j^order_j over the given orders (or the default coefficients row). Returns node, text, numeric total order. */
  product(
    orders: Record<string, Order> | undefined,
    defaults: Float64Array,
    pressure: boolean,
    path: FieldPath,
  ): { node: Node; text: string; total: number | undefined } {
    const s = this.s;
    const terms: { j: number; order: Order; p: FieldPath }[] = [];
    if (orders !== undefined) {
      if (orders === null || typeof orders !== 'object' || Array.isArray(orders)) {
        throw new RateloomError('E_TYPE', 'orders must be an object mapping species names to orders', { path });
      }
      for (const name of Object.keys(orders)) {
        const p = [...path, name];
        terms.push({ j: this.species(name, p), order: orders[name], p });
      }
    } else {
      for (let j = 0; j < this.nS; j++) {
        const a = defaults[this.i * this.nS + j];
        if (a !== 0) terms.push({ j, order: a, p: path });
      }
    }
    let node = s.num(1);
    const texts: string[] = [];
    let total: number | undefined = 0;
    for (const { j, order, p } of terms) {
      let a: Node;
      let aText: string;
      if (typeof order === 'number') {
        if (!Number.isFinite(order)) throw new RateloomError('E_VALUE', `order ${order} of '${this.ctx.chemistry.speciesNames[j]}' is not finite`, { path: p });
        if (order < 0 && this.reacts(j)) {
          throw new RateloomError(
            'E_ORDER',
            `order ${order} of '${this.ctx.chemistry.speciesNames[j]}' is negative, but '${this.ctx.chemistry.speciesNames[j]}' takes part in a reaction and its concentration can reach zero`,
            { path: p, fix: 'Use a non-negative order and describe the inhibition with an LHHW adsorption term instead (form "lhhw").' },
          );
        }
        if (order === 0) continue;
        a = s.num(order);
        aText = fmt(order);
        if (total !== undefined) total += order;
      } else if (typeof order === 'string') {
        a = this.param(order, p, '1');
        aText = order;
        total = undefined;
      } else {
        throw new RateloomError('E_TYPE', `an order must be a number or a parameter name, got ${JSON.stringify(order) ?? String(order)}`, { path: p });
      }
      node = s.mul(node, s.ppow(this.x(j, pressure), a));
      const nm = this.xName(j, pressure);
      texts.push(aText === '1' ? nm : /^[0-9.]+$/.test(aText) ? `${nm}^${aText}` : `${nm}^(${aText})`);
    }
    return { node, text: texts.length ? texts.join('*') : '1', total };
  }

  arrhenius(ref: ArrheniusRef, path: FieldPath, kUnit: string | undefined): { node: Node; text: string } {
    if (!ref || typeof ref !== 'object') throw new RateloomError('E_MISSING_FIELD', 'the rate constant is missing', { path });
    const k = this.param(ref.k, [...path, 'k'], kUnit);
    const E = ref.activationEnergy !== undefined ? this.param(ref.activationEnergy, [...path, 'activationEnergy'], 'J/mol') : undefined;
    return {
      node: temperatureFactorNode(this.s, k, E, this.T, this.ctx.referenceTemperature),
      text: E ? `${ref.k}*exp(-${ref.activationEnergy}/R*(1/T - 1/T_ref))` : ref.k,
    };
  }

  vantHoff(ref: VantHoffRef, path: FieldPath, KUnit: string | undefined): { node: Node; text: string } {
    if (!ref || typeof ref !== 'object') throw new RateloomError('E_MISSING_FIELD', 'the equilibrium or adsorption constant is missing', { path });
    const K = this.param(ref.K, [...path, 'K'], KUnit);
    const dH = ref.enthalpy !== undefined ? this.param(ref.enthalpy, [...path, 'enthalpy'], 'J/mol') : undefined;
    return {
      node: temperatureFactorNode(this.s, K, dH, this.T, this.ctx.referenceTemperature),
      text: dH ? `${ref.K}*exp(-${ref.enthalpy}/R*(1/T - 1/T_ref))` : ref.K,
    };
  }

  requireReversible(path: FieldPath): void {
    if (!this.ctx.chemistry.reversible[this.i]) {
      const id = this.ctx.chemistry.reactionIds[this.i];
      throw new RateloomError('E_VALUE', `reaction ${id} is written irreversible ('->') but its rate law has an equilibrium constant`, {
        path,
        fix: `Write the equation of ${id} with '<=>' or remove the equilibrium constant.`,
      });
    }
  }
}

/** Parenthesise anything but a bare name, so it can follow '/' or '*' safely. */
function wrap(t: string): string {
  return /^[A-Za-z_][A-Za-z0-9_]*$/.test(t) ? t : `(${t})`;
}

/**
 * Build the tree of reaction i's rate law.
 * @param path path of the rate law object (e.g. ['reactions', 0, 'rate']).
 */
export function buildRate(ctx: FormContext, spec: RateLawSpec, i: number, path: FieldPath): BuiltRate {
  if (!spec || typeof spec !== 'object') throw new RateloomError('E_MISSING_FIELD', 'the rate law is missing', { path });
  if (!FORMS.includes((spec as { form: string }).form)) {
    const near = closestName(String((spec as { form: unknown }).form), FORMS);
    throw new RateloomError('E_VALUE', `unknown rate-law form '${String((spec as { form: unknown }).form)}'${near ? ` (did you mean '${near}'?)` : ''}`, {
      path: [...path, 'form'],
      fix: `Use one of ${FORMS.join(', ')}.`,
    });
  }
  const basis: RateBasis = spec.basis ?? 'volume';
  if (basis !== 'volume' && basis !== 'mass') {
    throw new RateloomError('E_VALUE', `unknown rate basis '${String(basis)}'`, { path: [...path, 'basis'], fix: "Use 'volume' (per m3) or 'mass' (per kg catalyst)." });
  }
  const b = new FormBuilder(ctx, i);
  const s = ctx.store;
  const chem = ctx.chemistry;

  if (spec.form === 'expression') {
    return { ...buildExpressionRate(ctx, spec.expression, path), basis };
  }

  const pressure = spec.pressureBasis === true;
  const fwd = b.product(spec.orders, chem.reactantCoefficients, pressure, [...path, 'orders']);
  const kUnit = fwd.total !== undefined && spec.form !== 'lhhw' ? rateConstantUnit(basis, pressure, fwd.total) : undefined;
  const k = b.arrhenius(spec.rateConstant, [...path, 'rateConstant'], kUnit);

  let driving = fwd.node;
  let drivingText = fwd.text;
  const eqRef = spec.form === 'reversible-power-law' ? spec.equilibriumConstant : spec.form === 'lhhw' ? spec.equilibriumConstant : undefined;
  if (spec.form === 'reversible-power-law' && !eqRef) {
    throw new RateloomError('E_MISSING_FIELD', 'a reversible power law needs an equilibriumConstant', { path: [...path, 'equilibriumConstant'] });
  }
  if (eqRef) {
    b.requireReversible([...path, 'equilibriumConstant']);
    const rev = b.product(spec.form === 'power-law' ? undefined : spec.reverseOrders, chem.productCoefficients, pressure, [...path, 'reverseOrders']);
    const KUnit =
      fwd.total !== undefined && rev.total !== undefined
        ? rev.total - fwd.total === 0
          ? '1'
          : xUnitPow(pressure, rev.total - fwd.total)
        : undefined;
    const K = b.vantHoff(eqRef, [...path, 'equilibriumConstant'], KUnit);
    driving = s.sub(fwd.node, s.div(rev.node, K.node));
    drivingText = `${fwd.text} - ${rev.text}/${wrap(K.text)}`;
  }

  if (spec.form !== 'lhhw') {
    const node = s.mul(k.node, driving);
    const text = eqRef ? `${k.text}*(${drivingText})` : `${k.text}*${drivingText}`;
    return { node, basis, text, parameterUnits: b.parameterUnits };
  }

  // LHHW denominator
  const ads = spec.adsorption;
  if (!ads || typeof ads !== 'object' || Array.isArray(ads)) {
    throw new RateloomError('E_MISSING_FIELD', 'an LHHW rate law needs an adsorption object mapping species to constants', { path: [...path, 'adsorption'] });
  }
  const n = spec.exponent ?? 1;
  if (typeof n !== 'number' || !Number.isFinite(n) || n < 0) {
    throw new RateloomError('E_VALUE', `the LHHW exponent ${String(n)} must be a non-negative number`, { path: [...path, 'exponent'] });
  }
  let den = s.num(1);
  const denTexts = ['1'];
  for (const name of Object.keys(ads)) {
    const p = [...path, 'adsorption', name];
    const j = b.species(name, p);
    const K = b.vantHoff(ads[name], p, pressure ? '1/Pa' : 'm3/mol');
    den = s.add(den, s.mul(K.node, b.x(j, pressure)));
    denTexts.push(`${wrap(K.text)}*${b.xName(j, pressure)}`);
  }
  const node = s.div(s.mul(k.node, driving), s.pow(den, s.num(n)));
  const denText = `(${denTexts.join(' + ')})${n === 1 ? '' : `^${fmt(n)}`}`;
  const text = `${k.text}*${eqRef ? `(${drivingText})` : drivingText}/${denText}`;
  return { node, basis, text, parameterUnits: b.parameterUnits };
}

/** Tree of a custom rate expression, with C_<species>, p_<species>, T, R, T_ref and parameters as symbols. */
export function buildExpressionRate(ctx: FormContext, expression: string, path: FieldPath): Omit<BuiltRate, 'basis'> {
  const s = ctx.store;
  const chem = ctx.chemistry;
  const T = s.variable(ctx.layout.t());
  const symbols = new Map<string, Node>();
  const RT = s.mul(s.num(GAS_CONSTANT), T);
  chem.speciesNames.forEach((name, j) => {
    const c = s.ppow(s.variable(ctx.layout.c(j)), s.num(1));
    symbols.set(`C_${name}`, c);
    symbols.set(`p_${name}`, s.mul(c, RT));
  });
  symbols.set('T', T);
  symbols.set('R', s.num(GAS_CONSTANT));
  symbols.set('T_ref', s.num(ctx.referenceTemperature));
  const builtins = new Set(symbols.keys());
  const paramNames = ctx.parameterNames;
  paramNames.forEach((name, k) => {
    if (builtins.has(name)) {
      throw new RateloomError('E_VALUE', `parameter name '${name}' clashes with a built-in symbol of rate expressions`, {
        path: [...path, 'expression'],
        fix: `Rename the parameter '${name}'; C_<species>, p_<species>, T, R and T_ref are reserved in expressions.`,
      });
    }
    symbols.set(name, s.variable(ctx.layout.theta(k)));
  });
  if (typeof expression !== 'string') {
    throw new RateloomError('E_TYPE', 'the rate expression must be a string', { path: [...path, 'expression'] });
  }
  const epath = [...path, 'expression'];
  const onUnknown = (name: string, column: number): never => {
    const shown = expression.length > 60 ? `${expression.slice(0, 57)}...` : expression;
    if (/^[Cp]_/.test(name)) {
      const prefix = name.slice(0, 2);
      const near = closestName(name.slice(2), chem.speciesNames);
      throw new RateloomError(
        'E_UNKNOWN_SPECIES',
        `expression '${shown}': unknown species in '${name}' at column ${column}${near ? ` (did you mean '${prefix}${near}'?)` : ''}`,
        {
          path: epath,
          location: { column },
          fix: near ? `Write '${prefix}${near}' or declare the species.` : 'Declare the species in the species list.',
          details: { name, ...(near ? { closest: `${prefix}${near}` } : {}) },
        },
      );
    }
    const near = closestName(name, [...paramNames, 'T', 'R', 'T_ref']);
    throw new RateloomError(
      'E_UNKNOWN_PARAMETER',
      `expression '${shown}': unknown name '${name}' at column ${column}${near ? ` (did you mean '${near}'?)` : ''}`,
      {
        path: epath,
        location: { column },
        fix: near ? `Write '${near}' or declare '${name}' in the parameters list.` : `Declare '${name}' in the parameters list, or use C_<species>, p_<species>, T, R, T_ref.`,
        details: { name, ...(near ? { closest: near } : {}) },
      },
    );
  };
  const node = parseExpression(expression, s, { symbols, onUnknown, path: epath });
  return { node, text: expression.trim().replace(/\s+/g, ' '), parameterUnits: {} };
}
