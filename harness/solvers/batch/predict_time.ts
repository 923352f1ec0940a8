/**
 * Job time limits from the work measured on coarser grids: the run time grows like N^g in the
 * unknowns N, with g read from the two largest grids solved so far (at least 1: no solver's work
 * grows slower than its unknowns; at most 3).
 *
 * @module
 */

/** A finished solve's size and run time. */
export interface WorkPoint {
  unknowns: number;
  seconds: number;
}

/**
 * Predicts the run time of a solve with `unknowns` unknowns from earlier solves of the same case.
 *
 * @returns seconds, or null with fewer than two smaller solves to read the growth from
 *
 * @example
 * ```ts
 * import { predictSeconds } from "./predict_time.ts";
 * // time ~ N^1.5: 1 s at 1000, 8 s at 4000 → 64 s at 16000
 * const t = predictSeconds([{ unknowns: 1000, seconds: 1 }, { unknowns: 4000, seconds: 8 }], 16000);
 * console.assert(Math.abs(t! - 64) < 1e-9);
 * ```
 */
export function predictSeconds(points: readonly WorkPoint[], unknowns: number): number | null {
  const smaller = points.filter((p) => p.unknowns < unknowns && p.seconds > 0)
    .sort((a, b) => a.unknowns - b.unknowns);
  if (smaller.length < 2) return null;
  const [a, b] = smaller.slice(-2);
  if (a.unknowns === b.unknowns) return null;
  const g = Math.min(
    3,
    Math.max(1, Math.log(b.seconds / a.seconds) / Math.log(b.unknowns / a.unknowns)),
  );
  return b.seconds * (unknowns / b.unknowns) ** g;
}
