/**
 * Direct solution of a {@link LinearSystem} by banded Gaussian elimination.
 *
 * @module
 */
import type { LinearSystem } from "./system.ts";

/** A diagonal pivot is kept while it is at least this fraction of the column's largest entry. */
const PIVOT_THRESHOLD = 0.1;

/** The solution of a banded solve and whether rows had to be exchanged. */
export interface BandedSolution {
  u: Float64Array;
  pivoted: boolean;
}

/**
 * Solves A·u = rhs by banded Gaussian elimination with threshold partial pivoting (the diagonal is
 * kept unless it is below a tenth of the column's largest entry). A first pass reserves only the
 * band itself, which suffices when no rows are exchanged (the usual case for these diagonally
 * dominant stencils); when an exchange is needed the solve restarts with the LAPACK `gbtrf`
 * storage (upper band widened by the lower bandwidth). Work is O(n·w²) for bandwidth w.
 *
 * @param system the sparse system (its `bandwidth` bounds the band)
 * @returns the solution and whether rows were exchanged
 * @throws {RangeError} when the matrix is singular (a zero column below the diagonal)
 *
 * @example
 * ```ts
 * import { addEntry, emptySystem } from "./system.ts";
 * import { solveBanded } from "./banded.ts";
 * const s = emptySystem(2, 1);
 * addEntry(s, 0, 0, 2); addEntry(s, 0, 1, 1); addEntry(s, 1, 0, 1); addEntry(s, 1, 1, 3);
 * s.rhs.set([3, 4]);
 * solveBanded(s).u; // Float64Array [1, 1]
 * ```
 */
export function solveBanded(system: LinearSystem): BandedSolution {
  const narrow = eliminate(system, false);
  if (narrow) return { u: narrow, pivoted: false };
  return { u: eliminate(system, true)!, pivoted: true };
}

/**
 * One elimination pass; undefined when a row exchange is needed but not allowed. Entry (i, j) of
 * the band sits at i·width + j − i + lower; the right side is eliminated along with the matrix, so
 * the multipliers are not kept.
 */
function eliminate(system: LinearSystem, allowExchange: boolean): Float64Array | undefined {
  const { n, cols, vals, slots } = system;
  const lower = system.bandwidth;
  const upper = allowExchange ? 2 * lower : lower;
  const width = lower + upper + 1;
  const a = new Float64Array(n * width);
  for (let i = 0; i < n; i++) {
    for (let s = 0; s < slots; s++) {
      const c = cols[i * slots + s];
      if (c >= 0) a[i * width + c - i + lower] += vals[i * slots + s];
    }
  }
  const x = system.rhs.slice();
  // ju: the last column any row between k and k + lower may hold a nonzero in (gbtrf's JU)
  let ju = 0;
  for (let k = 0; k < n; k++) {
    const last = Math.min(n - 1, k + lower);
    const diag = Math.abs(a[k * width + lower]);
    let big = diag;
    let bigRow = k;
    for (let i = k + 1; i <= last; i++) {
      const v = Math.abs(a[i * width + k - i + lower]);
      if (v > big) {
        big = v;
        bigRow = i;
      }
    }
    if (big === 0) {
      throw new RangeError(`the matrix is singular: column ${k} has no nonzero pivot candidate`);
    }
    let p = k;
    if (diag < PIVOT_THRESHOLD * big) {
      if (!allowExchange) return undefined;
      p = bigRow;
    }
    ju = Math.max(ju, Math.min(n - 1, p + lower));
    const rowK = k * width - k + lower;
    if (p !== k) {
      const rowP = p * width - p + lower;
      for (let j = k; j <= ju; j++) {
        const t = a[rowK + j];
        a[rowK + j] = a[rowP + j];
        a[rowP + j] = t;
      }
      const t = x[k];
      x[k] = x[p];
      x[p] = t;
    }
    const pivot = a[rowK + k];
    const xk = x[k];
    // two rows per pass: each load of the pivot row serves both updates
    let i = k + 1;
    for (; i + 1 <= last; i += 2) {
      const rowI = i * width - i + lower;
      const rowJ = rowI + width - 1;
      const l1 = a[rowI + k] / pivot;
      const l2 = a[rowJ + k] / pivot;
      if (l1 === 0 && l2 === 0) continue;
      for (let j = k + 1; j <= ju; j++) {
        const ukj = a[rowK + j];
        a[rowI + j] -= l1 * ukj;
        a[rowJ + j] -= l2 * ukj;
      }
      x[i] -= l1 * xk;
      x[i + 1] -= l2 * xk;
    }
    if (i <= last) {
      const rowI = i * width - i + lower;
      const l = a[rowI + k] / pivot;
      if (l !== 0) {
        for (let j = k + 1; j <= ju; j++) a[rowI + j] -= l * a[rowK + j];
        x[i] -= l * xk;
      }
    }
  }
  for (let k = n - 1; k >= 0; k--) {
    const rowK = k * width - k + lower;
    const end = Math.min(n - 1, k + upper);
    let s = x[k];
    for (let j = k + 1; j <= end; j++) s -= a[rowK + j] * x[j];
    x[k] = s / a[rowK + k];
  }
  return x;
}
