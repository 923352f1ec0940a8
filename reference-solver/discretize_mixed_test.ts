import assert from "node:assert/strict";
import { assertClose } from "../testing/mod.ts";
import { discretize } from "./discretize.ts";
import type { Problem, ValuedCondition } from "./problem.ts";

function problem(nx: number, ny: number, m: ((q: number) => number) | undefined): Problem {
  const n = (nx + 1) * (ny + 1);
  const one = new Float64Array(n).fill(1);
  const side = (kind: "dirichlet" | "neumann", len: number) => ({
    kind,
    values: Float64Array.from({ length: len + 1 }, (_, k) => 0.1 * k),
  });
  return {
    domain: { x0: 0, x1: 2, y0: 0, y1: 1 },
    nx,
    ny,
    a: one,
    b: new Float64Array(n),
    c: one,
    d: new Float64Array(n),
    e: new Float64Array(n),
    f: one,
    boundary: {
      west: side("neumann", ny),
      east: side("dirichlet", ny),
      south: side("dirichlet", nx),
      north: side("dirichlet", nx),
    },
    ...(m === undefined ? {} : { m: Float64Array.from({ length: n }, (_, q) => m(q)) }),
  };
}

Deno.test("discretize() writes m·u_xy as the four-corner difference m/(4hx·hy)·(NE − SE − NW + SW)", () => {
  // Derived (module doc of discretize.ts): corner coefficients ±m/(4hx·hy) at interior nodes.
  const nx = 8, ny = 4, hx = 2 / nx, hy = 1 / ny;
  const m = (q: number) => 0.3 + 0.01 * q;
  const { op } = discretize(problem(nx, ny, m));
  const q = 2 * (nx + 1) + 5, k = op.index(5, 2), v = m(q) / (4 * hx * hy);
  assertClose(op.NE![k], v, { rel: 1e-14 });
  assertClose(op.SW![k], v, { rel: 1e-14 });
  assertClose(op.NW![k], -v, { rel: 1e-14 });
  assertClose(op.SE![k], -v, { rel: 1e-14 });
});

Deno.test("discretize() folds the corner ghosts of a Neumann side into the mirrored corners", () => {
  // Derived (module doc): on a Neumann west side u(−1, j±1) = u(1, j±1) + 2hx·g[j±1]. With m
  // constant, v = m/(4hx·hy): NW = −v folds into NE = v and SW = v into SE = −v, leaving all four
  // corners zero, and the right-hand side gains −K·2hx·g for each: v·2hx·(g[j+1] − g[j−1]).
  const nx = 8, ny = 4, hx = 2 / nx, hy = 1 / ny;
  const p = problem(nx, ny, () => 0.4);
  const { op, rhs } = discretize(p);
  const { rhs: plain } = discretize(problem(nx, ny, undefined));
  const v = 0.4 / (4 * hx * hy), j = 2, k = op.index(0, j);
  assert.equal(op.NW![k], 0);
  assert.equal(op.SW![k], 0);
  assertClose(op.NE![k], 0, { abs: 1e-12 });
  assertClose(op.SE![k], 0, { abs: 1e-12 });
  const g = (p.boundary.west as ValuedCondition).values;
  assertClose(rhs[k] - plain[k], v * 2 * hx * g[j + 1] - v * 2 * hx * g[j - 1], { rel: 1e-12 });
});

Deno.test("discretize() keeps a level five-point, with its arrays unchanged, when m is absent or zero", () => {
  const a = discretize(problem(8, 4, undefined)), b = discretize(problem(8, 4, () => 0));
  assert.equal(b.op.NE, undefined);
  assert.deepEqual(b.op.C, a.op.C);
  assert.deepEqual(b.rhs, a.rhs);
});
