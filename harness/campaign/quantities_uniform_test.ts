/**
 * Uniform grids keep their quantities bit for bit: `testdata/quantities/uniform_values.json` holds
 * the values the rules gave before the stretched-grid rules were added (commit a143415, recorded
 * by running this file's construction on that commit), for every built-in and every kind of
 * chosen quantity on both layouts, on square and odd grids, on a perturbed smooth field. The test
 * asserts strict equality: a uniform field never takes the unequal-step rules.
 */
import assert from "node:assert/strict";
import { buildCase, type QuantitySpec } from "../../cases/mod.ts";
import { testCase } from "../../cases/_test_case.ts";
import { discreteQuantity } from "./chosen_quantities.ts";
import { discreteQuantities } from "./quantities.ts";

const SPECS: QuantitySpec[] = [
  { name: "a", kind: "flux", side: "east" },
  { name: "b", kind: "flux", side: "north", segment: [0.13, 0.71] },
  { name: "c", kind: "flux", side: "west", segment: [0.3, 0.9] },
  { name: "d", kind: "flux", side: "south" },
  { name: "e", kind: "integral", x: [0.11, 0.58], y: [0.3, 0.93] },
  { name: "f", kind: "integral" },
  { name: "g", kind: "point", x: 0.31, y: 0.67 },
  { name: "h", kind: "point", x: 1.05, y: 0.25 },
];

Deno.test("uniform grids give the quantity values recorded before the stretched rules, bit for bit", async () => {
  const recorded: Record<string, number | null> = JSON.parse(
    await Deno.readTextFile(
      new URL("../../testdata/quantities/uniform_values.json", import.meta.url),
    ),
  );
  const kase = await buildCase(
    testCase({
      domain: { x0: -0.3, x1: 1.1, y0: 0.2, y1: 1.7 },
      form: "conservative",
      coefficients: undefined,
      conductivity: { k11: "2 + y", k12: "0.5", k22: "1" },
      exact: "exp(0.7*x)*cos(1.3*y) + x^3*sin(2*y)",
    }),
    { origin: "t" },
  );
  const now: Record<string, number | null> = {};
  for (const layout of ["vertex", "cell"] as const) {
    for (const [nx, ny] of [[12, 10], [7, 9]]) {
      const { x0, x1, y0, y1 } = kase.domain;
      const mi = layout === "vertex" ? nx + 1 : nx, mj = layout === "vertex" ? ny + 1 : ny;
      const off = layout === "vertex" ? 0 : 0.5;
      const n = mi * mj;
      const x = new Float64Array(n), y = new Float64Array(n);
      const weights = new Float64Array(n).fill(0.01), values = new Float64Array(n);
      for (let j = 0; j < mj; j++) {
        for (let i = 0; i < mi; i++) {
          const k = j * mi + i;
          x[k] = x0 + ((i + off) / nx) * (x1 - x0);
          y[k] = y0 + ((j + off) / ny) * (y1 - y0);
          values[k] = kase.exact(x[k], y[k]) + 0.01 * Math.sin(7 * k);
        }
      }
      const field = { layout, nx, ny, x, y, weights, values };
      const tag = `${layout}-${nx}x${ny}`;
      for (const [k, v] of Object.entries(discreteQuantities(field, kase.domain))) {
        now[`${tag}-${k}`] = v;
      }
      for (const s of SPECS) now[`${tag}-${s.name}`] = discreteQuantity(field, kase, s);
      for (const s of SPECS) {
        if (s.kind === "flux") {
          now[`${tag}-${s.name}-normal`] = discreteQuantity(field, kase, s, "normal");
        }
      }
    }
  }
  assert.deepEqual(now, recorded);
});
