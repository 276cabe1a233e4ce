/**
 * Tokenizer of the rate-expression language: numbers (1, 1.5, .5, 1e-3), identifiers
 * ([A-Za-z_][A-Za-z0-9_]*), the operators + - * / ^, parentheses and commas. Every other
 * character is refused with an E_EXPRESSION error naming its 1-based column, with a specific
 * explanation for the characters that would give access to JavaScript (member access '.',
 * brackets, quotes and backticks, assignment). The tokenizer is a single left-to-right scan,
 * linear in the input length.
 */
import { RateloomError, type FieldPath } from '../../core/errors.js';

export type Token =
  | { readonly kind: 'num'; readonly value: number; readonly text: string; readonly col: number }
  | { readonly kind: 'ident'; readonly text: string; readonly col: number }
  | { readonly kind: 'op'; readonly text: '+' | '-' | '*' | '/' | '^' | '(' | ')' | ','; readonly col: number }
  | { readonly kind: 'end'; readonly col: number };

/** Default longest expression accepted, characters. */
export const MAX_EXPRESSION_LENGTH = 10_000;

/** Throw an E_EXPRESSION error for `text` at 1-based `column`. */
export function expressionError(text: string, problem: string, column: number, path: FieldPath, fix?: string): never {
  const shown = text.length > 60 ? `${text.slice(0, 57)}...` : text;
  throw new RateloomError('E_EXPRESSION', `expression '${shown}': ${problem} at column ${column}`, {
    path,
    location: { column },
    ...(fix ? { fix } : {}),
  });
}

/** Names refused outright: they would mean something in JavaScript, and nothing in a rate law. */
export const RESERVED = new Set([
  'constructor', '__proto__', 'prototype', 'process', 'globalThis', 'global', 'window', 'self', 'this',
  'Function', 'eval', 'require', 'import', 'module', 'exports', 'Reflect', 'Proxy', 'Object', 'Symbol',
  'new', 'return', 'function', 'var', 'let', 'const', 'class', 'arguments', 'async', 'await', 'yield',
  'delete', 'typeof', 'instanceof', 'void', 'with', 'Math', 'setTimeout', 'setInterval', 'fetch',
]);

const NUMBER_RE = /(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?/y;
const IDENT_RE = /[A-Za-z_][A-Za-z0-9_]*/y;

function isDigit(c: string): boolean {
  return c >= '0' && c <= '9';
}

/** Split an expression into tokens; the last token is always `end`. */
export function tokenize(text: string, path: FieldPath = [], maxLength = MAX_EXPRESSION_LENGTH): Token[] {
  if (typeof text !== 'string') {
    throw new RateloomError('E_EXPRESSION', 'the rate expression must be a string', { path });
  }
  if (text.length > maxLength) {
    throw new RateloomError(
      'E_EXPRESSION',
      `expression is ${text.length} characters long; the limit is ${maxLength} at column ${maxLength + 1}`,
      { path, location: { column: maxLength + 1 }, fix: 'Shorten the expression, for example by defining parameters.' },
    );
  }
  const toks: Token[] = [];
  let i = 0;
  while (i < text.length) {
    const c = text[i];
    const col = i + 1;
    if (c === ' ' || c === '\t' || c === '\n' || c === '\r') {
      i++;
      continue;
    }
    if (isDigit(c) || (c === '.' && isDigit(text[i + 1] ?? ''))) {
      NUMBER_RE.lastIndex = i;
      const m = NUMBER_RE.exec(text) as RegExpExecArray;
      const end = i + m[0].length;
      const next = text[end] ?? '';
      if (next === '.' || /[A-Za-z_0-9]/.test(next)) {
        expressionError(text, `malformed number '${text.slice(i, end + 1)}'`, col, path, 'Write numbers as 2, 0.5 or 1e-3 and put an operator between a number and a name (2*x, not 2x).');
      }
      const value = Number(m[0]);
      if (!Number.isFinite(value)) expressionError(text, `number '${m[0]}' is out of range`, col, path);
      toks.push({ kind: 'num', value, text: m[0], col });
      i = end;
      continue;
    }
    if (/[A-Za-z_]/.test(c)) {
      IDENT_RE.lastIndex = i;
      const m = IDENT_RE.exec(text) as RegExpExecArray;
      if (RESERVED.has(m[0]) || m[0].startsWith('__')) {
        expressionError(text, `'${m[0]}' is not allowed in a rate expression`, col, path, 'Use only species concentrations (C_<name>), partial pressures (p_<name>), T, R, T_ref, parameter names and the functions exp, ln, log10, sqrt, abs, min, max, pow.');
      }
      toks.push({ kind: 'ident', text: m[0], col });
      i += m[0].length;
      continue;
    }
    switch (c) {
      case '+':
      case '-':
      case '/':
      case '^':
      case '(':
      case ')':
      case ',':
        toks.push({ kind: 'op', text: c, col });
        i++;
        continue;
      case '*':
        if (text[i + 1] === '*') expressionError(text, "'**' is not an operator", col, path, "Use '^' for powers, for example C_A^2.");
        toks.push({ kind: 'op', text: '*', col });
        i++;
        continue;
      case '.':
        expressionError(text, "member access '.' is not allowed", col, path);
      // falls through (unreachable: expressionError throws)
      case '[':
      case ']':
      case '{':
      case '}':
        expressionError(text, `brackets '${c}' are not allowed`, col, path, 'Use round parentheses for grouping.');
      // falls through
      case '"':
      case "'":
      case '`':
        expressionError(text, 'strings are not allowed', col, path);
      // falls through
      case '=':
        expressionError(text, "assignment and comparison ('=') are not allowed", col, path, 'Give only the right-hand side of the rate, for example k1*C_A.');
      // falls through
      case ';':
        expressionError(text, "statements (';') are not allowed", col, path);
      // falls through
      default: {
        const shown = c.charCodeAt(0) < 32 ? `\\u${c.charCodeAt(0).toString(16).padStart(4, '0')}` : c;
        expressionError(text, `character '${shown}' is not allowed`, col, path);
      }
    }
  }
  toks.push({ kind: 'end', col: text.length + 1 });
  return toks;
}
