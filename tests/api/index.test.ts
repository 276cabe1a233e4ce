import { describe, expect, it } from 'vitest';
import * as api from '../../src/index';

describe('public API', () => {
  it('exposes the main entry points as named exports', () => {
    for (const name of ['loadStudy', 'fitStudy', 'compareStudy', 'sizeReactor', 'solveReactor', 'compileKinetics', 'integrate', 'fitModel', 'renderFitReport', 'RateloomError']) {
      expect(typeof (api as Record<string, unknown>)[name], name).toBe('function');
    }
    expect(api.VERSION).toMatch(/^\d+\.\d+\.\d+$/);
  });
});
