import { describe, expect, it } from 'vitest';
import { NodeStore, evaluate, type Node } from '../../src/kinetics/expression/ast';
import { parseExpression } from '../../src/kinetics/expression/parser';
import { err } from './helpers';

function setup() {
  const s = new NodeStore();
  const symbols = new Map<string, Node>([
    ['x', s.variable(0)],
    ['y', s.variable(1)],
    ['k_1', s.variable(2)],
  ]);
  const parse = (text: string) => parseExpression(text, s, { symbols });
  const val = (text: string, x = 2, y = 3, k = 5) => evaluate(parse(text), [x, y, k]);
  return { s, parse, val };
}

describe('expression parser', () => {
  it('follows ordinary precedence and associativity', () => {
    const { val } = setup();
    expect(val('1 + 2*3')).toBe(7);
    expect(val('(1 + 2)*3')).toBe(9);
    expect(val('1 - 2 - 3')).toBe(-4);
    expect(val('8/4/2')).toBe(1);
    expect(val('2^3^2')).toBe(512); // right associative
    expect(val('-x^2')).toBe(-4); // -(x^2)
    expect(val('(-x)^2')).toBe(4);
    expect(val('2^-1')).toBe(0.5);
    expect(val('--x')).toBe(2);
    expect(val('+x')).toBe(2);
    expect(val('x*y/k_1')).toBeCloseTo(1.2, 15);
    expect(val('1.5e-3*1e3 + .5')).toBeCloseTo(2, 15);
  });

  it('evaluates the whitelisted functions', () => {
    const { val } = setup();
    expect(val('exp(x)')).toBeCloseTo(Math.exp(2), 14);
    expect(val('log(x)')).toBeCloseTo(Math.log(2), 15);
    expect(val('ln(x)')).toBeCloseTo(Math.log(2), 15);
    expect(val('log10(100*x)')).toBeCloseTo(Math.log10(200), 15);
    expect(val('sqrt(y)')).toBeCloseTo(Math.sqrt(3), 15);
    expect(val('abs(x - y)')).toBe(1);
    expect(val('min(x, y)')).toBe(2);
    expect(val('max(x, y, k_1, 1)')).toBe(5);
    expect(val('pow(x, y)')).toBe(8);
  });

  it('hash-conses equal subtrees into one node', () => {
    const { parse } = setup();
    const a = parse('exp(x*y) + 1');
    const b = parse('1 + exp(y*x)');
    expect(a.id).toBe(b.id);
    const c = parse('sqrt(x) * sqrt(x)');
    expect(c.kind).toBe('mul');
    if (c.kind === 'mul') expect(c.a.id).toBe(c.b.id);
  });

  it('folds constants and applies identities', () => {
    const { parse, s } = setup();
    expect(parse('2*3 + 1')).toBe(s.num(7));
    expect(parse('x*0')).toBe(s.num(0));
    expect(parse('x*1')).toBe(s.variable(0));
    expect(parse('0 + x')).toBe(s.variable(0));
    expect(parse('x^1')).toBe(s.variable(0));
    expect(parse('x^0')).toBe(s.num(1));
    expect(parse('x - x')).toBe(s.num(0));
    expect(parse('exp(ln(x))')).toBe(s.variable(0));
    expect(parse('x + x').kind).toBe('mul');
    // a non-finite fold is kept as a node (evaluates to the IEEE result at run time)
    expect(parse('1/0').kind).toBe('div');
  });

  it('reports errors with their column', () => {
    const { parse } = setup();
    const cases: [string, number, string][] = [
      ['x + ', 5, 'expected a number'],
      ['x + z', 5, "unknown name 'z'"],
      ['2x', 1, 'malformed number'],
      ['x y', 3, "unexpected 'y'"],
      ['(x + y', 7, 'not closed'],
      ['x + y)', 6, "unmatched ')'"],
      ['foo(x)', 1, "unknown function 'foo'"],
      ['exp(x, y)', 1, 'takes 1 argument'],
      ['exp()', 5, 'needs an argument'],
      ['exp', 1, 'must be called with parentheses'],
      ['x ** 2', 3, "'**'"],
      ['x = 1', 3, 'assignment'],
      ['1.2.3', 1, 'malformed number'],
      ['x; y', 2, 'statements'],
      ['x # y', 3, "character '#'"],
    ];
    for (const [text, col, msg] of cases) {
      const e = err(() => parse(text));
      expect(e.code, text).toBe('E_EXPRESSION');
      expect(e.location?.column, text).toBe(col);
      expect(e.message, text).toContain(msg);
      expect(e.message, text).toContain(`column ${col}`);
    }
    expect(err(() => parse('x + k1')).message).toContain("did you mean 'k_1'");
    expect(err(() => parse('expp(x)')).message).toContain("did you mean 'exp'");
  });
});
