import { describe, expect, it } from 'vitest';
import { NodeStore, evaluate, type Node } from '../../src/kinetics/expression/ast';
import { parseExpression } from '../../src/kinetics/expression/parser';
import { differentiate } from '../../src/kinetics/expression/diff';
import { centralDiff, close } from './helpers';

function setup() {
  const s = new NodeStore();
  // x, y plain variables; c is a concentration (positive part), a an order
  const symbols = new Map<string, Node>([
    ['x', s.variable(0)],
    ['y', s.variable(1)],
    ['c', s.ppow(s.variable(2), s.num(1))],
    ['a', s.variable(3)],
  ]);
  return { s, parse: (t: string) => parseExpression(t, s, { symbols }) };
}

const EXPRESSIONS = [
  'x*y + x/y - y^3',
  'exp(-x/y)*sqrt(x)',
  'ln(x*y) + log10(x + y)',
  'x^y',
  'pow(y, x) / (1 + x^2)^2',
  'abs(x - 2*y) + min(x, y) + max(x^2, y)',
  'c^a * exp(x) / (1 + y*c)^2',
  'c^0.5 + c^1.5 + c^2 + c',
  '-(x - y)^2 / (x + y)',
  '2^-x + x^-2',
];

describe('symbolic differentiation', () => {
  it('matches central finite differences for every node kind', () => {
    const { s, parse } = setup();
    const points = [
      [1.3, 0.7, 2.1, 0.8],
      [0.4, 2.5, 0.9, 1.7],
      [3.1, 1.9, 5.5, 0.3],
    ];
    for (const text of EXPRESSIONS) {
      const f = parse(text);
      for (const p of points) {
        const x = Float64Array.from(p);
        for (let v = 0; v < 4; v++) {
          const d = differentiate(s, f, v);
          const an = evaluate(d, x);
          const fd = centralDiff((z) => Float64Array.of(evaluate(f, z)), x, v)[0];
          expect(close(an, fd, 1e-6, 1e-10), `${text} d/dv${v} at ${p}: ${an} vs ${fd}`).toBe(true);
        }
      }
    }
  });

  it('keeps concentration powers and their derivatives finite at and below zero', () => {
    const { s, parse } = setup();
    const f = parse('c^0.5');
    const dc = differentiate(s, f, 2);
    const da = differentiate(s, parse('c^a'), 3);
    for (const cv of [0, -1, 1e-40, 1e-20]) {
      const vars = [1, 1, cv, 0.5];
      expect(evaluate(f, vars)).toBe(cv > 0 ? Math.sqrt(cv) : 0);
      const d = evaluate(dc, vars);
      expect(Number.isFinite(d)).toBe(true);
      if (cv <= 0) expect(Math.abs(d)).toBe(0);
      // d(c^a)/da = c^a ln c, and 0 at c <= 0
      const g = evaluate(da, vars);
      expect(Number.isFinite(g)).toBe(true);
      if (cv <= 0) expect(Math.abs(g)).toBe(0);
    }
    // regularised slope just above zero: 0.5 * (1e-30)^(-0.5)
    expect(evaluate(dc, [1, 1, 1e-40, 0])).toBeCloseTo(0.5e15, 0);
  });

  it('is exact for integer orders near zero and matches one-sided differences of max(c,0)', () => {
    const { s, parse } = setup();
    const d = differentiate(s, parse('c^2 + 3*c'), 2);
    expect(evaluate(d, [0, 0, 1e-12, 0])).toBeCloseTo(3 + 2e-12, 20);
    expect(evaluate(d, [0, 0, -0.5, 0])).toBe(0);
  });

  it('differentiates a DAG once per node (memoised)', () => {
    const { s, parse } = setup();
    // 30 nested squarings: a tree of 2^30 paths but only 30 distinct nodes
    let f = parse('x');
    for (let i = 0; i < 30; i++) f = s.mul(f, f);
    const before = s.size;
    const d = differentiate(s, f, 0);
    expect(s.size - before).toBeLessThan(200);
    // d/dx x^(2^30) at x = 1 is 2^30
    expect(evaluate(d, [1, 0, 0, 0])).toBe(2 ** 30);
  });
});
