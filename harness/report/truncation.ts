/**
 * The truncation error's observed order beside the solution error's, in words shared by the text,
 * Markdown and HTML renderers. The verdicts judge the solution order only; this is a reading aid.
 *
 * @module
 */
import type { StudyRecord } from "../result/mod.ts";
import { order, orderOf } from "./_shared.ts";

/** The paragraph shown when the truncation order trails the solution order (plain text). */
export const SUPRACONVERGENCE =
  "The truncation error (the residual of the exact solution in the discrete equations) converges " +
  "at a lower order than the solution error. This is supraconvergence, not a defect: on " +
  "non-uniform grids three-point differences have a first-order local truncation error where the " +
  "spacing changes, yet the errors cancel in the solution, which stays second order " +
  "(Manteuffel & White, Math. Comp. 47, 1986). The verdicts judge the solution order.";

/** What a report says about one study's truncation error, or null when it has none. */
export interface TruncationReading {
  /**
   * One line: the fitted truncation orders (max, L2 over the interior nodes) beside the solution
   * order (max error over all points).
   */
  line: string;
  /**
   * True when the fitted max-norm truncation order is lower than the solution's by more than the
   * study's order tolerance, with its whole 95 % interval (the upper end when known) below the
   * solution order minus the tolerance (the report then adds {@link SUPRACONVERGENCE}).
   */
  lower: boolean;
}

/**
 * Reads a study's truncation orders.
 *
 * @param study The study (its `truncationOrders` may be absent).
 * @returns The line and whether the truncation order is lower, or null without truncation orders.
 *
 * @example
 * ```ts ignore
 * const reading = truncationReading(study);
 * if (reading?.lower) lines.push(SUPRACONVERGENCE);
 * ```
 */
export function truncationReading(study: StudyRecord | undefined): TruncationReading | null {
  const max = study?.truncationOrders?.find((o) => o.norm === "max");
  const l2 = study?.truncationOrders?.find((o) => o.norm === "l2");
  if (!study || !max) return null;
  const solution = orderOf(study, "all", "max")?.fitted.order ?? null;
  const truncation = max.fitted.order;
  // the upper end of the 95 % interval, so that a fit still climbing on coarse grids (a smooth
  // map: 1.85 then 1.93 toward 2) does not read as a lower order
  const high = max.fitted.high ?? truncation;
  const lower = solution !== null && high !== null && high < solution - study.orderTolerance;
  return {
    line: `truncation error order (interior nodes, fitted over ${max.fitted.points} grids): ` +
      `max ${order(truncation)} [${order(max.fitted.low)}, ${order(max.fitted.high)}]` +
      (l2 ? `, L2 ${order(l2.fitted.order)}` : "") +
      `; solution error order (max) ${order(solution)} — the verdict judges the solution order`,
    lower,
  };
}
