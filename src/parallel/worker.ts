/**
 * Worker-thread entry of the pool (pool.ts): imports the job module named in workerData, runs its
 * setup once on the context, then answers { index, job } messages with { type: 'result', index,
 * ok, value | message } until the pool terminates the thread.
 */
import { parentPort, workerData } from 'node:worker_threads';
import type { JobModule } from './pool.js';

const { moduleUrl, context } = workerData as { moduleUrl: string; context: unknown };
const port = parentPort!;
const mod = (await import(moduleUrl)) as JobModule<unknown, unknown, unknown, unknown>;
const state = mod.setup ? await mod.setup(context) : context;
port.on('message', async (m: { index: number; job: unknown; kind?: string }) => {
  try {
    const value = await mod.runJob(state, m.job, m.kind);
    port.postMessage({ type: 'result', index: m.index, ok: true, value });
  } catch (e) {
    port.postMessage({ type: 'result', index: m.index, ok: false, message: e instanceof Error ? e.message : String(e) });
  }
});
port.postMessage({ type: 'ready' });
