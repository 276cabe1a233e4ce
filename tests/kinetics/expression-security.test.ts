/**
 * Hostile rate expressions must fail with a typed error (never an uncaught exception, never code
 * execution), and fail fast even for huge or deeply nested input.
 */
import { afterAll, describe, expect, it } from 'vitest';
import { buildChemistry } from '../../src/chemistry/mechanism';
import { RateloomError } from '../../src/core/errors';
import { compileKinetics } from '../../src/kinetics/compile';
import { NodeStore, type Node } from '../../src/kinetics/expression/ast';
import { parseExpression } from '../../src/kinetics/expression/parser';

const chem = buildChemistry([{ name: 'A' }, { name: 'B' }], [{ id: 'r1', equation: 'A -> B' }]);
const g = globalThis as Record<string, unknown>;

function compileExpr(expression: string) {
  return compileKinetics({
    chemistry: chem,
    rates: [{ form: 'expression', expression }],
    parameterNames: ['k', 'a', 'x'],
    referenceTemperature: 500,
  });
}

function typedError(expression: string): RateloomError {
  try {
    compileExpr(expression);
  } catch (e) {
    expect(e, expression.slice(0, 80)).toBeInstanceOf(RateloomError);
    return e as RateloomError;
  }
  throw new Error(`accepted: ${expression.slice(0, 80)}`);
}

afterAll(() => {
  // none of the payloads may have run
  expect(g.pwned).toBeUndefined();
});

describe('expression security', () => {
  const forbidden: [string, number][] = [
    ['constructor', 1],
    ['process', 1],
    ['globalThis', 1],
    ['this', 1],
    ['__proto__', 1],
    ['k*constructor', 3],
    ['a.constructor', 2],
    ["x['y']", 2],
    ['x["y"]', 2],
    ['Function("return 1")()', 1],
    ['`x`', 1],
    ['k*`${globalThis.pwned=1}`', 3],
    ['globalThis.pwned = 1', 1],
    ['process.exit(1)', 1],
    ['(() => 1)()', 5], // the first lexical error: '='
    ['k; globalThis.pwned=1', 2],
    ['eval("1")', 1],
    ['k /* c */', 4],
    ['k // c', 4],
    ['require("fs")', 1],
    ['C_A.constructor.constructor("return process")()', 4],
    ['x\u2028+1', 2],
    ['new Function', 1],
    ['{}', 1],
    ['k || 1', 3],
    ['k ? 1 : 0', 3],
    ['k\\u0041', 2],
    ['__defineGetter__', 1],
  ];

  it.each(forbidden)('refuses %j with E_EXPRESSION at column %i', (text, col) => {
    const e = typedError(text);
    expect(e.code).toBe('E_EXPRESSION');
    expect(e.location?.column).toBe(col);
    expect(e.message).toContain(`column ${col}`);
    expect(e.path).toEqual(['reactions', 0, 'rate', 'expression']);
  });

  it('treats object-prototype names as ordinary unknown names', () => {
    for (const text of ['toString', 'valueOf', 'hasOwnProperty', 'isPrototypeOf', 'k*toString']) {
      const e = typedError(text);
      expect(['E_EXPRESSION', 'E_UNKNOWN_PARAMETER']).toContain(e.code);
      expect(e.location?.column).toBeGreaterThan(0);
    }
  });

  it('refuses a 1e6-character input by its length', () => {
    const e = typedError('k+'.repeat(500_000));
    expect(e.code).toBe('E_EXPRESSION');
    expect(e.message).toContain('limit is 10000');
  });

  it('refuses 1e5 nested parentheses', () => {
    const e = typedError('('.repeat(100_000) + 'k' + ')'.repeat(100_000));
    expect(e.code).toBe('E_EXPRESSION');
  });

  it('refuses deep nesting within the length limit by its depth', () => {
    for (const text of [
      '('.repeat(4000) + 'k' + ')'.repeat(4000),
      '-'.repeat(9000) + 'k',
      'k^'.repeat(4000) + 'k',
      'exp('.repeat(1500) + 'k' + ')'.repeat(1500),
    ]) {
      const e = typedError(text);
      expect(e.code).toBe('E_EXPRESSION');
      expect(e.message).toMatch(/nests deeper than 100 levels/);
    }
  });

  it('refuses overly long operator chains by tree height, not by stack overflow', () => {
    const e = typedError(Array.from({ length: 2400 }, () => 'k').join('+'));
    expect(e.code).toBe('E_EXPRESSION');
    expect(e.message).toContain('too large');
  });

  it('accepts a long but reasonable expression', () => {
    const text = Array.from({ length: 300 }, (_, i) => `${i + 1}*k*C_A^${(i % 7) / 2}`).join(' + ');
    const kin = compileExpr(text);
    const out = new Float64Array(1);
    kin.rates(Float64Array.of(2, 1), 500, Float64Array.of(1, 1, 1), out);
    expect(Number.isFinite(out[0])).toBe(true);
  });

  it('resolves names only through the symbol table (a Map), never JS scope', () => {
    const s = new NodeStore();
    const symbols = new Map<string, Node>([['x', s.variable(0)]]);
    for (const name of ['Math', 'Object', 'Array', 'console', 'setTimeout', 'window', 'undefined', 'NaN', 'Infinity']) {
      let thrown: unknown;
      try {
        parseExpression(name, s, { symbols });
      } catch (e) {
        thrown = e;
      }
      expect(thrown, name).toBeInstanceOf(RateloomError);
      expect((thrown as RateloomError).code).toBe('E_EXPRESSION');
    }
  });
});
