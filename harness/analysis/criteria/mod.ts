/**
 * The registry of study criteria, one file each: what it measures, its thresholds with defaults
 * and sources, and its outcomes (pass / fail / inconclusive, warn for advice, not-applicable).
 * Every verdict carries its evidence numbers in `details`.
 *
 * @example
 * ```ts
 * import assert from "node:assert/strict";
 * import { CRITERIA } from "./mod.ts";
 * assert.ok(CRITERIA.some((c) => c.name === "order"));
 * ```
 *
 * @module
 */
export { CRITERIA } from "./registry.ts";
export { REDUCTION_SLACK } from "./convergence.ts";
export { ITERATIVE_SHARE } from "./iterative_error.ts";
export { DEFAULT_GROWTH, GROWTH_MARGIN, TIME_MARGIN } from "./flat_iterations.ts";
export { ERROR_FLOOR } from "./order.ts";
export type {
  Criterion,
  Finding,
  JudgeContext,
  JudgeOptions,
  NormName,
  OrderExpectation,
  RankComparison,
  Strictness,
  StudyInput,
} from "./types.ts";
export { RANK_ROUNDOFF, RANK_SAFETY } from "./rank_invariance.ts";
