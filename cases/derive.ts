/**
 * Symbolic derivation with mathjs: the source term f = a·u_xx + b·u_x + c·u_yy + d·u_y + e·u and
 * the boundary data of every side (u, ∂u/∂n with the outward normal, or α·u + β·∂u/∂n), all from
 * the exact solution. Nothing is typed by hand.
 *
 * Outward normals: west −x, east +x, south −y, north +y; so ∂u/∂n is −u_x, u_x, −u_y, u_y.
 *
 * @module
 */
import type { MathNode } from "mathjs";
import type { Side } from "../reference-solver/mod.ts";
import type { MathTools } from "./_mathjs.ts";
import type { SideSpec } from "./case_file.ts";

/** Trees derived from a case. */
export interface DerivedTrees {
  ux: MathNode;
  uy: MathNode;
  uxx: MathNode;
  uyy: MathNode;
  source: MathNode;
  /** Per side, the data of its condition. */
  boundary: Record<Side, MathNode>;
  /** Per side, ∂u/∂n with the outward normal. */
  normal: Record<Side, MathNode>;
}

// deno-lint-ignore no-explicit-any
type AnyNode = any;

/**
 * Rewrites functions mathjs cannot differentiate into equal forms it can: hypot(p, q, …) →
 * sqrt(p² + q² + …); atan2(p, q) → 2·atan(p / (sqrt(p² + q²) + q)) (the half-angle identity, equal
 * everywhere except on the ray p = 0, q < 0 where atan2 jumps); min/max(p, q) → (p + q ∓ |p − q|)/2.
 * `sign` has no useful derivative and is refused with a RangeError.
 */
export function differentiableForm(math: MathTools, node: MathNode): MathNode {
  const { OperatorNode, FunctionNode, ConstantNode, ParenthesisNode } = math.nodes;
  const add = (p: MathNode, q: MathNode) => new OperatorNode("+", "add", [p, q]);
  const square = (p: MathNode) =>
    new OperatorNode("^", "pow", [new ParenthesisNode(p), new ConstantNode(2)]);
  const rewrite = (n: AnyNode): MathNode => {
    if (n.type !== "FunctionNode") return n;
    const name = String(n.fn?.name);
    const args = n.args as MathNode[];
    if (name === "sign") {
      throw new RangeError(
        "sign() cannot be differentiated; the exact solution must be smooth where it is sampled",
      );
    }
    if (name === "hypot") {
      return new FunctionNode("sqrt", [args.map(square).reduce(add)]);
    }
    if (name === "atan2") {
      const [p, q] = args;
      const r = new FunctionNode("sqrt", [add(square(p), square(q))]);
      const ratio = new OperatorNode("/", "divide", [
        new ParenthesisNode(p),
        new ParenthesisNode(add(r, q)),
      ]);
      return new OperatorNode("*", "multiply", [
        new ConstantNode(2),
        new FunctionNode("atan", [ratio]),
      ]);
    }
    if ((name === "min" || name === "max") && args.length >= 2) {
      return args.reduce((p, q) => {
        const gap = new FunctionNode("abs", [new OperatorNode("-", "subtract", [p, q])]);
        const sum = add(p, q);
        const combined = name === "min"
          ? new OperatorNode("-", "subtract", [sum, gap])
          : new OperatorNode("+", "add", [sum, gap]);
        return new OperatorNode("/", "divide", [
          new ParenthesisNode(combined),
          new ConstantNode(2),
        ]);
      });
    }
    return n;
  };
  return (node as AnyNode).transform(rewrite) as MathNode;
}

function isZero(node: AnyNode): boolean {
  let n = node;
  while (n.type === "ParenthesisNode") n = n.content;
  return n.type === "ConstantNode" && n.value === 0;
}

/** True when a tree is the constant 0 (after mathjs simplification). */
export function isZeroTree(math: MathTools, node: MathNode): boolean {
  return isZero(math.simplify(node));
}

/**
 * Derives the source term and boundary data of a case.
 *
 * @param math the engine's mathjs tools
 * @param trees checked trees of the coefficients and the exact solution
 * @param boundary the kind (and Robin weights) of each side
 * @param options `simplify`: simplify every derived tree with mathjs (slow; for display). Default: false
 * @throws {RangeError} when the exact solution uses a function that cannot be differentiated
 */
export function deriveTrees(
  math: MathTools,
  trees: { a: MathNode; b: MathNode; c: MathNode; d: MathNode; e: MathNode; exact: MathNode },
  boundary: Record<Side, SideSpec>,
  options: { simplify?: boolean } = {},
): DerivedTrees {
  const { OperatorNode, ConstantNode, ParenthesisNode } = math.nodes;
  // mathjs's simplify costs 0.1–1 s per case; the compiler folds constants and shares
  // subexpressions itself, so by default the raw derivatives are kept and only displays simplify.
  const tidy = options.simplify ? (n: MathNode) => math.simplify(n) : (n: MathNode) => n;
  const derivativeOptions = { simplify: options.simplify === true };
  const u = differentiableForm(math, trees.exact);
  const ux = math.derivative(u, "x", derivativeOptions);
  const uy = math.derivative(u, "y", derivativeOptions);
  const uxx = math.derivative(ux, "x", derivativeOptions);
  const uyy = math.derivative(uy, "y", derivativeOptions);
  const wrap = (n: MathNode) => new ParenthesisNode(n);
  const terms: MathNode[] = [];
  const pairs: [MathNode, MathNode][] = [
    [trees.a, uxx],
    [trees.b, ux],
    [trees.c, uyy],
    [trees.d, uy],
    [trees.e, trees.exact],
  ];
  for (const [coefficient, derivative] of pairs) {
    if (isZero(coefficient) || isZero(derivative)) continue;
    terms.push(new OperatorNode("*", "multiply", [wrap(coefficient), wrap(derivative)]));
  }
  const source = terms.length === 0
    ? new ConstantNode(0)
    : tidy(terms.reduce((p, q) => new OperatorNode("+", "add", [p, q])));
  const negate = (n: MathNode) => tidy(new OperatorNode("-", "unaryMinus", [wrap(n)]));
  const normal: Record<Side, MathNode> = {
    west: negate(ux),
    east: ux,
    south: negate(uy),
    north: uy,
  };
  const data = {} as Record<Side, MathNode>;
  for (const side of ["west", "east", "south", "north"] as const) {
    const spec = boundary[side];
    if (spec.kind === "dirichlet") data[side] = trees.exact;
    else if (spec.kind === "neumann") data[side] = normal[side];
    else {
      const alpha = spec.alpha ?? 0;
      const beta = spec.beta ?? 0;
      const parts: MathNode[] = [];
      if (alpha !== 0) {
        parts.push(new OperatorNode("*", "multiply", [new ConstantNode(alpha), wrap(trees.exact)]));
      }
      if (beta !== 0) {
        parts.push(new OperatorNode("*", "multiply", [new ConstantNode(beta), wrap(normal[side])]));
      }
      data[side] = tidy(parts.reduce((p, q) => new OperatorNode("+", "add", [p, q])));
    }
  }
  return { ux, uy, uxx, uyy, source, boundary: data, normal };
}
