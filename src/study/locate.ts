/**
 * Find where a field path sits in JSON text (1-based line and column of the key, or of the value
 * for array items), so that study-file errors can point at the line. A single left-to-right scan
 * over text already known to be valid JSON.
 */
import type { FieldPath } from '../core/errors.js';

export interface TextPosition {
  line: number;
  column: number;
}

/** Position of `path` in `text`, or of its deepest existing ancestor; undefined for the root. */
export function locatePath(text: string, path: FieldPath): TextPosition | undefined {
  if (!path.length) return undefined;
  let i = 0;
  let line = 1;
  let lineStart = 0;
  const pos = (at: number): TextPosition => ({ line, column: at - lineStart + 1 });
  let best: TextPosition | undefined;
  const ws = () => {
    while (i < text.length) {
      const c = text[i];
      if (c === '\n') {
        line++;
        lineStart = i + 1;
      } else if (c !== ' ' && c !== '\t' && c !== '\r' && c !== '\uFEFF') break;
      i++;
    }
  };
  const str = (): string => {
    const start = i;
    i++;
    while (i < text.length && text[i] !== '"') i += text[i] === '\\' ? 2 : 1;
    i++;
    try {
      return JSON.parse(text.slice(start, i)) as string;
    } catch {
      return '';
    }
  };
  // Skip or descend into one value; `depth` = how many path segments matched so far.
  const value = (depth: number): void => {
    ws();
    const c = text[i];
    if (c === '{') {
      i++;
      ws();
      if (text[i] === '}') {
        i++;
        return;
      }
      for (;;) {
        ws();
        const keyAt = pos(i);
        const key = str();
        ws();
        i++; // ':'
        const match = depth >= 0 && depth < path.length && path[depth] === key;
        if (match) best = keyAt;
        value(match ? depth + 1 : -1);
        ws();
        if (text[i] === ',') {
          i++;
          continue;
        }
        i++; // '}'
        return;
      }
    }
    if (c === '[') {
      i++;
      ws();
      if (text[i] === ']') {
        i++;
        return;
      }
      for (let k = 0; ; k++) {
        ws();
        const match = depth >= 0 && depth < path.length && path[depth] === k;
        if (match) best = pos(i);
        value(match ? depth + 1 : -1);
        ws();
        if (text[i] === ',') {
          i++;
          continue;
        }
        i++; // ']'
        return;
      }
    }
    if (c === '"') {
      str();
      return;
    }
    while (i < text.length && !',}] \t\r\n'.includes(text[i])) i++;
  };
  value(0);
  return best;
}
