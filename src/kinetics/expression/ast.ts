/**
 * Expression trees with hash-consing and algebraic simplification.
 *
 * Method: every node is built through a NodeStore whose smart constructors (1) fold constants and
 * apply identities (x+0, x*1, x*0, x^1, x^0, --x, (max(x,0)^a)^b = max(x,0)^(ab)), (2) put the
 * operands of commutative operators in a canonical order, and (3) look the result up in a table
 * keyed by (kind, operand ids), so that structurally equal subtrees are one node with one id
 * (hash-consing; Ershov 1958, "On programming of arithmetic operations", and Filliatre &
 * Conchon 2006, "Type-safe modular hash-consing"). Shared ids make common-subexpression
 * elimination in codegen.ts a matter of counting references.
 *
 * Node kinds: num, var (an index into a caller-defined variable table), neg, add, sub, mul, div,
 * pow (plain x^y), ppow (positive-part power max(x,0)^y with a regularised derivative, used for
 * concentrations), call (whitelisted functions plus the internal helpers step, reg and sign).
 * The numeric meaning of every helper is defined once in RUNTIME below and shared by the
 * interpreter (evaluate) and the generated code.
 */
import { InternalError } from '../../core/errors.js';

/** Floor used when differentiating fractional powers of concentrations near zero (see RUNTIME.reg). */
export const TINY = 1e-30;

/** Functions callable in an expression tree. exp/ln/log10/abs/min/max are user functions; step/reg/sign are internal. */
export type FnName = 'exp' | 'ln' | 'log10' | 'abs' | 'min' | 'max' | 'step' | 'reg' | 'sign';

export type BinaryKind = 'add' | 'sub' | 'mul' | 'div' | 'pow' | 'ppow';

export type Node =
  | { readonly kind: 'num'; readonly id: number; readonly height: number; readonly value: number }
  | { readonly kind: 'var'; readonly id: number; readonly height: number; readonly v: number }
  | { readonly kind: 'neg'; readonly id: number; readonly height: number; readonly a: Node }
  | { readonly kind: BinaryKind; readonly id: number; readonly height: number; readonly a: Node; readonly b: Node }
  | { readonly kind: 'call'; readonly id: number; readonly height: number; readonly fn: FnName; readonly args: readonly Node[] };

export type NumNode = Extract<Node, { kind: 'num' }>;

/**
 * Numeric semantics of the non-Math helpers. Passed by reference into generated functions, so the
 * interpreter and the compiled code agree by construction.
 */
export const RUNTIME = {
  /** max(x, 0). */
  pos: (x: number): number => (x > 0 ? x : 0),
  /** max(x, 0)^a: 0 at x <= 0 for a > 0, 1 for a = 0. */
  ppow: (x: number, a: number): number => Math.pow(x > 0 ? x : 0, a),
  /** Heaviside step: 1 for x > 0, else 0. */
  step: (x: number): number => (x > 0 ? 1 : 0),
  /** max(x, TINY): keeps fractional-power derivatives finite at zero concentration. */
  reg: (x: number): number => (x > TINY ? x : TINY),
  /** Sign of x (0 at 0). */
  sign: (x: number): number => (x > 0 ? 1 : x < 0 ? -1 : 0),
} as const;

const isNum = (n: Node, v?: number): n is NumNode => n.kind === 'num' && (v === undefined || n.value === v);

/** Builds and owns hash-consed nodes. One store per compilation. */
export class NodeStore {
  private readonly table = new Map<string, Node>();
  private nextId = 0;

  /** Number of distinct nodes created so far. */
  get size(): number {
    return this.table.size;
  }

  private intern<N extends Node>(key: string, make: (id: number) => N): N {
    const hit = this.table.get(key);
    if (hit) return hit as N;
    const node = make(this.nextId++);
    this.table.set(key, node);
    return node;
  }

  num(value: number): Node {
    const v = value === 0 ? 0 : value; // fold -0 into 0
    return this.intern(`#${v}`, (id) => ({ kind: 'num', id, height: 0, value: v }));
  }

  variable(v: number): Node {
    if (!Number.isInteger(v) || v < 0) throw new InternalError(`bad variable index ${v}`);
    return this.intern(`v${v}`, (id) => ({ kind: 'var', id, height: 0, v }));
  }

  neg(a: Node): Node {
    if (isNum(a)) return this.num(-a.value);
    if (a.kind === 'neg') return a.a;
    return this.intern(`neg(${a.id})`, (id) => ({ kind: 'neg', id, height: a.height + 1, a }));
  }

  private bin(kind: BinaryKind, a: Node, b: Node): Node {
    return this.intern(`${kind}(${a.id},${b.id})`, (id) => ({
      kind,
      id,
      height: Math.max(a.height, b.height) + 1,
      a,
      b,
    }));
  }

  /** A folded constant when finite, otherwise undefined (keep the node so runtime gives the IEEE result). */
  private fold(x: number): Node | undefined {
    return Number.isFinite(x) ? this.num(x) : undefined;
  }

  add(a: Node, b: Node): Node {
    if (isNum(a) && isNum(b)) return this.fold(a.value + b.value) ?? this.bin('add', a, b);
    if (isNum(a, 0)) return b;
    if (isNum(b, 0)) return a;
    if (b.kind === 'neg') return this.sub(a, b.a);
    if (a.kind === 'neg') return this.sub(b, a.a);
    if (a === b) return this.mul(this.num(2), a);
    return a.id <= b.id ? this.bin('add', a, b) : this.bin('add', b, a);
  }

  sub(a: Node, b: Node): Node {
    if (isNum(a) && isNum(b)) return this.fold(a.value - b.value) ?? this.bin('sub', a, b);
    if (isNum(b, 0)) return a;
    if (isNum(a, 0)) return this.neg(b);
    if (a === b) return this.num(0);
    if (b.kind === 'neg') return this.add(a, b.a);
    return this.bin('sub', a, b);
  }

  mul(a: Node, b: Node): Node {
    if (isNum(a) && isNum(b)) return this.fold(a.value * b.value) ?? this.bin('mul', a, b);
    if (isNum(a, 0) || isNum(b, 0)) return this.num(0);
    if (isNum(a, 1)) return b;
    if (isNum(b, 1)) return a;
    if (isNum(a, -1)) return this.neg(b);
    if (isNum(b, -1)) return this.neg(a);
    if (a.kind === 'neg' && b.kind === 'neg') return this.mul(a.a, b.a);
    if (a.kind === 'neg') return this.neg(this.mul(a.a, b));
    if (b.kind === 'neg') return this.neg(this.mul(a, b.a));
    return a.id <= b.id ? this.bin('mul', a, b) : this.bin('mul', b, a);
  }

  div(a: Node, b: Node): Node {
    if (isNum(a) && isNum(b)) return this.fold(a.value / b.value) ?? this.bin('div', a, b);
    if (isNum(b, 1)) return a;
    if (isNum(b, -1)) return this.neg(a);
    if (isNum(a, 0) && !isNum(b, 0)) return this.num(0);
    if (a.kind === 'neg') return this.neg(this.div(a.a, b));
    return this.bin('div', a, b);
  }

  pow(a: Node, b: Node): Node {
    if (isNum(a) && isNum(b)) return this.fold(Math.pow(a.value, b.value)) ?? this.bin('pow', a, b);
    if (isNum(b, 1)) return a;
    if (isNum(b, 0)) return this.num(1);
    if (isNum(a, 1)) return this.num(1);
    // (max(x,0)^c)^b = max(x,0)^(c*b): the base is non-negative, so the identity holds.
    if (a.kind === 'ppow') return this.ppow(a.a, this.mul(a.b, b));
    return this.bin('pow', a, b);
  }

  /** Positive-part power max(a,0)^b; ppow(a, 1) is max(a, 0). */
  ppow(a: Node, b: Node): Node {
    if (isNum(a) && isNum(b)) return this.fold(RUNTIME.ppow(a.value, b.value)) ?? this.bin('ppow', a, b);
    if (isNum(b, 0)) return this.num(1);
    if (a.kind === 'ppow') return this.ppow(a.a, this.mul(a.b, b));
    return this.bin('ppow', a, b);
  }

  call(fn: FnName, args: readonly Node[]): Node {
    const arity = fn === 'min' || fn === 'max' ? 2 : 1;
    if (args.length !== arity) throw new InternalError(`${fn} takes ${arity} arguments`);
    if (args.every((x) => x.kind === 'num')) {
      const f = evalCall(fn, args.map((x) => (x as NumNode).value));
      const folded = this.fold(f);
      if (folded) return folded;
    }
    if ((fn === 'min' || fn === 'max') && args[0] === args[1]) return args[0];
    if (fn === 'exp' && args[0].kind === 'call' && args[0].fn === 'ln') return args[0].args[0];
    let ordered = args;
    if ((fn === 'min' || fn === 'max') && args[0].id > args[1].id) ordered = [args[1], args[0]];
    return this.intern(`${fn}(${ordered.map((x) => x.id).join(',')})`, (id) => ({
      kind: 'call',
      id,
      height: Math.max(...ordered.map((x) => x.height)) + 1,
      fn,
      args: ordered,
    }));
  }
}

/** The numeric value of a function call. */
export function evalCall(fn: FnName, x: readonly number[]): number {
  switch (fn) {
    case 'exp':
      return Math.exp(x[0]);
    case 'ln':
      return Math.log(x[0]);
    case 'log10':
      return Math.log10(x[0]);
    case 'abs':
      return Math.abs(x[0]);
    case 'min':
      return Math.min(x[0], x[1]);
    case 'max':
      return Math.max(x[0], x[1]);
    case 'step':
      return RUNTIME.step(x[0]);
    case 'reg':
      return RUNTIME.reg(x[0]);
    case 'sign':
      return RUNTIME.sign(x[0]);
  }
}

/** The children of a node. */
export function children(n: Node): readonly Node[] {
  switch (n.kind) {
    case 'num':
    case 'var':
      return [];
    case 'neg':
      return [n.a];
    case 'call':
      return n.args;
    default:
      return [n.a, n.b];
  }
}

/**
 * Evaluate a tree by interpretation (reference semantics for tests and one-off values).
 * @param vars values of the variable table, indexed by var node `v`.
 */
export function evaluate(root: Node, vars: ArrayLike<number>): number {
  const memo = new Map<number, number>();
  const ev = (n: Node): number => {
    const hit = memo.get(n.id);
    if (hit !== undefined) return hit;
    let r: number;
    switch (n.kind) {
      case 'num':
        r = n.value;
        break;
      case 'var':
        r = vars[n.v];
        break;
      case 'neg':
        r = -ev(n.a);
        break;
      case 'add':
        r = ev(n.a) + ev(n.b);
        break;
      case 'sub':
        r = ev(n.a) - ev(n.b);
        break;
      case 'mul':
        r = ev(n.a) * ev(n.b);
        break;
      case 'div':
        r = ev(n.a) / ev(n.b);
        break;
      case 'pow':
        r = Math.pow(ev(n.a), ev(n.b));
        break;
      case 'ppow':
        r = RUNTIME.ppow(ev(n.a), ev(n.b));
        break;
      case 'call':
        r = evalCall(n.fn, n.args.map(ev));
        break;
    }
    memo.set(n.id, r);
    return r;
  };
  return ev(root);
}

/** True when the tree depends on variable v. */
export function dependsOn(root: Node, v: number, memo = new Map<number, boolean>()): boolean {
  const hit = memo.get(root.id);
  if (hit !== undefined) return hit;
  const r = root.kind === 'var' ? root.v === v : children(root).some((c) => dependsOn(c, v, memo));
  memo.set(root.id, r);
  return r;
}
