import { describe, expect, it } from 'vitest';
import { NodeStore, evaluate, type Node } from '../../src/kinetics/expression/ast';
import { parseExpression } from '../../src/kinetics/expression/parser';
import { compileBody, emitBody, formatNumber } from '../../src/kinetics/expression/codegen';

function setup() {
  const s = new NodeStore();
  const symbols = new Map<string, Node>([
    ['C_A', s.ppow(s.variable(0), s.num(1))],
    ['C_B', s.ppow(s.variable(1), s.num(1))],
    ['T', s.variable(2)],
    ['k1', s.variable(3)],
    ['E1', s.variable(4)],
  ]);
  const access = (v: number) => (v < 2 ? `C[${v}]` : v === 2 ? 'T' : `th[${v - 3}]`);
  return { s, parse: (t: string) => parseExpression(t, s, { symbols }), access };
}

describe('code generation', () => {
  it('computes a repeated subexpression once (CSE)', () => {
    const { parse, access } = setup();
    const term = 'k1*exp(-E1/(8.314*T))*C_A^0.5';
    for (const k of [2, 5, 12]) {
      const text = Array.from({ length: k }, (_, i) => `${i + 1}*${term}`).join(' + ');
      const body = emitBody([{ index: 0, node: parse(text) }], { access });
      expect(body.code.match(/M\.exp\(/g)?.length, body.code).toBe(1);
      expect(body.code.match(/ppow\(/g)?.length).toBe(1);
      expect(body.temporaries).toBeGreaterThanOrEqual(1);
    }
  });

  it('shares subexpressions across outputs', () => {
    const { parse, access } = setup();
    const shared = 'exp(-E1/T)';
    const body = emitBody(
      [
        { index: 0, node: parse(`k1*${shared}*C_A`) },
        { index: 1, node: parse(`k1*${shared}*C_B`) },
      ],
      { access },
    );
    expect(body.code.match(/M\.exp\(/g)?.length).toBe(1);
  });

  it('compiled functions agree with the interpreter', () => {
    const { parse, access } = setup();
    const exprs = ['k1*exp(-E1/(8.314*T))*C_A^0.5*C_B', 'k1*C_A/(1 + E1*C_B)^2 - min(C_A, C_B)', 'abs(C_A - C_B)*log10(T)'];
    const nodes = exprs.map(parse);
    const f = compileBody(emitBody(nodes.map((node, index) => ({ index, node })), { access }));
    const out = new Float64Array(3);
    const C = Float64Array.of(1.7, 0.3);
    const th = Float64Array.of(2.5, 1200);
    f(C, 450, th, out);
    nodes.forEach((n, i) => expect(out[i]).toBe(evaluate(n, [1.7, 0.3, 450, 2.5, 1200])));
    // negative concentrations are clipped to zero
    f(Float64Array.of(-1, 0.3), 450, th, out);
    expect(out[0]).toBe(0);
  });

  it('emits no user text: only numbers, fixed names and indexed accessors', () => {
    const { parse, access } = setup();
    const code = emitBody([{ index: 0, node: parse('k1*C_A^0.5 - E1*C_B/T') }], { access }).code;
    expect(code).not.toMatch(/k1|E1|C_A|C_B/);
    const tokens = code.match(/[A-Za-z_][A-Za-z0-9_]*/g) ?? [];
    const allowed = new Set(['const', 'out', 'C', 'T', 'th', 'M', 'pow', 'exp', 'log', 'log10', 'abs', 'min', 'max', 'pos', 'ppow', 'step', 'reg', 'sign', 'fill', 'e']);
    for (const t of tokens) expect(allowed.has(t) || /^t\d+$/.test(t), t).toBe(true);
  });

  it('formats numbers safely and refuses unsafe accessors', () => {
    expect(formatNumber(1.5)).toBe('1.5');
    expect(formatNumber(-2)).toBe('(-2)');
    expect(formatNumber(1e-30)).toBe('1e-30');
    expect(() => formatNumber(NaN)).toThrow();
    expect(() => formatNumber(Infinity)).toThrow();
    const s = new NodeStore();
    expect(() => emitBody([{ index: 0, node: s.variable(0) }], { access: () => 'process.exit()' })).toThrow(/unsafe/);
  });
});
