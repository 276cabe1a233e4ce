/**
 * Code rules a machine checks: no function over 80 lines in src/ and cli/ (except the listed ones,
 * which remain to be split; the list may only shrink), and every physical constant written once, in
 * src/core/constants.ts. `npm run long-functions` prints the current list.
 */
import { describe, expect, it } from 'vitest';
import { constantLiterals, longFunctions, sourceFiles } from './source-scan';

/** Functions over 80 lines that remain to be split (file:name -> lines when listed). The list only shrinks. */
const ALLOWED_LONG: ReadonlyMap<string, number> = new Map([
  ['src/estimation/lm.ts:levenbergMarquardt', 180],
  ['src/numerics/newton.ts:newton', 174],
  ['src/reactors/ode-driver.ts:runOde', 124],
  ['src/numerics/rosenbrock.ts:step', 112],
  ['src/estimation/card-lm.ts:cardLevenbergMarquardt', 109],
  ['src/numerics/dopri5.ts:step', 106],
  ['src/parallel/pool.ts:startPool', 100],
  ['src/kinetics/expression/diff.ts:differentiate', 99],
  ['src/kinetics/compile.ts:compileKinetics', 95],
  ['src/numerics/ode-input.ts:checkOdeInput', 93],
  ['src/kinetics/expression/diff.ts:d', 91],
  ['src/kinetics/expression/tokenizer.ts:tokenize', 89],
  ['src/study/locate.ts:locatePath', 87],
  ['src/numerics/ode-workspace.ts:integrate', 84],
]);

describe('code rules', () => {
  it('no new function over 80 lines in src/ and cli/', () => {
    const found = longFunctions(sourceFiles(['src', 'cli']));
    const offenders = found.filter((f) => !ALLOWED_LONG.has(f.key));
    expect(offenders, 'split these into named steps of at most 80 lines').toEqual([]);
  });

  it('the allow-list of long functions holds only functions that are still long', () => {
    const found = new Set(longFunctions(sourceFiles(['src', 'cli'])).map((f) => f.key));
    const stale = [...ALLOWED_LONG.keys()].filter((k) => !found.has(k));
    expect(stale, 'remove these from ALLOWED_LONG in tests/house/code-rules.test.ts').toEqual([]);
  });

  it('physical constants are written only in src/core/constants.ts', () => {
    const files = sourceFiles(['src', 'cli', 'bench', 'datasets-demo']).filter((f) => f !== 'src/core/constants.ts');
    expect(constantLiterals(files), 'import the constant from src/core/constants.ts').toEqual([]);
  });
});
