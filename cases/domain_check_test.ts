import assert from "node:assert/strict";
import { assertClose } from "../testing/mod.ts";
import { growsWithoutBound, GROWTH_STEPS, localMinima } from "./_domain_kernels.ts";
import { CHECK_INTERVALS, checkDomain, type CheckedFunction } from "./domain_check.ts";

const square = { x0: 0, x1: 1, y0: 0, y1: 1 };
// p and q are no coordinate of any dyadic grid up to 1024, so none of the check lattices
const p = 0.3337;
const q = 0.6663;
const eps = 1e-8;

Deno.test("the test's features lie between the nodes of every dyadic grid up to 1024 and the check lattices", () => {
  // the band |x − p| < 1e-4 and the disc around (p, q) hold no point k/n: before the refinement
  // they passed every sampling
  for (let n = 2; n <= 1024; n *= 2) {
    for (let k = 0; k <= n; k++) {
      assert.ok(Math.abs(k / n - p) >= 1e-4, `${k}/${n}`);
      assert.ok(Math.abs(k / n - 0.123456) >= 1e-4, `${k}/${n}`);
    }
  }
  // the check lattices' points have coordinates k/(2n): nodes k/n, centres (k + 1/2)/n
  assert.ok(2 * CHECK_INTERVALS <= 1024);
});

Deno.test("checkDomain() finds a sign change between the lattice points, with the point and the value", async (t) => {
  // Exact identities: each function's minimum is −ε, attained at the stated place.
  const rows: { name: string; at: CheckedFunction["at"]; x?: number; y?: number }[] = [
    { name: "band across x", at: (x) => (x - p) ** 2 - eps, x: p },
    { name: "band across y", at: (_x, y) => (y - q) ** 2 - eps, y: q },
    { name: "pit", at: (x, y) => (x - p) ** 2 + (y - q) ** 2 - eps, x: p, y: q },
    // minimum −ε on the line x + y = 2p, across both axes
    { name: "diagonal valley", at: (x, y) => (x + y - 2 * p) ** 2 - eps },
  ];
  for (const row of rows) {
    await t.step(row.name, () => {
      const [fault] = checkDomain(square, [{ name: "a", at: row.at, sign: 1 }]);
      assert.equal(fault?.kind, "sign", JSON.stringify(fault));
      assert.equal(fault.found, "refinement");
      assert.equal(fault.name, "a");
      assert.ok(fault.value < 0);
      assertClose(fault.value, row.at(fault.x, fault.y), { rel: 0 });
      if (row.x !== undefined) assertClose(fault.x, row.x, { abs: 1e-4 });
      if (row.y !== undefined) assertClose(fault.y, row.y, { abs: 1e-4 });
    });
  }
  await t.step("a negative sign is kept the same way", () => {
    const [fault] = checkDomain(square, [{ name: "c", at: (x) => eps - (x - p) ** 2, sign: -1 }]);
    assert.equal(fault?.kind, "sign");
    assert.ok(fault.value > 0);
  });
});

Deno.test("checkDomain() finds singularities between the lattice points and tells them from steep bounded peaks", async (t) => {
  const singular: [string, CheckedFunction["at"], number][] = [
    ["simple pole", (x) => 1 / (x - 0.123456), 0.123456],
    ["double pole", (x) => 1 / (x - 0.123456) ** 2, 0.123456],
    ["point pole", (x, y) => 1 / ((x - p) ** 2 + (y - q) ** 2), p],
    ["logarithm", (x) => Math.log(Math.abs(x - 0.123456)), 0.123456],
  ];
  for (const [name, at, x] of singular) {
    await t.step(name, () => {
      const [fault] = checkDomain(square, [{ name: "e", at, sign: 0 }]);
      assert.ok(fault?.kind === "unbounded" || fault?.kind === "non-finite", JSON.stringify(fault));
      assertClose(fault.x, x, { abs: 1e-9 });
      assert.equal(fault.found, "refinement");
    });
  }
  const bounded: [string, CheckedFunction["at"], CheckedFunction["sign"]][] = [
    // derivatives of size 1e4 in a layer of width 0.01 at the east side
    ["boundary layer", (x) => Math.exp((x - 1) / 0.01) / 1e-4, 0],
    // |x − p|^(1/2): a cusp, bounded
    ["cusp", (x) => 1 - Math.sqrt(Math.abs(x - p)), 0],
    ["oscillation", (x, y) => 1 + 0.8 * Math.sin(16 * Math.PI * x) * Math.sin(16 * Math.PI * y), 1],
    // positive, but only 1e-8 above 0 at x = p (2e-8 of its largest value, above 1e-12)
    ["near zero", (x) => (x - p) ** 2 + eps, 1],
    // the library's near-degenerate coefficient
    ["0.001 + x²", (x) => 0.001 + x * x, 1],
  ];
  for (const [name, at, sign] of bounded) {
    await t.step(`${name} passes`, () => {
      assert.deepEqual(checkDomain(square, [{ name: "a", at, sign }]), []);
    });
  }
});

Deno.test("checkDomain() counts a value below 1e-12 of the largest as zero", async (t) => {
  await t.step("a coefficient that only touches zero between the lattice points", () => {
    // (x − p)² ≥ 0 is 0 on the line x = p: not elliptic there, though no sampled value is ≤ 0
    const [fault] = checkDomain(square, [{ name: "a", at: (x) => (x - p) ** 2, sign: 1 }]);
    assert.equal(fault?.kind, "vanishes");
    assert.equal(fault.found, "refinement");
    assert.ok(fault.value >= 0 && fault.value <= 1e-12 * fault.scale, JSON.stringify(fault));
  });
  await t.step("a positive coefficient spanning more than 12 decades", () => {
    // exp((x − 1)/0.01) is e^−100 ≈ 3.7e-44 at x = 0 and 1 at x = 1
    const [fault] = checkDomain(square, [
      { name: "a", at: (x) => Math.exp((x - 1) / 0.01), sign: 1 },
    ]);
    assert.deepEqual([fault?.kind, fault?.x, fault?.scale], ["vanishes", 0, 1]);
    assertClose(fault.value, Math.exp(-100), { rel: 1e-12 });
  });
});

Deno.test("checkDomain() reports a lattice point first, and non-finite values before signs", () => {
  const faults = checkDomain(square, [
    { name: "a", at: (x) => x - 0.5, sign: 1 },
    { name: "b", at: (x, y) => 1 / (x + y), sign: 0 },
    { name: "c", at: () => 2, sign: 1 },
  ]);
  assert.deepEqual(faults.map((f) => [f.name, f.kind, f.found, f.x, f.y, f.value]), [
    // the smallest value of x − 0.5 on the closed square: at x = 0
    ["a", "sign", "lattice", 0, 0, -0.5],
    ["b", "non-finite", "lattice", 0, 0, Infinity],
  ]);
});

Deno.test("checkDomain() checks a side (a segment) the same way", () => {
  const east = { x0: 1, x1: 1, y0: 0, y1: 1 };
  const [fault] = checkDomain(east, [{ name: "g", at: (_x, y) => 1 / (y - 0.123456), sign: 0 }]);
  assert.equal(fault?.kind, "unbounded");
  assert.equal(fault.x, 1);
  assertClose(fault.y, 0.123456, { abs: 1e-9 });
});

Deno.test("growsWithoutBound() tells poles and logarithms from bounded peaks", () => {
  // |v| at the distances d = 1e-6, 1e-9, 1e-12 of GROWTH_STEPS from the peak
  const at = (g: (d: number) => number) =>
    GROWTH_STEPS.map(g) as unknown as [number, number, number];
  assert.equal(growsWithoutBound(at((d) => 1 / d)), true);
  assert.equal(growsWithoutBound(at((d) => -Math.log(d))), true);
  assert.equal(growsWithoutBound(at((d) => 1 - d)), false);
  assert.equal(growsWithoutBound(at((d) => 2 - Math.sqrt(d))), false);
  assert.equal(growsWithoutBound(at(() => 5)), false);
});

Deno.test("localMinima() skips plateaus and keeps chosen minima apart", () => {
  // a plateau has no minimum; a valley along a column gives minima spread along it
  assert.deepEqual(localMinima(new Float64Array(9).fill(1), 2, 2, 1, 8), []);
  const n = 8;
  const v = new Float64Array((n + 1) ** 2);
  for (let j = 0; j <= n; j++) for (let i = 0; i <= n; i++) v[j * (n + 1) + i] = (i - 4) ** 2;
  const chosen = localMinima(v, n, n, 1, 8);
  assert.ok(chosen.length >= 3 && chosen.every((k) => k % (n + 1) === 4), String(chosen));
  const rows = chosen.map((k) => Math.floor(k / (n + 1))).sort((a, b) => a - b);
  for (let m = 1; m < rows.length; m++) assert.ok(rows[m] - rows[m - 1] >= 3, String(rows));
});
