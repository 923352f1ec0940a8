/**
 * Quantities of interest for grid-convergence studies, computed from a discrete solution and,
 * for their exact values, from the manufactured solution:
 *
 * - `integral`: ∫∫ u dx dy (the solver's own quadrature weights: trapezoid on vertex grids,
 *   midpoint on cell grids, given weights on free points);
 * - `point`: u at the centre of the domain by bilinear interpolation of the grid values
 *   (structured layouts only; on a stretched family, where the centre is no node, by the cubic
 *   Lagrange interpolation of `quantity_rules.ts` on the mapped lines, O(h⁴)). The centre is a node of every vertex grid with even counts, so
 *   the value converges smoothly; an off-node point mixes in an interpolation error whose
 *   constant changes with the node's position from grid to grid (non-monotone convergence);
 * - `maximum`: the largest value of u, refined on structured grids by the peak of the quadratic
 *   fitted to the 3×3 (or 3-point, on a side) neighbourhood of the largest value: the peak of
 *   the fit is within O(h³) of the peak of the sampled function (its gradient vanishes there),
 *   so the discretization error, O(h²), dominates and the order is clean (derived). The fit is
 *   in grid units, so on a stretched family it fits u as a function of the map's uniform
 *   parameter, smooth under a smooth map, whose peak value is the same (derived). On a
 *   solver's own points it is the largest point value, unrefined (free points have no stencil to
 *   fit): second order at an interior peak, but only first order when the peak lies on a side the
 *   points do not reach — e.g. cell centres, h/2 inside, where the gradient is not zero (derived
 *   by Taylor expansion); its observed order then says so, and its GCI uses that order;
 * - `east-flux`: ∫ ∂u/∂n dy over the east side, with the one-sided second-order derivative
 *   (3u_N − 4u_{N−1} + u_{N−2})/(2h) on vertex grids and (2u_1 − 3u_2 + u_3)/h from the three
 *   cell centres nearest the face on cell grids (both exact for quadratics in x — derived by
 *   Lagrange interpolation), trapezoid/midpoint in y (structured layouts only; on a stretched
 *   family the same rules on unequal steps).
 *
 * Apart from that case of the maximum, all are second-order accurate functionals of a
 * second-order solution (common practice), so their observed orders and GCIs are meaningful.
 *
 * @module
 */
import type { CompiledCase } from "../../cases/types.ts";
import type { SolveOutcome } from "../solvers/mod.ts";
import { discreteQuantity, exactQuantity, structured } from "./chosen_quantities.ts";
import { cubicPointValue } from "./quantity_rules.ts";
import { gaussLegendre } from "../../cases/mod.ts";

export { gaussLegendre };

/** The built-in `east-flux` as an instance of the general flux: ∂u/∂n over the whole east side. */
const EAST_FLUX = { name: "east-flux", kind: "flux", side: "east" } as const;

/** Where the values of a discrete solution sit: the parts of a solver's outcome used here. */
export type DiscreteField = Pick<
  SolveOutcome,
  "layout" | "nx" | "ny" | "x" | "y" | "weights" | "values"
>;

/** Names and labels of the quantities, in report order. */
export const QUANTITIES = [
  { name: "integral", label: "integral of u over the domain" },
  { name: "point", label: "u at the centre of the domain, bilinear interpolation" },
  {
    name: "maximum",
    label: "largest value of u (quadratic fit around the largest nodal value; on a solver's own " +
      "points, the largest point value)",
  },
  { name: "east-flux", label: "integral of the outward normal derivative over the east side" },
] as const;

/**
 * The built-in quantities' names and labels for a case: on a stretched family `point` is the
 * cubic interpolation on the mapped lines (see the module doc), elsewhere {@link QUANTITIES}.
 */
export function builtInQuantities(stretched: boolean): { name: string; label: string }[] {
  return QUANTITIES.map((q) =>
    stretched && q.name === "point"
      ? {
        name: q.name,
        label: "u at the centre of the domain, cubic interpolation on the mapped lines",
      }
      : q
  );
}

/** Relative position of the `point` quantity inside the domain. */
const PROBE = { sx: 0.5, sy: 0.5 };

/**
 * Computes every quantity that applies to the field's layout.
 *
 * @param field the solver's values and where they sit
 * @param domain the rectangle
 * @param mappings a stretched family's per-axis maps (default: none, equal steps); on mapped
 *   lines `point` is the cubic interpolation in physical coordinates (the centre is no node) and
 *   `east-flux` takes the rules on unequal steps (`quantity_rules_mapped.ts`)
 * @returns the values by name
 */
export function discreteQuantities(
  field: DiscreteField,
  domain: { x0: number; x1: number; y0: number; y1: number },
  mappings?: CompiledCase["mappings"],
): Record<string, number> {
  const { values, weights } = field;
  let integral = 0;
  let maximum = -Infinity;
  for (let k = 0; k < values.length; k++) {
    integral += weights[k] * values[k];
    if (values[k] > maximum) maximum = values[k];
  }
  const out: Record<string, number> = { integral, maximum };
  if (field.layout === "points") return out;
  const grid = structured(field, domain, mappings);
  if (grid?.lines) {
    const point = cubicPointValue(
      grid,
      domain.x0 + PROBE.sx * (domain.x1 - domain.x0),
      domain.y0 + PROBE.sy * (domain.y1 - domain.y0),
    );
    if (point !== null) out.point = point;
    const flux = discreteQuantity(field, { domain, mappings }, EAST_FLUX, "normal");
    if (flux !== null) out["east-flux"] = flux;
    out.maximum = refinedMaximum(values, grid.ni, grid.nj);
    return out;
  }
  const { nx, ny } = field;
  const hx = (domain.x1 - domain.x0) / nx;
  const hy = (domain.y1 - domain.y0) / ny;
  // Structured: a (ni × nj) array of values at (ox + i·hx, oy + j·hy).
  const cell = field.layout === "cell";
  const ni = cell ? nx : nx + 1;
  const nj = cell ? ny : ny + 1;
  const ox = domain.x0 + (cell ? hx / 2 : 0);
  const oy = domain.y0 + (cell ? hy / 2 : 0);
  const px = domain.x0 + PROBE.sx * (domain.x1 - domain.x0);
  const py = domain.y0 + PROBE.sy * (domain.y1 - domain.y0);
  const fi = Math.min(Math.max((px - ox) / hx, 0), ni - 1 - 1e-12);
  const fj = Math.min(Math.max((py - oy) / hy, 0), nj - 1 - 1e-12);
  const i = Math.floor(fi), j = Math.floor(fj);
  const s = fi - i, t = fj - j;
  const at = (ii: number, jj: number) => values[jj * ni + ii];
  out.point = (1 - s) * (1 - t) * at(i, j) + s * (1 - t) * at(i + 1, j) +
    (1 - s) * t * at(i, j + 1) + s * t * at(i + 1, j + 1);
  const flux = discreteQuantity(field, { domain }, EAST_FLUX, "normal");
  if (flux !== null) out["east-flux"] = flux;
  out.maximum = refinedMaximum(values, ni, nj);
  return out;
}

/**
 * The peak of the quadratic fitted around the largest value of a structured (ni × nj) array: a
 * full 2-D quadratic from central differences (gradient, Hessian with the cross term) at an
 * interior peak, a 1-D parabola along a side at a peak on a side; the nodal value when the fit
 * has no interior maximum.
 */
export function refinedMaximum(values: Float64Array, ni: number, nj: number): number {
  let best = 0;
  for (let k = 1; k < values.length; k++) if (values[k] > values[best]) best = k;
  const i = best % ni, j = (best - i) / ni;
  const u0 = values[best];
  const at = (ii: number, jj: number) => values[jj * ni + ii];
  const inX = i > 0 && i < ni - 1, inY = j > 0 && j < nj - 1;
  // In grid units: q(s, t) = u0 + gx·s + gy·t + ½(hxx s² + 2 hxy s t + hyy t²).
  const gx = inX ? (at(i + 1, j) - at(i - 1, j)) / 2 : 0;
  const gy = inY ? (at(i, j + 1) - at(i, j - 1)) / 2 : 0;
  const hxx = inX ? at(i + 1, j) - 2 * u0 + at(i - 1, j) : 0;
  const hyy = inY ? at(i, j + 1) - 2 * u0 + at(i, j - 1) : 0;
  if (inX && inY) {
    const hxy = (at(i + 1, j + 1) - at(i + 1, j - 1) - at(i - 1, j + 1) + at(i - 1, j - 1)) / 4;
    const det = hxx * hyy - hxy * hxy;
    if (hxx < 0 && det > 0) {
      // peak of q: H·(s,t) = −g; value u0 + ½ g·(s,t)
      const s = -(hyy * gx - hxy * gy) / det;
      const t = -(-hxy * gx + hxx * gy) / det;
      if (Math.abs(s) <= 1 && Math.abs(t) <= 1) return u0 + 0.5 * (gx * s + gy * t);
    }
    return u0;
  }
  if (inX && hxx < 0) return u0 - (gx * gx) / (2 * hxx);
  if (inY && hyy < 0) return u0 - (gy * gy) / (2 * hyy);
  return u0;
}

/** The exact values of the quantities for a manufactured case (by quadrature of its exact solution). */
export function exactQuantities(kase: CompiledCase): Record<string, number> {
  const { x0, x1, y0, y1 } = kase.domain;
  const gx = gaussLegendre(x0, x1, 32);
  const gy = gaussLegendre(y0, y1, 32);
  let integral = 0;
  for (let j = 0; j < gy.x.length; j++) {
    for (let i = 0; i < gx.x.length; i++) {
      integral += gx.w[i] * gy.w[j] * kase.exact(gx.x[i], gy.x[j]);
    }
  }
  return {
    integral,
    point: kase.exact(x0 + PROBE.sx * (x1 - x0), y0 + PROBE.sy * (y1 - y0)),
    maximum: exactMaximum(kase),
    "east-flux": exactQuantity(kase, EAST_FLUX, "normal"),
  };
}

/** Maximum of the exact solution: a 201×201 scan, then a shrinking pattern search around the best point. */
function exactMaximum(kase: CompiledCase): number {
  const { x0, x1, y0, y1 } = kase.domain;
  const n = 200;
  let best = -Infinity, bx = x0, by = y0;
  for (let j = 0; j <= n; j++) {
    for (let i = 0; i <= n; i++) {
      const x = x0 + (i / n) * (x1 - x0), y = y0 + (j / n) * (y1 - y0);
      const v = kase.exact(x, y);
      if (v > best) (best = v), (bx = x), (by = y);
    }
  }
  let sx = (x1 - x0) / n, sy = (y1 - y0) / n;
  while (sx > 1e-12 * (x1 - x0)) {
    let moved = false;
    for (const [dx, dy] of [[1, 0], [-1, 0], [0, 1], [0, -1]]) {
      const x = Math.min(Math.max(bx + dx * sx, x0), x1);
      const y = Math.min(Math.max(by + dy * sy, y0), y1);
      const v = kase.exact(x, y);
      if (v > best) (best = v), (bx = x), (by = y), (moved = true);
    }
    if (!moved) (sx /= 2), (sy /= 2);
  }
  return best;
}
