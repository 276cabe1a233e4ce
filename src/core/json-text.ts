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
const LITERALS = ['true', 'false', 'null'] as const;

function describe(c: string): string {
  const code = c.charCodeAt(0);
  if (code < 0x20 || code === 0x7f) return `control character U+${code.toString(16).padStart(4, '0').toUpperCase()}`;
  return `'${c}'`;
}

/** Where the scan expects to be: the grammar position between two tokens. */
type ScanState = 'value' | 'valueOrClose' | 'key' | 'keyOrClose' | 'colon' | 'after';

/** The scan's position: text (BOM removed), offset of the next character, open containers. */
interface JsonScan {
  readonly s: string;
  i: number;
  state: ScanState;
  /** Opening brackets ('{' or '[') of the containers not yet closed, outermost first. */
  readonly stack: string[];
}

/** The problem record for `offset` of the scanned text. */
function problemAt(scan: JsonScan, offset: number, problem: string): JsonSyntaxProblem {
  return { offset, ...lineColumn(scan.s, offset), problem };
}

/**
 * The first syntax error of `text` (after an optional leading BOM), or undefined when the text is
 * one valid JSON document.
 */
export function findJsonSyntaxError(text: string): JsonSyntaxProblem | undefined {
  const scan: JsonScan = { s: text.charCodeAt(0) === 0xfeff ? text.slice(1) : text, i: 0, state: 'value', stack: [] };
  for (;;) {
    skipWhitespace(scan);
    if (scan.i >= scan.s.length) return endOfText(scan);
    const problem = scanToken(scan, scan.s[scan.i]);
    if (problem) return problem;
  }
}

function skipWhitespace(scan: JsonScan): void {
  const { s } = scan;
  while (scan.i < s.length) {
    const c = s.charCodeAt(scan.i);
    if (c !== 32 && c !== 9 && c !== 10 && c !== 13) return;
    scan.i++;
  }
}

/** The text ended: fine after one complete value, else the empty-file or not-closed problem. */
function endOfText(scan: JsonScan): JsonSyntaxProblem | undefined {
  const n = scan.s.length;
  if (scan.state === 'after' && scan.stack.length === 0) return undefined;
  const empty = n === 0 || (scan.state === 'value' && scan.stack.length === 0);
  return problemAt(scan, n, empty ? 'the file is empty (no JSON value)' : 'unexpected end of the file (something is not closed)');
}

/** Scan the token starting with `c` at scan.i in the current state; a problem or undefined. */
function scanToken(scan: JsonScan, c: string): JsonSyntaxProblem | undefined {
  switch (scan.state) {
    case 'value':
    case 'valueOrClose':
      return scanValue(scan, c);
    case 'key':
    case 'keyOrClose':
      return scanKey(scan, c);
    case 'colon':
      if (c !== ':') return problemAt(scan, scan.i, `expected ':' after the property name, found ${describe(c)}`);
      scan.i++;
      scan.state = 'value';
      return undefined;
    case 'after':
      return scanAfterValue(scan, c);
  }
}

/** Close the innermost container at scan.i; a complete value follows. */
function closeContainer(scan: JsonScan): void {
  scan.stack.pop();
  scan.i++;
  scan.state = 'after';
}

/** A value (or, in an array just opened, its closing ']'). */
function scanValue(scan: JsonScan, c: string): JsonSyntaxProblem | undefined {
  const { s, i } = scan;
  if (scan.state === 'valueOrClose' && c === ']') {
    closeContainer(scan);
    return undefined;
  }
  if (c === '{' || c === '[') {
    scan.stack.push(c);
    scan.i++;
    scan.state = c === '{' ? 'keyOrClose' : 'valueOrClose';
    return undefined;
  }
  if (c === '"') {
    scan.state = 'after';
    return scanString(scan);
  }
  if (c === '-' || (c >= '0' && c <= '9')) {
    NUMBER_RE.lastIndex = i;
    if (!NUMBER_RE.test(s)) return problemAt(scan, i, 'invalid number');
    scan.i = NUMBER_RE.lastIndex;
    scan.state = 'after';
    return undefined;
  }
  const literal = LITERALS.find((w) => s.startsWith(w, i));
  if (!literal) return problemAt(scan, i, `unexpected ${describe(c)} where a value should be (strings need double quotes; NaN, Infinity and comments are not JSON)`);
  scan.i += literal.length;
  scan.state = 'after';
  return undefined;
}

/** A property name (or, in an object just opened, its closing '}'). */
function scanKey(scan: JsonScan, c: string): JsonSyntaxProblem | undefined {
  if (scan.state === 'keyOrClose' && c === '}') {
    closeContainer(scan);
    return undefined;
  }
  if (c === '"') {
    scan.state = 'colon';
    return scanString(scan);
  }
  const hint = scan.state === 'key' ? ' (a trailing comma?)' : '';
  return problemAt(scan, scan.i, `unexpected ${describe(c)} where a double-quoted property name should be${hint}`);
}

/** After a complete value: ',' or the closing bracket of the innermost container, or nothing. */
function scanAfterValue(scan: JsonScan, c: string): JsonSyntaxProblem | undefined {
  const top = scan.stack[scan.stack.length - 1];
  if (top === undefined) return problemAt(scan, scan.i, `unexpected ${describe(c)} after the end of the JSON value`);
  const close = top === '{' ? '}' : ']';
  if (c === ',') {
    scan.i++;
    scan.state = top === '{' ? 'key' : 'value';
  } else if (c === close) closeContainer(scan);
  else return problemAt(scan, scan.i, `expected ',' or '${close}', found ${describe(c)} (a missing comma?)`);
  return undefined;
}

/** Scan a string starting at the quote at scan.i; returns a problem or moves past the closing quote. */
function scanString(scan: JsonScan): JsonSyntaxProblem | undefined {
  const { s } = scan;
  const start = scan.i;
  let i = start + 1;
  for (;;) {
    if (i >= s.length) return problemAt(scan, start, 'string is never closed (missing ")');
    const c = s.charCodeAt(i);
    if (c === 34) {
      scan.i = i + 1;
      return undefined;
    }
    if (c < 0x20) return problemAt(scan, i, `${describe(s[i])} inside a string (write it as an escape such as \\n)`);
    if (c === 92) {
      const e = s[i + 1];
      if (e === undefined || !ESCAPES.includes(e)) return problemAt(scan, i, `invalid escape '\\${e ?? ''}' in a string`);
      if (e === 'u' && !/^[0-9a-fA-F]{4}$/.test(s.slice(i + 2, i + 6))) return problemAt(scan, i, 'invalid \\u escape (needs 4 hex digits)');
      i += e === 'u' ? 6 : 2;
    } else i++;
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
    // The locator strips the one leading BOM itself: give it the original text, not `clean`, or a
    // second BOM would be stripped and a document JSON.parse rejects would look valid to it.
    const p = findJsonSyntaxError(text);
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
