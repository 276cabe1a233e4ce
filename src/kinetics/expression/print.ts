/**
 * Readable text of an expression tree in the input language (minimal parentheses by operator
 * precedence), used for debugging, describe() output and round-trip tests. The printed text parses
 * back to the same tree when every variable name maps to the same variable.
 */
import type { Node } from './ast.js';

/** Precedence: higher binds tighter. */
const PREC = { add: 1, sub: 1, mul: 2, div: 2, neg: 3, pow: 4, atom: 5 } as const;

export interface PrintOptions {
  /** Name of variable v, e.g. 'C_A', 'T', 'k1'. */
  name: (v: number) => string;
  /** Significant digits of numbers; default: shortest exact text. */
  digits?: number;
}

/** Text of a tree, e.g. 'k1*exp(-E1/R*(1/T - 1/T_ref))*C_A^0.5'. */
export function printExpression(root: Node, opts: PrintOptions): string {
  const num = (x: number): string => (opts.digits ? String(Number(x.toPrecision(opts.digits))) : String(x));
  const go = (n: Node): [string, number] => {
    switch (n.kind) {
      case 'num':
        return n.value < 0 ? [`-${num(-n.value)}`, PREC.neg] : [num(n.value), PREC.atom];
      case 'var':
        return [opts.name(n.v), PREC.atom];
      case 'neg': {
        const [a, p] = go(n.a);
        return [`-${p < PREC.pow ? `(${a})` : a}`, PREC.neg];
      }
      case 'add':
      case 'sub': {
        const [a] = go(n.a);
        const [b, pb] = go(n.b);
        const right = pb <= PREC.add ? `(${b})` : b;
        return [`${a} ${n.kind === 'add' ? '+' : '-'} ${right}`, PREC.add];
      }
      case 'mul':
      case 'div': {
        const [a, pa] = go(n.a);
        const [b, pb] = go(n.b);
        const left = pa < PREC.mul ? `(${a})` : a;
        const right = pb <= PREC.mul ? `(${b})` : b;
        return [`${left}${n.kind === 'mul' ? '*' : '/'}${right}`, PREC.mul];
      }
      case 'pow':
      case 'ppow': {
        let [a, pa] = go(n.a);
        if (n.kind === 'ppow') {
          // max(x,0)^b: a bare variable is shown plainly (concentrations are clipped at zero by definition)
          if (n.a.kind !== 'var') [a, pa] = [`max(${a}, 0)`, PREC.atom];
          if (n.b.kind === 'num' && n.b.value === 1) return [a, pa];
        }
        const [b, pb] = go(n.b);
        const left = pa <= PREC.pow ? `(${a})` : a;
        const right = pb < PREC.pow ? `(${b})` : b;
        return [`${left}^${right}`, PREC.pow];
      }
      case 'call': {
        const args = n.args.map((x) => go(x)[0]);
        if (n.fn === 'reg') return [`max(${args[0]}, 1e-30)`, PREC.atom];
        return [`${n.fn}(${args.join(', ')})`, PREC.atom];
      }
    }
  };
  return go(root)[0];
}
