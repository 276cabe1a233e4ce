/**
 * sizeReactor with the Monte Carlo draws on worker threads (pool.ts + mc-jobs.ts). The sizing runs
 * here (design/size.ts sizeReactorWith); each Monte Carlo pass it asks for (with the tube count of
 * the bundle at that pass, which the percentile tube design may raise between passes) is drawn in
 * one stream here exactly as propagate draws it (mc-adapter.ts monteCarloVectors), cut into
 * consecutive chunks and evaluated on the workers with the serial evaluation (drawEvaluator), so
 * the result equals sizeReactor's byte for byte. One pool serves every pass; it starts at the first
 * pass. The delta method and the bands stay in this thread. A pass with a failed chunk is drawn
 * here instead (never dropped).
 */
import { sizeReactorWith, type DrawRequest, type DrawValues, type SizingInput, type SizingResult } from '../design/size.js';
import { chooseWorkers, type WorkersSetting } from './auto.js';
import { monteCarloVectors } from './mc-adapter.js';
import { runJob as runMcJob, setup as setupMc, type McContext, type McJob, type McJobResult } from './mc-jobs.js';
import { chunkRanges, siblingModule } from './pool.js';
import { workerRunner, type WorkerRunner } from './runner.js';
import { checkArgs, is, options as optionsArg } from '../core/args.js';

const JOBS_URL = siblingModule('mc-jobs', import.meta.url);

export interface ParallelSizingOptions {
  /** Worker threads (1 = serial) or 'auto' (see auto.ts, by the number of draws); default 'auto'. */
  workers?: WorkersSetting;
  /** Draws per job (the unit of work handed to a worker and of progress); default 250. */
  chunkDraws?: number;
}

/** The files the sizing input was read from, as parsed JSON (the workers rebuild the case from them). */
export interface SizingSources {
  /** The fitted-kinetics hand-off as read from its JSON file. */
  handoff: unknown;
  /** The design case as read from its JSON file. */
  case: unknown;
}

/** Worker threads sizeReactorParallel would use for this input (after resolving 'auto'). */
export function sizingWorkers(input: SizingInput, setting?: WorkersSetting): number {
  const draws = input.options?.draws ?? input.kase.uncertainty.draws;
  return chooseWorkers(setting, { draws });
}

/**
 * Size the production reactor with the Monte Carlo draws on worker threads; the same result as
 * sizeReactor(input). `sources` must be the JSON the input's hand-off and case were parsed from.
 */
export async function sizeReactorParallel(input: SizingInput, sources: SizingSources, options: ParallelSizingOptions = {}): Promise<SizingResult> {
  checkArgs('sizeReactorParallel', [input, sources, options, input?.options], [{ name: 'input', check: is.sizingInput }, { name: 'sources', check: is.object }, optionsArg('options', ['workers']), optionsArg('input.options', ['draws', 'seed'])]);
  const workers = sizingWorkers(input, options.workers);
  if (workers <= 1) return sizeReactorWith(input, async () => undefined);
  const onProgress = input.options?.onProgress;
  const perJob = Math.max(1, Math.floor(options.chunkDraws ?? 250));
  let runner: WorkerRunner | undefined;
  let here: ReturnType<typeof setupMc> | undefined;
  const provider = async (req: DrawRequest): Promise<DrawValues | undefined> => {
    const vec = monteCarloVectors(sources.handoff, sources.case, req.draws, req.seed);
    if (!vec) return undefined; // covariance not positive semidefinite: the serial pass reports it
    const ctx: McContext = { handoff: sources.handoff, case: sources.case, ...(req.tubeCount !== undefined ? { tubeCount: req.tubeCount } : {}) };
    runner ??= workerRunner({ 'mc-draws': { moduleUrl: JOBS_URL, context: ctx } }, workers);
    const ranges = chunkRanges(req.draws, Math.ceil(req.draws / perJob));
    const jobs: McJob[] = ranges.map((r) => ({
      z: vec.z.slice(r.start * vec.n, (r.start + r.count) * vec.n),
      count: r.count,
      ...(req.tubeCount !== undefined ? { tubeCount: req.tubeCount } : {}),
    }));
    const outs = await runner.run<McJob, McJobResult>({
      kind: 'mc-draws',
      jobs,
      runHere: (job) => runMcJob((here ??= setupMc(ctx)), job),
      ...(onProgress ? { onProgress: (done: number, total: number) => onProgress(Math.round((done * req.draws) / total), req.draws) } : {}),
    });
    if (outs.some((o) => !o.ok)) return undefined;
    const values = new Float64Array(req.draws);
    const sizes = new Float64Array(req.draws);
    const drops = new Float64Array(req.draws);
    const statuses: string[] = new Array(req.draws);
    outs.forEach((o, c) => {
      if (!o.ok) return;
      const r = ranges[c];
      values.set(o.value.values, r.start);
      sizes.set(o.value.sizes, r.start);
      drops.set(o.value.drops, r.start);
      o.value.statuses.forEach((s, i) => (statuses[r.start + i] = s));
    });
    return { values, statuses, sizes, drops };
  };
  try {
    return await sizeReactorWith(input, provider);
  } finally {
    await runner?.close();
  }
}
