import assert from "node:assert/strict";
import { assertClose } from "../../testing/mod.ts";
import { refineConvergence } from "./refine_convergence.ts";

const grids = (h: [number, number, number], f: [number, number, number]) => ({
  fine: { h: h[0], value: f[0] },
  medium: { h: h[1], value: f[1] },
  coarse: { h: h[2], value: f[2] },
});

Deno.test("refineConvergence() predicts the difference ratio for non-constant refinement ratios", () => {
  // derived: f = 1 + h² at h = 1, 1.5, 3 (r21 = 1.5, r32 = 2): f = 2, 3.25, 10;
  // (f3 − f2)/(f2 − f1) = 6.75/1.25 = 5.4; expected r21²·(r32² − 1)/(r21² − 1) = 2.25·3/1.25 = 5.4
  const c = refineConvergence(grids([1, 1.5, 3], [1 + 1, 1 + 2.25, 1 + 9]), { formalOrder: 2 });
  assertClose(c.expectedDifferenceRatio, 5.4, { rel: 1e-12 });
  assertClose(c.differenceRatio!, 5.4, { rel: 1e-12 });
  assert.equal(c.convergence, "monotone");
});

Deno.test("refineConvergence() classifies the finest three grids", async (t) => {
  const h: [number, number, number] = [1, 2, 4];
  // each row: values fine, medium, coarse; class by hand from d21 = f2 − f1, d32 = f3 − f2
  const rows: [string, [number, number, number], string][] = [
    ["shrinking, same sign", [1.01, 1.04, 1.16], "monotone"], // d21 = 0.03, d32 = 0.12
    ["shrinking, alternating sign", [1.1, 1.2, 1], "oscillatory"], // 0.1, −0.2
    ["growing", [1.3, 1.1, 1], "divergent"], // −0.2, −0.1
    ["equal differences", [1.5, 1.25, 1], "divergent"], // −0.25, −0.25 (exact in binary): order 0, our choice
    ["growing and alternating", [0.9, 1.2, 1], "divergent"], // 0.3, −0.2
    ["the same value", [1, 1, 1], "unchanged"],
  ];
  for (const [what, f, expected] of rows) {
    await t.step(
      what,
      () => assert.equal(refineConvergence(grids(h, f), { formalOrder: 2 }).convergence, expected),
    );
  }
});
