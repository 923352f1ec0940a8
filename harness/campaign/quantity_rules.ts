/**
 * The discrete rules of the quantities of interest on a structured grid: pure kernels on the
 * solver's values (a row-major `ni × nj` array, x fastest, value `(i, j)` at `(ox + i·hx, oy + j·hy)`).
 *
 * Rules, per layout (each at least second order for a second-order solution; derived by Taylor
 * expansion and Lagrange interpolation, checked by `quantity_rules_test.ts` on smooth fields):
 *
 * - **integral over [a, b]** along one line ({@link lineWeights}): on vertex grids the exact
 *   integral of the piecewise-linear interpolant of the nodal values (the trapezoid rule where
 *   [a, b] holds whole intervals); on cell grids the midpoint rule on every whole cell, and on a
 *   cell [a, b] covers in part, the integral over the covered part of the cell's linear
 *   reconstruction `u_k + s_k·(x − x_k)` (slope `s_k` by central differences of the neighbouring
 *   centres, one-sided at the ends of the line). A whole cell's slope term integrates to zero, so
 *   a face-aligned [a, b] is the plain midpoint rule. The partial intervals at the ends add
 *   O(h³) each, so the error is the smooth O(h²) of the whole-interval rule plus O(h³) — the
 *   observed order reads cleanly wherever a and b fall between grid points. A rectangle takes the
 *   tensor product of the two lines' weights.
 * - **value at a point** ({@link cubicPointValue}): tensor-product cubic Lagrange interpolation on
 *   the 4 × 4 grid values around the point (shifted inward near a side): O(h⁴), so the solver's
 *   O(h²) error dominates and converges smoothly wherever the point lies between grid points.
 * - **flux through a side** ({@link sideDerivatives}): the outward normal derivative at each point
 *   of the side from the three grid values nearest it along the normal, exact for quadratics —
 *   vertex `(3u₀ − 4u₁ + u₂)/(2h)`, cell (centres h/2, 3h/2, 5h/2 from the face)
 *   `(2u₀ − 3u₁ + u₂)/h` — and the tangential derivative along the side by central differences
 *   (one-sided second-order at its ends) of the side's values: the nodal values on vertex grids,
 *   on cell grids the face values extrapolated by the same quadratic, `(15u₀ − 10u₁ + 3u₂)/8`.
 *   The flux density is then integrated along the side with {@link lineWeights}.
 *
 * A field with `lines` (a stretched family's mapped grid lines) takes the same rules written on
 * unequal steps (`quantity_rules_mapped.ts`, with the derivation of the one-sided derivative);
 * without them every value is computed as before, bit for bit.
 *
 * @module
 */
import {
  derivativeWeights,
  lagrangeWeights,
  mappedLineWeights,
  mappedPositions,
  sideWeights,
} from "./quantity_rules_mapped.ts";

/** Where values sit along one grid line: nodes (`vertex`) or cell centres (`cell`). */
export type LineLayout = "vertex" | "cell";

/** A structured field: values at `(ox + i·hx, oy + j·hy)`, `i < ni`, `j < nj`, x fastest. */
export interface StructuredField {
  layout: LineLayout;
  values: ArrayLike<number>;
  ni: number;
  nj: number;
  /** The domain the grid covers. */
  domain: { x0: number; x1: number; y0: number; y1: number };
  /**
   * The grid lines per axis (vertex nodes or cell faces, nx + 1 and ny + 1 numbers) when the
   * steps are unequal; absent (default): equal steps across the domain.
   */
  lines?: { x: ArrayLike<number>; y: ArrayLike<number> };
}

/**
 * Quadrature weights of ∫ₐᵇ u dt from the values of u along one grid line (rules in the module
 * doc). The line covers [lo, lo + n·h] with n intervals: n + 1 nodes (`vertex`) or n centres
 * (`cell`). [a, b] must lie inside the line (a ≤ b).
 */
export function lineWeights(
  layout: LineLayout,
  lo: number,
  h: number,
  n: number,
  a: number,
  b: number,
): Float64Array {
  if (layout === "vertex") {
    const w = new Float64Array(n + 1);
    for (let k = 0; k < n; k++) {
      const t0 = lo + k * h, t1 = t0 + h;
      const l = Math.max(a, t0), r = Math.min(b, t1);
      if (!(r > l)) continue;
      // ∫ₗʳ of the hat functions of nodes k and k + 1 on [t0, t1]
      const len = r - l, mid = (l + r) / 2;
      w[k] += (len * (t1 - mid)) / h;
      w[k + 1] += (len * (mid - t0)) / h;
    }
    return w;
  }
  const w = new Float64Array(n);
  for (let k = 0; k < n; k++) {
    const f0 = lo + k * h, f1 = f0 + h, c = f0 + h / 2;
    const l = Math.max(a, f0), r = Math.min(b, f1);
    if (!(r > l)) continue;
    const len = r - l;
    w[k] += len;
    // ∫ₗʳ (t − c) dt: zero for a whole cell
    const moment = ((r - c) ** 2 - (l - c) ** 2) / 2;
    if (moment === 0 || n < 2) continue;
    if (k === 0) {
      w[1] += moment / h;
      w[0] -= moment / h;
    } else if (k === n - 1) {
      w[n - 1] += moment / h;
      w[n - 2] -= moment / h;
    } else {
      w[k + 1] += moment / (2 * h);
      w[k - 1] -= moment / (2 * h);
    }
  }
  return w;
}

/** The positions of a line's values: nodes or cell centres of n intervals on [lo, lo + n·h]. */
export function linePositions(layout: LineLayout, lo: number, h: number, n: number): number[] {
  const m = layout === "vertex" ? n + 1 : n;
  const off = layout === "vertex" ? 0 : h / 2;
  return Array.from({ length: m }, (_, k) => lo + off + k * h);
}

/** ∫∫ u over [xa, xb] × [ya, yb] (inside the domain) by the tensor product of {@link lineWeights}. */
export function rectangleIntegral(
  field: StructuredField,
  xa: number,
  xb: number,
  ya: number,
  yb: number,
): number {
  const { layout, values, ni, nj, domain, lines } = field;
  const nx = layout === "vertex" ? ni - 1 : ni;
  const ny = layout === "vertex" ? nj - 1 : nj;
  const hx = (domain.x1 - domain.x0) / nx, hy = (domain.y1 - domain.y0) / ny;
  const wx = lines
    ? mappedLineWeights(layout, lines.x, xa, xb)
    : lineWeights(layout, domain.x0, hx, nx, xa, xb);
  const wy = lines
    ? mappedLineWeights(layout, lines.y, ya, yb)
    : lineWeights(layout, domain.y0, hy, ny, ya, yb);
  let sum = 0;
  for (let j = 0; j < nj; j++) {
    if (wy[j] === 0) continue;
    let row = 0;
    for (let i = 0; i < ni; i++) row += wx[i] * values[j * ni + i];
    sum += wy[j] * row;
  }
  return sum;
}

/** Cubic Lagrange weights on the 4 of `m` positions `o + k·h` around t: the first index and weights. */
function cubicStencil(o: number, h: number, m: number, t: number): [number, number[]] {
  const f = (t - o) / h;
  const first = Math.min(Math.max(Math.floor(f) - 1, 0), m - 4);
  const s = f - first; // position in units of h from the first node: nodes at 0, 1, 2, 3
  return [first, [
    (-(s - 1) * (s - 2) * (s - 3)) / 6,
    (s * (s - 2) * (s - 3)) / 2,
    (-s * (s - 1) * (s - 3)) / 2,
    (s * (s - 1) * (s - 2)) / 6,
  ]];
}

/**
 * u at (x, y) by tensor-product cubic Lagrange interpolation (module doc); null when a direction
 * has fewer than 4 values.
 */
export function cubicPointValue(field: StructuredField, x: number, y: number): number | null {
  const { layout, values, ni, nj, domain } = field;
  if (ni < 4 || nj < 4) return null;
  const nx = layout === "vertex" ? ni - 1 : ni;
  const ny = layout === "vertex" ? nj - 1 : nj;
  const hx = (domain.x1 - domain.x0) / nx, hy = (domain.y1 - domain.y0) / ny;
  const off = layout === "vertex" ? 0 : 0.5;
  const { lines } = field;
  const [i0, wx] = lines
    ? lagrangeWeights(mappedPositions(layout, lines.x), x)
    : cubicStencil(domain.x0 + off * hx, hx, ni, x);
  const [j0, wy] = lines
    ? lagrangeWeights(mappedPositions(layout, lines.y), y)
    : cubicStencil(domain.y0 + off * hy, hy, nj, y);
  let sum = 0;
  for (let b = 0; b < 4; b++) {
    let row = 0;
    for (let a = 0; a < 4; a++) row += wx[a] * values[(j0 + b) * ni + i0 + a];
    sum += wy[b] * row;
  }
  return sum;
}

/** A side of the rectangle. */
export type SideName = "west" | "east" | "south" | "north";

/**
 * The derivatives of u at the points of one side (module doc), ordered by increasing coordinate
 * along the side: the outward normal derivative `dn`, the tangential derivative `dt` (along +y on
 * west and east, +x on south and north), and where the points are (`t`, along the side) with the
 * line's spacing (on unequal steps, `lines`: the side's grid lines, and `h` their mean step).
 * Null when fewer than 3 values lie along the normal or the side.
 */
export function sideDerivatives(
  field: StructuredField,
  side: SideName,
): SideDerivatives | null {
  const { layout, values, ni, nj, domain } = field;
  const vertical = side === "west" || side === "east";
  const across = vertical ? ni : nj, along = vertical ? nj : ni;
  if (across < 3 || along < 3) return null;
  if (field.lines) return mappedSideDerivatives(field, side, field.lines);
  const n = layout === "vertex" ? along - 1 : along;
  const lo = vertical ? domain.y0 : domain.x0;
  const h = ((vertical ? domain.y1 : domain.x1) - lo) / n;
  const nAcross = layout === "vertex" ? across - 1 : across;
  const hn = (vertical ? domain.x1 - domain.x0 : domain.y1 - domain.y0) / nAcross;
  const far = side === "east" || side === "north";
  // value at depth d (0: the row nearest the side) and position k along the side
  const at = (d: number, k: number) => {
    const r = far ? across - 1 - d : d;
    return vertical ? values[k * ni + r] : values[r * ni + k];
  };
  const dn = new Float64Array(along), onSide = new Float64Array(along);
  for (let k = 0; k < along; k++) {
    const u0 = at(0, k), u1 = at(1, k), u2 = at(2, k);
    if (layout === "vertex") {
      dn[k] = (3 * u0 - 4 * u1 + u2) / (2 * hn);
      onSide[k] = u0;
    } else {
      dn[k] = (2 * u0 - 3 * u1 + u2) / hn;
      onSide[k] = (15 * u0 - 10 * u1 + 3 * u2) / 8;
    }
  }
  const dt = new Float64Array(along);
  for (let k = 0; k < along; k++) {
    if (k === 0) dt[k] = (-3 * onSide[0] + 4 * onSide[1] - onSide[2]) / (2 * h);
    else if (k === along - 1) {
      dt[k] = (3 * onSide[k] - 4 * onSide[k - 1] + onSide[k - 2]) / (2 * h);
    } else dt[k] = (onSide[k + 1] - onSide[k - 1]) / (2 * h);
  }
  return { dn, dt, t: linePositions(layout, lo, h, n), lo, h, n };
}

/** What {@link sideDerivatives} returns. */
export interface SideDerivatives {
  /** The outward normal derivative at each point of the side. */
  dn: Float64Array;
  /** The tangential derivative at each point of the side. */
  dt: Float64Array;
  /** Where the points are along the side. */
  t: ArrayLike<number>;
  /** The side's first line, its mean step and its number of intervals. */
  lo: number;
  h: number;
  n: number;
  /** The side's grid lines when the steps are unequal. */
  lines?: ArrayLike<number>;
}

/** {@link sideDerivatives} on unequal steps (rules in `quantity_rules_mapped.ts`). */
function mappedSideDerivatives(
  field: StructuredField,
  side: SideName,
  lines: { x: ArrayLike<number>; y: ArrayLike<number> },
): SideDerivatives {
  const { layout, values, ni, nj } = field;
  const vertical = side === "west" || side === "east";
  const across = vertical ? ni : nj, along = vertical ? nj : ni;
  const far = side === "east" || side === "north";
  const normalLines = vertical ? lines.x : lines.y, sideLines = vertical ? lines.y : lines.x;
  const p = mappedPositions(layout, normalLines);
  const wall = far ? normalLines[normalLines.length - 1] : normalLines[0];
  // distances inward from the side of the three values nearest it
  const depth = (d: number) => Math.abs(p[far ? across - 1 - d : d] - wall);
  const weights = sideWeights(depth(0), depth(1), depth(2));
  const at = (d: number, k: number) => {
    const r = far ? across - 1 - d : d;
    return vertical ? values[k * ni + r] : values[r * ni + k];
  };
  const dn = new Float64Array(along), onSide = new Float64Array(along);
  for (let k = 0; k < along; k++) {
    const u0 = at(0, k), u1 = at(1, k), u2 = at(2, k);
    dn[k] = weights.dn[0] * u0 + weights.dn[1] * u1 + weights.dn[2] * u2;
    onSide[k] = layout === "vertex"
      ? u0
      : weights.value[0] * u0 + weights.value[1] * u1 + weights.value[2] * u2;
  }
  const t = mappedPositions(layout, sideLines);
  const dt = new Float64Array(along);
  for (let k = 0; k < along; k++) {
    // the middle of three neighbours, or the first or last three at the ends
    const c = Math.min(Math.max(k - 1, 0), along - 3);
    const [a, b, e] = derivativeWeights(t[c], t[c + 1], t[c + 2], t[k]);
    dt[k] = a * onSide[c] + b * onSide[c + 1] + e * onSide[c + 2];
  }
  const n = sideLines.length - 1, lo = sideLines[0];
  return { dn, dt, t, lo, h: (sideLines[n] - lo) / n, n, lines: sideLines };
}
