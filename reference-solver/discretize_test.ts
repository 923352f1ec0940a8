import assert from "node:assert/strict";
import { assertClose } from "../testing/mod.ts";
import { solve } from "./solve.ts";
import { assembleMatrix, residualNorm } from "./assemble.ts";
import { discretize } from "./discretize.ts";
import {
  ALL_DIRICHLET,
  type Exact,
  LAPLACE,
  manufactured,
  type SideSpec,
  SMOOTH,
  VARIABLE,
} from "./_test_problems.ts";
import type { Side, ValuedCondition } from "./problem.ts";

// Derived (docs/check-values.md, "Exact facts of central differences"): central first and second
// differences and the ghost-node treatment of Neumann/Robin sides are exact for quadratics.
const QUADRATIC: Exact = {
  u: (x, y) => 1 + 2 * x - y + 0.5 * x * x + 0.75 * x * y - 0.3 * y * y,
  ux: (x, y) => 2 + x + 0.75 * y,
  uy: (x, _y) => -1 + 0.75 * x - 0.6 * _y,
  uxx: () => 1,
  uyy: () => -0.6,
};
// Derived: the 5-point stencil for a·u_xx + c·u_yy reproduces every polynomial of degree ≤ 3.
const CUBIC: Exact = {
  u: (x, y) => x * x * x - 2 * x * x * y + 0.5 * y * y * y + x * y + 1,
  ux: (x, y) => 3 * x * x - 4 * x * y + y,
  uy: (x, y) => -2 * x * x + 1.5 * y * y + x,
  uxx: (x, y) => 6 * x - 4 * y,
  uyy: (_x, y) => 3 * y,
};

const DOMAIN = { x0: 0.5, x1: 2, y0: -1, y1: 0.25 };
const ROBIN = { alpha: 1.5, beta: 0.75 };
const CONFIGS: [string, Record<Side, SideSpec>][] = [
  ["all Dirichlet", ALL_DIRICHLET],
  ["all Neumann with e ≠ 0", {
    west: "neumann",
    east: "neumann",
    south: "neumann",
    north: "neumann",
  }],
  ["all Robin", { west: ROBIN, east: ROBIN, south: ROBIN, north: ROBIN }],
  ["mixed Dirichlet/Neumann/Robin", {
    west: "dirichlet",
    east: "neumann",
    south: ROBIN,
    north: "dirichlet",
  }],
  ["Neumann–Robin corners", {
    west: "neumann",
    east: ROBIN,
    south: { alpha: -0.5, beta: 2 },
    north: "neumann",
  }],
  ["Robin with β = 0 (u = g/α) beside Neumann", {
    west: { alpha: 2, beta: 0 },
    east: "neumann",
    south: "neumann",
    north: { alpha: 0.5, beta: 0 },
  }],
];

function maxRelError(u: Float64Array, problemExact: Exact, nx: number, ny: number): number {
  const hx = (DOMAIN.x1 - DOMAIN.x0) / nx, hy = (DOMAIN.y1 - DOMAIN.y0) / ny;
  let err = 0, scale = 0;
  for (let j = 0; j <= ny; j++) {
    for (let i = 0; i <= nx; i++) {
      const ex = problemExact.u(DOMAIN.x0 + i * hx, DOMAIN.y0 + j * hy);
      err = Math.max(err, Math.abs(u[j * (nx + 1) + i] - ex));
      scale = Math.max(scale, Math.abs(ex));
    }
  }
  return err / scale;
}

Deno.test("discretize() reproduces a quadratic exactly with all five coefficients variable and every boundary kind", async (t) => {
  for (const [name, sides] of CONFIGS) {
    await t.step(name, () => {
      const p = manufactured(VARIABLE, QUADRATIC, { nx: 12, ny: 10, domain: DOMAIN }, sides);
      // Direct solve (one level, banded LU) and multigrid both give the exact quadratic.
      const direct = solve(p, { coarse: { maxLevels: 1 } });
      assert.ok(maxRelError(direct.solution, QUADRATIC, 12, 10) <= 1e-11);
      const mg = solve(p, { coarse: { maxDirectUnknowns: 20 }, stop: { tolerance: 1e-14 } });
      assert.ok(maxRelError(mg.solution, QUADRATIC, 12, 10) <= 1e-11, mg.reason);
    });
  }
});

Deno.test("discretize() reproduces a cubic exactly for a·u_xx + c·u_yy + e·u with Dirichlet sides", () => {
  const coef = { ...VARIABLE, b: () => 0, d: () => 0 };
  const p = manufactured(coef, CUBIC, { nx: 16, ny: 12, domain: DOMAIN }, ALL_DIRICHLET);
  const r = solve(p, { coarse: { maxLevels: 1 } });
  assert.ok(maxRelError(r.solution, CUBIC, 16, 12) <= 1e-11);
});

Deno.test("discretize() with central differences is not exact for a cubic once b ≠ 0 (the check can fail)", () => {
  const p = manufactured(VARIABLE, CUBIC, { nx: 16, ny: 12, domain: DOMAIN }, ALL_DIRICHLET);
  const r = solve(p, { coarse: { maxLevels: 1 } });
  assert.ok(maxRelError(r.solution, CUBIC, 16, 12) > 1e-8);
});

Deno.test("discretize() with upwinding converges at first order, central at second order", () => {
  // Derived: the one-sided difference has truncation error O(h), the central one O(h²).
  const errs = (upwind: boolean) =>
    [16, 32, 64].map((n) => {
      const p = manufactured(VARIABLE, SMOOTH, { nx: n, ny: n }, ALL_DIRICHLET);
      const r = solve(p, { scheme: { upwind } });
      let e = 0;
      for (let j = 0; j <= n; j++) {
        for (let i = 0; i <= n; i++) {
          e = Math.max(e, Math.abs(r.solution[j * (n + 1) + i] - SMOOTH.u(i / n, j / n)));
        }
      }
      return e;
    });
  const central = errs(false), upwind = errs(true);
  assertClose(Math.log2(central[1] / central[2]), 2, { abs: 0.15 });
  assertClose(Math.log2(upwind[1] / upwind[2]), 1, { abs: 0.2 });
});

Deno.test("discretize() makes Dirichlet rows identity rows and takes a Dirichlet corner from west/east", () => {
  const p = manufactured(LAPLACE, QUADRATIC, { nx: 4, ny: 4 }, ALL_DIRICHLET);
  (p.boundary.south as ValuedCondition).values[0] = 123; // disagrees with the west side at the corner (0, 0)
  const { op, rhs } = discretize(p);
  const k = op.index(0, 0);
  assert.equal(op.C[k], 1);
  assert.equal(op.W[k] + op.E[k] + op.S[k] + op.N[k], 0);
  assert.equal(rhs[k], (p.boundary.west as ValuedCondition).values[0]);
  assert.equal(op.dirichlet.length, 16);
});

Deno.test("assembleMatrix() and residualNorm() describe the same system solve() solves", () => {
  const p = manufactured(VARIABLE, SMOOTH, { nx: 10, ny: 14 }, CONFIGS[3][1]);
  const A = assembleMatrix(p);
  assert.equal(A.n, 11 * 15);
  assert.equal(A.rowPtr[A.n], A.col.length);
  const r = solve(p, { stop: { tolerance: 1e-13 } });
  const r0 = residualNorm(p, new Float64Array(A.n));
  assert.ok(residualNorm(p, r.solution) <= 1e-12 * r0);
  // ‖f‖ of rows where u = 0 gives r0 exactly.
  let s = 0;
  for (let q = 0; q < A.n; q++) s += A.rhs[q] * A.rhs[q];
  assertClose(r0, Math.sqrt(s), { rel: 1e-15 });
});
