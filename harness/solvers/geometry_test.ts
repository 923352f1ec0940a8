import assert from "node:assert/strict";
import { assertClose } from "../../testing/mod.ts";
import { freePoints, gridPoints } from "./geometry.ts";

const domain = { x0: -1, x1: 2, y0: 0, y1: 1.5 };

Deno.test("gridPoints() weights integrate constants and linear functions exactly", async (t) => {
  for (const layout of ["vertex", "cell"] as const) {
    await t.step(layout, () => {
      const p = gridPoints(layout, domain, 6, 5);
      // derived: trapezoid and midpoint rules are exact for polynomials of degree ≤ 1;
      // area = 3 × 1.5 = 4.5, ∫∫ x dA = 1.5 · (2² − 1²)/2 = 2.25
      assertClose(p.weights.reduce((s, w) => s + w, 0), 4.5, { rel: 1e-14 });
      assertClose(p.weights.reduce((s, w, k) => s + w * p.x[k], 0), 2.25, { rel: 1e-13 });
    });
  }
});

Deno.test("gridPoints() marks the boundary row and one layer in as the band", () => {
  // vertex 7×6 nodes: interior block two layers in is 3×2 → band 42 − 6
  assert.equal(gridPoints("vertex", domain, 6, 5).boundaryBand.reduce((s, b) => s + b, 0), 42 - 6);
  // cell 6×5: interior block two layers in is 2×1 → band 30 − 2
  assert.equal(gridPoints("cell", domain, 6, 5).boundaryBand.reduce((s, b) => s + b, 0), 30 - 2);
  const cell = gridPoints("cell", domain, 6, 5);
  assert.deepEqual([cell.x[0], cell.y[0]], [-0.75, 0.15]);
});

Deno.test("freePoints() gives area/N weights and a band two spacings wide", () => {
  const x = new Float64Array([0.5, 0.5, -0.9]);
  const y = new Float64Array([0.75, 0.05, 0.75]);
  const p = freePoints(domain, x, y);
  // derived: h = sqrt(4.5 / 3) ≈ 1.22; (0.5, 0.75) is 0.75 from the south side → within 2h
  assert.deepEqual(Array.from(p.weights), [1.5, 1.5, 1.5]);
  assert.deepEqual(Array.from(p.boundaryBand), [1, 1, 1]);
  const many = freePoints(
    { x0: 0, x1: 1, y0: 0, y1: 1 },
    new Float64Array(10000).fill(0.5),
    new Float64Array(10000).fill(0.5),
  );
  // h = 0.01: the centre is 0.5 from every side → outside the band
  assert.equal(many.boundaryBand[0], 0);
});
