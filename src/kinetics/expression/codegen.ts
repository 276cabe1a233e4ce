/**
 * Code generation: expression trees -> straight-line JavaScript, compiled with `new Function`.
 *
 * Method: the roots' DAG is walked once in post-order; every non-trivial node referenced more than
 * once (hash-consing in ast.ts makes equal subtrees one node) is computed once into a local
 * `const tN` (common-subexpression elimination by value numbering; Cocke 1970, "Global common
 * subexpression elimination"). Everything else is inlined, fully parenthesised.
 *
 * Why `new Function` is safe here: the generated source is assembled ONLY from
 *  - fixed fragments written in this file (operators, parentheses, `M.exp(`, `ppow(`, `const`, ...),
 *  - numeric literals produced by `formatNumber`, which accepts only finite numbers and checks
 *    the text against a strict numeric pattern,
 *  - local names `t<integer>`, output indices `out[<integer>]`, and variable accessors returned by
 *    the caller, each checked against /^[A-Za-z_][A-Za-z0-9_]*(\[\d+\])?$/ (the kinetics compiler
 *    only uses `C[j]`, `T`, `th[k]`).
 * No string from user input (expression text, species or parameter names) is ever copied into the
 * source: names were resolved to variable indices by the parser, and trees carry only numbers,
 * indices and a closed set of operator and function tags. The function body runs in strict mode
 * and receives Math and the helper functions as arguments, so it touches no other scope.
 */
import { RUNTIME, children, type Node } from './ast.js';
import { InternalError } from '../../core/errors.js';

const ACCESS_RE = /^[A-Za-z_][A-Za-z0-9_]*(\[\d+\])?$/;
const NUMBER_TEXT_RE = /^-?(\d+(\.\d+)?|\.\d+)(e[+-]?\d+)?$/;

/** A finite number as a JavaScript literal (negative values parenthesised). */
export function formatNumber(x: number): string {
  if (typeof x !== 'number' || !Number.isFinite(x)) throw new InternalError(`cannot emit non-finite literal ${String(x)}`);
  const s = String(x);
  if (!NUMBER_TEXT_RE.test(s)) throw new InternalError(`unexpected number text ${s}`);
  return x < 0 ? `(${s})` : s;
}

/** One output of a generated function: `out[index] = root`. */
export interface Assignment {
  index: number;
  node: Node;
}

export interface EmitOptions {
  /** JavaScript accessor of variable v (e.g. 'C[3]', 'T', 'th[0]'). Checked against a strict pattern. */
  access: (v: number) => string;
  /** Write `out.fill(0)` first (for sparse Jacobians); default false. */
  zeroFill?: boolean;
}

export interface EmittedBody {
  /** The statements (without the function header). */
  code: string;
  /** Number of local temporaries (shared subexpressions computed once). */
  temporaries: number;
}

const CALL_TEXT: Record<string, string> = {
  exp: 'M.exp',
  ln: 'M.log',
  log10: 'M.log10',
  abs: 'M.abs',
  min: 'M.min',
  max: 'M.max',
  step: 'step',
  reg: 'reg',
  sign: 'sign',
};

/** Straight-line statements computing all assignments, with shared subtrees hoisted into consts. */
export function emitBody(assignments: readonly Assignment[], opts: EmitOptions): EmittedBody {
  const { refs, order } = referenceCounts(assignments);
  const accessOf = checkedAccessor(opts.access);
  const text = new Map<number, string>();
  const lines: string[] = [];
  let temps = 0;
  for (const n of order) {
    let t = nodeText(n, text, accessOf);
    const shared = (refs.get(n.id) as number) > 1 && n.kind !== 'num' && n.kind !== 'var';
    if (shared) {
      const name = `t${temps++}`;
      lines.push(`const ${name}=${t};`);
      t = name;
    }
    text.set(n.id, t);
  }
  const outLines = assignments.map((a) => {
    if (!Number.isInteger(a.index) || a.index < 0) throw new InternalError('bad output index');
    return `out[${a.index}]=${text.get(a.node.id)};`;
  });
  return {
    code: [...(opts.zeroFill ? ['out.fill(0);'] : []), ...lines, ...outLines].join('\n'),
    temporaries: temps,
  };
}

/** Reference counts over the DAG reachable from the roots, and its nodes in post-order (children first). */
function referenceCounts(assignments: readonly Assignment[]): { refs: Map<number, number>; order: Node[] } {
  const refs = new Map<number, number>();
  const order: Node[] = [];
  const visit = (n: Node): void => {
    const c = refs.get(n.id);
    refs.set(n.id, (c ?? 0) + 1);
    if (c !== undefined) return;
    for (const ch of children(n)) visit(ch);
    order.push(n); // post-order: children before parents
  };
  for (const a of assignments) visit(a.node);
  return { refs, order };
}

/** The caller's variable accessor, each result checked against ACCESS_RE once and memoised. */
function checkedAccessor(access: (v: number) => string): (v: number) => string {
  const varText = new Map<number, string>();
  return (v) => {
    let s = varText.get(v);
    if (s === undefined) {
      s = access(v);
      if (!ACCESS_RE.test(s)) throw new InternalError(`unsafe variable accessor '${s}'`);
      varText.set(v, s);
    }
    return s;
  };
}

/** Source text of one node, its children's texts (or temporaries) already in `text`. */
function nodeText(n: Node, text: ReadonlyMap<number, string>, accessOf: (v: number) => string): string {
  switch (n.kind) {
    case 'num':
      return formatNumber(n.value);
    case 'var':
      return accessOf(n.v);
    case 'neg':
      return `(-${text.get(n.a.id)})`;
    case 'add':
      return `(${text.get(n.a.id)}+${text.get(n.b.id)})`;
    case 'sub':
      return `(${text.get(n.a.id)}-${text.get(n.b.id)})`;
    case 'mul':
      return `(${text.get(n.a.id)}*${text.get(n.b.id)})`;
    case 'div':
      return `(${text.get(n.a.id)}/${text.get(n.b.id)})`;
    case 'pow':
      return `M.pow(${text.get(n.a.id)},${text.get(n.b.id)})`;
    case 'ppow':
      return n.b.kind === 'num' && n.b.value === 1
        ? `pos(${text.get(n.a.id)})`
        : `ppow(${text.get(n.a.id)},${text.get(n.b.id)})`;
    case 'call': {
      const f = CALL_TEXT[n.fn];
      if (f === undefined) throw new InternalError('unknown function tag');
      return `${f}(${n.args.map((a) => text.get(a.id)).join(',')})`;
    }
  }
}

/** Signature of a generated evaluator: (C, T, theta, out) -> void. */
export type GeneratedFn = (C: Float64Array, T: number, th: Float64Array, out: Float64Array) => void;

/**
 * Compile a body produced by emitBody into a function (C, T, th, out) => void.
 * See the file header for why this use of `new Function` cannot run user-supplied code.
 */
export function compileBody(body: EmittedBody): GeneratedFn {
  const src = `"use strict";\nreturn function generated(C, T, th, out) {\n${body.code}\n};`;
  // eslint-disable-next-line @typescript-eslint/no-implied-eval
  const factory = new Function('M', 'pos', 'ppow', 'step', 'reg', 'sign', src) as (...a: unknown[]) => GeneratedFn;
  return factory(Math, RUNTIME.pos, RUNTIME.ppow, RUNTIME.step, RUNTIME.reg, RUNTIME.sign);
}
