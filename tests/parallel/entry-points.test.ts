import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { loadStudy } from '../../src/study/load';
import { fitStudy, type StudyFit } from '../../src/workflow/fit-study';
import { fitStudyParallel } from '../../src/parallel/fit-parallel';
import { sizeReactorParallel } from '../../src/parallel/size-parallel';
import { AUTO_RULE, chooseWorkers } from '../../src/parallel/auto';
import { parseHandoff } from '../../src/design/handoff-load';
import { kineticsFromHandoff } from '../../src/design/kinetics';
import { loadCase } from '../../src/design/case';
import { sizeReactor } from '../../src/design/size';
import { toJson } from '../../cli/run';

const demo = (p: string) => fileURLToPath(new URL(`../../datasets-demo/${p}`, import.meta.url));
const study = loadStudy(readFileSync(demo('cstr/cstr.study.json'), 'utf8'), demo('cstr/cstr.study.json'), (abs) => readFileSync(abs, 'utf8')).study;
/** Everything a StudyFit reports (the model object aside), as the CLI prints it. */
const text = (sf: StudyFit) => toJson({ ...sf, model: undefined });

describe('parallel entry points give the serial result, byte for byte', () => {
  it('fitStudyParallel: multistart starts and profiles on 2 workers equal fitStudy', async () => {
    const opts = { profile: true, starts: 3, seed: 5 };
    const serial = fitStudy(study, opts);
    const progress: number[] = [];
    const two = await fitStudyParallel(study, { ...opts, workers: 2, progress: (done) => progress.push(done) });
    expect(serial.fit.profiles.length).toBe(serial.fit.statistics.p);
    expect(serial.minima!.length).toBeGreaterThan(0);
    expect(text(two)).toBe(text(serial));
    expect(progress[progress.length - 1]).toBe(4);
  }, 60000);

  it('fitStudyParallel: a single fit with profiles on 2 workers equals fitStudy', async () => {
    const serial = fitStudy(study, { profile: true, level: 0.9 });
    const two = await fitStudyParallel(study, { profile: true, level: 0.9, workers: 2 });
    expect(serial.fit.parameters.every((p) => p.fixed || p.ci.profile)).toBe(true);
    expect(text(two)).toBe(text(serial));
  }, 60000);

  it('sizeReactorParallel: every Monte Carlo pass of the percentile tube design on 2 workers equals sizeReactor', async () => {
    const root = new URL('../design/fixtures/', import.meta.url);
    const handoffRaw = JSON.parse(readFileSync(new URL('bed.kinetics.json', root), 'utf8'));
    const caseRaw = JSON.parse(readFileSync(new URL('bed.case.json', root), 'utf8'));
    const h = parseHandoff(handoffRaw);
    const dk = kineticsFromHandoff(h);
    const kase = loadCase(caseRaw, dk.kinetics.speciesNames, dk.kinetics.reactionIds);
    const input = { handoff: h, kinetics: dk.kinetics, kase, molarMasses: dk.molarMasses!, options: { draws: 300, profileDraws: 40 } };
    const serial = sizeReactor(input);
    const seen: number[] = [];
    const two = await sizeReactorParallel({ ...input, options: { ...input.options, onProgress: (d) => seen.push(d) } }, { handoff: handoffRaw, case: caseRaw }, { workers: 2, chunkDraws: 70 });
    expect(serial.status).toBe('sized');
    // the bundle was raised above the nominal count, so more than one pass ran with different counts
    expect(serial.tubes!.count).toBeGreaterThan(serial.tubes!.nominalCount);
    expect(toJson(two)).toBe(toJson(serial));
    expect(seen).toContain(300);
  }, 60000);
});

describe("the 'auto' worker rule", () => {
  it('uses 2 workers only for large work on a machine with 2 or more cores; a given count is kept', () => {
    expect(chooseWorkers('auto', { draws: AUTO_RULE.draws }, 2)).toBe(2);
    expect(chooseWorkers('auto', { draws: AUTO_RULE.draws - 1 }, 2)).toBe(1);
    expect(chooseWorkers('auto', { draws: AUTO_RULE.draws }, 1)).toBe(1);
    expect(chooseWorkers('auto', { profileParameters: 3, runs: 19 }, 8)).toBe(1);
    expect(chooseWorkers('auto', { profileParameters: AUTO_RULE.profileParameters, runs: AUTO_RULE.profileRuns }, 8)).toBe(2);
    expect(chooseWorkers('auto', { starts: AUTO_RULE.starts }, 2)).toBe(2);
    expect(chooseWorkers(undefined, { starts: AUTO_RULE.starts - 1 }, 2)).toBe(1);
    expect(chooseWorkers(1, { draws: 1e6 }, 8)).toBe(1);
    expect(chooseWorkers(3, {}, 1)).toBe(3);
    // a count that is not a whole number >= 1 is bad input with a stable code, never rounded silently
    for (const bad of [0, -2, 1.5, Number.NaN]) expect(() => chooseWorkers(bad, {}, 2)).toThrow(expect.objectContaining({ code: 'E_VALUE' }));
  });
});
