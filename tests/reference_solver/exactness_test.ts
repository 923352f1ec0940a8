/**
 * Exactness of the discretization on polynomials (derived facts of central differences,
 * docs/check-values.md, "Exact facts of central differences"): central first and second
 * differences and the central ghost-node boundary formulas are exact for quadratics, so a quadratic
 * solution is reproduced to round-off with every coefficient variable and every boundary kind; the
 * second difference alone is exact for cubics, so a cubic is reproduced for a·u_xx + c·u_yy + e·u
 * with Dirichlet sides.
 *
 * The solve goes through the multigrid solver with a deep hierarchy (a small direct-solve
 * threshold), hx ≠ hy and counts that force semi-coarsening, on a non-unit rectangle.
 */
import assert from "node:assert/strict";
import { solve } from "../../reference-solver/mod.ts";
import {
  ALL_DIRICHLET,
  ALL_NEUMANN,
  ALL_ROBIN,
  errorNorms,
  type GridSpec,
  manufacturedProblem,
  maxAbs,
  MIXED,
  type SideSpecs,
} from "./_build.ts";
import {
  type Coefficients,
  CUBIC,
  type Field,
  NO_FIRST_ORDER,
  QUADRATIC,
  VARIABLE,
} from "./_manufactured.ts";

const DOMAIN = { x0: -0.5, x1: 1.0, y0: 0.25, y1: 1.25 };
// 48 × 40 intervals: hx = 1/32, hy = 1/40; coarsening 48×40 → 24×20 → 12×10 → 6×5 → 3×5 (x only)
const NX = 48;
const NY = 40;
const OPTIONS = {
  stop: { tolerance: 1e-13, maxCycles: 100 },
  coarse: { maxDirectUnknowns: 20 },
};
// derived: exact in exact arithmetic; 1e-11 relative leaves room for round-off of a system whose
// condition number grows like 1/h² (about 1e4 here)
const ROUND_OFF = 1e-11;

function checkExact(field: Field, k: Coefficients, sides: SideSpecs): void {
  const grid: GridSpec = { domain: DOMAIN, nx: NX, ny: NY, sides };
  const result = solve(manufacturedProblem(field, k, grid), OPTIONS);
  assert.ok(result.description.levels.length >= 4, "expected a multigrid hierarchy");
  assert.notEqual(result.reason, "diverged", `solver diverged: ${result.residualHistory}`);
  const err = errorNorms(result.solution, field, grid).max / maxAbs(field, grid);
  assert.ok(
    err <= ROUND_OFF,
    `${field.name} with ${k.name}: relative max error ${err.toExponential(3)} > ${ROUND_OFF} ` +
      `(reason ${result.reason}, ${result.cycles} cycles, final residual ` +
      `${result.residualHistory.at(-1)?.toExponential(3)})`,
  );
}

Deno.test("solve() reproduces a quadratic solution to round-off with all five coefficients variable, for every boundary kind", async (t) => {
  await t.step("all sides Dirichlet", () => checkExact(QUADRATIC, VARIABLE, ALL_DIRICHLET));
  await t.step(
    "all sides Neumann (e ≤ −1 keeps it non-singular)",
    () => checkExact(QUADRATIC, VARIABLE, ALL_NEUMANN),
  );
  await t.step("all sides Robin", () => checkExact(QUADRATIC, VARIABLE, ALL_ROBIN));
  await t.step(
    "Dirichlet, Neumann and Robin sides together",
    () => checkExact(QUADRATIC, VARIABLE, MIXED),
  );
});

Deno.test("solve() reproduces a cubic solution to round-off for a·u_xx + c·u_yy + e·u with Dirichlet sides", () => {
  checkExact(CUBIC, NO_FIRST_ORDER, ALL_DIRICHLET);
});

Deno.test("solve() does not reproduce a cubic with first-order terms, as the derivation predicts (the exactness check can fail)", () => {
  // derived: central first differences have truncation error (h²/6)·u_xxx ≠ 0 for a cubic, so the
  // error must be far above round-off; this guards against a comparison that always passes
  const grid: GridSpec = { domain: DOMAIN, nx: NX, ny: NY, sides: ALL_DIRICHLET };
  const result = solve(manufacturedProblem(CUBIC, VARIABLE, grid), OPTIONS);
  const err = errorNorms(result.solution, CUBIC, grid).max / maxAbs(CUBIC, grid);
  assert.ok(err > 1e-7, `relative max error ${err} is unexpectedly at round-off level`);
});
