/**
 * Verification analysis as pure functions on plain numbers: error norms per region, observed
 * order of accuracy (pairwise and least squares with a Student-t interval), Richardson
 * extrapolation, Roache's GCI, the three-grid procedure of Celik et al. (2008), the least-squares
 * procedure of Eça & Hoekstra (2014), residual metrics and scaling, and verdicts in plain words.
 * No Deno APIs, no printing; numbers that cannot be computed are null. Every function documents
 * its formula and source.
 *
 * Conventions: grid sequences are given coarsest first (h decreasing); relative figures (GCI,
 * relative errors) are fractions, not percent.
 *
 * @example
 * ```ts
 * import assert from "node:assert/strict";
 * import { quantityRecord } from "./mod.ts";
 * // NASA NPARC tutorial: three grids h = 4, 2, 1
 * const q = quantityRecord([4, 2, 1], [0.96178, 0.96854, 0.9705]);
 * assert.ok(Math.abs(q.extrapolated! - 0.9713) < 1e-6);
 * ```
 *
 * @module
 */
export { studentTCdf, studentTQuantile } from "./student_t.ts";
export { vertexWeights } from "./vertex_weights.ts";
export { type ErrorNormOptions, errorNorms } from "./error_norms.ts";
export { weightedMean, withoutMean } from "./mean_removal.ts";
export {
  boundaryBandMask,
  DEFAULT_BAND,
  pointRegionNorms,
  pointsInBand,
  type VertexGrid,
  vertexRegionNorms,
} from "./region_norms.ts";
export { pairwiseOrders } from "./pairwise_orders.ts";
export { PLACE_LAYERS, placeNorms, placeOfPoints } from "./places.ts";
export { IMPOSED_BOUND, imposedDataCheck, type SideData } from "./imposed_data.ts";
export { betterOrder, REORDER_GAIN, REORDERINGS } from "./reorderings.ts";
export { errorMap } from "./error_map.ts";
export { truncationNorms } from "./truncation_norms.ts";
export { type FittedOrder, fittedOrder } from "./fitted_order.ts";
export { asymptoticRange, orderRecord } from "./order_record.ts";
export { type GciPair, richardsonExtrapolate, roacheGci } from "./richardson.ts";
export { type CelikResult, celikThreeGrid, type ConvergenceType, type GridValue } from "./celik.ts";
export {
  type LeastSquaresFit,
  type LeastSquaresFitName,
  type LeastSquaresResult,
  leastSquaresUncertainty,
} from "./least_squares_uncertainty.ts";
export { type QuantityOptions, quantityRecord } from "./quantity_record.ts";
export { studyWarnings } from "./study_warnings.ts";
export { headingOrder, type OrderTrend, orderTrend } from "./order_trend.ts";
export { ERROR_FACTOR, locateDefect, type Location, ORDER_MARGIN, sideWords } from "./locate.ts";
export {
  CRITERIA,
  type Criterion,
  ERROR_FLOOR,
  GROWTH_MARGIN,
  ITERATIVE_SHARE,
  RANK_ROUNDOFF,
  RANK_SAFETY,
  type RankComparison,
  REDUCTION_SLACK,
} from "./criteria/mod.ts";
export { type ResidualMetrics, residualMetrics, type ResidualOptions } from "./residual_metrics.ts";
export { powerLawExponent } from "./power_law_exponent.ts";
export {
  MIN_FIT_UNKNOWNS,
  type ScalingOptions,
  scalingRecord,
  type ScalingSolve,
} from "./scaling_record.ts";
export {
  type JudgeOptions,
  judgeStudy,
  type NormName,
  type OrderExpectation,
  type Strictness,
  type StudyInput,
} from "./judge_study.ts";
export { buildStudy, type StudySpec } from "./build_study.ts";
