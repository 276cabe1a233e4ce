import { describe, expect, it } from 'vitest';
import { InternalError, isRateloomError } from '../../src/core/errors';
import { NodeStore } from '../../src/kinetics/expression/ast';

describe('InternalError', () => {
  it('is thrown for a broken invariant and is not mistaken for bad input', () => {
    const s = new NodeStore();
    let caught: unknown;
    try {
      s.variable(-1);
    } catch (e) {
      caught = e;
    }
    expect(caught).toBeInstanceOf(InternalError);
    expect((caught as InternalError).code).toBe('E_INTERNAL');
    expect((caught as Error).message).toMatch(/^internal: bad variable index -1/);
    expect(isRateloomError(caught)).toBe(false);
  });
});
