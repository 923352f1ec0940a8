/**
 * The zoo's linear system: at most five entries per row in fixed slots (x fastest ordering), with
 * its residual norm.
 *
 * @module
 */

/** Entries per row: centre and four neighbours. */
export const SLOTS = 5;

/**
 * A sparse system A·u = rhs with up to {@link SLOTS} entries per row; unused slots have column −1.
 * `bandwidth` bounds |column − row| over all entries.
 */
export interface LinearSystem {
  n: number;
  cols: Int32Array;
  vals: Float64Array;
  rhs: Float64Array;
  bandwidth: number;
}

/** An empty system of n rows with the given bandwidth. */
export function emptySystem(n: number, bandwidth: number): LinearSystem {
  return {
    n,
    cols: new Int32Array(n * SLOTS).fill(-1),
    vals: new Float64Array(n * SLOTS),
    rhs: new Float64Array(n),
    bandwidth,
  };
}

/**
 * Adds `value` to entry (row, col), merging with an entry already in that column.
 *
 * @throws {RangeError} when the row already holds five other columns (an assembly bug)
 */
export function addEntry(system: LinearSystem, row: number, col: number, value: number): void {
  const base = row * SLOTS;
  for (let s = 0; s < SLOTS; s++) {
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
  const { n, cols, vals, rhs } = system;
  let sum = 0;
  for (let i = 0; i < n; i++) {
    let r = rhs[i];
    const base = i * SLOTS;
    for (let s = 0; s < SLOTS; s++) {
      const c = cols[base + s];
      if (c >= 0) r -= vals[base + s] * u[c];
    }
    sum += r * r;
  }
  return Math.sqrt(sum);
}
