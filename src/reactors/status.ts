/**
 * The status table of reactor solutions: which statuses count as success and their default
 * messages (the Outcome convention of core/outcome.ts).
 */
import type { StatusTable } from '../core/outcome.js';
import type { ReactorStatus } from './types.js';

const REACTOR_STATUS: StatusTable<ReactorStatus> = {
  success: { success: true, message: 'reactor solved' },
  'integration-failed': { success: false, message: 'the integration of the mole balances failed' },
  'pressure-exhausted': { success: false, message: 'the pressure falls to zero inside the reactor' },
  'newton-failed': { success: false, message: 'the steady-state balances could not be solved' },
  'non-finite': { success: false, message: 'a non-finite value appeared in the solution' },
};

/** success flag per status, read from the table. */
export const STATUS_SUCCESS = Object.fromEntries(
  Object.entries(REACTOR_STATUS).map(([status, row]) => [status, row.success]),
) as Record<ReactorStatus, boolean>;
