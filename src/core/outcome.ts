/**
 * Results of numerical work carry a status instead of throwing. Each algorithm declares a table of
 * status codes with messages (as SciPy's solvers do); `success` is derived from the code, never set
 * by hand. Warnings say what went wrong where the result is still usable.
 */

/** A warning on a result: stable code, readable message, optional path (run id, parameter, ...). */
export interface Warning {
  code: string;
  message: string;
  path?: ReadonlyArray<string | number>;
}

/** The common shape of every numerical result. */
export interface Outcome<S extends string = string> {
  status: S;
  success: boolean;
  message: string;
  warnings: Warning[];
}

/** A status table: each code maps to whether it counts as success and its default message. */
export type StatusTable<S extends string> = Record<S, { success: boolean; message: string }>;

/** Build the status/success/message triple from a table, optionally with extra detail. */
export function outcome<S extends string>(
  table: StatusTable<S>,
  status: S,
  warnings: Warning[] = [],
  detail?: string,
): Outcome<S> {
  const entry = table[status];
  return {
    status,
    success: entry.success,
    message: detail ? `${entry.message}: ${detail}` : entry.message,
    warnings,
  };
}
