/**
 * The worker threads' module choice (pool.ts, workerModule) and the idle-core part of the 'auto'
 * rule (auto.ts, idleCores); plain functions, no worker is started here.
 */
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { describe, expect, it } from 'vitest';
import { AUTO_RULE, chooseWorkers, idleCores } from '../../src/parallel/auto';
import { workerModule } from '../../src/parallel/pool';

describe('workerModule: worker threads load the bundled copy of a compiled job module', () => {
  it('maps dist/src/parallel/<m>.js to dist/bundle/parallel/<m>.js when the copy exists, else keeps the URL', () => {
    const root = mkdtempSync(join(tmpdir(), 'rateloom-wm-'));
    try {
      mkdirSync(join(root, 'dist/src/parallel'), { recursive: true });
      mkdirSync(join(root, 'dist/bundle/parallel'), { recursive: true });
      writeFileSync(join(root, 'dist/src/parallel/study-jobs.js'), '');
      writeFileSync(join(root, 'dist/src/parallel/mc-jobs.js'), '');
      writeFileSync(join(root, 'dist/bundle/parallel/study-jobs.js'), '');
      const url = (p: string) => pathToFileURL(join(root, p)).href;
      expect(workerModule(url('dist/src/parallel/study-jobs.js'))).toBe(url('dist/bundle/parallel/study-jobs.js'));
      expect(workerModule(url('dist/src/parallel/mc-jobs.js'))).toBe(url('dist/src/parallel/mc-jobs.js'));
      expect(workerModule(url('src/parallel/study-jobs.ts'))).toBe(url('src/parallel/study-jobs.ts'));
    } finally {
      rmSync(root, { recursive: true, force: true });
    }
  });
});

describe('idleCores: the auto rule leaves the pool alone on a busy machine', () => {
  it('counts the cores less the load of other processes (this one excluded)', () => {
    expect(idleCores(2, 0)).toBe(2);
    expect(idleCores(2, 1)).toBe(2); // this process alone
    expect(idleCores(2, 1.5)).toBe(1.5);
    expect(idleCores(2, 8)).toBeLessThan(0);
    expect(idleCores(8, 3)).toBe(6);
  });
  it('large work gets 2 workers only with 2 idle cores; a given count always wins', () => {
    const large = { draws: AUTO_RULE.draws };
    expect(chooseWorkers('auto', large, idleCores(2, 1))).toBe(2);
    expect(chooseWorkers('auto', large, idleCores(2, 1.5))).toBe(1);
    expect(chooseWorkers('auto', large, idleCores(2, 8))).toBe(1);
    expect(chooseWorkers(2, large, idleCores(2, 8))).toBe(2);
  });
});
