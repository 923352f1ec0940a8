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
import type { MathTools } from "./_mathjs.ts";

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
