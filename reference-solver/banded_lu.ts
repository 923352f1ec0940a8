/**
 * Banded LU factorization with partial (row) pivoting, the coarsest-grid direct solver.
 *
 * @module
 */

/** A factorized banded matrix. */
export interface BandedLU {
  /** Order of the matrix. */
  readonly n: number;
  /** Solves A·x = b in place (b is overwritten by x). */
  solve(b: Float64Array): void;
}

/**
 * Factorizes an n × n matrix with `kl` sub- and `ku` super-diagonals, given by a callback that
 * visits the entries of each row. Row pivoting widens the upper band to ku + kl, as in LAPACK's
 * banded LU; the work is O(n·kl·(kl + ku)), the storage n·(2kl + ku + 1).
 *
 * @param n Order of the matrix.
 * @param kl Lower bandwidth.
 * @param ku Upper bandwidth.
 * @param fill Called with `set(row, col, value)`; entries outside the band throw.
 * @returns The factorization.
 * @throws {RangeError} If the matrix is singular (a zero pivot), naming the row.
 *
 * @example
 * ```ts
 * import { bandedLU } from "./banded_lu.ts";
 * const lu = bandedLU(2, 1, 1, (set) => { set(0, 0, 2); set(0, 1, 1); set(1, 0, 1); set(1, 1, 3); });
 * const b = Float64Array.of(3, 4);
 * lu.solve(b); // x = (1, 1)
 * ```
 */
export function bandedLU(
  n: number,
  kl: number,
  ku: number,
  fill: (set: (row: number, col: number, value: number) => void) => void,
): BandedLU {
  const width = 2 * kl + ku + 1;
  // Row r stores columns r − kl … r + kl + ku at offsets 0 … width − 1.
  const a = new Float64Array(n * width);
  const at = (r: number, c: number) => r * width + c - r + kl;
  fill((r, c, v) => {
    if (r < 0 || r >= n || c < 0 || c >= n || c < r - kl || c > r + ku) {
      throw new RangeError(
        `Banded LU: entry (${r}, ${c}) lies outside the band kl=${kl}, ku=${ku}`,
      );
    }
    a[at(r, c)] += v;
  });
  const piv = new Int32Array(n);
  let scale = 0;
  for (let k = 0; k < a.length; k++) scale = Math.max(scale, Math.abs(a[k]));
  for (let k = 0; k < n; k++) {
    const last = Math.min(n - 1, k + kl);
    let p = k, best = Math.abs(a[at(k, k)]);
    for (let r = k + 1; r <= last; r++) {
      const v = Math.abs(a[at(r, k)]);
      if (v > best) (best = v, p = r);
    }
    if (!(best > scale * 1e-14)) {
      throw new RangeError(
        `Banded LU: the matrix is singular at row ${k} (largest pivot candidate ${best}); the coarsest-grid operator has no unique solution`,
      );
    }
    piv[k] = p;
    const cEnd = Math.min(n - 1, k + kl + ku);
    if (p !== k) {
      for (let c = k; c <= cEnd; c++) {
        const i1 = at(k, c), i2 = at(p, c);
        const t = a[i1];
        a[i1] = a[i2], a[i2] = t;
      }
    }
    const inv = 1 / a[at(k, k)];
    for (let r = k + 1; r <= last; r++) {
      const l = a[at(r, k)] * inv;
      a[at(r, k)] = l;
      if (l === 0) continue;
      const rk = at(r, 0), kk = at(k, 0);
      for (let c = k + 1; c <= cEnd; c++) a[rk + c] -= l * a[kk + c];
    }
  }
  return {
    n,
    solve(b) {
      for (let k = 0; k < n; k++) {
        const p = piv[k];
        if (p !== k) {
          const t = b[k];
          b[k] = b[p], b[p] = t;
        }
        const bk = b[k];
        const last = Math.min(n - 1, k + kl);
        for (let r = k + 1; r <= last; r++) b[r] -= a[at(r, k)] * bk;
      }
      for (let k = n - 1; k >= 0; k--) {
        const cEnd = Math.min(n - 1, k + kl + ku);
        const kk = at(k, 0);
        let s = b[k];
        for (let c = k + 1; c <= cEnd; c++) s -= a[kk + c] * b[c];
        b[k] = s / a[kk + k];
      }
    },
  };
}
