/**
 * The one sampled-problem type of gridproof: an elliptic problem sampled at the points of one
 * grid layout, as plain typed arrays. The reference solver takes it, a compiled case's `sample`
 * returns it, the harness samples the cell layout into it, and the solver protocol writes it to
 * and reads it from the wire (`harness/protocol/request.ts`). It knows nothing of cases,
 * expressions or processes.
 *
 * Grid: the rectangle [x0, x1] × [y0, y1] split into nx × ny intervals (cells), hx = (x1 − x0)/nx,
 * hy = (y1 − y0)/ny on a uniform grid, the lines of {@link SampledProblem.coordinates} on a
 * stretched one. The points of a layout, stored x fastest:
 *
 * - vertex: the (nx + 1)(ny + 1) nodes, node (i, j) at (x0 + i·hx, y0 + j·hy) (or (x[i], y[j]))
 *   stored at `j·(nx + 1) + i`;
 * - cell: the nx·ny cell centres, cell (i, j) at (x0 + (i + ½)·hx, y0 + (j + ½)·hy) (or the
 *   midpoints of neighbouring face lines) stored at `j·nx + i`.
 *
 * Operator, non-conservative form: a·u_xx + m·u_xy + c·u_yy + b·u_x + d·u_y + e·u = f, elliptic
 * where a·c > 0 and, with m, 4ac − m² > 0. Conservative form, when a {@link Conductivity} is given:
 * ∇·(K∇u) + βx·u_x + βy·u_y + σ·u = f with K = [[k11, k12], [k12, k22]] where each flux is
 * evaluated; then a, c and m hold k11, k22 and 2·k12 at the points (the non-conservative
 * coefficients of K's second-derivative part), and b, d, e hold βx, βy and σ.
 *
 * @module
 */
import type { Box, GridLayout } from "../grid/mod.ts";

/** The rectangle: [x0, x1] × [y0, y1], x1 > x0 and y1 > y0 (the grid's `Box`). */
export type Domain = Box;

/** The four sides of the rectangle. West is x = x0, east x = x1, south y = y0, north y = y1. */
export type Side = "west" | "east" | "south" | "north";

/** All sides, in the order used everywhere (reports, loops, messages, the protocol). */
export const SIDES: readonly Side[] = ["west", "east", "south", "north"] as const;

/** The four kinds of boundary condition. */
export type BoundaryKind = "dirichlet" | "neumann" | "robin" | "periodic";

/**
 * A boundary condition on one side. `values` holds one number per point along the side, ordered
 * by increasing coordinate: on the vertex layout the side's nodes, corners included (ny + 1 on
 * west and east, nx + 1 on south and north); on the cell layout the centres of the side's
 * boundary faces (ny on west and east, nx on south and north).
 *
 * - dirichlet: u = values
 * - neumann: ∂u/∂n = values, n the outward unit normal ((K∇u)·n in the conservative form)
 * - robin: alpha·u + beta·∂u/∂n = values (n outward), with alpha and beta given per point like
 *   values (they may vary along the side). On one side beta is either 0 at every point (the side
 *   fixes u = values/alpha) or non-zero at every point (a flux condition); alpha and beta are
 *   never both 0 at a point. `robinCondition` builds a side with constant weights.
 * - periodic: no values. Periodic sides come in pairs, west+east or south+north (a lone periodic
 *   side is refused). On the vertex layout nodes stay (nx + 1) × (ny + 1); with west+east
 *   periodic, node i = nx is the image of node i = 0: every input array must agree there and the
 *   reference solver returns equal values there. The period is x1 − x0: across the seam the
 *   spacing is x[1] − x[0] on one side and x[nx] − x[nx−1] on the other. South+north alike in y.
 */
export type BoundaryCondition =
  | { kind: "dirichlet"; values: Float64Array }
  | { kind: "neumann"; values: Float64Array }
  | { kind: "robin"; alpha: Float64Array; beta: Float64Array; values: Float64Array }
  | { kind: "periodic" };

/** A condition that carries values (every kind but periodic). */
export type ValuedCondition = Exclude<BoundaryCondition, { kind: "periodic" }>;

/**
 * The lines of a non-uniform (stretched) grid along each axis: x.length = nx + 1,
 * y.length = ny + 1, strictly increasing, x[0] = domain.x0, x[nx] = domain.x1 (same for y). On
 * the vertex layout they are the node coordinates; on the cell layout the face coordinates (cell
 * centres are the midpoints of neighbouring lines). The same numbers as `Grid.lines`.
 */
export interface GridLines {
  /** The nx + 1 abscissae, strictly increasing, from domain.x0 to domain.x1. */
  x: Float64Array;
  /** The ny + 1 ordinates, strictly increasing, from domain.y0 to domain.y1. */
  y: Float64Array;
}

/**
 * K where a flux-form scheme evaluates each flux. A value on a material interface is already the
 * effective one (harmonic mean of the one-sided values for a flux across the interface,
 * arithmetic mean for a flux along it), so a solver never averages. An absent k12 is zero.
 * Counts and places, x fastest (`faceCounts` gives the counts):
 *
 * - `alongX`, fluxes that run along x. Vertex layout: the midpoints of the grid edges along x,
 *   (x0 + (i + ½)·hx, y0 + j·hy), nx·(ny + 1) values, index j·nx + i. Cell layout: the x-faces,
 *   (x0 + i·hx, y0 + (j + ½)·hy), (nx + 1)·ny values, index j·(nx + 1) + i.
 * - `alongY`, fluxes that run along y. Vertex layout: the midpoints of the grid edges along y,
 *   (x0 + i·hx, y0 + (j + ½)·hy), (nx + 1)·ny values, index j·(nx + 1) + i. Cell layout: the
 *   y-faces, (x0 + (i + ½)·hx, y0 + j·hy), nx·(ny + 1) values, index j·nx + i.
 *
 * On a stretched grid the midpoints are the physical ones ((x[i] + x[i+1])/2 and alike).
 */
export interface Conductivity {
  /** k11 (and k12) where the flux runs along x. */
  alongX: { k11: Float64Array; k12?: Float64Array };
  /** k22 (and k12) where the flux runs along y. */
  alongY: { k12?: Float64Array; k22: Float64Array };
}

/**
 * The operator's form: `non-conservative` a·u_xx + m·u_xy + c·u_yy + b·u_x + d·u_y + e·u = f, or
 * `conservative` ∇·(K∇u) + βx·u_x + βy·u_y + σ·u = f.
 */
export type OperatorForm = "non-conservative" | "conservative";

/** The coefficient arrays a problem may name as holding one value everywhere. */
export type CoefficientName = "a" | "b" | "c" | "d" | "e" | "m";

/**
 * A discrete elliptic problem sampled at the points of one layout (module doc: points, storage,
 * operator). Every point array has the layout's point count: (nx + 1)(ny + 1) on the vertex
 * layout, nx·ny on the cell layout.
 */
export interface SampledProblem {
  /** The rectangle. */
  domain: Domain;
  /** Intervals (vertex layout, ≥ 2 for the reference solver) or cells (cell layout) along x. */
  nx: number;
  /** Intervals or cells along y. */
  ny: number;
  /** Where the points sit. Default: "vertex". The reference solver takes the vertex layout only. */
  layout?: GridLayout;
  /** Coefficient of u_xx at the points; k11 in the conservative form. */
  a: Float64Array;
  /** Coefficient of u_x at the points; βx in the conservative form. */
  b: Float64Array;
  /** Coefficient of u_yy at the points; k22 in the conservative form. */
  c: Float64Array;
  /** Coefficient of u_y at the points; βy in the conservative form. */
  d: Float64Array;
  /** Coefficient of u at the points; σ in the conservative form. */
  e: Float64Array;
  /** Right-hand side at the points. */
  f: Float64Array;
  /**
   * Coefficient of u_xy at the points (non-conservative form: elliptic where 4ac − m² > 0); in the
   * conservative form 2·k12 at the points (the solver's flux rows do not use it). Absent: zero.
   */
  m?: Float64Array;
  /** The condition on each side, at the side's points of the layout. */
  boundary: Record<Side, BoundaryCondition>;
  /**
   * The conservative form: K where each flux is evaluated. When present the operator is
   * ∇·(K∇u) + b·u_x + d·u_y + e·u = f and Neumann and Robin data refer to the conormal flux
   * (K∇u)·n.
   */
  conductivity?: Conductivity;
  /**
   * The lines of a stretched grid (node lines for the vertex layout, face lines for the cell
   * layout). Absent: uniform.
   */
  coordinates?: GridLines;
  /**
   * The operator's form, when the producer states it. Absent: "conservative" when a
   * `conductivity` is given, else "non-conservative" (`formOf`).
   */
  form?: OperatorForm;
  /**
   * Coefficients known to hold one value at every point (found from the case's expressions), with
   * that value: a request in the constant form sends them without looking at their arrays.
   * Absent or not named: the arrays are looked at.
   */
  constantCoefficients?: Partial<Record<CoefficientName, number>>;
  /** Material interfaces (lines x = const and y = const), conservative form. Absent: none. */
  interfaces?: { x: number[]; y: number[] };
  /**
   * true when the solution is fixed only up to a constant (no side fixes u, no reaction term).
   * Absent: false.
   */
  singular?: boolean;
}
