/** Planning of the next lab runs: candidates within the lab's limits, optimal-design criteria, exchange. */
export { planRuns, PLAN_STATUS, type PlanOptions } from './plan.js';
export { checkDistinctRivals } from './rivals.js';
export { parseLimits, LIMITS_SCHEMA, type LabLimits } from './limits.js';
export { greedyExchange, type ExchangeProblem, type ExchangeResult } from './exchange.js';
export { criterionValue, type CriterionKind } from './criteria.js';
export type { PlanResult, PlannedRun } from '../report/types.js';
