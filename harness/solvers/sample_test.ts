import assert from "node:assert/strict";
import { testCase } from "../../tests/protocol/_case.ts";
import type { ValuedCondition } from "../../problem/mod.ts";
import { sampleCase } from "./sample.ts";

/** A side that carries values (these tests sample no periodic side). */
const valued = (b: unknown) => b as ValuedCondition;

Deno.test("sampleCase() puts cell values at centres and boundary data at face centres", () => {
  const c = testCase();
  const p = sampleCase(c, 4, 8, "cell");
  assert.equal(p.f.length, 32);
  // cell (1, 2): centre (0.375, 0.625) on [0,1]×[0,2] with hx = hy = 0.25
  assert.equal(p.f[2 * 4 + 1], c.source(0.375, 0.625));
  assert.equal(p.a[2 * 4 + 1], 1.375);
  // east face centres at x = 1, y = 0.125, 0.375, …; south at y = 0, x = 0.125, …
  assert.equal(valued(p.boundary.east).values.length, 8);
  assert.equal(valued(p.boundary.east).values[1], Math.exp(1 + 0.375 / 2));
  assert.equal(valued(p.boundary.south).values[3], 0.75 * Math.exp(0.875));
  const south = p.boundary.south;
  assert.equal(south.kind, "robin");
  if (south.kind !== "robin") return;
  // the Robin weights come at the same face centres as the data (one value each here)
  const faces = south.values.length;
  assert.deepEqual(south.alpha, new Float64Array(faces).fill(1));
  assert.deepEqual(south.beta, new Float64Array(faces).fill(0.5));
});

Deno.test("sampleCase() takes vertex samples from the case itself", () => {
  const c = testCase();
  const p = sampleCase(c, 4, 8, "vertex");
  assert.deepEqual(p.f, c.sample(4, 8).f);
  assert.equal(valued(p.boundary.west).values.length, 9);
});

Deno.test("sampleCase() refuses a case that is not elliptic at a cell centre", () => {
  const c = testCase();
  const bad = { ...c, coefficients: { ...c.coefficients, c: (x: number) => (x > 0.5 ? -1 : 1) } };
  assert.throws(
    () => sampleCase(bad, 4, 4, "cell"),
    /not elliptic at cell centre \(0\.625, 0\.25\)/,
  );
});
