/**
 * Observed order of accuracy of the reference solver (method of manufactured solutions: Salari &
 * Knupp, SAND2000-1444, 2000; Roache, J. Fluids Eng. 124:4–10, 2002 — published, see
 * docs/check-values.md, "Manufactured solutions and order of accuracy"): for a second-order
 * scheme the error falls by a factor of 4 per halving of h in the asymptotic range, for first-order
 * upwinding by 2. The manufactured solution and its source terms are derived by hand in
 * `_manufactured.ts` (checked by finite differences in `_manufactured_test.ts`).
 */
import assert from "node:assert/strict";
import { solve } from "../../reference-solver/mod.ts";
import { assertClose } from "../../testing/mod.ts";
import {
  ALL_DIRICHLET,
  ALL_NEUMANN,
  ALL_ROBIN,
  errorNorms,
  type GridSpec,
  manufacturedProblem,
  MIXED,
  type SideSpecs,
} from "./_build.ts";
import { type Coefficients, CONVECTIVE, type Field, SMOOTH, VARIABLE } from "./_manufactured.ts";

const DOMAIN = { x0: -0.25, x1: 1.25, y0: 0.0, y1: 1.0 };
// four grids, refinement ratio 2, hx = 0.075 … 0.009375 and hy = 1/16 … 1/128 (hx ≠ hy)
const GRIDS: [number, number][] = [[20, 16], [40, 32], [80, 64], [160, 128]];
// the algebraic error must sit far below the discretization error (≥ 1e-6 on these grids)
// (a small direct-solve threshold keeps even the coarsest grid of the study a multigrid solve)
const OPTIONS = {
  stop: { tolerance: 1e-12, maxCycles: 100 },
  coarse: { maxDirectUnknowns: 30 },
};

interface Study {
  max: number[];
  l2: number[];
}

// The upwind study runs on a 1.25 × 1 rectangle (hx = hy). On the 1.5 × 1 one, all-Neumann upwind
// errors are still pre-asymptotic on these grids (measured orders 1.42, 1.28, 1.17, then 1.09 and
// 1.05 on two further refinements): the first- and second-order error terms have opposite signs
// there, so the grid sequence needs more refinements than this test affords.
const UPWIND_DOMAIN = { x0: -0.25, x1: 1.0, y0: 0.0, y1: 1.0 };

function refine(field: Field, k: Coefficients, sides: SideSpecs, upwind: boolean): Study {
  const study: Study = { max: [], l2: [] };
  for (const [nx, ny] of GRIDS) {
    const grid: GridSpec = { domain: upwind ? UPWIND_DOMAIN : DOMAIN, nx, ny, sides };
    const result = solve(manufacturedProblem(field, k, grid), {
      ...OPTIONS,
      scheme: { upwind },
    });
    assert.ok(result.converged, `${nx}×${ny}: solve stopped with ${result.reason}`);
    const e = errorNorms(result.solution, field, grid);
    study.max.push(e.max);
    study.l2.push(e.l2);
  }
  return study;
}

/** Observed order from the two finest grids, p = log2(E(2h)/E(h)). */
function finestOrder(errors: number[]): number {
  const n = errors.length;
  return Math.log2(errors[n - 2] / errors[n - 1]);
}

function checkOrder(study: Study, formal: number, label: string): void {
  for (const norm of ["max", "l2"] as const) {
    const errors = study[norm];
    for (let g = 1; g < errors.length; g++) {
      assert.ok(errors[g] < errors[g - 1], `${label}: ${norm} error grew: ${errors}`);
    }
    const p = finestOrder(errors);
    // ±0.1 on the two finest grids, as the issue asks (about 5 % of the formal order is the
    // accepted band, Roache 2011, published second hand)
    assertClose(p, formal, { abs: 0.1 }, `${label}: observed order in the ${norm} norm`);
  }
}

const SIDE_SETS: [string, SideSpecs][] = [
  ["all sides Dirichlet", ALL_DIRICHLET],
  ["all sides Neumann with e ≠ 0", ALL_NEUMANN],
  ["all sides Robin", ALL_ROBIN],
  ["mixed Dirichlet, Neumann and Robin sides", MIXED],
];

Deno.test("solve() shows observed order 2 in the max and L2 norms with all five coefficients variable", async (t) => {
  for (const [label, sides] of SIDE_SETS) {
    await t.step(label, () => checkOrder(refine(SMOOTH, VARIABLE, sides, false), 2, label));
  }
});

Deno.test("solve() with upwinding shows observed order 1 when b and d dominate the error", async (t) => {
  for (const [label, sides] of SIDE_SETS) {
    await t.step(label, () => checkOrder(refine(SMOOTH, CONVECTIVE, sides, true), 1, label));
  }
});

Deno.test("solve() gives the derived max errors for u = x⁴ under the Laplacian on the unit square", () => {
  // derived (docs/check-values.md, "Exact facts of central differences"; recomputed independently
  // with SciPy while writing this test): u = x⁴, a = c = 1, b = d = e = 0, Dirichlet sides,
  // h = 1/4 … 1/32
  const expected: [number, number][] = [
    [4, 8.789062e-03],
    [8, 2.274457e-03],
    [16, 5.737951e-04],
    [32, 1.437788e-04],
  ];
  const quartic: Field = {
    name: "u = x⁴",
    u: (x) => x ** 4,
    ux: (x) => 4 * x ** 3,
    uy: () => 0,
    uxx: (x) => 12 * x * x,
    uyy: () => 0,
  };
  const laplace: Coefficients = {
    name: "Laplacian",
    a: () => 1,
    b: () => 0,
    c: () => 1,
    d: () => 0,
    e: () => 0,
  };
  for (const [n, maxError] of expected) {
    const grid: GridSpec = {
      domain: { x0: 0, x1: 1, y0: 0, y1: 1 },
      nx: n,
      ny: n,
      sides: ALL_DIRICHLET,
    };
    // a direct-solve threshold of 1 forces multigrid even on the smallest grids
    const result = solve(manufacturedProblem(quartic, laplace, grid), {
      stop: { tolerance: 1e-13, maxCycles: 100 },
      coarse: { maxDirectUnknowns: 9 },
    });
    // the listed values carry 7 significant digits: compare at 1e-6 relative
    assertClose(
      errorNorms(result.solution, quartic, grid).max,
      maxError,
      { rel: 1e-6 },
      `h = 1/${n}`,
    );
  }
});
