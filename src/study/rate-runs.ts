/**
 * Runs that need no reactor size: every observation of the run is a measured rate, which is
 * predicted from the rate law at the composition where it was measured (no reactor is solved).
 */
import type { MappedObservation } from '../data/mapping.js';

/** Ids of the runs whose observations are all 'rate' responses. */
export function ratesOnlyRuns(observations: readonly MappedObservation[]): Set<string> {
  const rate = new Set<string>();
  for (const o of observations) if (o.response === 'rate') rate.add(o.runId);
  if (rate.size === 0) return rate; // the common case: no measured rates, no set of every run id
  for (const o of observations) if (o.response !== 'rate') rate.delete(o.runId);
  return rate;
}
