import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import * as api from '../../src/index';

describe('public API', () => {
  it('exposes the main entry points as named exports', () => {
    for (const name of ['loadStudy', 'fitStudy', 'compareStudy', 'sizeReactor', 'solveReactor', 'compileKinetics', 'integrate', 'fitModel', 'renderFitReport', 'RateloomError']) {
      expect(typeof (api as Record<string, unknown>)[name], name).toBe('function');
    }
    expect(api.VERSION).toMatch(/^\d+\.\d+\.\d+$/);
    // The version written into hand-off files and reports is the package's own.
    const pkg = JSON.parse(readFileSync(resolve(__dirname, '../../package.json'), 'utf8')) as { version: string };
    expect(api.VERSION).toBe(pkg.version);
  });
});
