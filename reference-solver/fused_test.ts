import assert from "node:assert/strict";
import { ALL_DIRICHLET, manufactured, SMOOTH, VARIABLE } from "./_test_problems.ts";
import { discretize } from "./discretize.ts";
import { createTransfer } from "./transfer.ts";
import { redBlackSweep, redResidualNorm2, residual, residualNorm2 } from "./_kernels.ts";
import type { Side } from "./problem.ts";
import type { SideSpec } from "./_test_problems.ts";

const MIXED: Record<Side, SideSpec> = {
  west: "neumann",
  east: { alpha: 1.5, beta: 0.5 },
  south: "dirichlet",
  north: "neumann",
};

const CASES = [
  { name: "16×12, Dirichlet sides, central", nx: 16, ny: 12, sides: ALL_DIRICHLET, upwind: false },
  {
    name: "20×16, Neumann, Robin and Dirichlet sides, upwind",
    nx: 20,
    ny: 16,
    sides: MIXED,
    upwind: true,
  },
];

/** A deterministic rough iterate (every mode present). */
function rough(length: number): Float64Array {
  const u = new Float64Array(length);
  let s = 12345;
  for (let k = 0; k < length; k++) {
    s = (s * 1103515245 + 12345) % 2147483648;
    u[k] = s / 2147483648 - 0.5;
  }
  return u;
}

Deno.test("the fused red-residual restriction equals residual then full weighting after a red–black sweep, to rounding", async (t) => {
  // Identity (exact arithmetic): a red–black sweep ends on the black nodes, whose residual it
  // zeroes, and full weighting's edge weights meet only black nodes. Rounding bound: the black
  // residuals are ε-sized against |f| + |A|·|u|, so the difference is below 1e-12 of that scale.
  for (const c of CASES) {
    await t.step(c.name, () => {
      const problem = manufactured(VARIABLE, SMOOTH, c, c.sides);
      const { op: fine, rhs } = discretize(problem, c.upwind);
      const coarse = discretize(
        manufactured(VARIABLE, SMOOTH, { nx: c.nx / 2, ny: c.ny / 2 }, c.sides),
        c.upwind,
      ).op;
      const T = createTransfer("full-weighting", fine, coarse);
      assert.ok(T.restrictResidual !== undefined);
      const u = rough(fine.length);
      for (let k = 0; k < u.length; k++) {
        const i = (k % fine.stride) - 1, j = Math.floor(k / fine.stride) - 1;
        if (i < 0 || i > fine.nx || j < 0 || j > fine.ny) u[k] = 0;
      }
      const r = fine.vector(), plain = coarse.vector(), fused = coarse.vector();
      // Before a sweep the black residuals are not zero: the two must differ (the test can fail).
      residual(fine, u, rhs, r);
      T.restrict(r, plain);
      T.restrictResidual!(fine, u, rhs, fused);
      let before = 0;
      for (let k = 0; k < plain.length; k++) {
        before = Math.max(before, Math.abs(plain[k] - fused[k]));
      }
      assert.ok(before > 1e-3, `rough iterate: ${before}`);
      redBlackSweep(fine, u, rhs);
      residual(fine, u, rhs, r);
      T.restrict(r, plain);
      T.restrictResidual!(fine, u, rhs, fused);
      let scale = 0, diff = 0;
      for (let k = 0; k < plain.length; k++) {
        scale = Math.max(scale, Math.abs(plain[k]));
        diff = Math.max(diff, Math.abs(plain[k] - fused[k]));
      }
      let rhsScale = 0;
      for (let k = 0; k < rhs.length; k++) rhsScale = Math.max(rhsScale, Math.abs(rhs[k]));
      assert.ok(diff <= 1e-12 * Math.max(rhsScale, 1), `fused against plain: ${diff}`);
      assert.ok(scale > 1e-3, "the restricted residual is not trivially zero");
      // The red-only norm is the whole norm after the sweep (same rounding argument).
      const whole = residualNorm2(fine, u, rhs), red = redResidualNorm2(fine, u, rhs);
      assert.ok(Math.abs(whole - red) <= 1e-12 * whole, `${red} vs ${whole}`);
    });
  }
});

Deno.test("only full weighting with grid scaling on a level coarsened both ways restricts fused", () => {
  const p = manufactured(VARIABLE, SMOOTH, { nx: 8, ny: 8 }, ALL_DIRICHLET);
  const fine = discretize(p, false).op;
  const coarse = discretize(manufactured(VARIABLE, SMOOTH, { nx: 4, ny: 4 }, ALL_DIRICHLET), false)
    .op;
  const semi = discretize(manufactured(VARIABLE, SMOOTH, { nx: 4, ny: 8 }, ALL_DIRICHLET), false)
    .op;
  assert.equal(createTransfer("half-weighting", fine, coarse).restrictResidual, undefined);
  assert.equal(
    createTransfer("full-weighting", fine, coarse, { scaling: "volume" }).restrictResidual,
    undefined,
  );
  assert.equal(createTransfer("full-weighting", fine, semi).restrictResidual, undefined);
});
