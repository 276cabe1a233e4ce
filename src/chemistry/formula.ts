/**
 * Molecular formulas: 'C2H6O', 'Ca(OH)2', 'K4[Fe(CN)6]'. A recursive-descent parser over
 * element symbols (checked against the IUPAC table in elements.ts), counts, and nested groups in
 * round or square brackets. The molar mass is the count-weighted sum of standard atomic weights.
 */
import { RateloomError, closestName, type FieldPath } from '../core/errors.js';
import { ATOMIC_WEIGHTS } from './elements.js';
import { checkArgs, is } from '../core/args.js';

/** A parsed formula. */
export interface Formula {
  /** The formula text as given. */
  readonly text: string;
  /** Atom counts per element symbol, in order of first appearance. */
  readonly counts: Readonly<Record<string, number>>;
  /** Molar mass, kg/mol (IUPAC 2007 standard atomic weights). */
  readonly molarMass: number;
}

/** Longest formula text accepted (characters). */
const MAX_FORMULA_LENGTH = 200;
/** Deepest bracket nesting accepted. */
const MAX_DEPTH = 8;

class FormulaParser {
  private pos = 0;
  constructor(
    private readonly text: string,
    private readonly path: FieldPath,
  ) {}

  private fail(problem: string, column: number, fix?: string, details?: Record<string, unknown>): never {
    throw new RateloomError('E_FORMULA', `formula '${this.text}': ${problem} at column ${column}`, {
      path: this.path,
      location: { column },
      ...(fix ? { fix } : {}),
      ...(details ? { details } : {}),
    });
  }

  parse(): Map<string, number> {
    const counts = this.group(0);
    if (this.pos < this.text.length) {
      const ch = this.text[this.pos];
      if (ch === ')' || ch === ']') this.fail(`unmatched '${ch}'`, this.pos + 1);
      this.fail(`unexpected character '${ch}'`, this.pos + 1);
    }
    if (counts.size === 0) this.fail('no element symbols', 1);
    return counts;
  }

  /** Parse a sequence of items until a closing bracket or the end. */
  private group(depth: number): Map<string, number> {
    if (depth > MAX_DEPTH) this.fail(`brackets nest deeper than ${MAX_DEPTH} levels`, this.pos + 1);
    const counts = new Map<string, number>();
    const t = this.text;
    while (this.pos < t.length) {
      const ch = t[this.pos];
      if (ch === '(' || ch === '[') {
        const open = this.pos;
        const close = ch === '(' ? ')' : ']';
        this.pos++;
        const inner = this.group(depth + 1);
        if (t[this.pos] !== close) this.fail(`'${ch}' opened here is not closed with '${close}'`, open + 1);
        if (inner.size === 0) this.fail('empty brackets', open + 1);
        this.pos++;
        const n = this.count();
        for (const [el, c] of inner) counts.set(el, (counts.get(el) ?? 0) + c * n);
      } else if (ch >= 'A' && ch <= 'Z') {
        const start = this.pos;
        this.pos++;
        while (this.pos < t.length && t[this.pos] >= 'a' && t[this.pos] <= 'z') this.pos++;
        const sym = t.slice(start, this.pos);
        if (!ATOMIC_WEIGHTS.has(sym)) {
          const near = closestName(sym, ATOMIC_WEIGHTS.keys());
          this.fail(
            `unknown element symbol '${sym}'`,
            start + 1,
            `Use a valid element symbol${near ? ` (did you mean '${near}'?)` : ''}; symbols are one capital letter and an optional small letter.`,
            near ? { closest: near } : undefined,
          );
        }
        const n = this.count();
        counts.set(sym, (counts.get(sym) ?? 0) + n);
      } else if (ch === ')' || ch === ']') {
        return counts;
      } else if (ch >= 'a' && ch <= 'z') {
        this.fail(`element symbols start with a capital letter, found '${ch}'`, this.pos + 1);
      } else {
        this.fail(`unexpected character '${ch}'`, this.pos + 1);
      }
    }
    return counts;
  }

  /** An optional positive count (integer or decimal); 1 when absent. */
  private count(): number {
    const t = this.text;
    const start = this.pos;
    while (this.pos < t.length && ((t[this.pos] >= '0' && t[this.pos] <= '9') || t[this.pos] === '.')) this.pos++;
    if (this.pos === start) return 1;
    const s = t.slice(start, this.pos);
    if (!/^\d+(\.\d+)?$/.test(s)) this.fail(`malformed count '${s}'`, start + 1);
    const n = Number(s);
    if (!(n > 0)) this.fail(`count '${s}' must be positive`, start + 1);
    return n;
  }
}

/**
 * Parse a molecular formula such as 'C2H6O' or 'Ca(OH)2'.
 * @param text formula text; element symbols are case-sensitive.
 * @param path field path used in error messages.
 * @throws RateloomError E_FORMULA naming the column of the problem.
 */
export function parseFormula(text: string, path: FieldPath = []): Formula {
  checkArgs('parseFormula', [text], [{ name: 'text', check: is.text }]);
  if (typeof text !== 'string' || text.trim() === '') {
    throw new RateloomError('E_FORMULA', 'the formula is empty', { path });
  }
  if (text.length > MAX_FORMULA_LENGTH) {
    throw new RateloomError('E_FORMULA', `the formula is longer than ${MAX_FORMULA_LENGTH} characters`, { path });
  }
  const map = new FormulaParser(text, path).parse();
  const counts: Record<string, number> = {};
  let grams = 0;
  for (const [el, c] of map) {
    counts[el] = c;
    grams += c * (ATOMIC_WEIGHTS.get(el) as number);
  }
  return { text, counts, molarMass: grams / 1000 };
}

/** Molar mass in kg/mol of a formula (see parseFormula). */
export function molarMassOf(text: string, path: FieldPath = []): number {
  return parseFormula(text, path).molarMass;
}
