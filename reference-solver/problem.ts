/**
 * The problem the reference solver takes: gridproof's one sampled-problem type
 * (`problem/`, {@link SampledProblem}) on the vertex layout. `Problem` is its name here; there is
 * no second shape. A cell-layout problem is refused by validation (`problem.layout`).
 *
 * Grid: the rectangle [x0, x1] × [y0, y1] split into nx × ny intervals, hx = (x1 − x0)/nx,
 * hy = (y1 − y0)/ny (hx may differ from hy). Node (i, j), 0 ≤ i ≤ nx, 0 ≤ j ≤ ny, sits at
 * (x0 + i·hx, y0 + j·hy) and is stored at index `j·(nx + 1) + i` (x fastest). A stretched grid
 * gives its node coordinates instead (`coordinates`): node (i, j) at (x[i], y[j]), same storage,
 * discretized by `discretize_stretched.ts` and solved by the multigrid of `stretched_solve.ts`
 * (periodic sides take the same path). Edge midpoints, where a {@link Conductivity} is sampled,
 * are then the physical midpoints ((x[i] + x[i+1])/2, y[j]) and (x[i], (y[j] + y[j+1])/2).
 *
 * Operator, non-conservative form: a·u_xx + m·u_xy + c·u_yy + b·u_x + d·u_y + e·u = f, elliptic
 * where a·c > 0 and, with m, 4ac − m² > 0 (`discretize.ts`). Conservative form, when a
 * {@link Conductivity} is given: ∇·(K∇u) + b·u_x + d·u_y + e·u = f with K sampled at the edge
 * midpoints (`discretize_conservative.ts`); a, c and m are then not used.
 *
 * @module
 */
import type { SampledProblem } from "../problem/mod.ts";

export type {
  BoundaryCondition,
  BoundaryKind,
  Conductivity,
  Domain,
  GridLines as NodeCoordinates,
  Side,
  ValuedCondition,
} from "../problem/mod.ts";
export { nodeCount, robinCondition, SIDES } from "../problem/mod.ts";

/** A discrete elliptic problem on a vertex-centred grid: the one {@link SampledProblem} type. */
export type Problem = SampledProblem;
