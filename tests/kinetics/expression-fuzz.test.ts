/**
 * Property tests (fast-check): arbitrary strings either compile or fail with a typed error and a
 * column; random well-formed expressions that are defined for positive inputs compile, agree with
 * a direct evaluation, and give finite rates and Jacobians (never NaN).
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { buildChemistry } from '../../src/chemistry/mechanism';
import { RateloomError } from '../../src/core/errors';
import { compileKinetics } from '../../src/kinetics/compile';

const chem = buildChemistry([{ name: 'A' }, { name: 'B' }], [{ id: 'r1', equation: 'A -> B' }]);
const parameterNames = ['k', 'E'];

function compileExpr(expression: string) {
  return compileKinetics({ chemistry: chem, rates: [{ form: 'expression', expression }], parameterNames, referenceTemperature: 500 });
}

interface Env {
  A: number;
  B: number;
  k: number;
  E: number;
  T: number;
}
interface Gen {
  text: string;
  f: (e: Env) => number;
}

const leaf: fc.Arbitrary<Gen> = fc.oneof(
  fc.double({ min: 0.1, max: 10, noNaN: true }).map((v) => ({ text: String(v), f: () => v })),
  fc.constantFrom<Gen>(
    { text: 'C_A', f: (e) => e.A },
    { text: 'C_B', f: (e) => e.B },
    { text: 'k', f: (e) => e.k },
    { text: 'E', f: (e) => e.E },
    { text: 'T', f: (e) => e.T / 100 },
  ).map((g) => (g.text === 'T' ? { text: '(T/100)', f: g.f } : g)),
);

/** Expressions closed over positive values: every sub-expression is positive for positive inputs. */
const positiveExpr: fc.Arbitrary<Gen> = fc.letrec<{ e: Gen }>((tie) => ({
  e: fc.oneof(
    { depthSize: 'small', withCrossShrink: true },
    leaf,
    fc.tuple(tie('e'), tie('e')).map(([a, b]) => ({ text: `(${a.text} + ${b.text})`, f: (x: Env) => a.f(x) + b.f(x) })),
    fc.tuple(tie('e'), tie('e')).map(([a, b]) => ({ text: `${a.text}*${b.text}`, f: (x: Env) => a.f(x) * b.f(x) })),
    fc.tuple(tie('e'), tie('e')).map(([a, b]) => ({ text: `${a.text}/(${b.text})`, f: (x: Env) => a.f(x) / b.f(x) })),
    fc
      .tuple(tie('e'), fc.double({ min: -2, max: 2, noNaN: true }))
      .map(([a, p]) => ({ text: `(${a.text})^(${p})`, f: (x: Env) => Math.pow(a.f(x), p) })),
    tie('e').map((a) => ({ text: `sqrt(${a.text})`, f: (x: Env) => Math.sqrt(a.f(x)) })),
    tie('e').map((a) => ({ text: `exp(-${a.text})`, f: (x: Env) => Math.exp(-a.f(x)) })),
    tie('e').map((a) => ({ text: `ln(1 + ${a.text})`, f: (x: Env) => Math.log(1 + a.f(x)) })),
    tie('e').map((a) => ({ text: `log10(10 + ${a.text})`, f: (x: Env) => Math.log10(10 + a.f(x)) })),
    fc.tuple(tie('e'), tie('e')).map(([a, b]) => ({ text: `max(${a.text}, ${b.text})`, f: (x: Env) => Math.max(a.f(x), b.f(x)) })),
    fc.tuple(tie('e'), tie('e')).map(([a, b]) => ({ text: `min(${a.text}, ${b.text})`, f: (x: Env) => Math.min(a.f(x), b.f(x)) })),
    fc.tuple(tie('e'), tie('e')).map(([a, b]) => ({ text: `(abs(${a.text} - ${b.text}) + 1)`, f: (x: Env) => Math.abs(a.f(x) - b.f(x)) + 1 })),
    fc.tuple(tie('e'), tie('e')).map(([a, b]) => ({ text: `pow(${a.text}, 1/(1 + ${b.text}))`, f: (x: Env) => Math.pow(a.f(x), 1 / (1 + b.f(x))) })),
  ),
})).e;

const exprChars = fc.constantFrom(...'0123456789.eE+-*/^(),_ CApTkRxyz'.split(''), 'exp(', 'ln(', 'C_A', 'C_B', 'p_A', 'T_ref', 'min(', '[', '.', '`', '"', '\u00e9', '\u2028', 'constructor');

describe('expression fuzzing', () => {
  it('any string compiles or fails with a typed error carrying a column', () => {
    let tried = 0;
    let compiled = 0;
    const check = (text: string) => {
      tried++;
      try {
        const kin = compileExpr(text);
        compiled++;
        const out = new Float64Array(1);
        kin.rates(Float64Array.of(1, 2), 500, Float64Array.of(1, 2), out);
      } catch (e) {
        expect(e).toBeInstanceOf(RateloomError);
        const col = (e as RateloomError).location?.column;
        expect(typeof col === 'number' && col >= 1 && col <= text.length + 1, `${text} -> ${(e as Error).message}`).toBe(true);
      }
    };
    fc.assert(fc.property(fc.string({ maxLength: 60 }), check), { numRuns: 1500 });
    fc.assert(fc.property(fc.array(exprChars, { maxLength: 30 }).map((a) => a.join('')), check), { numRuns: 3000 });
    fc.assert(fc.property(fc.string({ unit: 'binary', maxLength: 40 }), check), { numRuns: 500 });
    console.log(`expression fuzz (strings): ${tried} inputs tried, ${compiled} compiled, ${tried - compiled} refused with typed errors`);
    expect(tried).toBe(5000);
  });

  it('random valid expressions compile, match direct evaluation and give no NaN on positive inputs', () => {
    let tried = 0;
    const env = fc.record({
      A: fc.double({ min: 0.1, max: 10, noNaN: true }),
      B: fc.double({ min: 0.1, max: 10, noNaN: true }),
      k: fc.double({ min: 0.1, max: 10, noNaN: true }),
      E: fc.double({ min: 0.1, max: 10, noNaN: true }),
      T: fc.double({ min: 300, max: 900, noNaN: true }),
    });
    fc.assert(
      fc.property(positiveExpr, env, (g, x) => {
        tried++;
        const kin = compileExpr(g.text);
        const C = Float64Array.of(x.A, x.B);
        const th = Float64Array.of(x.k, x.E);
        const r = new Float64Array(1);
        const jc = new Float64Array(2);
        const jp = new Float64Array(2);
        kin.rates(C, x.T, th, r);
        kin.ratesJacC(C, x.T, th, jc);
        kin.ratesJacP(C, x.T, th, jp);
        const want = g.f(x);
        if (!Number.isFinite(want)) return; // overflow in the reference itself: nothing to compare
        expect(Number.isNaN(r[0]), g.text).toBe(false);
        expect(Math.abs(r[0] - want) <= 1e-9 * Math.abs(want) + 1e-300, `${g.text}: ${r[0]} vs ${want}`).toBe(true);
        for (const v of [...jc, ...jp]) expect(Number.isNaN(v), `${g.text} derivative`).toBe(false);
      }),
      { numRuns: 2000 },
    );
    console.log(`expression fuzz (random valid trees): ${tried} expressions compiled and checked`);
    expect(tried).toBe(2000);
  });
});
