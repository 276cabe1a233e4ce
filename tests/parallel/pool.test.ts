import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { chunkRanges, deriveSeed, runJobs, startPool } from '../../src/parallel/pool';
import { parallelDraws } from '../../src/parallel/mc-adapter';
import { parseHandoff } from '../../src/design/handoff-load';
import { kineticsFromHandoff } from '../../src/design/kinetics';
import { loadCase } from '../../src/design/case';
import { sizeReactor } from '../../src/design/size';
import { quantileSorted } from '../../src/design/uncertainty';

const JOBS = new URL('./fixtures/mix-jobs.ts', import.meta.url).href;

describe('worker pool', () => {
  it('chunkRanges covers every item once, in order, with near-equal chunks', () => {
    const r = chunkRanges(10, 3);
    expect(r).toEqual([{ start: 0, count: 4 }, { start: 4, count: 3 }, { start: 7, count: 3 }]);
    expect(chunkRanges(2, 5)).toEqual([{ start: 0, count: 1 }, { start: 1, count: 1 }]);
  });

  it('deriveSeed is deterministic and differs between jobs', () => {
    expect(deriveSeed(7, 3)).toBe(deriveSeed(7, 3));
    const seeds = new Set(Array.from({ length: 1000 }, (_, i) => deriveSeed(7, i)));
    expect(seeds.size).toBe(1000);
  });

  it('gives the same outcomes, in job order, with 1 or 2 workers; a throwing job is an outcome, not a throw', async () => {
    const jobs = Array.from({ length: 7 }, (_, index) => ({ index, fail: index === 4 }));
    const serial = await runJobs(JOBS, { offset: 0.5 }, jobs, { workers: 1 });
    const two = await runJobs(JOBS, { offset: 0.5 }, jobs, { workers: 2 });
    expect(two).toEqual(serial);
    expect(serial.map((o) => o.ok)).toEqual([true, true, true, true, false, true, true]);
    const failed = two[4];
    expect(failed.ok === false && failed.message).toContain('asked to fail');
    two.forEach((o, i) => {
      if (o.ok) expect((o.value as { index: number }).index).toBe(i);
    });
  }, 30000);

  it('a started pool runs several batches and reports a worker that cannot set up', async () => {
    const pool = await startPool(JOBS, { offset: 1 }, { workers: 2 });
    expect(pool.workers).toBe(2);
    const a = await pool.run([{ index: 0 }, { index: 1 }]);
    const b = await pool.run([{ index: 1 }]);
    await pool.close();
    expect(a[1]).toEqual(b[0]);
    const bad = await runJobs(new URL('./fixtures/no-such-module.ts', import.meta.url).href, {}, [{ index: 0 }, { index: 1 }], { workers: 2 });
    expect(bad.every((o) => !o.ok)).toBe(true);
  }, 30000);
});

describe('parallel Monte Carlo draws', () => {
  it('equal the serial sizing percentiles for any number of workers', async () => {
    const root = new URL('../design/fixtures/', import.meta.url);
    const handoffRaw = JSON.parse(readFileSync(new URL('bed.kinetics.json', root), 'utf8'));
    const caseRaw = JSON.parse(readFileSync(new URL('bed.case.json', root), 'utf8'));
    const draws = 120;
    const h = parseHandoff(handoffRaw);
    const dk = kineticsFromHandoff(h);
    const kase = loadCase(caseRaw, dk.kinetics.speciesNames, dk.kinetics.reactionIds);
    const serial = sizeReactor({ handoff: h, kinetics: dk.kinetics, kase, molarMasses: dk.molarMasses!, options: { draws, profileDraws: 0 } });
    // the draws are sized with the tube bundle sizeReactor settled on (its count may be raised for a percentile)
    const ctx = { handoff: handoffRaw, case: caseRaw, tubeCount: serial.tubes!.count };
    const one = await parallelDraws(ctx, { draws, workers: 1, chunks: 3 });
    const two = await parallelDraws(ctx, { draws, workers: 2, chunks: 5 });
    expect(one.status).toBe('ok');
    expect(Array.from(two.values)).toEqual(Array.from(one.values));
    const ok = Float64Array.from(two.values.filter((v) => Number.isFinite(v))).sort();
    const u = serial.uncertainty!;
    expect(ok.length).toBe(u.succeeded);
    expect(quantileSorted(ok, 0.5)).toBe(u.median);
    expect(quantileSorted(ok, u.percentiles[0].level)).toBe(u.percentiles[0].value);
  }, 60000);
});
