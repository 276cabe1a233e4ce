/**
 * Compound unit parser: 'mol/(kg s)', 'mmol/(g min)', 'mol kg-1 s-1', 'L/(mol s)', 'mol/(kg s Pa^1.5)',
 * 'kg/(m2 s)', 'cm3'. Recursive descent over the grammar
 *
 *   unit    := product ('/' product)*          (division is left-associative)
 *   product := factor ((' ' | '*' | '.' | '·') factor)*
 *   factor  := (atom | '(' unit ')') [('^' | '**')? exponent]
 *
 * Juxtaposition binds tighter than '/', so 'J/mol K' reads as J/(mol K), the convention of
 * chemistry tables. Exponents may be negative or fractional ('Pa^1.5', 's-1'). Atoms and their
 * factors come from table.ts (NIST SP 811 Appendix B, SI Brochure 9th ed.).
 */
import { ALIASES, ATOMS, DIM_NAMES, type Dims } from './table.js';

export interface ParsedUnit {
  /** Multiply a value in this unit by `factor` to get SI. */
  factor: number;
  dims: Dims;
  /** True when every atom's factor is exact by definition. */
  exact: boolean;
  /** The atoms as written (canonical names, aliases resolved) with their summed exponents, in order of appearance. */
  terms: ReadonlyArray<readonly [string, number]>;
}

/** Why a unit text could not be parsed: the message names the offending piece. */
export class UnitSyntaxError extends Error {}

const ATOM_RE = /^[A-Za-z%µ°]+/;
const NUM_RE = /^[-+]?\d+(\.\d+)?/;
/** Deepest accepted nesting of parentheses in a unit (real units need two or three). */
export const MAX_UNIT_NESTING = 8;
/** Longest accepted unit text, in characters. */
export const MAX_UNIT_LENGTH = 200;

function lookupAtom(name: string): ParsedUnit | undefined {
  // Own properties only: 'constructor' or '__proto__' are not units.
  const key = Object.hasOwn(ATOMS, name) ? name : Object.hasOwn(ALIASES, name) ? ALIASES[name] : undefined;
  const a = key !== undefined && Object.hasOwn(ATOMS, key) ? ATOMS[key] : undefined;
  return a && key !== undefined ? { factor: a.factor, dims: a.dims, exact: a.exact, terms: key === '1' ? [] : [[key, 1]] } : undefined;
}

/** Exponents of two term lists added (b scaled by `sign`), atoms in order of first appearance, zeros dropped. */
function addTerms(a: ParsedUnit['terms'], b: ParsedUnit['terms'], sign: number): ParsedUnit['terms'] {
  const out = new Map<string, number>(a);
  for (const [k, e] of b) out.set(k, (out.get(k) ?? 0) + sign * e);
  return [...out].filter(([, e]) => Math.abs(e) > 1e-12);
}

function mul(a: ParsedUnit, b: ParsedUnit, sign: 1 | -1): ParsedUnit {
  return {
    factor: sign === 1 ? a.factor * b.factor : a.factor / b.factor,
    dims: a.dims.map((d, i) => d + sign * b.dims[i]) as unknown as Dims,
    exact: a.exact && b.exact,
    terms: addTerms(a.terms, b.terms, sign),
  };
}

function pow(a: ParsedUnit, e: number): ParsedUnit {
  return { factor: Math.pow(a.factor, e), dims: a.dims.map((d) => d * e) as unknown as Dims, exact: a.exact && Number.isInteger(e), terms: addTerms([], a.terms, e) };
}

class Parser {
  private pos = 0;
  /** Current depth of open parentheses. */
  private depth = 0;
  constructor(private readonly s: string) {}

  parse(): ParsedUnit {
    const u = this.unit();
    this.skipSpace();
    if (this.pos < this.s.length) throw new UnitSyntaxError(`unexpected '${this.s.slice(this.pos)}'`);
    return u;
  }

  private skipSpace(): boolean {
    const start = this.pos;
    while (this.s[this.pos] === ' ') this.pos++;
    return this.pos > start;
  }

  private unit(): ParsedUnit {
    let u = this.product();
    for (;;) {
      this.skipSpace();
      if (this.s[this.pos] !== '/') return u;
      this.pos++;
      u = mul(u, this.product(), -1);
    }
  }

  private product(): ParsedUnit {
    let u = this.factor();
    for (;;) {
      const save = this.pos;
      const spaced = this.skipSpace();
      const c = this.s[this.pos];
      if (c === '*' || c === '·' || (c === '.' && !/\d/.test(this.s[this.pos + 1] ?? ''))) {
        this.pos++;
        this.skipSpace();
        u = mul(u, this.factor(), 1);
      } else if (spaced && c !== undefined && c !== '/' && c !== ')') {
        u = mul(u, this.factor(), 1);
      } else {
        this.pos = save;
        return u;
      }
    }
  }

  private factor(): ParsedUnit {
    this.skipSpace();
    let base: ParsedUnit;
    if (this.s[this.pos] === '(') {
      if (++this.depth > MAX_UNIT_NESTING) throw new UnitSyntaxError(`more than ${MAX_UNIT_NESTING} nested parentheses`);
      this.pos++;
      base = this.unit();
      this.skipSpace();
      if (this.s[this.pos] !== ')') throw new UnitSyntaxError("missing ')'");
      this.pos++;
      this.depth--;
    } else {
      const m = ATOM_RE.exec(this.s.slice(this.pos));
      if (m) {
        const found = lookupAtom(m[0]);
        if (!found) throw new UnitSyntaxError(`unknown unit symbol '${m[0]}'`);
        base = found;
        this.pos += m[0].length;
      } else {
        const n = /^1(?![\d.])/.exec(this.s.slice(this.pos));
        if (!n) throw new UnitSyntaxError(`unexpected '${this.s.slice(this.pos) || 'end of unit'}'`);
        base = { factor: 1, dims: [0, 0, 0, 0, 0], exact: true, terms: [] };
        this.pos += 1;
      }
    }
    let rest = this.s.slice(this.pos);
    let caret = 0;
    if (rest.startsWith('^')) caret = 1;
    else if (rest.startsWith('**')) caret = 2;
    rest = rest.slice(caret);
    const e = NUM_RE.exec(rest);
    if (e) {
      this.pos += caret + e[0].length;
      return pow(base, Number(e[0]));
    }
    if (caret) throw new UnitSyntaxError('exponent expected after ^');
    return base;
  }
}

/** Parse a compound unit into a factor to SI and a dimension vector; throws UnitSyntaxError. */
export function parseCompoundUnit(text: string): ParsedUnit {
  const s = text.trim().replace(/\s+/g, ' ');
  if (s === '') throw new UnitSyntaxError('empty unit');
  if (s.length > MAX_UNIT_LENGTH) throw new UnitSyntaxError(`unit text is ${s.length} characters long; at most ${MAX_UNIT_LENGTH} are accepted`);
  return new Parser(s).parse();
}

/** Equal dimension vectors (to 1e-9, for fractional exponents). */
export function sameDims(a: Dims, b: Dims): boolean {
  return a.every((d, i) => Math.abs(d - b[i]) < 1e-9);
}

function fmtExp(e: number): string {
  return Number.isInteger(e) ? String(e) : String(Math.round(e * 1e6) / 1e6);
}

/**
 * The SI unit of a dimension vector, written as 'num/(den)', for example 'mol/(kg s)' or
 * 'm^4.5/(mol^0.5 s)'. Dimensionless is '1'.
 */
export function formatSiUnit(dims: Dims): string {
  const num: string[] = [];
  const den: string[] = [];
  dims.forEach((e, i) => {
    if (Math.abs(e) < 1e-12) return;
    const name = DIM_NAMES[i];
    const a = Math.abs(e);
    const term = Math.abs(a - 1) < 1e-12 ? name : `${name}^${fmtExp(a)}`;
    (e > 0 ? num : den).push(term);
  });
  const n = num.length ? num.join(' ') : '1';
  if (!den.length) return n;
  return `${n}/${den.length > 1 ? `(${den.join(' ')})` : den[0]}`;
}
