/**
 * Pure kernels of the domain check (`domain_check.ts`): local minima of values sampled on a
 * lattice, a golden-section line search, and the growth test that tells a singularity from a steep
 * but bounded peak.
 *
 * @module
 */

/** What one pass over sampled values finds (see {@link valueStats}). */
export interface ValueStats {
  /** Index of the first NaN or ±Infinity, −1 when every value is finite. */
  firstBad: number;
  /** Index of the smallest value × sign (of the first one when tied). */
  lowest: number;
  /** The largest |value| among the finite values. */
  maxAbs: number;
  /** Whether every value equals the first. */
  constant: boolean;
}

/**
 * One pass over sampled values: the first non-finite one, the smallest value × sign, the largest
 * magnitude, and whether they are all equal. Stops at the first non-finite value.
 *
 * @example
 * ```ts
 * import assert from "node:assert/strict";
 * import { valueStats } from "./_domain_kernels.ts";
 * assert.deepEqual(valueStats(new Float64Array([2, -3, 1]), 1), {
 *   firstBad: -1,
 *   lowest: 1,
 *   maxAbs: 3,
 *   constant: false,
 * });
 * ```
 */
export function valueStats(values: Float64Array, sign: number): ValueStats {
  let lowest = 0;
  let low = Infinity;
  let maxAbs = 0;
  let constant = true;
  const first = values[0];
  for (let k = 0; k < values.length; k++) {
    const v = values[k];
    if (v - v !== 0) return { firstBad: k, lowest, maxAbs, constant: false };
    const s = sign * v;
    if (s < low) {
      low = s;
      lowest = k;
    }
    const m = Math.abs(v);
    if (m > maxAbs) maxAbs = m;
    if (v !== first) constant = false;
  }
  return { firstBad: -1, lowest, maxAbs, constant };
}

/** Two chosen minima differ by at least this many lattice steps in x or in y. */
const SPREAD = 3;

/**
 * The discrete local minima of key(v) = sign·v (or −|v| when `sign` is 0, i.e. the peaks of |v|)
 * for values v on an (nx + 1) × (ny + 1) lattice (x fastest, index j·(nx + 1) + i): points whose
 * key is no larger than that of any of their up to 8 neighbours and smaller than at least one (so
 * a plateau has none). Smallest key first, at least {@link SPREAD} steps apart, at most `limit` of
 * them. Non-finite values are never minima.
 *
 * @example
 * ```ts
 * import assert from "node:assert/strict";
 * import { localMinima } from "./_domain_kernels.ts";
 * const v = new Float64Array([3, 1, 2, 4, 0, 5]);
 * assert.deepEqual(localMinima(v, 5, 0, 1, 8), [4, 1]);
 * // the peaks of |v|: index 3 is too near index 5
 * assert.deepEqual(localMinima(v, 5, 0, 0, 8), [5, 0]);
 * ```
 */
export function localMinima(
  values: Float64Array,
  nx: number,
  ny: number,
  sign: number,
  limit: number,
): number[] {
  const row = nx + 1;
  const key = (m: number) => sign === 0 ? -Math.abs(values[m]) : sign * values[m];
  const found: number[] = [];
  // one flat loop with the neighbours written out: V8 deoptimizes an inner loop compiled on its
  // own (on-stack replacement) each time it is left, once per row
  for (let k = 0; k < values.length; k++) {
    const v = key(k);
    if (v - v !== 0) continue;
    const i = k % row;
    const w = i > 0;
    const e = i < nx;
    const s = k >= row;
    const n = k < ny * row;
    if (
      (w && key(k - 1) < v) || (e && key(k + 1) < v) ||
      (s && key(k - row) < v) || (n && key(k + row) < v) ||
      (s && w && key(k - row - 1) < v) || (s && e && key(k - row + 1) < v) ||
      (n && w && key(k + row - 1) < v) || (n && e && key(k + row + 1) < v)
    ) continue;
    const above = (w && key(k - 1) > v) || (e && key(k + 1) > v) ||
      (s && key(k - row) > v) || (n && key(k + row) > v) ||
      (s && w && key(k - row - 1) > v) || (s && e && key(k - row + 1) > v) ||
      (n && w && key(k + row - 1) > v) || (n && e && key(k + row + 1) > v);
    if (above) found.push(k);
  }
  found.sort((p, q) => key(p) - key(q));
  const chosen: number[] = [];
  for (const k of found) {
    if (chosen.length >= limit) break;
    const i = k % row;
    const j = (k - i) / row;
    const near = chosen.some((c) => {
      const ci = c % row;
      return Math.abs(ci - i) < SPREAD && Math.abs((c - ci) / row - j) < SPREAD;
    });
    if (!near) chosen.push(k);
  }
  return chosen;
}

const INV_PHI = (Math.sqrt(5) - 1) / 2;

/** Golden-section steps at most: the bracket shrinks by 0.618 per step, 1e-40 after 192. */
const MAX_STEPS = 192;

/**
 * Golden-section search for a minimum of `f` on [lo, hi], until the bracket is narrower than
 * `tol`. Returns the best point evaluated (the ends and `start` included), so a minimum at an end
 * of the interval is found too; for a unimodal `f` that is the minimum to within `tol`.
 *
 * @example
 * ```ts
 * import assert from "node:assert/strict";
 * import { goldenMin } from "./_domain_kernels.ts";
 * assert.ok(Math.abs(goldenMin((t) => (t - 0.3) ** 2, 0, 1, 1e-12).t - 0.3) < 1e-9);
 * ```
 */
export function goldenMin(
  f: (t: number) => number,
  lo: number,
  hi: number,
  tol: number,
  start?: number,
): { t: number; value: number } {
  let bestT = lo;
  let best = f(lo);
  const consider = (t: number, v: number) => {
    if (v < best) {
      best = v;
      bestT = t;
    }
  };
  consider(hi, f(hi));
  if (start !== undefined) consider(start, f(start));
  let c = hi - INV_PHI * (hi - lo);
  let d = lo + INV_PHI * (hi - lo);
  let fc = f(c);
  let fd = f(d);
  consider(c, fc);
  consider(d, fd);
  for (let step = 0; step < MAX_STEPS && hi - lo > tol; step++) {
    if (fc < fd) {
      hi = d;
      d = c;
      fd = fc;
      c = hi - INV_PHI * (hi - lo);
      fc = f(c);
      consider(c, fc);
    } else {
      lo = c;
      c = d;
      fc = fd;
      d = lo + INV_PHI * (hi - lo);
      fd = f(d);
      consider(d, fd);
    }
  }
  return { t: bestT, value: best };
}

/** Distances from a peak, as fractions of the domain's side, at which its growth is measured. */
export const GROWTH_STEPS: readonly [number, number, number] = [1e-6, 1e-9, 1e-12];

/**
 * Whether |v|, measured at the distances {@link GROWTH_STEPS} from a peak, grows like a
 * singularity: it rises at each step closer, by a non-negligible amount (more than 1e-6 of itself,
 * which round-off and a smooth peak cannot reach at those distances), and the second rise is at
 * least 0.9 of the first. A pole |p − x|^−k rises a thousandfold per step, a logarithm by the same
 * amount each step; a smooth or cusped but bounded peak rises less and less (a smooth one by a
 * factor of 1000 less per step, a cusp |x − p|^β by 1000^−β).
 *
 * @param g |v| at the three distances, farthest first
 * @example
 * ```ts
 * import assert from "node:assert/strict";
 * import { growsWithoutBound } from "./_domain_kernels.ts";
 * assert.equal(growsWithoutBound([1e6, 1e9, 1e12]), true); // 1/d
 * assert.equal(growsWithoutBound([1 - 1e-6, 1 - 1e-9, 1 - 1e-12]), false); // 1 − d
 * ```
 */
export function growsWithoutBound(g: readonly [number, number, number]): boolean {
  const [far, mid, near] = g;
  const first = mid - far;
  const second = near - mid;
  return first > 1e-6 * mid && second >= 0.9 * first;
}
