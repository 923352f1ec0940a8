/**
 * The reference solver on stretched and periodic grids, against outside references:
 * - exactness on a quadratic: the non-uniform 3-point differences are the derivatives of the
 *   interpolating parabola, hence exact for quadratics (derived identity), and the ghost
 *   elimination of Neumann/Robin sides is the central difference, exact for quadratics too;
 * - observed orders from manufactured solutions (Roache, Verification and Validation in
 *   Computational Science and Engineering, 1998: refinement by one map, order log₂(e_h/e_{h/2}));
 *   supraconvergence, a first-order truncation error with a second-order solution error on grids
 *   whose spacing jumps (Manteuffel & White, Math. Comp. 47, 1986);
 * - the volume weights sum to the area, and the trapezoid rule (common practice);
 * - convergence factor ≤ 0.2 at a stretching ratio of 10, flat under refinement (issue 14).
 */
import assert from "node:assert/strict";
import { assertClose } from "../../testing/mod.ts";
import { discreteResidual, solve, volumeWeights } from "../../reference-solver/mod.ts";
import {
  alternating,
  build,
  type Field,
  geometric,
  type Kinds,
  sampleAt,
  stretchRatio,
  tanhBetaFor,
  tanhBoth,
} from "./_stretched.ts";

const TIGHT = { stop: { tolerance: 1e-13, maxCycles: 60 } };
const maxAbs = (v: Float64Array) => v.reduce((m, t) => Math.max(m, Math.abs(t)), 0);
const diff = (a: Float64Array, b: Float64Array) => a.map((t, k) => t - b[k]);
const BETA10 = tanhBetaFor(10);

const K = { a: 1.3, b: 0.4, c: 0.7, d: -0.2, e: -0.5 };
const QUAD: Field = {
  u: (x, y) => 1 + 2 * x - y + 0.5 * x * x - 0.75 * y * y,
  ux: (x) => 2 + x,
  uy: (_x, y) => -1 - 1.5 * y,
  f: (x, y) =>
    K.a * 1 + K.c * -1.5 + K.b * (2 + x) + K.d * (-1 - 1.5 * y) +
    K.e * (1 + 2 * x - y + 0.5 * x * x - 0.75 * y * y),
};
const LAP = { a: 1, b: 0, c: 1, d: 0, e: 0 };
const SMOOTH: Field = {
  u: (x, y) => Math.sin(Math.PI * x) * Math.cos(2 * y) + x * x,
  ux: (x, y) => Math.PI * Math.cos(Math.PI * x) * Math.cos(2 * y) + 2 * x,
  uy: (x, y) => -2 * Math.sin(Math.PI * x) * Math.sin(2 * y),
  f: (x, y) => -(Math.PI ** 2 + 4) * Math.sin(Math.PI * x) * Math.cos(2 * y) + 2,
};
const DIRICHLET: Kinds = {
  west: "dirichlet",
  east: "dirichlet",
  south: "dirichlet",
  north: "dirichlet",
};

Deno.test("Stretched grid: a quadratic is reproduced to round-off with Dirichlet, Neumann and Robin sides (3-point differences exact for quadratics)", () => {
  const x = geometric(24, 10), y = tanhBoth(20, BETA10);
  const kinds: Kinds = { west: "neumann", east: "dirichlet", south: "robin", north: "neumann" };
  const p = build(QUAD, x, y, kinds, K);
  const r = solve(p, TIGHT);
  assert.equal(r.converged, true, r.reason);
  assertClose(maxAbs(diff(r.solution, sampleAt(QUAD, x, y))), 0, { abs: 1e-10 });
  assertClose(maxAbs(discreteResidual(p, sampleAt(QUAD, x, y))), 0, { abs: 1e-9 });
});

Deno.test("Stretched grid: the volume weights sum to the area and integrate x·y exactly (trapezoid rule, bilinear integrand)", () => {
  const x = geometric(10, 7), y = tanhBoth(12, 1.5);
  const p = { domain: { x0: 0, x1: 1, y0: 0, y1: 1 }, nx: 10, ny: 12, coordinates: { x, y } };
  const w = volumeWeights(p);
  assertClose(w.reduce((s, t) => s + t, 0), 1, { rel: 1e-14 });
  let s = 0;
  for (let j = 0; j <= 12; j++) for (let i = 0; i <= 10; i++) s += w[j * 11 + i] * x[i] * y[j];
  assertClose(s, 0.25, { rel: 1e-13 }, "∫∫xy = 1/4");
});

/** Max-norm errors of solution and truncation on a family. */
function study(family: (n: number) => Float64Array, field: Field, kinds: Kinds, ns: number[]) {
  return ns.map((n) => {
    const x = family(n), y = family(n);
    const p = build(field, x, y, kinds, LAP);
    const r = solve(p, TIGHT);
    assert.equal(r.converged, true, `${n}: ${r.reason}`);
    const exact = sampleAt(field, x, y);
    return { e: maxAbs(diff(r.solution, exact)), tau: maxAbs(discreteResidual(p, exact)), r };
  });
}

Deno.test("Tanh family at stretching ratio 10: observed solution order 2 with a Neumann side; convergence factor ≤ 0.2 and flat", () => {
  const kinds: Kinds = { ...DIRICHLET, south: "neumann" };
  const s = study((n) => tanhBoth(n, BETA10), SMOOTH, kinds, [32, 64, 128]);
  for (let k = 1; k < s.length; k++) {
    assertClose(Math.log2(s[k - 1].e / s[k].e), 2, { abs: 0.1 }, `order ${k}`);
    assert.ok(s[k].r.asymptoticFactor <= 0.2, `factor ${s[k].r.asymptoticFactor}`);
  }
  assert.ok(stretchRatio(tanhBoth(128, BETA10)) > 9);
});

Deno.test("Alternating spacings h, 2h: truncation error first order, solution error second order (supraconvergence)", () => {
  const s = study(alternating, SMOOTH, DIRICHLET, [32, 64, 128]);
  for (let k = 1; k < s.length; k++) {
    assertClose(Math.log2(s[k - 1].tau / s[k].tau), 1, { abs: 0.15 }, `truncation order ${k}`);
    assertClose(Math.log2(s[k - 1].e / s[k].e), 2, { abs: 0.15 }, `solution order ${k}`);
  }
});

Deno.test("Periodic west–east with first-order term, stretched in y: observed order 2, images equal", () => {
  const tp = 2 * Math.PI, b = 0.5;
  const field: Field = {
    u: (x, y) => Math.sin(tp * x) * (1 + y * y),
    ux: (x, y) => tp * Math.cos(tp * x) * (1 + y * y),
    uy: (x, y) => Math.sin(tp * x) * 2 * y,
    f: (x, y) =>
      -tp * tp * Math.sin(tp * x) * (1 + y * y) + 2 * Math.sin(tp * x) +
      b * tp * Math.cos(tp * x) * (1 + y * y),
  };
  const kinds: Kinds = { west: "periodic", east: "periodic", south: "dirichlet", north: "neumann" };
  const errs = [32, 64, 128].map((n) => {
    const x = geometric(n, 4), y = tanhBoth(n, BETA10);
    const p = build(field, x, y, kinds, { ...LAP, b });
    const r = solve(p, TIGHT);
    assert.equal(r.converged, true, r.reason);
    for (let j = 0; j <= n; j++) assert.equal(r.solution[j * (n + 1)], r.solution[j * (n + 1) + n]);
    return maxAbs(diff(r.solution, sampleAt(field, x, y)));
  });
  for (let k = 1; k < errs.length; k++) {
    assertClose(Math.log2(errs[k - 1] / errs[k]), 2, { abs: 0.15 }, `order ${k}`);
  }
});

Deno.test("All-Neumann on a stretched grid: u = cos πx cos πy, zero data, volume-weighted mean zero, order 2, factor ≤ 0.2", () => {
  const pi = Math.PI;
  const field: Field = {
    u: (x, y) => Math.cos(pi * x) * Math.cos(pi * y),
    ux: (x, y) => -pi * Math.sin(pi * x) * Math.cos(pi * y),
    uy: (x, y) => -pi * Math.cos(pi * x) * Math.sin(pi * y),
    f: (x, y) => -2 * pi * pi * Math.cos(pi * x) * Math.cos(pi * y),
  };
  const kinds: Kinds = { west: "neumann", east: "neumann", south: "neumann", north: "neumann" };
  const errs = [32, 64, 128].map((n) => {
    const x = tanhBoth(n, BETA10), y = geometric(n, 10);
    const p = build(field, x, y, kinds, LAP);
    // Tolerance 1e-11: the shifted singular system stagnates near 1e-12 relative (round-off).
    const r = solve(p, { stop: { tolerance: 1e-11, maxCycles: 60 }, singular: "mean-zero" });
    assert.equal(r.converged, true, r.reason);
    assert.ok(r.asymptoticFactor <= 0.2, `factor ${r.asymptoticFactor}`);
    const w = volumeWeights(p), exact = sampleAt(field, x, y);
    const mean = (v: Float64Array) => v.reduce((s, t, k) => s + t * w[k], 0);
    assertClose(mean(r.solution), 0, { abs: 1e-12 }, "volume-weighted mean");
    const m = mean(exact);
    return maxAbs(r.solution.map((t, k) => t - (exact[k] - m)));
  });
  for (let k = 1; k < errs.length; k++) {
    assertClose(Math.log2(errs[k - 1] / errs[k]), 2, { abs: 0.15 }, `order ${k}`);
  }
});

Deno.test("Stretched and periodic problems refused with the field named: lone periodic side, image mismatch, decreasing coordinates, mixed term", () => {
  const x = tanhBoth(8, 1), y = tanhBoth(8, 1);
  const kinds: Kinds = {
    west: "periodic",
    east: "periodic",
    south: "dirichlet",
    north: "dirichlet",
  };
  const p = build(SMOOTH, x, y, kinds, LAP);
  assert.throws(
    () => solve({ ...p, boundary: { ...p.boundary, east: p.boundary.south } }),
    /problem\.boundary\.west: a periodic side needs its opposite side periodic/,
  );
  assert.throws(
    () => solve(p),
    /problem\.boundary\.south\.values: node \(8, 0\) is the periodic image of node \(0, 0\)/,
  );
  const bad = Float64Array.from(x);
  bad[3] = bad[2];
  assert.throws(
    () => solve({ ...build(SMOOTH, x, y, DIRICHLET, LAP), coordinates: { x: bad, y } }),
    /problem\.coordinates\.x\[3\]: coordinates must increase strictly/,
  );
  const q = build(SMOOTH, x, y, DIRICHLET, LAP);
  assert.throws(
    () => solve({ ...q, m: new Float64Array(81).fill(0.1) }),
    /mixed term m ≠ 0 on a stretched grid/,
  );
});

Deno.test("smootherFor() decides by local spacings on a stretched grid: hs·hn = 0.01·0.02 against hx² = 1/64 is a coupling ratio 0.0128 < 1/10", async () => {
  const { smootherFor } = await import("../../reference-solver/protocol_main.ts");
  const x = Float64Array.from({ length: 9 }, (_, i) => i / 8);
  const y = Float64Array.of(0, 0.01, 0.03, 0.1, 0.3, 0.6, 0.8, 0.95, 1);
  const q = build(SMOOTH, x, x, DIRICHLET, LAP);
  assert.equal(smootherFor(q), "red-black");
  assert.equal(smootherFor({ ...q, coordinates: { x, y } }), "alternating-line");
});
