/**
 * The rules of `quantity_rules.ts` on grids with unequal steps (a stretched family's mapped
 * lines): pure kernels on the solver's values, each rule the one of the uniform grid written in
 * physical coordinates, so it reduces to it on equal steps (up to rounding).
 *
 * A line is given by its n + 1 grid lines `t₀ < … < tₙ` (a vertex grid's nodes, a cell grid's
 * faces); values sit at the nodes or at the cell centres `cₖ = (tₖ + tₖ₊₁)/2`, widths
 * `hₖ = tₖ₊₁ − tₖ`.
 *
 * - **integral over [a, b]** ({@link mappedLineWeights}): vertex — the exact integral of the
 *   piecewise-linear interpolant (trapezoid with the real interval lengths); cell — the midpoint
 *   rule with the real widths on whole cells and, on a partly covered cell, the integral of the
 *   linear reconstruction `uₖ + sₖ·(t − cₖ)` over the covered part, the slope from the
 *   neighbouring centres `sₖ = (uₖ₊₁ − uₖ₋₁)/(cₖ₊₁ − cₖ₋₁)` (one-sided `(u₁ − u₀)/(c₁ − c₀)`
 *   at the ends; exact for linear u on any spacing). A whole cell's slope term integrates to zero.
 * - **value at a point** ({@link lagrangeWeights}): Lagrange interpolation on the 4 values around
 *   the point (shifted inward near a side), weights `ℓₐ(t) = Π_{b≠a} (t − p_b)/(p_a − p_b)` at the
 *   real positions: exact for cubics, O(h⁴) under a smooth map.
 * - **normal derivative at a side** ({@link sideWeights}): from the three values nearest the side
 *   at distances d₀ < d₁ < d₂ inward from it (vertex: d₀ = 0; cell: the centres' distances),
 *   differentiate the quadratic interpolant p(d) = Σ uᵢ ℓᵢ(d) at d = 0. With
 *   ℓ₀(d) = (d − d₁)(d − d₂)/((d₀ − d₁)(d₀ − d₂)) and its cyclic versions,
 *
 *       ℓ₀′(0) = −(d₁ + d₂)/((d₀ − d₁)(d₀ − d₂)),
 *       ℓ₁′(0) = −(d₀ + d₂)/((d₁ − d₀)(d₁ − d₂)),
 *       ℓ₂′(0) = −(d₀ + d₁)/((d₂ − d₀)(d₂ − d₁)),
 *
 *   and since d grows inward, the outward derivative is ∂u/∂n = −Σ uᵢ ℓᵢ′(0): exact for
 *   quadratics on any spacing, error O(h²) (on vertex grids, d₀ = 0, it is u‴·d₁d₂/6 at leading
 *   order: the derivative of the interpolation error at a node). On
 *   equal steps, vertex d = (0, h, 2h) gives (3u₀ − 4u₁ + u₂)/(2h) and cell d = (h/2, 3h/2, 5h/2)
 *   gives (2u₀ − 3u₁ + u₂)/h, the uniform rules. A cell grid's value on the side is the same
 *   quadratic at d = 0, Σ uᵢ ℓᵢ(0) with ℓ₀(0) = d₁d₂/((d₀ − d₁)(d₀ − d₂)) (15/8, −10/8, 3/8 on
 *   equal steps).
 * - **tangential derivative along a side**: the derivative of the quadratic through three
 *   neighbouring side values at the middle one (at the first or last one at the ends of the side):
 *   {@link derivativeWeights}.
 *
 * @module
 */
import type { LineLayout } from "./quantity_rules.ts";

/** The positions of a line's values: its nodes (vertex) or the midpoints of its faces (cell). */
export function mappedPositions(layout: LineLayout, lines: ArrayLike<number>): Float64Array {
  if (layout === "vertex") return Float64Array.from(lines);
  const out = new Float64Array(lines.length - 1);
  for (let k = 0; k < out.length; k++) out[k] = (lines[k] + lines[k + 1]) / 2;
  return out;
}

/**
 * Quadrature weights of ∫ₐᵇ u dt from the values along one line with unequal steps (module doc).
 * [a, b] must lie inside the line (a ≤ b).
 *
 * @param layout vertex (values at the lines) or cell (values at the centres)
 * @param lines the n + 1 lines, increasing
 * @param a start of the interval
 * @param b end of the interval
 * @returns one weight per value
 */
export function mappedLineWeights(
  layout: LineLayout,
  lines: ArrayLike<number>,
  a: number,
  b: number,
): Float64Array {
  const n = lines.length - 1;
  if (layout === "vertex") {
    const w = new Float64Array(n + 1);
    for (let k = 0; k < n; k++) {
      const t0 = lines[k], t1 = lines[k + 1], h = t1 - t0;
      const l = Math.max(a, t0), r = Math.min(b, t1);
      if (!(r > l)) continue;
      const len = r - l, mid = (l + r) / 2;
      w[k] += (len * (t1 - mid)) / h;
      w[k + 1] += (len * (mid - t0)) / h;
    }
    return w;
  }
  const c = mappedPositions("cell", lines);
  const w = new Float64Array(n);
  for (let k = 0; k < n; k++) {
    const f0 = lines[k], f1 = lines[k + 1];
    const l = Math.max(a, f0), r = Math.min(b, f1);
    if (!(r > l)) continue;
    w[k] += r - l;
    // ∫ₗʳ (t − cₖ) dt, zero for a whole cell, times the slope's weights
    const moment = ((r - c[k]) ** 2 - (l - c[k]) ** 2) / 2;
    if (moment === 0 || n < 2) continue;
    const [lo, hi] = k === 0 ? [0, 1] : k === n - 1 ? [n - 2, n - 1] : [k - 1, k + 1];
    const s = moment / (c[hi] - c[lo]);
    w[hi] += s;
    w[lo] -= s;
  }
  return w;
}

/**
 * The first index and the 4 Lagrange weights of the value at t from positions p (increasing, at
 * least 4): the 4 positions around t, shifted inward near the ends (module doc).
 *
 * @param p the positions of the values
 * @param t where to interpolate
 * @returns the first of the 4 indices and their weights
 */
export function lagrangeWeights(p: ArrayLike<number>, t: number): [number, number[]] {
  const m = p.length;
  // the last position at or before t (binary search)
  let lo = 0, hi = m - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (p[mid] <= t) lo = mid;
    else hi = mid;
  }
  const first = Math.min(Math.max(lo - 1, 0), m - 4);
  const w: number[] = [];
  for (let a = 0; a < 4; a++) {
    let prod = 1;
    for (let b = 0; b < 4; b++) {
      if (b !== a) prod *= (t - p[first + b]) / (p[first + a] - p[first + b]);
    }
    w.push(prod);
  }
  return [first, w];
}

/**
 * The weights ℓᵢ′(t) of the derivative at t of the quadratic through (pᵢ, uᵢ), i = 0, 1, 2:
 * exact for quadratics on any spacing.
 */
export function derivativeWeights(
  p0: number,
  p1: number,
  p2: number,
  t: number,
): [number, number, number] {
  return [
    ((t - p1) + (t - p2)) / ((p0 - p1) * (p0 - p2)),
    ((t - p0) + (t - p2)) / ((p1 - p0) * (p1 - p2)),
    ((t - p0) + (t - p1)) / ((p2 - p0) * (p2 - p1)),
  ];
}

/**
 * Weights on the three values nearest a side, at distances d₀ < d₁ < d₂ inward from it: the
 * outward normal derivative `dn` and the value on the side `value` of their quadratic
 * (module doc).
 */
export function sideWeights(
  d0: number,
  d1: number,
  d2: number,
): { dn: [number, number, number]; value: [number, number, number] } {
  const [a, b, c] = derivativeWeights(d0, d1, d2, 0);
  return {
    dn: [-a, -b, -c],
    value: [
      (d1 * d2) / ((d0 - d1) * (d0 - d2)),
      (d0 * d2) / ((d1 - d0) * (d1 - d2)),
      (d0 * d1) / ((d2 - d0) * (d2 - d1)),
    ],
  };
}
