/**
 * Reaction equations: 'A + 2 B <=> C' (reversible), 'A -> B' (irreversible), decimal coefficients
 * ('0.5 O2'). A small tokenizer and a two-sided term list; a species repeated on one side has its
 * coefficients summed. Errors name the 1-based column of the offending token.
 */
import { RateloomError, closestName, type FieldPath } from '../core/errors.js';
import { checkArgs, is } from '../core/args.js';

/** One species with its (positive) stoichiometric coefficient on one side of an equation. */
export interface EquationTerm {
  readonly species: string;
  readonly coefficient: number;
}

export interface ParsedEquation {
  /** True for '<=>', false for '->'. */
  readonly reversible: boolean;
  readonly reactants: readonly EquationTerm[];
  readonly products: readonly EquationTerm[];
}

/** Longest equation text accepted (characters). */
const MAX_EQUATION_LENGTH = 2000;

type Tok =
  | { kind: 'num'; value: number; text: string; col: number }
  | { kind: 'name'; text: string; col: number }
  | { kind: 'plus'; col: number }
  | { kind: 'arrow'; reversible: boolean; col: number };

function fail(text: string, problem: string, column: number, path: FieldPath, fix?: string): never {
  throw new RateloomError('E_EQUATION', `equation '${text}': ${problem} at column ${column}`, {
    path,
    location: { column },
    ...(fix ? { fix } : {}),
  });
}

function tokenize(text: string, path: FieldPath): Tok[] {
  const toks: Tok[] = [];
  let i = 0;
  while (i < text.length) {
    const ch = text[i];
    const col = i + 1;
    if (ch === ' ' || ch === '\t') {
      i++;
    } else if (text.startsWith('<=>', i)) {
      toks.push({ kind: 'arrow', reversible: true, col });
      i += 3;
    } else if (text.startsWith('->', i)) {
      toks.push({ kind: 'arrow', reversible: false, col });
      i += 2;
    } else if (ch === '+') {
      toks.push({ kind: 'plus', col });
      i++;
    } else if ((ch >= '0' && ch <= '9') || ch === '.') {
      const m = /^(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?/.exec(text.slice(i));
      if (!m) fail(text, `malformed number`, col, path);
      toks.push({ kind: 'num', value: Number(m[0]), text: m[0], col });
      i += m[0].length;
    } else if (/[A-Za-z]/.test(ch)) {
      const m = /^[A-Za-z][A-Za-z0-9_]*/.exec(text.slice(i)) as RegExpExecArray;
      toks.push({ kind: 'name', text: m[0], col });
      i += m[0].length;
    } else if (text.startsWith('<->', i) || text.startsWith('=>', i) || ch === '=' || ch === '<' || ch === '>') {
      fail(text, `unsupported arrow`, col, path, "Use '<=>' for a reversible reaction or '->' for an irreversible one.");
    } else {
      fail(text, `unexpected character '${ch}'`, col, path);
    }
  }
  return toks;
}

/**
 * Parse a reaction equation.
 * @param text equation such as 'A + 2 B <=> C'.
 * @param species the declared species names; when given, an unknown name is an E_UNKNOWN_SPECIES
 *   error naming the closest declared name.
 * @param path field path used in error messages.
 */
export function parseEquation(text: string, species?: readonly string[], path: FieldPath = []): ParsedEquation {
  checkArgs('parseEquation', [text, species], [{ name: 'text', check: is.text }, { name: 'species', check: is.optional(is.stringList) }]);
  if (typeof text !== 'string' || text.trim() === '') {
    throw new RateloomError('E_EQUATION', 'the equation is empty', { path });
  }
  if (text.length > MAX_EQUATION_LENGTH) {
    throw new RateloomError('E_EQUATION', `the equation is longer than ${MAX_EQUATION_LENGTH} characters`, { path });
  }
  const toks = tokenize(text, path);
  const arrows = toks.filter((t) => t.kind === 'arrow');
  if (arrows.length === 0) {
    fail(text, 'no reaction arrow', text.length + 1, path);
  }
  if (arrows.length > 1) fail(text, 'more than one reaction arrow', arrows[1].col, path);
  const known = species ? new Set(species) : undefined;

  const sides: Map<string, number>[] = [new Map(), new Map()];
  let side = 0;
  let i = 0;
  const endCol = text.length + 1;
  // state machine: expect a term at the start of each side and after '+'
  for (;;) {
    // one term
    let coef = 1;
    let t = toks[i];
    if (t === undefined || t.kind === 'arrow' || t.kind === 'plus') {
      fail(text, side === 0 ? 'missing reactant' : 'missing product', t ? t.col : endCol, path);
    }
    if (t.kind === 'num') {
      coef = t.value;
      if (!(coef > 0) || !Number.isFinite(coef)) fail(text, `coefficient '${t.text}' must be a positive number`, t.col, path);
      i++;
      t = toks[i];
      if (t === undefined || t.kind !== 'name') fail(text, 'a species name must follow the coefficient', t ? t.col : endCol, path);
    }
    if (known && !known.has(t.text)) {
      const near = closestName(t.text, known);
      throw new RateloomError(
        'E_UNKNOWN_SPECIES',
        `equation '${text}': unknown species '${t.text}' at column ${t.col}${near ? ` (did you mean '${near}'?)` : ''}`,
        {
          path,
          location: { column: t.col },
          fix: near ? `Write '${near}' or declare '${t.text}' in the species list.` : `Declare '${t.text}' in the species list.`,
          details: { species: t.text, ...(near ? { closest: near } : {}) },
        },
      );
    }
    const m = sides[side];
    m.set(t.text, (m.get(t.text) ?? 0) + coef);
    i++;
    const next = toks[i];
    if (next === undefined) {
      if (side === 0) fail(text, 'no reaction arrow', endCol, path);
      break;
    }
    if (next.kind === 'plus') {
      i++;
      continue;
    }
    if (next.kind === 'arrow') {
      side = 1;
      i++;
      continue;
    }
    fail(text, `expected '+' or an arrow before '${next.kind === 'name' ? next.text : (next as { text: string }).text}'`, next.col, path);
  }
  const toTerms = (m: Map<string, number>): EquationTerm[] =>
    [...m].map(([s, c]) => ({ species: s, coefficient: c }));
  return {
    reversible: (arrows[0] as { reversible: boolean }).reversible,
    reactants: toTerms(sides[0]),
    products: toTerms(sides[1]),
  };
}

/** The equation written back in a normal form: '2 A + B <=> C'. */
export function formatEquation(eq: ParsedEquation): string {
  const side = (ts: readonly EquationTerm[]) =>
    ts.map((t) => (t.coefficient === 1 ? t.species : `${t.coefficient} ${t.species}`)).join(' + ');
  return `${side(eq.reactants)} ${eq.reversible ? '<=>' : '->'} ${side(eq.products)}`;
}
