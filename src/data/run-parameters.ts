/**
 * Run-level values held by fitted parameters: an initial concentration of a batch (or semibatch)
 * run, or a feed flow known only roughly, named in the column mapping as {"parameter": "<name>",
 * "unit": ...}. A parameter may be shared by all runs (scope 'global') or have one copy per run
 * group (scope 'per-run-group'; with the run id as the group column this is one per run). The
 * model puts the parameter's current value into the run before each reactor solve.
 */

/** Where a run-level parameter goes. */
export interface RunParameterRef {
  target: 'feed' | 'initialConcentration';
  speciesIndex: number;
  /** Parameter name as written (per-run-group copies are '<name>@<group>'). */
  parameter: string;
}
