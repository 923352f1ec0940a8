/**
 * Exactness of the conservative flux form and of the mixed term on polynomials, through `solve()`
 * with deep multigrid hierarchies (Galerkin for the conductivity problems, rediscretization and
 * Galerkin for the mixed term) on a non-unit rectangle with hx ≠ hy and a semi-coarsened count.
 * Each claim is derived in its test from the formulas of `reference-solver/discretize.ts` and
 * `reference-solver/discretize_conservative.ts` (derived facts of central differences, see
 * docs/check-values.md, "Exact facts of central differences").
 */
import assert from "node:assert/strict";
import { solve } from "../../reference-solver/mod.ts";
import { ALL_DIRICHLET, type SideSpecs } from "./_build.ts";
import {
  conservativeProblem,
  constantTensor,
  type FieldXY,
  maxError,
  mixedProblem,
  NO_LOWER,
  type Tensor,
} from "./_forms.ts";

const DOMAIN = { x0: -0.25, x1: 1.25, y0: 0, y1: 1 };
// 48 × 36: 48 → 24 → 12 → 6 in x, 36 → 18 → 9 (odd) — the last coarsening is in x only
const GRID = { domain: DOMAIN, nx: 48, ny: 36 };
const OPTIONS = { stop: { tolerance: 1e-13, maxCycles: 100 }, coarse: { maxDirectUnknowns: 30 } };

/** u = 1 + x − 2y + 3x² − xy + 2y². */
const QUADRATIC: FieldXY = {
  name: "u = 1 + x − 2y + 3x² − xy + 2y²",
  u: (x, y) => 1 + x - 2 * y + 3 * x * x - x * y + 2 * y * y,
  ux: (x, y) => 1 + 6 * x - y,
  uy: (x, y) => -2 - x + 4 * y,
  uxx: () => 6,
  uyy: () => 4,
  uxy: () => -1,
};

/** u = x·y. */
const XY: FieldXY = {
  name: "u = x·y",
  u: (x, y) => x * y,
  ux: (_x, y) => y,
  uy: (x) => x,
  uxx: () => 0,
  uyy: () => 0,
  uxy: () => 1,
};

/**
 * k11 linear in x (any y-dependence), k22 linear in y (any x-dependence), k12 bilinear; positive
 * definite on DOMAIN (k11 ≥ 1.4, k22 ≥ 1.7, |k12| ≤ 0.39).
 */
const GRADED: Tensor = {
  name: "k11 = (1.5 + 0.4x)(1 + 0.3 sin y), k12 = 0.2 + 0.1x − 0.15y + 0.05xy, " +
    "k22 = (2 − 0.3y)(1 + 0.2 cos x)",
  k11: (x, y) => (1.5 + 0.4 * x) * (1 + 0.3 * Math.sin(y)),
  k12: (x, y) => 0.2 + 0.1 * x - 0.15 * y + 0.05 * x * y,
  k22: (x, y) => (2 - 0.3 * y) * (1 + 0.2 * Math.cos(x)),
  k11x: (_x, y) => 0.4 * (1 + 0.3 * Math.sin(y)),
  k12x: (_x, y) => 0.1 + 0.05 * y,
  k12y: (x) => -0.15 + 0.05 * x,
  k22y: (x) => -0.3 * (1 + 0.2 * Math.cos(x)),
};

const LOWER = {
  b: (x: number, y: number) => 0.7 * Math.cos(x - y),
  d: (_x: number, y: number) => -0.5 + 0.4 * Math.sin(y),
  e: (x: number, y: number) => -(0.5 + 0.2 * x * x + 0.1 * y),
};

function assertExact(problem: Parameters<typeof solve>[0], u: FieldXY, options = {}): void {
  const result = solve(problem, { ...OPTIONS, ...options });
  assert.ok(result.converged, `solve stopped with ${result.reason}`);
  assert.ok(result.description.levels.length >= 4, "expected a deep hierarchy");
  const err = maxError(result.solution, u.u, GRID);
  // round-off: |u| ≤ 10 on DOMAIN, relative residual 1e-13, condition ≈ 1e3
  assert.ok(err < 1e-9, `${u.name}: max error ${err.toExponential(3)}`);
}

Deno.test("the conservative flux form reproduces a quadratic for k11 linear in x, k22 linear in y, k12 bilinear", async (t) => {
  // Derived: for u quadratic, (u(i+1, j) − u(i, j))/hx = u_x at x_{i+½} exactly, so the x-face
  // flux k11·(…)/hx equals (k11·u_x)(x_{i+½}, y_j); that is quadratic in x when k11 is linear in x,
  // and the central difference (F_e − F_w)/hx of a quadratic is its exact derivative. The cross
  // flux k12·D_y: D_y averages two exact central differences, u_y(x_i, y_j) and u_y(x_{i+1}, y_j),
  // which is u_y(x_{i+½}, y_j) because u_y is linear; k12·u_y is quadratic in x when k12 is linear
  // in x. Likewise in y. b·u_x, d·u_y (central) and e·u are exact for quadratics. Dirichlet sides.
  // The discrete solution does not depend on how the coarse levels are built; each hierarchy must
  // converge to it.
  const problem = conservativeProblem({
    grid: GRID,
    K: GRADED,
    u: QUADRATIC,
    sides: ALL_DIRICHLET,
    lower: LOWER,
  });
  const variants: [string, Parameters<typeof solve>[1]][] = [
    ["default: Galerkin, operator-dependent interpolation", {}],
    ["Galerkin, bilinear interpolation", { transfer: { interpolation: "bilinear" } }],
    ["rediscretized (harmonic means of K along coarse edges)", {
      coarse: { ...OPTIONS.coarse, operator: "rediscretize" },
    }],
  ];
  for (const [label, options] of variants) {
    await t.step(label, () => assertExact(problem, QUADRATIC, options));
  }
});

Deno.test("the half control volumes of Neumann/Robin sides are exact for a quadratic with constant K", () => {
  // Derived (module doc of discretize_conservative.ts): with K constant and b = d = e = 0, f is
  // constant, so f at the node is its half-volume mean; the x-face and boundary fluxes are linear
  // along their faces and are taken at the face midpoints; the two half y-faces of a side node are
  // both off by the same amount (D_x at x0 + hx/2, k22·u_y at x0 instead of x0 + hx/4), which
  // cancels in G_n − G_s. Corners here are Dirichlet (west/east Neumann/Robin, south/north Dirichlet).
  const sides: SideSpecs = {
    west: { kind: "neumann" },
    east: { kind: "robin", alpha: 1.3, beta: 0.6 },
    south: { kind: "dirichlet" },
    north: { kind: "dirichlet" },
  };
  assertExact(
    conservativeProblem({ grid: GRID, K: constantTensor(2, 0.7, 1.5), u: QUADRATIC, sides }),
    QUADRATIC,
  );
});

Deno.test("quarter volumes at corners between two flux sides are exact for a quadratic when k12 = 0", () => {
  // Derived: at a corner the k11 error of the east half face (k11·u_x taken at y0 instead of
  // y0 + hy/4) and of the boundary half face (φ at the node instead of the half face's midpoint)
  // cancel; with k12 ≠ 0 a k12·u_yy·hy/4 term would remain (module doc), so K is diagonal here.
  const sides: SideSpecs = {
    west: { kind: "robin", alpha: 1.5, beta: 0.7 },
    east: { kind: "neumann" },
    south: { kind: "robin", alpha: 2.0, beta: 0.5 },
    north: { kind: "robin", alpha: 1.0, beta: 1.0 },
  };
  assertExact(
    conservativeProblem({
      grid: GRID,
      K: constantTensor(1.7, 0, 0.9),
      u: QUADRATIC,
      sides,
      lower: NO_LOWER,
      diagonal: true,
    }),
    QUADRATIC,
  );
});

Deno.test("the four-corner mixed difference reproduces u = x·y", () => {
  // Derived: (u(i+1, j+1) − u(i+1, j−1) − u(i−1, j+1) + u(i−1, j−1))/(4hx·hy) = 1 exactly for
  // u = x·y, and the second differences of x·y along x and along y are 0.
  assertExact(
    mixedProblem({
      grid: GRID,
      coef: { a: () => 1, m: (x, y) => 0.8 + 0.3 * Math.sin(x + y), c: () => 1, ...NO_LOWER },
      u: XY,
      sides: ALL_DIRICHLET,
    }),
    XY,
  );
});

Deno.test("the mixed term with ghost-eliminated Neumann/Robin sides reproduces a quadratic", async (t) => {
  // Derived: the four-corner difference, central differences and the central difference of the
  // boundary condition that defines every ghost (corner ghosts included) are exact for quadratics.
  const coef = {
    a: (x: number, y: number) => 1 + 0.3 * Math.sin(x + 2 * y),
    m: (x: number, y: number) => 0.9 * Math.cos(x - y),
    c: (x: number, y: number) => 1.4 + 0.25 * Math.cos(x * y),
    ...LOWER,
  };
  const layouts: [string, SideSpecs][] = [
    ["Neumann west, Robin east", {
      west: { kind: "neumann" },
      east: { kind: "robin", alpha: 1.3, beta: 0.6 },
      south: { kind: "dirichlet" },
      north: { kind: "dirichlet" },
    }],
    ["Robin south, Neumann north", {
      west: { kind: "dirichlet" },
      east: { kind: "dirichlet" },
      south: { kind: "robin", alpha: 2.0, beta: 0.5 },
      north: { kind: "neumann" },
    }],
  ];
  for (const [label, sides] of layouts) {
    for (const operator of ["rediscretize", "galerkin"] as const) {
      await t.step(`${label}, ${operator} coarse operators`, () => {
        assertExact(
          mixedProblem({ grid: GRID, coef, u: QUADRATIC, sides }),
          QUADRATIC,
          { coarse: { ...OPTIONS.coarse, operator } },
        );
      });
    }
  }
});
