import { describe, expect, it } from 'vitest';
import { findReplicates, pureErrors } from '../../src/data/validation';
import type { MappedObservation, MappedRun } from '../../src/data/mapping';

const run = (id: string, T: number, W: number, group?: string): MappedRun => ({
  id,
  temperature: T,
  size: W,
  pressure: 1e5,
  feed: Float64Array.from([1e-4, 0]),
  ...(group ? { group } : {}),
  location: { file: 'f.csv', line: 1 },
});

describe('replicates', () => {
  it('equal within the relative tolerance, across sort order, group matters', () => {
    const runs = [run('a', 500, 1e-3), run('b', 600, 1e-3), run('c', 500 * (1 + 5e-7), 1e-3), run('d', 500, 1e-3 * (1 + 2e-6)), run('e', 500, 1e-3, 'g2'), run('f', 600, 1e-3)];
    expect(findReplicates(runs, 1e-6)).toEqual([
      { id: 'rep1', runIds: ['a', 'c'] },
      { id: 'rep2', runIds: ['b', 'f'] },
    ]);
    expect(findReplicates(runs, 1e-5).map((g) => g.runIds)).toEqual([['a', 'c', 'd'], ['b', 'f']]);
  });
  it('pooled pure error: sum of squares over groups / sum of (n - 1)', () => {
    const obs = (runId: string, value: number): MappedObservation => ({ runId, response: 'outlet-flow', species: 'A', speciesIndex: 0, value, unit: 'mol/s', location: { file: 'f', line: 1 } });
    const groups = [{ id: 'rep1', runIds: ['a', 'c'] }, { id: 'rep2', runIds: ['b', 'f', 'g'] }];
    const pe = pureErrors([obs('a', 1), obs('c', 3), obs('b', 2), obs('f', 4), obs('g', 6), obs('x', 100)], groups);
    // Source: definition. SS = (1-2)^2+(3-2)^2 + (2-4)^2+(4-4)^2+(6-4)^2 = 2 + 8 = 10; dof = 1 + 2 = 3
    expect(pe).toHaveLength(1);
    expect(pe[0].sumSquares).toBeCloseTo(10, 12);
    expect(pe[0].dof).toBe(3);
    expect(pe[0].sigma).toBeCloseTo(Math.sqrt(10 / 3), 12);
  });
});
