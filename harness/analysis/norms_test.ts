import assert from "node:assert/strict";
import { assertClose } from "../../testing/mod.ts";
import { vertexWeights } from "./vertex_weights.ts";
import { errorNorms } from "./error_norms.ts";
import {
  boundaryBandMask,
  pointRegionNorms,
  pointsInBand,
  vertexRegionNorms,
} from "./region_norms.ts";

Deno.test("vertexWeights() sum to the area and integrate bilinear functions exactly", () => {
  // derived: the composite trapezoid rule is exact for functions linear in each direction
  const nx = 6, ny = 4, hx = 0.5 / nx, hy = 2 / ny;
  const w = vertexWeights(nx, ny, hx, hy);
  let area = 0, integral = 0;
  for (let j = 0; j <= ny; j++) {
    for (let i = 0; i <= nx; i++) {
      const x = i * hx, y = j * hy, k = j * (nx + 1) + i;
      area += w[k];
      integral += w[k] * (1 + 2 * x + 3 * y + 4 * x * y);
    }
  }
  assertClose(area, 1, { rel: 1e-14 });
  // ∫₀^½∫₀² (1 + 2x + 3y + 4xy) dy dx = 1 + 0.5 + 3 + 1 = 5.5
  assertClose(integral, 5.5, { rel: 1e-14 });
});

Deno.test("errorNorms() gives max, RMS and mean error for equal weights", () => {
  // derived by hand: errors 0, 3, 4 → max 4, L1 7/3, L2 sqrt(25/3)
  const n = errorNorms([1, 5, -4], [1, 2, 0]);
  assert.equal(n.max, 4);
  assertClose(n.l1, 7 / 3);
  assertClose(n.l2, Math.sqrt(25 / 3));
});

Deno.test("errorNorms() with trapezoid weights reproduces the continuous norms of sin(πx)sin(πy)", () => {
  // derived: e = sin(πx) sin(πy) on the unit square has ‖e‖₂ = ½ exactly; the trapezoid rule
  // integrates sin² (a trigonometric polynomial vanishing at the ends) exactly
  const nx = 32;
  const h = 1 / nx;
  const values = new Float64Array((nx + 1) ** 2);
  for (let j = 0; j <= nx; j++) {
    for (let i = 0; i <= nx; i++) {
      values[j * (nx + 1) + i] = Math.sin(Math.PI * i * h) * Math.sin(Math.PI * j * h);
    }
  }
  const n = errorNorms(values, new Float64Array(values.length), {
    weights: vertexWeights(nx, nx, h, h),
  });
  assertClose(n.l2, 0.5, { rel: 1e-12 });
  assertClose(n.max, 1, { rel: 1e-12 });
  // ∫∫ sin(πx) sin(πy) = 4/π²
  assertClose(n.l1, 4 / Math.PI ** 2, { rel: 2e-3 });
});

Deno.test("errorNorms() rejects mismatched lengths and empty masks", async (t) => {
  await t.step("lengths", () => {
    assert.throws(() => errorNorms([1, 2], [1]), /arrays differ in length/);
  });
  await t.step("empty mask", () => {
    assert.throws(() => errorNorms([1, 2], [1, 2], { mask: [0, 0] }), /no point is included/);
  });
  await t.step("weights and mask may also be given positionally", () => {
    const a = errorNorms([1, 4, 0], [1, 2, 0], [1, 1, 2], [1, 1, 0]);
    const b = errorNorms([1, 4, 0], [1, 2, 0], { weights: [1, 1, 2], mask: [1, 1, 0] });
    assert.deepEqual(a, b);
    assert.equal(a.l1, 1);
  });
  await t.step("NaN values give NaN norms", () => {
    assert.ok(Number.isNaN(errorNorms([NaN, 1], [0, 0]).l2));
  });
});

Deno.test("boundaryBandMask() marks a fixed number of node layers", () => {
  const m = boundaryBandMask({ nx: 8, ny: 6 }, 2);
  let band = 0;
  for (const v of m) band += v;
  // derived: 9·7 = 63 nodes; the interior is 2 ≤ i ≤ 6, 2 ≤ j ≤ 4 → 5·3 = 15 nodes; 48 in the band
  assert.equal(band, 48);
  assert.throws(() => boundaryBandMask({ nx: 3, ny: 8 }, 2), /use at least 4 intervals/);
});

Deno.test("vertexRegionNorms() shows an error on boundary nodes in the band norms only", () => {
  // derived: the defining property of the split — an error placed only on the south side's
  // nodes appears in the band and all-node norms and not in the interior norms
  const nx = 16, ny = 16, h = 1 / 16;
  const n = (nx + 1) * (ny + 1);
  const values = new Float64Array(n);
  for (let i = 0; i <= nx; i++) values[i] = h; // south side only
  const r = vertexRegionNorms(values, new Float64Array(n), { nx, ny, hx: h, hy: h });
  assert.equal(r.all.max, h);
  assert.equal(r.boundary.max, h);
  assert.equal(r.interior.max, 0);
  assert.equal(r.interior.l2, 0);
  assert.ok(r.boundary.l2 > r.all.l2, "band is smaller, so its normalized error is larger");
});

Deno.test("pointRegionNorms() splits a point set by a band mask from pointsInBand()", () => {
  const x = [0.02, 0.5, 0.98, 0.5];
  const y = [0.5, 0.5, 0.5, 0.03];
  const band = pointsInBand(x, y, { x0: 0, x1: 1, y0: 0, y1: 1 }, 0.05);
  assert.deepEqual([...band], [1, 0, 1, 1]);
  const r = pointRegionNorms([1, 2, 3, 4], [1, 2.5, 3, 4], { band, weights: [1, 2, 1, 1] });
  assert.equal(r.interior.max, 0.5);
  assert.equal(r.boundary.max, 0);
  // derived: weighted mean |e| = 2·0.5 / 5 = 0.2
  assertClose(r.all.l1, 0.2);
});

Deno.test("vertexRegionNorms() keeps the true order of a band error and of an interior error", () => {
  // derived: a constant error c·h on the band nodes has band L1 = L2 = c·h exactly (mean over
  // the band), so its order is exactly 1; the interior norms of h²·sin(πx)sin(πy) divide by the
  // fixed domain area, so their pairwise order stays within O(h²) of 2 — the missing edge strips
  // cost about 0.024 here — instead of drifting by O(h) (about 0.1 here) as they would if divided
  // by the interior's own shrinking area
  const at = (n: number) => {
    const h = 1 / n;
    const exact = new Float64Array((n + 1) ** 2);
    const values = new Float64Array(exact.length);
    const band = boundaryBandMask({ nx: n, ny: n });
    for (let j = 0; j <= n; j++) {
      for (let i = 0; i <= n; i++) {
        const k = j * (n + 1) + i;
        values[k] = band[k]
          ? 0.3 * h
          : h * h * Math.sin(Math.PI * i * h) * Math.sin(Math.PI * j * h);
      }
    }
    return vertexRegionNorms(values, exact, { nx: n, ny: n, hx: h, hy: h });
  };
  const [a, b] = [at(32), at(64)];
  assertClose(a.boundary.l1, 0.3 / 32, { rel: 1e-12 });
  assertClose(Math.log2(a.boundary.l2 / b.boundary.l2), 1, { rel: 1e-12 });
  assertClose(Math.log2(a.interior.l1 / b.interior.l1), 2, { abs: 0.03 });
  assertClose(Math.log2(a.interior.l2 / b.interior.l2), 2, { abs: 0.03 });
});
