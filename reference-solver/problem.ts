/**
 * The problem the reference solver takes: plain typed arrays on a vertex-centred grid, with no
 * knowledge of cases, expressions or the harness.
 *
 * Grid: the rectangle [x0, x1] × [y0, y1] split into nx × ny equal intervals, hx = (x1 − x0)/nx,
 * hy = (y1 − y0)/ny (hx may differ from hy). Node (i, j), 0 ≤ i ≤ nx, 0 ≤ j ≤ ny, sits at
 * (x0 + i·hx, y0 + j·hy) and is stored at index `j·(nx + 1) + i` (x fastest). A stretched grid
 * gives its node coordinates instead ({@link NodeCoordinates}): node (i, j) at (x[i], y[j]), same
 * storage. Edge midpoints (where a {@link Conductivity} is sampled) are then the physical
 * midpoints ((x[i] + x[i+1])/2, y[j]) and (x[i], (y[j] + y[j+1])/2).
 *
 * Operator, non-conservative form: a·u_xx + m·u_xy + c·u_yy + b·u_x + d·u_y + e·u = f, elliptic
 * where a·c > 0 and, with m, 4ac − m² > 0 (`discretize.ts`). Conservative form, when a
 * {@link Conductivity} is given: ∇·(K∇u) + b·u_x + d·u_y + e·u = f with K sampled at the edge
 * midpoints (`discretize_conservative.ts`).
 *
 * @module
 */

/** The four sides of the rectangle. West is x = x0, east x = x1, south y = y0, north y = y1. */
export type Side = "west" | "east" | "south" | "north";

/** All sides, in the order used everywhere (reports, loops, messages). */
export const SIDES: readonly Side[] = ["west", "east", "south", "north"] as const;

/** The four kinds of boundary condition. */
export type BoundaryKind = "dirichlet" | "neumann" | "robin" | "periodic";

/**
 * A boundary condition on one side. `values` holds one number per node along the side, ordered by
 * increasing coordinate: ny + 1 values on west and east (south to north), nx + 1 values on south and
 * north (west to east), corners included.
 *
 * - dirichlet: u = values
 * - neumann: ∂u/∂n = values, n the outward unit normal
 * - robin: alpha·u + beta·∂u/∂n = values (n outward), with alpha and beta given per node like
 *   values (they may vary along the side). On one side beta is either 0 at every node (the side
 *   fixes u = values/alpha) or non-zero at every node (a flux condition); alpha and beta are never
 *   both 0 at a node. {@link robinCondition} builds a side with constant weights.
 * - periodic: no values. Periodic sides come in pairs, west+east or south+north (a lone periodic
 *   side is refused). Nodes stay (nx + 1) × (ny + 1); with west+east periodic, node i = nx is the
 *   image of node i = 0: every input array must agree there (validated, naming the node) and the
 *   solution returned has equal values there. The grid is periodic with period x1 − x0: across
 *   the seam the spacing is x[1] − x[0] on one side and x[nx] − x[nx−1] on the other, so the west
 *   neighbour of node 0 is node nx − 1 at distance x[nx] − x[nx−1]. South+north alike in y.
 */
export type BoundaryCondition =
  | { kind: "dirichlet"; values: Float64Array }
  | { kind: "neumann"; values: Float64Array }
  | { kind: "robin"; alpha: Float64Array; beta: Float64Array; values: Float64Array }
  | { kind: "periodic" };

/** A condition that carries values (every kind but periodic). */
export type ValuedCondition = Exclude<BoundaryCondition, { kind: "periodic" }>;

/**
 * A Robin side α·u + β·∂u/∂n = values whose weights are constants or per-node arrays.
 *
 * @param alpha α: one number for the whole side, or one value per node
 * @param beta β: one number, or one value per node
 * @param values the data g, one value per node along the side
 * @returns the condition, with α and β as arrays of the length of `values`
 *
 * @example
 * ```ts
 * import { robinCondition } from "./problem.ts";
 * const east = robinCondition(2, 0.5, new Float64Array(9));
 * east.alpha.length; // 9
 * ```
 */
export function robinCondition(
  alpha: number | Float64Array,
  beta: number | Float64Array,
  values: Float64Array,
): Extract<BoundaryCondition, { kind: "robin" }> {
  const spread = (w: number | Float64Array) =>
    typeof w === "number" ? new Float64Array(values.length).fill(w) : w;
  return { kind: "robin", alpha: spread(alpha), beta: spread(beta), values };
}

/**
 * Node coordinates of a non-uniform grid: x.length = nx + 1, y.length = ny + 1, strictly
 * increasing, x[0] = domain.x0, x[nx] = domain.x1 (same for y).
 */
export interface NodeCoordinates {
  /** The nx + 1 node abscissae, strictly increasing, from domain.x0 to domain.x1. */
  x: Float64Array;
  /** The ny + 1 node ordinates, strictly increasing, from domain.y0 to domain.y1. */
  y: Float64Array;
}

/** The rectangle. */
export interface Domain {
  /** West edge. */
  x0: number;
  /** East edge (> x0). */
  x1: number;
  /** South edge. */
  y0: number;
  /** North edge (> y0). */
  y1: number;
}

/** A discrete elliptic problem on a vertex-centred grid (see the module doc for the layout). */
export interface Problem {
  /** The rectangle. */
  domain: Domain;
  /** Number of intervals along x (≥ 2). */
  nx: number;
  /** Number of intervals along y (≥ 2). */
  ny: number;
  /** Coefficient of u_xx at the nodes, length (nx+1)(ny+1). */
  a: Float64Array;
  /** Coefficient of u_x at the nodes. */
  b: Float64Array;
  /** Coefficient of u_yy at the nodes. */
  c: Float64Array;
  /** Coefficient of u_y at the nodes. */
  d: Float64Array;
  /** Coefficient of u at the nodes. */
  e: Float64Array;
  /** Right-hand side at the nodes. */
  f: Float64Array;
  /** The condition on each side. */
  boundary: Record<Side, BoundaryCondition>;
  /**
   * Coefficient of u_xy at the nodes (non-conservative form): a·u_xx + m·u_xy + c·u_yy + b·u_x +
   * d·u_y + e·u = f, elliptic where a > 0, c > 0 and 4ac − m² > 0. Absent: zero.
   */
  m?: Float64Array;
  /**
   * The conservative form. When present the operator is ∇·(K∇u) + b·u_x + d·u_y + e·u = f with
   * the symmetric tensor K = [[k11, k12], [k12, k22]] (positive definite), and a, c and m are not
   * used. Neumann and Robin data then refer to the conormal flux (K∇u)·n (n the outward normal):
   * Neumann (K∇u)·n = g, Robin α·u + β·(K∇u)·n = g.
   */
  conductivity?: Conductivity;
  /**
   * Node coordinates of a non-uniform (stretched) grid; absent: uniform, node (i, j) at
   * (x0 + i·hx, y0 + j·hy). With coordinates, node (i, j) sits at (x[i], y[j]) and the problem is
   * discretized by `discretize_stretched.ts` (non-uniform 3-point differences, flux form with K
   * at the physical edge midpoints) and solved by the multigrid of `stretched_solve.ts`. Periodic
   * sides take the same path, with or without coordinates.
   */
  coordinates?: NodeCoordinates;
}

/**
 * K sampled where a flux-form scheme needs it: at the midpoints of the grid edges. A value on a
 * material interface is already the effective one (harmonic mean of the one-sided values for a
 * flux across the interface, arithmetic mean for a flux along it), so the solver never averages.
 */
export interface Conductivity {
  /** At the midpoints of the edges along x, (x0 + (i + ½)·hx, y0 + j·hy): nx·(ny + 1) values, index j·nx + i. */
  alongX: { k11: Float64Array; k12?: Float64Array };
  /** At the midpoints of the edges along y, (x0 + i·hx, y0 + (j + ½)·hy): (nx + 1)·ny values, index j·(nx + 1) + i. */
  alongY: { k12?: Float64Array; k22: Float64Array };
}

/** Number of nodes of a problem's grid: (nx + 1)(ny + 1). */
export function nodeCount(p: { nx: number; ny: number }): number {
  return (p.nx + 1) * (p.ny + 1);
}
