import assert from "node:assert/strict";
import { vertexWeights } from "./vertex_weights.ts";
import { weightedMean, withoutMean } from "./mean_removal.ts";

Deno.test("withoutMean() makes the error independent of the constant: (u + C) − mean(u + C) = u − mean(u)", () => {
  // exact identity: the weighted mean of u + C is mean(u) + C for weights of any positive sum
  const w = vertexWeights(8, 4, 1 / 8, 1 / 4);
  const u = new Float64Array(w.length).map((_, k) => Math.sin(k) + 0.1 * k);
  const shifted = u.map((v) => v + 123.5);
  const a = withoutMean(u, w), b = withoutMean(shifted, w);
  for (let k = 0; k < u.length; k++) assert.ok(Math.abs(a[k] - b[k]) < 1e-12);
  assert.ok(Math.abs(weightedMean(a, w)) < 1e-14);
});

Deno.test("weightedMean() with trapezoid weights integrates x + y exactly to its mean 1 on [0, 1]²", () => {
  // exact identity: the trapezoid rule is exact for bilinear functions; ∫∫ (x + y) = 1
  const n = 4, w = vertexWeights(n, n, 1 / n, 1 / n);
  const v = new Float64Array(w.length);
  for (let j = 0; j <= n; j++) for (let i = 0; i <= n; i++) v[j * (n + 1) + i] = i / n + j / n;
  assert.ok(Math.abs(weightedMean(v, w) - 1) < 1e-15);
});
