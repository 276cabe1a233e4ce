/**
 * One job-runner interface, two runners: the same steps give the same result bit for bit whether
 * their batches run in this thread (runStepsHere, inProcessRunner) or on worker threads
 * (workerRunner); results come back in job order with progress, and a cancelled batch starts no
 * further job.
 */
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { JobsCancelled, inProcessRunner, runSteps, runStepsHere, batchOf, type JobBatch, type JobSteps } from '../../src/core/jobs';
import { workerRunner } from '../../src/parallel/runner';
import { siblingModule } from '../../src/parallel/pool';
import { loadStudy } from '../../src/study/load';
import { planStudyFit, studyFitSteps, type StudyFit } from '../../src/workflow/fit-study';
import { toJson } from '../../cli/run';
import { runJob as mixJob } from './fixtures/mix-jobs';

const demo = (p: string) => fileURLToPath(new URL(`../../datasets-demo/${p}`, import.meta.url));
const study = loadStudy(readFileSync(demo('cstr/cstr.study.json'), 'utf8'), demo('cstr/cstr.study.json'), (abs) => readFileSync(abs, 'utf8')).study;
/** Every number of a StudyFit as its shortest round-trip decimal: equal text means equal bits. */
const text = (sf: StudyFit) => toJson({ ...sf, model: undefined });

const STUDY_JOBS = siblingModule('study-jobs', new URL('../../src/parallel/fit-parallel.ts', import.meta.url).href);
const MIX = new URL('./fixtures/mix-jobs.ts', import.meta.url).href;

describe('job runners', () => {
  it('a study fit (multistart starts and profiles) is bit-for-bit identical on every runner', async () => {
    const options = { profile: true, starts: 3, seed: 5 };
    const plan = planStudyFit(study, options);
    const steps = () => studyFitSteps(study, plan, options);
    const here = runStepsHere(steps());
    const inProcess = await runSteps(steps(), inProcessRunner);
    const context = { study, variant: plan.variant.name, parameters: plan.variant.parameters, fit: { profile: true, starts: 3, seed: 5 } };
    const ref = { moduleUrl: STUDY_JOBS, context };
    const runner = workerRunner({ 'fit-start': ref, 'fit-profile': ref }, 2);
    let pooled: StudyFit;
    try {
      pooled = await runSteps(steps(), runner);
    } finally {
      await runner.close();
    }
    expect(here.fit.profiles.length).toBe(here.fit.statistics.p);
    expect(here.starts!.length).toBe(4);
    expect(text(inProcess)).toBe(text(here));
    expect(text(pooled)).toBe(text(here));
  }, 90000);

  it('returns results in job order with progress, on both runners', async () => {
    const jobs = Array.from({ length: 9 }, (_, index) => ({ index }));
    const state = { offset: 0.5 };
    const seen: number[] = [];
    const batch: JobBatch<{ index: number }, ReturnType<typeof mixJob>> = { kind: 'mix', jobs, runHere: (job) => mixJob(state, job), onProgress: (done) => seen.push(done) };
    const a = await inProcessRunner.run(batch);
    const runner = workerRunner({ mix: { moduleUrl: MIX, context: state } }, 2);
    try {
      const b = await runner.run(batch);
      expect(b).toEqual(a);
    } finally {
      await runner.close();
    }
    expect(a.map((o) => (o.ok ? o.value.index : -1))).toEqual(jobs.map((j) => j.index));
    expect(seen.filter((d) => d === jobs.length).length).toBe(2);
  }, 60000);

  it('a cancelled batch starts no further job, and the driver stops with JobsCancelled', async () => {
    const controller = new AbortController();
    const jobs = Array.from({ length: 6 }, (_, index) => ({ index }));
    const batch = { kind: 'mix', jobs, runHere: (job: { index: number }) => mixJob({ offset: 0 }, job), onProgress: (done: number) => done === 2 && controller.abort() };
    const out = await inProcessRunner.run(batch, controller.signal);
    expect(out.slice(0, 2).every((o) => o.ok)).toBe(true);
    expect(out.slice(2)).toEqual(Array(4).fill({ ok: false, message: 'cancelled' }));
    function* steps(): JobSteps<number> {
      const r = yield* batchOf(batch);
      return r.length;
    }
    await expect(runSteps(steps(), inProcessRunner, controller.signal)).rejects.toBeInstanceOf(JobsCancelled);
  });
});
