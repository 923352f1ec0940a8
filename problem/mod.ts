/**
 * The one sampled-problem type, {@link SampledProblem}: an elliptic problem sampled at the points
 * of a vertex or cell grid as plain `Float64Array`s (coefficients a–f and m, the four sides, K
 * where each flux is evaluated, the lines of a stretched grid), with its side and conductivity
 * types and the counts of every array. The reference solver solves it, a compiled case's `sample`
 * and the harness's cell sampler produce it, and the solver protocol maps it to and from the wire.
 *
 * Why a folder of its own rather than `grid/`: `grid/` describes where points are (a box, lines,
 * a layout) and says nothing about equations; this part is the data of one equation on such a
 * grid. It builds on `grid/` (its `Box` and `GridLayout`) and, like it, is a leaf: it imports
 * nothing else of gridproof and no Deno API, so the reference solver, the protocol and the
 * harness can all import it without importing one another.
 *
 * @example
 * ```ts
 * import { pointCount, robinCondition, type SampledProblem, SIDES } from "./mod.ts";
 * const n = pointCount("vertex", 2, 2);
 * const zero = new Float64Array(n), one = new Float64Array(n).fill(1);
 * const side = { kind: "dirichlet" as const, values: new Float64Array(3) };
 * const p: SampledProblem = {
 *   domain: { x0: 0, x1: 1, y0: 0, y1: 1 }, nx: 2, ny: 2,
 *   a: one, b: zero, c: one, d: zero, e: zero, f: one,
 *   boundary: { west: side, east: side, south: robinCondition(1, 0.5, new Float64Array(3)), north: side },
 * };
 * SIDES.length; // 4
 * ```
 *
 * @module
 */
export type {
  BoundaryCondition,
  BoundaryKind,
  CoefficientName,
  Conductivity,
  Domain,
  GridLines,
  OperatorForm,
  SampledProblem,
  Side,
  ValuedCondition,
} from "./types.ts";
export { SIDES } from "./types.ts";
export { faceCounts, nodeCount, pointCount, problemPointCount, sideCount } from "./counts.ts";
export { robinCondition } from "./robin.ts";
export { allZero, formOf } from "./form.ts";
