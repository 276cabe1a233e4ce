/**
 * The expression compiler reaches nothing outside its whitelist: prototype names as species,
 * parameters and symbols, look-alike and escaped identifiers, random hostile token soup. Every
 * input compiles or fails with a RateloomError; nothing global changes; compiled code runs.
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { buildChemistry } from '../../src/chemistry/mechanism';
import { RateloomError } from '../../src/core/errors';
import { compileKinetics } from '../../src/kinetics/compile';

const PROTO_NAMES = ['constructor', '__proto__', 'prototype', 'toString', 'valueOf', 'hasOwnProperty', '__defineGetter__', '__lookupSetter__', 'isPrototypeOf', 'propertyIsEnumerable', 'toLocaleString'];

function snapshotGlobals(): string {
  return JSON.stringify([
    Object.getOwnPropertyNames(Object.prototype).sort(),
    Object.getOwnPropertyNames(Function.prototype).sort(),
    Object.getOwnPropertyNames(Array.prototype).length,
    Object.keys(globalThis).sort(),
    typeof Math.exp,
  ]);
}

function compile(expression: string, species = ['A', 'B'], parameterNames = ['k', 'a']) {
  const chem = buildChemistry(species.map((name) => ({ name })), [{ id: 'r1', equation: `${species[0]} -> ${species[1]}` }]);
  return compileKinetics({ chemistry: chem, rates: [{ form: 'expression', expression }], parameterNames, referenceTemperature: 500 });
}

function typed(f: () => unknown): 'ok' | 'error' {
  try {
    f();
    return 'ok';
  } catch (e) {
    if (!(e instanceof RateloomError)) throw e;
    expect(e.message).toContain('Fix:');
    return 'error';
  }
}

describe('hostile expression input', () => {
  const before = snapshotGlobals();

  it('prototype names as parameters, as symbols and as C_<name> resolve to nothing or fail typed', () => {
    let n = 0;
    for (const name of PROTO_NAMES) {
      for (const expr of [name, `k*${name}`, `C_${name}`, `p_${name}`, `${name}(k)`, `k^${name}`]) {
        n++;
        const r = typed(() => compile(expr));
        expect(r, expr).toBe('error');
      }
    }
    console.log(`prototype-name expressions: ${n} cases tried, all refused`);
  });

  it('a parameter or species really named like a prototype property is an ordinary name or a typed error', () => {
    let n = 0;
    for (const name of PROTO_NAMES) {
      n++;
      const r = typed(() => {
        const kin = compile(`${name}*C_A`, ['A', 'B'], [name]);
        const out = new Float64Array(1);
        kin.rates(Float64Array.of(2, 0), 500, Float64Array.of(3), out);
        expect(out[0]).toBe(6);
      });
      expect(['ok', 'error']).toContain(r);
      n++;
      typed(() => compile(`k*C_${name}`, [name, 'B'], ['k']));
    }
    console.log(`prototype names as parameters and species: ${n} cases tried`);
  });

  it('look-alike, escaped and invisible identifiers are refused with a column', () => {
    const inputs = ['\uff4b', 'k\u200b', '\u212a', 'k\\u0041', '\\u006b', 'c\u043Enstructor', 'k\u0000', 'k\ud800', '\u{1D55C}', 'k\u202e1', '\uFEFFk'];
    for (const t of inputs) {
      try {
        compile(t);
        throw new Error(`accepted ${JSON.stringify(t)}`);
      } catch (e) {
        expect(e, JSON.stringify(t)).toBeInstanceOf(RateloomError);
        expect((e as RateloomError).location?.column).toBeGreaterThan(0);
      }
    }
  });

  it('random hostile token soup: typed outcome, compiled code runs, globals untouched', () => {
    const token = fc.constantFrom(
      'k', 'a', 'C_A', 'C_B', 'T', 'R', 'T_ref', '+', '-', '*', '/', '^', '(', ')', ',', 'exp(', 'log(', 'sqrt(', 'min(', 'max(', 'abs(',
      '1', '0', '1e308', '1e-320', '0.5', ...PROTO_NAMES, 'globalThis', 'process', 'this', 'new', 'return', ';', '=', '.', '[', ']', '"', '`', '\\',
    );
    let tried = 0;
    const seen = { ok: 0, error: 0 };
    const out = new Float64Array(1);
    fc.assert(
      fc.property(fc.array(token, { minLength: 1, maxLength: 14 }), fc.double({ min: 1e-3, max: 1e3, noNaN: true }), (toks, c) => {
        tried++;
        let kin: ReturnType<typeof compile> | undefined;
        seen[typed(() => (kin = compile(toks.join(''))))]++;
        if (kin) {
          // The generated code runs without throwing (a rate may be non-finite for some inputs,
          // e.g. log of a negative; the reactor and fit layers turn that into a status).
          expect(() => kin!.rates(Float64Array.of(c, c), 500, Float64Array.of(1.5, 0.5), out)).not.toThrow();
        }
      }),
      { numRuns: 3000 },
    );
    console.log(`hostile token soup: ${tried} cases tried (${seen.ok} compiled, ${seen.error} typed errors)`);
    expect(snapshotGlobals()).toBe(before);
  });

  it('very long inputs of every kind fail fast by their size', () => {
    const t0 = performance.now();
    for (const t of ['k'.repeat(200_000), '1'.repeat(200_000), 'k*'.repeat(100_000) + 'k', ' '.repeat(1_000_000) + 'k', '('.repeat(50_000), 'exp('.repeat(50_000)]) {
      expect(typed(() => compile(t))).toBe('error');
    }
    const ms = performance.now() - t0;
    console.log(`long inputs: 6 cases refused in ${ms.toFixed(0)} ms`);
  });
});
