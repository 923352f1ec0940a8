/**
 * The zoo's linear system: a fixed number of entries per row in slots (five for the five-point
 * stencils, nine for stencils with cross terms; x fastest ordering), with its residual norm.
 *
 * @module
 */

/** Default entries per row: centre and four neighbours. */
export const SLOTS = 5;

/**
 * A sparse system A·u = rhs with up to `slots` entries per row; unused slots have column −1.
 * `bandwidth` bounds |column − row| over all entries.
 */
export interface LinearSystem {
  n: number;
  /** Entries per row (row r owns slots r·slots … r·slots + slots − 1). */
  slots: number;
  cols: Int32Array;
  vals: Float64Array;
  rhs: Float64Array;
  bandwidth: number;
}

/** An empty system of n rows with the given bandwidth and entries per row (default {@link SLOTS}). */
export function emptySystem(n: number, bandwidth: number, slots: number = SLOTS): LinearSystem {
  return {
    n,
    slots,
    cols: new Int32Array(n * slots).fill(-1),
    vals: new Float64Array(n * slots),
    rhs: new Float64Array(n),
    bandwidth,
  };
}

/**
 * Adds `value` to entry (row, col), merging with an entry already in that column.
 *
 * @throws {RangeError} when the row already holds `slots` other columns (an assembly bug)
 */
export function addEntry(system: LinearSystem, row: number, col: number, value: number): void {
  const { slots } = system;
  const base = row * slots;
  for (let s = 0; s < slots; s++) {
    const c = system.cols[base + s];
    if (c === col) {
      system.vals[base + s] += value;
      return;
    }
    if (c === -1) {
      system.cols[base + s] = col;
      system.vals[base + s] = value;
      return;
    }
  }
  throw new RangeError(`row ${row} has no free slot for column ${col}; an assembly bug`);
}

/**
 * The Euclidean norm of rhs − A·u.
 *
 * @example
 * ```ts
 * import { addEntry, emptySystem, residualNorm } from "./system.ts";
 * const s = emptySystem(1, 0);
 * addEntry(s, 0, 0, 2);
 * s.rhs[0] = 4;
 * residualNorm(s, new Float64Array([1])); // 2
 * ```
 */
export function residualNorm(system: LinearSystem, u: Float64Array): number {
  const { n, cols, vals, rhs, slots } = system;
  let sum = 0;
  for (let i = 0; i < n; i++) {
    let r = rhs[i];
    const base = i * slots;
    for (let s = 0; s < slots; s++) {
      const c = cols[base + s];
      if (c >= 0) r -= vals[base + s] * u[c];
    }
    sum += r * r;
  }
  return Math.sqrt(sum);
}
