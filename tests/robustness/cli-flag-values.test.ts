import { describe, expect, it } from 'vitest';
import { ROOT, runCli } from './cli-helpers';

describe('flag values', () => {
  it('an option value that is another flag is a usage error, not a folder name', async () => {
    const r = await runCli(['compare', 'tests/data/fixtures/study.json', '--out', '--json'], ROOT);
    expect(r.code).toBe(2);
    const doc = JSON.parse(r.stdout) as { error: { code: string; problem: string } };
    expect(doc.error.code).toBe('E_USAGE');
    expect(doc.error.problem).toMatch(/--out <dir>' got '--json'/);
  });
});
