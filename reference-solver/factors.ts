/**
 * The convergence factors a solve reports, from its residual history.
 *
 * @module
 */

/**
 * Average and asymptotic convergence factors of a residual history.
 *
 * @param history relative or absolute residual norms, the initial one first
 * @param r0 the initial residual norm
 * @param cycles cycles done (history.length − 1)
 * @returns `averageFactor` (last/r0)^(1/cycles) and `asymptoticFactor`, the geometric mean of the
 *   last three cycle-to-cycle ratios (0 when no cycle was done)
 *
 * @example
 * ```ts
 * import { convergenceFactors } from "./factors.ts";
 * convergenceFactors([1, 0.1, 0.01], 1, 2).averageFactor; // 0.1
 * ```
 */
export function convergenceFactors(
  history: number[],
  r0: number,
  cycles: number,
): { averageFactor: number; asymptoticFactor: number } {
  const last = history[history.length - 1];
  const factors = history.slice(1).map((v, k) => v / history[k]);
  const tail = factors.slice(-3);
  return {
    averageFactor: cycles === 0 ? 0 : Math.pow(last / r0, 1 / cycles),
    asymptoticFactor: tail.length === 0
      ? 0
      : Math.pow(tail.reduce((p, v) => p * v, 1), 1 / tail.length),
  };
}
