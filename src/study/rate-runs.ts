/**
 * Runs that need no reactor size: every observation of the run is a measured rate, which is
 * predicted from the rate law at the composition where it was measured (no reactor is solved).
 */
import type { MappedObservation } from '../data/mapping.js';

/** Ids of the runs whose observations are all 'rate' responses. */
export function ratesOnlyRuns(observations: readonly MappedObservation[]): Set<string> {
  const rate = new Set<string>();
  const other = new Set<string>();
  for (const o of observations) (o.response === 'rate' ? rate : other).add(o.runId);
  for (const id of other) rate.delete(id);
  return rate;
}
