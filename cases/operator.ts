/**
 * The two operator forms a case can state, and the symbolic derivation of everything a solver
 * needs from the exact solution, for either form (one region of the domain at a time):
 *
 * - non-conservative: a·u_xx + m·u_xy + c·u_yy + b·u_x + d·u_y + e·u = f;
 * - conservative: ∇·(K∇u) + β·∇u + σ·u = f with K = [[k11, k12], [k12, k22]] symmetric positive
 *   definite, β = (βx, βy). The sign convention is the non-conservative form's: with K = I,
 *   β = 0, σ = 0 it is the Laplacian, u_xx + u_yy = f.
 *
 * The conservative form expands to the non-conservative one wherever K is smooth:
 * ∇·(K∇u) = k11·u_xx + 2k12·u_xy + k22·u_yy + (∂x k11 + ∂y k12)·u_x + (∂x k12 + ∂y k22)·u_y, so
 * a = k11, m = 2k12, c = k22, b = βx + ∂x k11 + ∂y k12, d = βy + ∂x k12 + ∂y k22, e = σ. The
 * expansion is what a non-conservative solver discretizes; inside one region it is exact.
 *
 * Boundary data: Dirichlet u; Neumann the normal flux and Robin α·u + β·(normal flux), where the
 * normal flux is ∂u/∂n for the non-conservative form and the conormal flux (K∇u)·n for the
 * conservative one (n the outward normal: west −x, east +x, south −y, north +y).
 *
 * @module
 */
import type { MathNode } from "mathjs";
import type { BoundaryKind, Side } from "../reference-solver/mod.ts";
import type { MathTools } from "./_mathjs.ts";
import { differentiableForm } from "./derive.ts";

/** The operator forms, by their case-file names. */
export type OperatorForm = "non-conservative" | "conservative";

/** One side's kind, and for a Robin side its weights α and β as trees (constants or of x, y). */
export interface SideTrees {
  kind: BoundaryKind;
  alpha?: MathNode;
  beta?: MathNode;
}

/** The coefficients of the non-conservative form (`m` is the coefficient of u_xy). */
export const GENERAL_TERMS = ["a", "b", "c", "d", "e", "m"] as const;
/** The coefficients of the conservative form. */
export const CONSERVATIVE_TERMS = ["k11", "k12", "k22", "bx", "by", "sigma"] as const;

/** One region's operator, as checked expression trees. */
export type OperatorTrees =
  | { form: "non-conservative" } & Record<(typeof GENERAL_TERMS)[number], MathNode>
  | { form: "conservative" } & Record<(typeof CONSERVATIVE_TERMS)[number], MathNode>;

/** Everything derived for one region. */
export interface DerivedRegion {
  ux: MathNode;
  uy: MathNode;
  /** f, the operator applied to the exact solution. */
  source: MathNode;
  /**
   * The flux vector whose normal component Neumann and Robin sides prescribe: ∇u for the
   * non-conservative form, K∇u for the conservative one.
   */
  flux: { x: MathNode; y: MathNode };
  /** Per side, the data of its condition. */
  boundary: Record<Side, MathNode>;
  /** Per side, the normal flux with the outward normal. */
  normal: Record<Side, MathNode>;
  /** The non-conservative coefficients equal to this region's operator (see the module doc). */
  expanded: Record<(typeof GENERAL_TERMS)[number], MathNode>;
}

// deno-lint-ignore no-explicit-any
type AnyNode = any;

function isZero(node: AnyNode): boolean {
  let n = node;
  while (n.type === "ParenthesisNode") n = n.content;
  return n.type === "ConstantNode" && n.value === 0;
}

/**
 * Derives the source term, fluxes and boundary data of one region.
 *
 * @param math the engine's mathjs tools
 * @param op the region's operator
 * @param exact the region's exact solution
 * @param boundary the kind (and Robin weights) of each side
 * @param options `simplify`: simplify every derived tree (slow; for display). Default: false
 * @throws {RangeError} when the exact solution or K uses a function that cannot be differentiated
 */
export function deriveRegion(
  math: MathTools,
  op: OperatorTrees,
  exact: MathNode,
  boundary: Record<Side, SideTrees>,
  options: { simplify?: boolean } = {},
): DerivedRegion {
  const { OperatorNode, ConstantNode, ParenthesisNode } = math.nodes;
  const tidy = options.simplify ? (n: MathNode) => math.simplify(n) : (n: MathNode) => n;
  const derivativeOptions = { simplify: options.simplify === true };
  const d = (n: MathNode, v: "x" | "y") =>
    isZero(n)
      ? new ConstantNode(0)
      : math.derivative(differentiableForm(math, n), v, derivativeOptions);
  const wrap = (n: MathNode) => new ParenthesisNode(n);
  const times = (p: MathNode, q: MathNode): MathNode | null =>
    isZero(p) || isZero(q) ? null : new OperatorNode("*", "multiply", [wrap(p), wrap(q)]);
  const sum = (parts: (MathNode | null)[]): MathNode => {
    const kept = parts.filter((p): p is MathNode => p !== null && !isZero(p));
    return kept.length === 0
      ? new ConstantNode(0)
      : kept.reduce((p, q) => new OperatorNode("+", "add", [p, q]));
  };
  const u = exact;
  const ux = d(u, "x");
  const uy = d(u, "y");
  let source: MathNode, flux: { x: MathNode; y: MathNode };
  let expanded: DerivedRegion["expanded"];
  if (op.form === "non-conservative") {
    const uxx = d(ux, "x"), uyy = d(uy, "y"), uxy = d(ux, "y");
    source = sum([
      times(op.a, uxx),
      times(op.m, uxy),
      times(op.c, uyy),
      times(op.b, ux),
      times(op.d, uy),
      times(op.e, u),
    ]);
    flux = { x: ux, y: uy };
    expanded = { a: op.a, b: op.b, c: op.c, d: op.d, e: op.e, m: op.m };
  } else {
    // the flux K∇u, differentiated as a whole: no product rule is typed by hand
    const qx = sum([times(op.k11, ux), times(op.k12, uy)]);
    const qy = sum([times(op.k12, ux), times(op.k22, uy)]);
    source = sum([d(qx, "x"), d(qy, "y"), times(op.bx, ux), times(op.by, uy), times(op.sigma, u)]);
    flux = { x: qx, y: qy };
    const two = new ConstantNode(2);
    expanded = {
      a: op.k11,
      c: op.k22,
      m: isZero(op.k12)
        ? new ConstantNode(0)
        : new OperatorNode("*", "multiply", [two, wrap(op.k12)]),
      b: sum([op.bx, d(op.k11, "x"), d(op.k12, "y")]),
      d: sum([op.by, d(op.k12, "x"), d(op.k22, "y")]),
      e: op.sigma,
    };
  }
  const negate = (n: MathNode) =>
    isZero(n) ? n : tidy(new OperatorNode("-", "unaryMinus", [wrap(n)]));
  const normal: Record<Side, MathNode> = {
    west: negate(flux.x),
    east: tidy(flux.x),
    south: negate(flux.y),
    north: tidy(flux.y),
  };
  const data = {} as Record<Side, MathNode>;
  for (const side of ["west", "east", "south", "north"] as const) {
    const spec = boundary[side];
    if (spec.kind === "dirichlet") data[side] = exact;
    else if (spec.kind === "neumann") data[side] = normal[side];
    // a periodic side carries no data: its neighbour across the seam is the opposite side
    else if (spec.kind === "periodic") data[side] = new ConstantNode(0);
    else {
      data[side] = tidy(sum([
        times(spec.alpha ?? new ConstantNode(0), exact),
        times(spec.beta ?? new ConstantNode(0), normal[side]),
      ]));
    }
  }
  return {
    ux: tidy(ux),
    uy: tidy(uy),
    source: tidy(source),
    flux: { x: tidy(flux.x), y: tidy(flux.y) },
    boundary: data,
    normal,
    expanded,
  };
}
