/**
 * Kinetics compiler: chemistry + one rate law per reaction -> CompiledKinetics (see compiled.ts).
 *
 * Method: each rate law becomes an expression tree (forms.ts) in one hash-consed store; exact
 * derivatives d r_i/d C_j and d r_i/d theta_k are built symbolically (expression/diff.ts); the
 * three sets of trees are turned into three straight-line, allocation-free JavaScript functions
 * with common subexpressions hoisted into local constants (expression/codegen.ts, whose header
 * explains why compiling generated source is safe: no user text reaches it).
 */
import { RateloomError, type FieldPath } from '../core/errors.js';
import type { Chemistry } from '../chemistry/mechanism.js';
import type { CompiledKinetics } from './compiled.js';
import type { RateBasis, RateLawSpec } from './spec.js';
import { NodeStore, type Node } from './expression/ast.js';
import { differentiate } from './expression/diff.js';
import { compileBody, emitBody, type Assignment, type EmittedBody } from './expression/codegen.js';
import { printExpression } from './expression/print.js';
import { buildRate, variableLayout, type BuiltRate } from './forms.js';

export interface KineticsInput {
  chemistry: Chemistry;
  /** One rate law per reaction, in the order of chemistry.reactionIds. */
  rates: readonly RateLawSpec[];
  /** Names of the parameters, in the order of theta. Unique. */
  parameterNames: readonly string[];
  /** Reference temperature T_ref of the Arrhenius and van 't Hoff terms, K (> 0). */
  referenceTemperature: number;
}

/** Readable description of one reaction's rate law (for reports). */
export interface RateDescription {
  id: string;
  /** Equation in normal form, e.g. 'A + 2 B <=> C'. */
  equation: string;
  form: RateLawSpec['form'];
  basis: RateBasis;
  /** Unit of the rate: 'mol/(m3 s)' (volume basis) or 'mol/(kg s)' (mass basis). */
  rateUnit: string;
  /** The rate law, e.g. 'k1*exp(-E1/R*(1/T - 1/T_ref))*C_A*C_B'. */
  text: string;
  /** SI units of the parameters where the form fixes them, e.g. { k1: 'm3/(mol s)', E1: 'J/mol' }. */
  parameterUnits: Record<string, string>;
}

/** CompiledKinetics plus debugging and reporting helpers. */
export interface CompiledKineticsInfo extends CompiledKinetics {
  /** One readable description per reaction. */
  describe(): RateDescription[];
  /** The generated JavaScript bodies (for debugging and tests). */
  source(): { rates: string; jacC: string; jacP: string };
  /** Each rate's simplified expression tree printed back as text (debugging). */
  expressions(): string[];
  /** Size of the generated code: distinct tree nodes and hoisted temporaries per function. */
  readonly stats: { nodes: number; temporaries: { rates: number; jacC: number; jacP: number } };
}

const NAME_RE = /^[A-Za-z_][A-Za-z0-9_]*$/;

/**
 * Compile rate laws into allocation-free evaluators with exact Jacobians.
 * @param path path of the enclosing study object (errors point at path.reactions[i].rate...).
 * @throws RateloomError for unknown species/parameters, bad orders, bad expressions.
 */
export function compileKinetics(input: KineticsInput, path: FieldPath = []): CompiledKineticsInfo {
  const { chemistry: chem, rates, parameterNames, referenceTemperature: Tref } = input;
  const nS = chem.speciesNames.length;
  const nR = chem.reactionIds.length;
  const nP = parameterNames.length;
  if (!Array.isArray(rates) || rates.length !== nR) {
    throw new RateloomError('E_VALUE', `expected one rate law per reaction (${nR}), got ${Array.isArray(rates) ? rates.length : 'none'}`, {
      path: [...path, 'reactions'],
    });
  }
  if (typeof Tref !== 'number' || !Number.isFinite(Tref) || !(Tref > 0)) {
    throw new RateloomError('E_VALUE', `reference temperature ${String(Tref)} K must be a positive finite number`, {
      path: [...path, 'referenceTemperature'],
    });
  }
  const seen = new Set<string>();
  parameterNames.forEach((p, k) => {
    if (typeof p !== 'string' || !NAME_RE.test(p)) {
      throw new RateloomError('E_VALUE', `parameter name '${String(p)}' is not valid`, {
        path: [...path, 'parameters', k, 'name'],
        fix: "Use letters, digits and '_' only, starting with a letter or '_'.",
      });
    }
    if (seen.has(p)) {
      throw new RateloomError('E_VALUE', `parameter '${p}' is declared twice`, { path: [...path, 'parameters', k, 'name'], fix: 'Give every parameter a unique name.' });
    }
    seen.add(p);
  });

  const store = new NodeStore();
  const layout = variableLayout(nS, nP);
  const ctx = { store, chemistry: chem, parameterNames, referenceTemperature: Tref, layout };
  const built: BuiltRate[] = rates.map((spec, i) => buildRate(ctx, spec, i, [...path, 'reactions', i, 'rate']));
  const roots: Node[] = built.map((b) => b.node);

  const access = (v: number): string => (v < nS ? `C[${v}]` : v === nS ? 'T' : `th[${v - nS - 1}]`);

  const rateAssign: Assignment[] = roots.map((node, i) => ({ index: i, node }));
  const jacCAssign: Assignment[] = [];
  for (let j = 0; j < nS; j++) {
    const memo = new Map<number, Node>();
    roots.forEach((root, i) => {
      const d = differentiate(store, root, layout.c(j), memo);
      if (!(d.kind === 'num' && d.value === 0)) jacCAssign.push({ index: i * nS + j, node: d });
    });
  }
  const jacPAssign: Assignment[] = [];
  for (let k = 0; k < nP; k++) {
    const memo = new Map<number, Node>();
    roots.forEach((root, i) => {
      const d = differentiate(store, root, layout.theta(k), memo);
      if (!(d.kind === 'num' && d.value === 0)) jacPAssign.push({ index: i * nP + k, node: d });
    });
  }
  const bodies: Record<'rates' | 'jacC' | 'jacP', EmittedBody> = {
    rates: emitBody(rateAssign, { access }),
    jacC: emitBody(jacCAssign, { access, zeroFill: true }),
    jacP: emitBody(jacPAssign, { access, zeroFill: true }),
  };
  const fRates = compileBody(bodies.rates);
  const fJacC = compileBody(bodies.jacC);
  const fJacP = compileBody(bodies.jacP);

  const basis = built.map((b) => b.basis);
  const descriptions: RateDescription[] = built.map((b, i) => ({
    id: chem.reactionIds[i],
    equation: chem.equations[i],
    form: rates[i].form,
    basis: b.basis,
    rateUnit: b.basis === 'volume' ? 'mol/(m3 s)' : 'mol/(kg s)',
    text: b.text,
    parameterUnits: { ...b.parameterUnits },
  }));
  const varName = (v: number): string =>
    v < nS ? `C_${chem.speciesNames[v]}` : v === nS ? 'T' : parameterNames[v - nS - 1];

  return {
    speciesNames: [...chem.speciesNames],
    reactionIds: [...chem.reactionIds],
    parameterNames: [...parameterNames],
    stoich: Float64Array.from(chem.stoich),
    basis,
    referenceTemperature: Tref,
    rates: fRates,
    ratesJacC: fJacC,
    ratesJacP: fJacP,
    describe: () => descriptions.map((d) => ({ ...d, parameterUnits: { ...d.parameterUnits } })),
    source: () => ({ rates: bodies.rates.code, jacC: bodies.jacC.code, jacP: bodies.jacP.code }),
    expressions: () => roots.map((r) => printExpression(r, { name: varName, digits: 10 })),
    stats: {
      nodes: store.size,
      temporaries: { rates: bodies.rates.temporaries, jacC: bodies.jacC.temporaries, jacP: bodies.jacP.temporaries },
    },
  };
}

/**
 * Species net rates R_j = sum_i nu_ij r_i (allocation-free).
 * @param r reaction rates, length nR.
 * @param out species net rates, length nS (overwritten).
 */
export function netRates(k: Pick<CompiledKinetics, 'stoich' | 'speciesNames' | 'reactionIds'>, r: Float64Array, out: Float64Array): void {
  const nS = k.speciesNames.length;
  const nR = k.reactionIds.length;
  const nu = k.stoich;
  for (let j = 0; j < nS; j++) out[j] = 0;
  for (let i = 0; i < nR; i++) {
    const ri = r[i];
    if (ri === 0) continue;
    const row = i * nS;
    for (let j = 0; j < nS; j++) out[j] += nu[row + j] * ri;
  }
}
