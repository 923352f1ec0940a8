/**
 * The library and the reference solver check each other: every built-in case, solved on its
 * suggested grids with the central scheme, must show its declared order (observed where declared,
 * else formal) in the max and L2 norms on the finest pair within 0.1, and the exactness case must
 * give round-off errors.
 */
import assert from "node:assert/strict";
import { type CompiledCase, expectationFor, loadLibrary } from "../../cases/mod.ts";
import { type SmootherName, solve } from "../../reference-solver/mod.ts";
import { errorNorms, vertexWeights, withoutMean } from "../../harness/analysis/mod.ts";
import { assertClose } from "../../testing/mod.ts";

function errorsOn(c: CompiledCase, n: number) {
  const { nx, ny } = c.gridFor(n);
  const result = solve(c.sample(nx, ny), {
    stop: { tolerance: 1e-12, maxCycles: 200 },
    ...(c.solver?.smoother ? { smoother: { name: c.solver.smoother as SmootherName } } : {}),
    ...(c.singular ? { singular: "mean-zero" as const } : {}),
  });
  assert.ok(result.converged, `${c.id} n=${n}: ${result.reason}`);
  const hx = (c.domain.x1 - c.domain.x0) / nx;
  const hy = (c.domain.y1 - c.domain.y0) / ny;
  const w = vertexWeights(nx, ny, hx, hy);
  // a singular case is fixed up to a constant: compare mean-free fields (docs/cases.md)
  const fix = (v: Float64Array) => c.singular ? withoutMean(v, w) : v;
  return {
    h: Math.sqrt(hx * hy),
    ...errorNorms(fix(result.solution), fix(c.sampleExact(nx, ny)), w),
  };
}

const library = await loadLibrary();

Deno.test("every built-in case shows its declared order with the reference solver", async (t) => {
  for (const c of library) {
    await t.step(c.id, () => {
      // the reference solver is vertex-centred: its expectation is the case's for that layout
      const expected = expectationFor(c, "central", "vertex");
      const runs = c.grids.map((n) => errorsOn(c, n));
      if (expected.exactToRoundOff) {
        // exactness case: errors at round-off (derived: the scheme is exact for quadratics)
        for (const r of runs) {
          assert.ok(r.max < 1e-9, `${c.id}: max error ${r.max} is not round-off`);
        }
        return;
      }
      const [coarse, fine] = runs.slice(-2);
      for (const norm of ["max", "l2"] as const) {
        const want = expected.achievable?.[norm]?.order ?? expected.formal;
        const got = Math.log(coarse[norm] / fine[norm]) / Math.log(coarse.h / fine.h);
        assert.ok(
          Math.abs(got - want) <= 0.1,
          `${c.id}: ${norm} order ${got.toFixed(3)}, declared ${want}`,
        );
      }
    });
  }
});

Deno.test("quartic-poisson gives the derived max errors of docs/check-values.md", () => {
  // derived (docs/check-values.md, "Exact facts of central differences"): u = x⁴, unit square,
  // Dirichlet, h = 1/4 … 1/32 → 8.789062e-03, 2.274457e-03, 5.737951e-04, 1.437788e-04
  const c = library.find((k) => k.id === "quartic-poisson")!;
  const want = [8.789062e-03, 2.274457e-03, 5.737951e-04, 1.437788e-04];
  c.grids.forEach((n, k) => assertClose(errorsOn(c, n).max, want[k], { rel: 1e-6 }, `n=${n}`));
});
