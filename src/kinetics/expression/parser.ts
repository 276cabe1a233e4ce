/**
 * Parser of the rate-expression language by precedence climbing (recursive descent with one
 * level per precedence; Richards 1979 / Clarke 1986, "The top-down parsing of expressions"):
 *
 *   expr    := term (('+' | '-') term)*
 *   term    := unary (('*' | '/') unary)*
 *   unary   := ('-' | '+') unary | power
 *   power   := primary ('^' unary)?          right associative; ^ binds tighter than unary minus,
 *                                            so -x^2 = -(x^2) and 2^-1 = 0.5
 *   primary := number | name | func '(' expr (',' expr)* ')' | '(' expr ')'
 *
 * Names resolve only against the caller's symbol table (a Map, so no prototype lookups), never
 * against JavaScript scope. Functions come from a whitelist: exp, log and ln (natural log), log10,
 * sqrt, abs, min, max, pow. Known JavaScript escape hatches (constructor, __proto__, process,
 * globalThis, this, Function, eval, ...) are refused by name. Nesting depth and tree height are
 * bounded so hostile input fails fast with a typed error instead of exhausting the stack.
 */
import { closestName, type FieldPath } from '../../core/errors.js';
import type { Node, NodeStore } from './ast.js';
import { MAX_EXPRESSION_LENGTH, expressionError, tokenize, type Token } from './tokenizer.js';

/** Functions a user may call, with their arity (min/max take two or more arguments). */
export const USER_FUNCTIONS: ReadonlyMap<string, { min: number; max: number }> = new Map([
  ['exp', { min: 1, max: 1 }],
  ['log', { min: 1, max: 1 }],
  ['ln', { min: 1, max: 1 }],
  ['log10', { min: 1, max: 1 }],
  ['sqrt', { min: 1, max: 1 }],
  ['abs', { min: 1, max: 1 }],
  ['min', { min: 2, max: 64 }],
  ['max', { min: 2, max: 64 }],
  ['pow', { min: 2, max: 2 }],
]);


export interface ParseOptions {
  /** Identifier -> tree it stands for (e.g. 'C_A' -> max(C[0],0), 'k1' -> theta[2]). */
  symbols: ReadonlyMap<string, Node>;
  /** Called for an identifier that is not a symbol; should throw a typed error. Default: E_EXPRESSION with the closest symbol. */
  onUnknown?: (name: string, column: number) => never;
  /** Field path for errors; default []. */
  path?: FieldPath;
  /** Longest input, characters; default 10,000. */
  maxLength?: number;
  /** Deepest nesting of parentheses, unary signs and powers; default 100. */
  maxDepth?: number;
  /** Tallest expression tree (operations chained); default 1,000. */
  maxHeight?: number;
}

class Parser {
  private i = 0;
  private depth = 0;
  private readonly path: FieldPath;
  private readonly maxDepth: number;
  private readonly maxHeight: number;

  constructor(
    private readonly text: string,
    private readonly toks: Token[],
    private readonly s: NodeStore,
    private readonly opts: ParseOptions,
  ) {
    this.path = opts.path ?? [];
    this.maxDepth = opts.maxDepth ?? 100;
    this.maxHeight = opts.maxHeight ?? 1000;
  }

  private fail(problem: string, col: number, fix?: string): never {
    return expressionError(this.text, problem, col, this.path, fix);
  }

  private peek(): Token {
    return this.toks[this.i];
  }

  private isOp(t: Token, op: string): boolean {
    return t.kind === 'op' && t.text === op;
  }

  private describe(t: Token): string {
    return t.kind === 'end' ? 'end of expression' : `'${t.text}'`;
  }

  private checked(n: Node, col: number): Node {
    if (n.height > this.maxHeight) {
      this.fail(`expression is too large (more than ${this.maxHeight} chained operations)`, col, 'Simplify the expression.');
    }
    return n;
  }

  parse(): Node {
    const n = this.expr();
    const t = this.peek();
    if (t.kind !== 'end') {
      if (this.isOp(t, ')')) this.fail("unmatched ')'", t.col);
      this.fail(`unexpected ${this.describe(t)}`, t.col, 'Put an operator between operands (2*x, not 2 x).');
    }
    return n;
  }

  private enter(col: number): void {
    if (++this.depth > this.maxDepth) {
      this.fail(`expression nests deeper than ${this.maxDepth} levels`, col, 'Remove redundant parentheses or simplify the expression.');
    }
  }

  private expr(): Node {
    let left = this.term();
    for (;;) {
      const t = this.peek();
      if (this.isOp(t, '+') || this.isOp(t, '-')) {
        this.i++;
        const right = this.term();
        left = this.checked(t.kind === 'op' && t.text === '+' ? this.s.add(left, right) : this.s.sub(left, right), t.col);
      } else return left;
    }
  }

  private term(): Node {
    let left = this.unary();
    for (;;) {
      const t = this.peek();
      if (this.isOp(t, '*') || this.isOp(t, '/')) {
        this.i++;
        const right = this.unary();
        left = this.checked(t.kind === 'op' && t.text === '*' ? this.s.mul(left, right) : this.s.div(left, right), t.col);
      } else return left;
    }
  }

  private unary(): Node {
    const t = this.peek();
    this.enter(t.col);
    let r: Node;
    if (this.isOp(t, '-')) {
      this.i++;
      r = this.checked(this.s.neg(this.unary()), t.col);
    } else if (this.isOp(t, '+')) {
      this.i++;
      r = this.unary();
    } else {
      r = this.power();
    }
    this.depth--;
    return r;
  }

  private power(): Node {
    const base = this.primary();
    const t = this.peek();
    if (this.isOp(t, '^')) {
      this.i++;
      const exponent = this.unary();
      return this.checked(this.s.pow(base, exponent), t.col);
    }
    return base;
  }

  private primary(): Node {
    const t = this.peek();
    if (t.kind === 'num') {
      this.i++;
      return this.s.num(t.value);
    }
    if (t.kind === 'ident') {
      this.i++;
      if (this.isOp(this.peek(), '(')) return this.call(t.text, t.col);
      const sym = this.opts.symbols.get(t.text);
      if (sym) return sym;
      if (USER_FUNCTIONS.has(t.text)) this.fail(`function '${t.text}' must be called with parentheses`, t.col);
      if (this.opts.onUnknown) return this.opts.onUnknown(t.text, t.col);
      const near = closestName(t.text, this.opts.symbols.keys());
      return this.fail(`unknown name '${t.text}'${near ? ` (did you mean '${near}'?)` : ''}`, t.col);
    }
    if (this.isOp(t, '(')) {
      this.i++;
      this.enter(t.col);
      const inner = this.expr();
      this.depth--;
      const close = this.peek();
      if (!this.isOp(close, ')')) this.fail(`'(' opened at column ${t.col} is not closed; found ${this.describe(close)}`, close.col);
      this.i++;
      return inner;
    }
    return this.fail(`expected a number, name or '(' but found ${this.describe(t)}`, t.col);
  }

  private call(name: string, col: number): Node {
    const sig = USER_FUNCTIONS.get(name);
    if (!sig) {
      const near = closestName(name, USER_FUNCTIONS.keys());
      this.fail(`unknown function '${name}'${near ? ` (did you mean '${near}'?)` : ''}`, col, 'Use one of the functions exp, ln, log, log10, sqrt, abs, min, max, pow.');
    }
    const open = this.peek();
    this.i++; // '('
    this.enter(open.col);
    const args: Node[] = [];
    if (this.isOp(this.peek(), ')')) this.fail(`function '${name}' needs an argument`, this.peek().col);
    for (;;) {
      args.push(this.expr());
      const t = this.peek();
      if (this.isOp(t, ',')) {
        this.i++;
        continue;
      }
      if (this.isOp(t, ')')) {
        this.i++;
        break;
      }
      this.fail(`expected ',' or ')' in the call of '${name}' but found ${this.describe(t)}`, t.col);
    }
    this.depth--;
    if (args.length < sig.min || args.length > sig.max) {
      this.fail(`function '${name}' takes ${sig.min === sig.max ? sig.min : `${sig.min} or more`} argument${sig.min === 1 ? '' : 's'}, got ${args.length}`, col);
    }
    const s = this.s;
    let r: Node;
    switch (name) {
      case 'log':
      case 'ln':
        r = s.call('ln', args);
        break;
      case 'sqrt':
        r = s.pow(args[0], s.num(0.5));
        break;
      case 'pow':
        r = s.pow(args[0], args[1]);
        break;
      case 'min':
      case 'max':
        r = args.reduce((acc, x) => s.call(name, [acc, x]));
        break;
      default:
        r = s.call(name as 'exp' | 'log10' | 'abs', args);
    }
    return this.checked(r, col);
  }
}

/**
 * Parse an expression into a tree in `store`.
 * @throws RateloomError E_EXPRESSION naming the column, or whatever `onUnknown` throws.
 */
export function parseExpression(text: string, store: NodeStore, options: ParseOptions): Node {
  const toks = tokenize(text, options.path ?? [], options.maxLength ?? MAX_EXPRESSION_LENGTH);
  return new Parser(text, toks, store, options).parse();
}
