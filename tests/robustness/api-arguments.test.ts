/**
 * The public API called with the wrong things: null, undefined, NaN, numbers where paths belong,
 * empty objects where studies belong, options out of range. Every entry point (the list below,
 * each guarded by checkArgs in src/core/args.ts) must either return or throw a RateloomError
 * naming the function and the argument; never a TypeError from deep inside, never a hang.
 * Building blocks that take typed objects from other calls (integrate, levenbergMarquardt,
 * fitModel, the pellet and lab arithmetic...) are not in this list; the README says so.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import * as api from '../../src/index';
import { STUDY_PATH } from '../data/helpers';
import { caught } from './caught';

type Fn = (...args: unknown[]) => unknown;

/** The guarded entry points of src/index.ts with their number of arguments. */
const ENTRY_POINTS: Record<string, number> = {
  loadStudy: 2, fitStudy: 2, simulate: 2, compare: 2, sizeReactor: 3, prepareSizing: 2, sizingInput: 2,
  fitStudyParallel: 2, compareStudyParallel: 2, sizeReactorParallel: 3,
  parseHandoff: 1, kineticsFromHandoff: 1, loadCase: 3, parseLimits: 3, planRuns: 4, loadPellet: 3,
  readCsv: 2, decodeInput: 3, parseJsonText: 3, readText: 2, readJson: 2,
  toSI: 3, fromSI: 3, unitFor: 3, acceptedUnits: 1, siUnit: 1, compoundToSI: 3,
  parseFormula: 1, molarMassOf: 1, parseEquation: 2,
  buildHandoff: 2, studyVariants: 1, fitReportData: 3, sizingReportData: 1, summarizeStudy: 2,
  compareStudy: 2, applyParameterValues: 3, simulateStudy: 3, renderFitReport: 1, renderSizingReport: 1,
  optionProblem: 2, checkOption: 2, rangeText: 1,
  sniffBom: 1, formatRejection: 1, parseOrders: 2, splitHeader: 1, recogniseColumn: 1,
};

/** Values a caller gets wrong. */
const wrong = fc.oneof(
  fc.constantFrom(null, undefined, Number.NaN, Number.POSITIVE_INFINITY, -1, 0, 1e300, '', ' ', 'nope', '\0', {}, [], [null], { study: null, report: null }, { fit: {} }, true, () => 1, new Uint8Array([0, 0, 0])),
  fc.anything({ maxDepth: 2 }),
);

/** Call `f` and return the non-RateloomError it throws or rejects with (undefined when fine). */
async function crashOf(f: Fn, args: unknown[]): Promise<unknown> {
  try {
    const r = f(...args);
    if (r instanceof Promise) await r;
  } catch (e) {
    if (!api.isRateloomError(e)) return e;
    expect(e.message.split('\n')).toHaveLength(1);
  }
  return undefined;
}

describe('every guarded entry point refuses wrong arguments with a RateloomError', () => {
  it('the list names only functions the API exports', () => {
    for (const name of Object.keys(ENTRY_POINTS)) expect(typeof (api as Record<string, unknown>)[name], name).toBe('function');
  });
  it('property: random wrong arguments (null, NaN, numbers, objects) never crash with a TypeError', async () => {
    await fc.assert(
      fc.asyncProperty(fc.constantFrom(...Object.keys(ENTRY_POINTS)), fc.array(wrong, { minLength: 0, maxLength: 4 }), async (name, args) => {
        const f = (api as unknown as Record<string, Fn>)[name];
        const crash = await crashOf(f, args.slice(0, ENTRY_POINTS[name]));
        if (crash !== undefined) throw new Error(`${name}(${args.map((a) => String(a)).join(', ')}) threw ${String(crash)}`);
      }),
      { numRuns: 1500, seed: 18 },
    );
  });
  it('each entry point with null as every argument names the function and the argument', async () => {
    for (const [name, n] of Object.entries(ENTRY_POINTS)) {
      const f = (api as unknown as Record<string, Fn>)[name];
      let err: unknown;
      try {
        await f(...Array.from({ length: n }, () => null));
      } catch (e) {
        err = e;
      }
      expect(api.isRateloomError(err), `${name}: ${String(err)}`).toBe(true);
      expect((err as api.RateloomError).code).toMatch(/^E_(TYPE|VALUE)$/);
    }
  });
});

describe('options out of range on a real study', () => {
  const loaded = api.loadStudy(STUDY_PATH);
  it.each([
    [{ starts: 1e9 }, 'starts'],
    [{ starts: Number.NaN }, 'starts'],
    [{ seed: -1 }, 'seed'],
    [{ maxIterations: 0.5 }, 'maxIterations'],
    [{ level: 1 }, 'level'],
  ])('fitStudy(study, %o) is refused naming the option', (options, name) => {
    const e = caught(() => api.fitStudy(loaded, options));
    expect(e.code).toBe('E_VALUE');
    expect(e.path).toEqual(['arguments', 'options', name]);
    expect(e.fix).toMatch(/for example/);
  });
  it('sizeReactor with 1e12 draws is refused before any array is made', () => {
    const e = caught(() => api.sizeReactor('tests/design/fixtures/bed.kinetics.json', 'tests/design/fixtures/bed.case.json', { draws: 1e12 }));
    expect(e.code).toBe('E_VALUE');
    expect(e.problem).toMatch(/Monte Carlo draws must be a whole number from 0 to 10000000/);
  });
  it('the parallel forms refuse 100,000 workers', async () => {
    await expect(api.fitStudyParallel(loaded.study, { workers: 100_000 })).rejects.toMatchObject({ code: 'E_VALUE', path: ['arguments', 'options', 'workers'] });
  });
  it('a Study from loadStudy passes the shape check (the guards refuse nothing valid)', () => {
    expect(api.studyVariants(loaded.study).length).toBeGreaterThan(0);
    expect(api.summarizeStudy(loaded.study, loaded.report).runs).toBeGreaterThan(0);
  });
});
