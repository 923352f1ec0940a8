/**
 * Node coordinates and volume weights of a problem's grid, uniform or stretched, periodic or not.
 *
 * Volume weights (the trapezoid rule on the node grid): along x, node i owns
 * wx[i] = ((x[i] − x[i−1]) [i > 0] + (x[i+1] − x[i]) [i < nx]) / 2, so a side node owns half its
 * cell and Σ wx = x1 − x0; along y alike; node (i, j) owns wx[i]·wy[j]. The weights sum to the
 * domain's area, and Σ w·u is the trapezoid rule for ∫u. On a periodic axis the node i = nx is the
 * image of i = 0 and the two halves together, (x[1] − x[0] + x[nx] − x[nx−1])/2, are the periodic
 * trapezoid weight of that node. The volume-weighted mean of u is Σ w·u / Σ w.
 *
 * @module
 */
import type { Problem } from "./problem.ts";

/** The node coordinates of a problem: its `coordinates`, or the uniform nodes x0 + i·hx. */
export function nodeCoordinates(
  problem: Pick<Problem, "domain" | "nx" | "ny" | "coordinates">,
): { x: Float64Array; y: Float64Array } {
  if (problem.coordinates !== undefined) return problem.coordinates;
  const { domain: d, nx, ny } = problem;
  const x = Float64Array.from({ length: nx + 1 }, (_, i) => d.x0 + (i * (d.x1 - d.x0)) / nx);
  const y = Float64Array.from({ length: ny + 1 }, (_, j) => d.y0 + (j * (d.y1 - d.y0)) / ny);
  x[nx] = d.x1, y[ny] = d.y1;
  return { x, y };
}

/** The 1-D trapezoid weights of the nodes of one axis (see the module doc). */
export function axisWeights(x: Float64Array): Float64Array {
  const n = x.length - 1;
  const w = new Float64Array(n + 1);
  for (let i = 0; i < n; i++) {
    const h = (x[i + 1] - x[i]) / 2;
    w[i] += h, w[i + 1] += h;
  }
  return w;
}

/**
 * The volume weight of every node of a problem's grid (trapezoid rule, see the module doc), on the
 * public layout ((nx + 1)(ny + 1) values, x fastest). The weights sum to the domain's area; the
 * volume-weighted mean of a field u is Σ w·u / Σ w.
 *
 * @param problem The grid: domain, nx, ny and optional coordinates.
 * @returns One weight per node.
 *
 * @example
 * ```ts
 * import { volumeWeights } from "./stretched_grid.ts";
 * const w = volumeWeights({ domain: { x0: 0, x1: 1, y0: 0, y1: 1 }, nx: 2, ny: 2 });
 * if (w[4] !== 0.25 || w[0] !== 0.0625) throw new Error("trapezoid weights");
 * ```
 */
export function volumeWeights(
  problem: Pick<Problem, "domain" | "nx" | "ny" | "coordinates">,
): Float64Array {
  const { x, y } = nodeCoordinates(problem);
  const wx = axisWeights(x), wy = axisWeights(y);
  const { nx, ny } = problem;
  const out = new Float64Array((nx + 1) * (ny + 1));
  for (let j = 0; j <= ny; j++) {
    for (let i = 0; i <= nx; i++) out[j * (nx + 1) + i] = wx[i] * wy[j];
  }
  return out;
}
