import { asymptoticRange } from "./asymptotic_range.ts";
import { convergence } from "./convergence.ts";
import { exactness } from "./exactness.ts";
import { flatIterations } from "./flat_iterations.ts";
import { imposedData } from "./imposed_data.ts";
import { iterativeError } from "./iterative_error.ts";
import { order } from "./order.ts";
import { pointOrder } from "./point_order.ts";
import { rankInvariance } from "./rank_invariance.ts";
import type { Criterion } from "./types.ts";

/**
 * Every criterion of a study, in judging order: the preconditions first (their failures make the
 * order verdicts inconclusive instead of blaming the discretization), then order or exactness,
 * then work and the quantities' asymptotic range. Campaign-level criteria (agreement with the
 * reference, applicability, baseline) live with the campaign.
 */
export const CRITERIA: readonly Criterion[] = [
  pointOrder,
  imposedData,
  convergence,
  iterativeError,
  order,
  exactness,
  flatIterations,
  asymptoticRange,
  rankInvariance,
];
