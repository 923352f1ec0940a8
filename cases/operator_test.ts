import { assertClose } from "../testing/mod.ts";
import { loadMath } from "./_mathjs.ts";
import { compileExpr } from "./compile.ts";
import { parseExpression, toExpr } from "./expression.ts";
import { deriveRegion, type OperatorTrees } from "./operator.ts";
import type { SideTrees } from "./operator.ts";

const math = await loadMath();
const tree = (text: string) => parseExpression(math, text, []).node!;
const fn = (node: Parameters<typeof toExpr>[0]) => compileExpr(toExpr(node, {}));
const dirichlet: SideTrees = { kind: "dirichlet" };
const allDirichlet = { west: dirichlet, east: dirichlet, south: dirichlet, north: dirichlet };
const { PI, sin, cos } = Math;

function conservative(k11: string, k12: string, k22: string): OperatorTrees {
  return {
    form: "conservative",
    k11: tree(k11),
    k12: tree(k12),
    k22: tree(k22),
    bx: tree("0"),
    by: tree("0"),
    sigma: tree("0"),
  };
}

Deno.test("conservative form with K = [[2,1],[1,2]] and u = sin πx sin πy gives the derived source", () => {
  // Derived by hand: ∇·(K∇u) = 2u_xx + 2u_xy + 2u_yy (K constant, k12 counted twice)
  // = −4π² sin πx sin πy + 2π² cos πx cos πy.
  const d = deriveRegion(
    math,
    conservative("2", "1", "2"),
    tree("sin(pi*x)*sin(pi*y)"),
    allDirichlet,
  );
  const f = fn(d.source);
  for (const [x, y] of [[0.1, 0.7], [0.5, 0.5], [0.93, 0.21]]) {
    const expected = -4 * PI * PI * sin(PI * x) * sin(PI * y) +
      2 * PI * PI * cos(PI * x) * cos(PI * y);
    assertClose(f(x, y), expected, { rel: 1e-13, abs: 1e-12 });
  }
});

Deno.test("the expanded coefficients of a variable tensor reproduce the conservative source", () => {
  // Identity: ∇·(K∇u) = k11 u_xx + 2k12 u_xy + k22 u_yy + (∂x k11 + ∂y k12) u_x + (∂x k12 + ∂y k22) u_y
  // (product rule). Both sides are derived by mathjs here, from different trees.
  const op = conservative("1 + x^2", "0.3*x*y", "2 + sin(y)");
  const exact = tree("exp(x)*cos(2*y)");
  const d = deriveRegion(math, op, exact, allDirichlet);
  const e = d.expanded;
  const nc: OperatorTrees = { form: "non-conservative", ...e };
  const again = deriveRegion(math, nc, exact, allDirichlet);
  const f1 = fn(d.source), f2 = fn(again.source);
  for (const [x, y] of [[0.2, 0.3], [0.8, 0.1], [0.45, 0.95]]) {
    assertClose(f1(x, y), f2(x, y), { rel: 1e-12 });
  }
});

Deno.test("a conservative Neumann side prescribes the conormal flux (K∇u)·n", () => {
  // west side, n = −x: (K∇u)·n = −(k11 u_x + k12 u_y); for u = x² + xy, K = [[3, 1], [1, 2]]:
  // u_x = 2x + y, u_y = x, so the data is −(3(2x + y) + x) = −7x − 3y (derived by hand).
  const sides = { ...allDirichlet, west: { kind: "neumann" as const } };
  const d = deriveRegion(math, conservative("3", "1", "2"), tree("x^2 + x*y"), sides);
  const g = fn(d.boundary.west);
  assertClose(g(0, 0.4), -3 * 0.4, { rel: 1e-14 });
  assertClose(g(0.25, 0.5), -7 * 0.25 - 3 * 0.5, { rel: 1e-14 });
});

Deno.test("the mixed term of the non-conservative form enters the source as m·u_xy", () => {
  // u = x²y: u_xy = 2x, u_xx = 2y, u_yy = 0; with a = 1, m = 3, c = 1: f = 2y + 6x (derived).
  const z = tree("0");
  const op: OperatorTrees = {
    form: "non-conservative",
    a: tree("1"),
    b: z,
    c: tree("1"),
    d: z,
    e: z,
    m: tree("3"),
  };
  const f = fn(deriveRegion(math, op, tree("x^2*y"), allDirichlet).source);
  assertClose(f(0.3, 0.7), 2 * 0.7 + 6 * 0.3, { rel: 1e-14 });
});
