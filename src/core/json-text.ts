/**
 * Parse JSON text with an error that names the line and column of the first syntax error.
 *
 * Method: JSON.parse does the parsing; only when it fails, a single left-to-right scan with an
 * explicit container stack (no recursion, so any nesting depth is safe) follows the grammar of
 * RFC 8259 to find the offset of the first character that cannot continue a valid document. This
 * keeps the location independent of the wording of the engine's message (which, depending on the
 * Node version, may or may not carry a position).
 */
import { RateloomError } from './errors.js';
import { checkArgs, is } from './args.js';

/** A JSON syntax problem: 0-based offset into the text (BOM removed), 1-based line and column. */
export interface JsonSyntaxProblem {
  offset: number;
  line: number;
  column: number;
  problem: string;
}

const NUMBER_RE = /-?(?:0|[1-9]\d*)(?:\.\d+)?(?:[eE][+-]?\d+)?/y;
const ESCAPES = '"\\/bfnrtu';

function describe(c: string): string {
  const code = c.charCodeAt(0);
  if (code < 0x20 || code === 0x7f) return `control character U+${code.toString(16).padStart(4, '0').toUpperCase()}`;
  return `'${c}'`;
}

/**
 * The first syntax error of `text` (after an optional leading BOM), or undefined when the text is
 * one valid JSON document.
 */
export function findJsonSyntaxError(text: string): JsonSyntaxProblem | undefined {
  const s = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  const n = s.length;
  const stack: string[] = [];
  let state: 'value' | 'valueOrClose' | 'key' | 'keyOrClose' | 'colon' | 'after' = 'value';
  let i = 0;
  const at = (offset: number, problem: string): JsonSyntaxProblem => {
    let line = 1;
    let lineStart = 0;
    for (let k = 0; k < offset && k < n; k++) {
      if (s.charCodeAt(k) === 10) {
        line++;
        lineStart = k + 1;
      }
    }
    return { offset, line, column: offset - lineStart + 1, problem };
  };
  /** Scan a string starting at the quote at i; returns a problem or moves i past the closing quote. */
  const scanString = (): JsonSyntaxProblem | undefined => {
    const start = i;
    i++;
    for (;;) {
      if (i >= n) return at(start, 'string is never closed (missing ")');
      const c = s.charCodeAt(i);
      if (c === 34) {
        i++;
        return undefined;
      }
      if (c < 0x20) return at(i, `${describe(s[i])} inside a string (write it as an escape such as \\n)`);
      if (c === 92) {
        const e = s[i + 1];
        if (e === undefined || !ESCAPES.includes(e)) return at(i, `invalid escape '\\${e ?? ''}' in a string`);
        if (e === 'u') {
          if (!/^[0-9a-fA-F]{4}$/.test(s.slice(i + 2, i + 6))) return at(i, 'invalid \\u escape (needs 4 hex digits)');
          i += 6;
        } else i += 2;
        continue;
      }
      i++;
    }
  };
  for (;;) {
    while (i < n) {
      const c = s.charCodeAt(i);
      if (c !== 32 && c !== 9 && c !== 10 && c !== 13) break;
      i++;
    }
    if (i >= n) {
      if (state === 'after' && stack.length === 0) return undefined;
      return at(n, n === 0 || (state === 'value' && stack.length === 0) ? 'the file is empty (no JSON value)' : 'unexpected end of the file (something is not closed)');
    }
    const c = s[i];
    switch (state) {
      case 'value':
      case 'valueOrClose': {
        if (state === 'valueOrClose' && c === ']') {
          stack.pop();
          i++;
          state = 'after';
          break;
        }
        if (c === '{' || c === '[') {
          stack.push(c);
          i++;
          state = c === '{' ? 'keyOrClose' : 'valueOrClose';
          break;
        }
        if (c === '"') {
          const p = scanString();
          if (p) return p;
          state = 'after';
          break;
        }
        if (c === '-' || (c >= '0' && c <= '9')) {
          NUMBER_RE.lastIndex = i;
          if (!NUMBER_RE.test(s)) return at(i, 'invalid number');
          i = NUMBER_RE.lastIndex;
          state = 'after';
          break;
        }
        const lit = ['true', 'false', 'null'].find((w) => s.startsWith(w, i));
        if (lit) {
          i += lit.length;
          state = 'after';
          break;
        }
        return at(i, `unexpected ${describe(c)} where a value should be (strings need double quotes; NaN, Infinity and comments are not JSON)`);
      }
      case 'key':
      case 'keyOrClose': {
        if (state === 'keyOrClose' && c === '}') {
          stack.pop();
          i++;
          state = 'after';
          break;
        }
        if (c === '"') {
          const p = scanString();
          if (p) return p;
          state = 'colon';
          break;
        }
        return at(i, `unexpected ${describe(c)} where a double-quoted property name should be${state === 'key' ? ' (a trailing comma?)' : ''}`);
      }
      case 'colon':
        if (c !== ':') return at(i, `expected ':' after the property name, found ${describe(c)}`);
        i++;
        state = 'value';
        break;
      case 'after': {
        const top = stack[stack.length - 1];
        if (top === undefined) return at(i, `unexpected ${describe(c)} after the end of the JSON value`);
        const close = top === '{' ? '}' : ']';
        if (c === ',') {
          i++;
          state = top === '{' ? 'key' : 'value';
        } else if (c === close) {
          stack.pop();
          i++;
        } else return at(i, `expected ',' or '${close}', found ${describe(c)} (a missing comma?)`);
        break;
      }
    }
  }
}

/**
 * Parse JSON text (a leading BOM is ignored). A syntax error throws E_JSON naming the file, line
 * and column, what was wrong there, and how to fix it.
 * @param what how the file is called in the message, e.g. 'study file'
 */
export function parseJsonText(text: string, file: string, what = 'JSON file'): unknown {
  checkArgs('parseJsonText', [text, file, what], [{ name: 'text', check: is.text }, { name: 'file', check: is.text }, { name: 'what', check: is.text }]);
  const clean = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  const deep = tooDeepAt(clean, MAX_JSON_DEPTH);
  if (deep !== undefined) {
    const p = lineColumn(clean, deep);
    throw new RateloomError('E_JSON', `${what} nests objects and arrays more than ${MAX_JSON_DEPTH} levels deep`, {
      location: { file, line: p.line, column: p.column },
      fix: `Flatten the document: a rateloom file needs far fewer than ${MAX_JSON_DEPTH} levels.`,
    });
  }
  try {
    return JSON.parse(clean);
  } catch (e) {
    const p = findJsonSyntaxError(clean);
    const problem = p ? p.problem : (e as Error).message.split('\n')[0];
    throw new RateloomError('E_JSON', `${what} is not valid JSON: ${problem}`, {
      location: { file, ...(p ? { line: p.line, column: p.column } : {}) },
      fix: p ? `Correct the JSON at line ${p.line}, column ${p.column}; a JSON checker in your editor shows the exact spot.` : 'Correct the JSON syntax.',
    });
  }
}

/** Deepest nesting of objects and arrays accepted in a JSON input (study, case, hand-off files). */
export const MAX_JSON_DEPTH = 64;

/** 1-based line and column of a 0-based offset. */
function lineColumn(s: string, offset: number): { line: number; column: number } {
  let line = 1;
  let lineStart = 0;
  for (let k = s.indexOf('\n'); k >= 0 && k < offset; k = s.indexOf('\n', k + 1)) {
    line++;
    lineStart = k + 1;
  }
  return { line, column: offset - lineStart + 1 };
}

/**
 * Offset of the first '[' or '{' that opens a container deeper than `limit` (strings skipped), or
 * undefined. One loop, no recursion: safe on any input before JSON.parse and the recursive walks
 * that follow it see the document.
 */
export function tooDeepAt(s: string, limit: number): number | undefined {
  let depth = 0;
  for (let i = 0; i < s.length; i++) {
    const c = s.charCodeAt(i);
    if (c === 34) {
      for (i++; i < s.length && s.charCodeAt(i) !== 34; i++) if (s.charCodeAt(i) === 92) i++;
    } else if (c === 91 || c === 123) {
      if (++depth > limit) return i;
    } else if (c === 93 || c === 125) depth--;
  }
  return undefined;
}
