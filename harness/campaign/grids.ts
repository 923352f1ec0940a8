/**
 * Grid sequences for a campaign: an explicit list, or a geometric sequence from the coarsest
 * grid with any ratio ≥ 1.1 (the NPARC tutorial's lower limit, published), rounded to whole
 * interval counts — e.g. ratio 1.5 from 32 gives 32, 48, 72, 108.
 *
 * @module
 */
import { MAX_NODES } from "../../cases/mod.ts";

/** How a campaign chooses its grids. */
export interface GridSpec {
  /** Explicit interval counts along x, any order (they are sorted ascending). */
  grids?: number[];
  /** Refinement ratio between successive grids (≥ 1.1). Default: 2. */
  ratio?: number;
  /** Number of grids of a geometric sequence (≥ 2). Default: 5. */
  levels?: number;
  /** Interval count of the coarsest grid of a geometric sequence. Default: 16. */
  coarsest?: number;
}

/**
 * Returns the grid sequence (interval counts along x), coarsest first.
 *
 * @throws {RangeError} when a count is below 2, repeated, the ratio is below 1.1, rounding
 * makes two successive grids equal, or a grid of the sequence is beyond the largest sampled grid
 * (`MAX_NODES` nodes on a square)
 * @example
 * ```ts
 * import { gridSequence } from "./grids.ts";
 * gridSequence({ ratio: 1.5, levels: 4, coarsest: 32 }); // [32, 48, 72, 108]
 * ```
 */
export function gridSequence(spec: GridSpec = {}): number[] {
  if (spec.grids !== undefined) {
    const grids = [...spec.grids].sort((p, q) => p - q);
    for (const n of grids) {
      if (!Number.isInteger(n) || n < 2) {
        throw new RangeError(`grid ${n} is not a whole number of intervals ≥ 2: use e.g. 16,32,64`);
      }
    }
    for (let k = 1; k < grids.length; k++) {
      if (grids[k] === grids[k - 1]) {
        throw new RangeError(`grid ${grids[k]} is given twice: list each grid once`);
      }
    }
    if (grids.length < 2) {
      throw new RangeError(`a study needs at least 2 grids, got ${grids.length}: add more grids`);
    }
    return grids;
  }
  const ratio = spec.ratio ?? 2;
  const levels = spec.levels ?? 5;
  const coarsest = spec.coarsest ?? 16;
  if (!(ratio >= 1.1)) {
    throw new RangeError(
      `refinement ratio ${ratio} is below 1.1, too close to 1 for a meaningful order: use ≥ 1.1 (1.3 or more recommended)`,
    );
  }
  if (!Number.isInteger(levels) || levels < 2) {
    throw new RangeError(`levels ${levels} must be a whole number ≥ 2`);
  }
  if (!Number.isInteger(coarsest) || coarsest < 2) {
    throw new RangeError(`coarsest grid ${coarsest} must be a whole number of intervals ≥ 2`);
  }
  const grids: number[] = [];
  for (let k = 0; k < levels; k++) {
    const n = Math.round(coarsest * ratio ** k);
    // stop at the first grid too large to sample (a square one), before building the rest
    if ((n + 1) ** 2 > MAX_NODES) {
      const fix = k === 0
        ? "use a smaller coarsest grid"
        : k === 1
        ? "use a smaller coarsest grid or ratio"
        : `use at most ${k} levels${
          k <= 12 ? ` (grids ${grids.join(", ")})` : ""
        }, or a smaller ratio or coarsest grid`;
      throw new RangeError(
        `${levels} levels with ratio ${ratio} from ${coarsest}: grid ${k + 1} would have ${n} ` +
          `intervals along x, more than the largest grid (${MAX_NODES} nodes, ` +
          `${Math.floor(Math.sqrt(MAX_NODES)) - 1} intervals a side); ${fix}`,
      );
    }
    if (grids.length > 0 && n <= grids[grids.length - 1]) {
      throw new RangeError(
        `ratio ${ratio} from ${coarsest} rounds two grids to the same count ${n}: start from a finer coarsest grid`,
      );
    }
    grids.push(n);
  }
  return grids;
}
