/**
 * Killed runs leave no partial output under a final name: every writer goes through the one write
 * transaction (cli/output.ts: temporary names, then rename), and a run killed with SIGKILL at any
 * moment leaves each output either absent or whole (temporary '.*.tmp' files may stay: a killed
 * process cannot clean up, and the next run never reads them).
 */
import { spawn } from 'node:child_process';
import { readFileSync, readdirSync, existsSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ROOT, workspace } from './cli-helpers';

const TSX = join(ROOT, 'node_modules', 'tsx', 'dist', 'loader.mjs');

/** Source files under `dir` (recursively). */
function sources(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((e) => (e.isDirectory() ? sources(join(dir, e.name)) : /\.ts$/.test(e.name) ? [join(dir, e.name)] : []));
}

describe('one write path', () => {
  it('no file in src/ or cli/ writes a file except cli/output.ts', () => {
    const writers = [...sources(join(ROOT, 'src')), ...sources(join(ROOT, 'cli'))].filter((f) => !f.endsWith(join('cli', 'output.ts')) && /\b(writeFileSync|appendFileSync|createWriteStream|copyFileSync|renameSync)\s*\(|\bfs\.promises\.writeFile|\bwriteFile\s*\(/.test(readFileSync(f, 'utf8')));
    expect(writers.map((f) => f.slice(ROOT.length + 1))).toEqual([]);
  });
});

describe('a sizing killed at any moment', () => {
  let ws: ReturnType<typeof workspace>;
  const delays = [400, 1200, 2500, 4000];
  beforeAll(async () => {
    ws = workspace();
    await Promise.all(
      delays.map(
        (ms, i) =>
          new Promise<void>((done) => {
            const child = spawn(process.execPath, ['--import', TSX, join(ROOT, 'cli', 'main.ts'), 'size', 'kinetics.json', 'plant.case.json', '--report', `killed${i}`, '--out', `killed${i}/sizing.json`, '--draws', '2000'], { cwd: ws.dir, stdio: 'ignore' });
            const timer = setTimeout(() => child.kill('SIGKILL'), ms);
            child.on('close', () => {
              clearTimeout(timer);
              done();
            });
          }),
      ),
    );
  }, 120_000);
  afterAll(() => ws?.cleanup());

  it.each(delays.map((ms, i) => [ms, i]))('killed after %i ms: every output under its final name is whole', (_ms, i) => {
    const dir = join(ws.dir, `killed${i}`);
    const finals = existsSync(dir) ? readdirSync(dir).filter((n) => !n.startsWith('.')) : [];
    for (const n of finals) {
      const text = readFileSync(join(dir, n), 'utf8');
      if (n.endsWith('.json')) expect(() => JSON.parse(text)).not.toThrow();
      if (n.endsWith('.html')) expect(text.trimEnd().endsWith('</html>')).toBe(true);
      if (n.endsWith('.md')) expect(text.endsWith('\n')).toBe(true);
    }
  });
});
