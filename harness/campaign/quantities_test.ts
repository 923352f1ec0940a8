import { assertClose } from "../../testing/mod.ts";
import type { CompiledCase } from "../../cases/types.ts";
import { discreteQuantities, exactQuantities, gaussLegendre } from "./quantities.ts";

const domain = { x0: 0, x1: 2, y0: -1, y1: 1 };

function vertexField(nx: number, ny: number, u: (x: number, y: number) => number) {
  const hx = 2 / nx, hy = 2 / ny;
  const n = (nx + 1) * (ny + 1);
  const x = new Float64Array(n), y = new Float64Array(n), w = new Float64Array(n);
  const values = new Float64Array(n);
  for (let j = 0; j <= ny; j++) {
    for (let i = 0; i <= nx; i++) {
      const k = j * (nx + 1) + i;
      x[k] = i * hx;
      y[k] = -1 + j * hy;
      w[k] = hx * hy * (i === 0 || i === nx ? 0.5 : 1) * (j === 0 || j === ny ? 0.5 : 1);
      values[k] = u(x[k], y[k]);
    }
  }
  return { layout: "vertex" as const, nx, ny, x, y, weights: w, values };
}

function cellField(nx: number, ny: number, u: (x: number, y: number) => number) {
  const hx = 2 / nx, hy = 2 / ny;
  const n = nx * ny;
  const x = new Float64Array(n), y = new Float64Array(n), w = new Float64Array(n).fill(hx * hy);
  const values = new Float64Array(n);
  for (let j = 0; j < ny; j++) {
    for (let i = 0; i < nx; i++) {
      const k = j * nx + i;
      x[k] = (i + 0.5) * hx;
      y[k] = -1 + (j + 0.5) * hy;
      values[k] = u(x[k], y[k]);
    }
  }
  return { layout: "cell" as const, nx, ny, x, y, weights: w, values };
}

Deno.test("discreteQuantities() is exact where its rules are exact", async (t) => {
  // Derived: trapezoid/midpoint and bilinear interpolation are exact for bilinear functions; the
  // one-sided derivative formulas are exact for quadratics in x.
  const bilinear = (x: number, y: number) => 1 + 2 * x - 3 * y + 0.5 * x * y;
  await t.step("vertex layout", () => {
    const q = discreteQuantities(vertexField(10, 6, bilinear), domain);
    assertClose(q.integral, 4 * 1 + 2 * 2 * 2 * 1, { rel: 1e-13 }); // ∫∫ = 4 + 2·∫x·2 = 12
    assertClose(q.point, bilinear(1, 0), { rel: 1e-13 });
    assertClose(q["east-flux"], 2 * 2 + 0.5 * 0, { abs: 1e-12 }); // ∫ (2 + 0.5y) dy over [−1,1] = 4
  });
  await t.step("cell layout", () => {
    const q = discreteQuantities(cellField(10, 6, bilinear), domain);
    assertClose(q.integral, 12, { rel: 1e-13 });
    assertClose(q.point, bilinear(1, 0), { rel: 1e-13 });
    assertClose(q["east-flux"], 4, { rel: 1e-12 });
  });
  await t.step("a quadratic in x gives the exact flux on both layouts", () => {
    const quad = (x: number) => x * x; // ∂u/∂x at x = 2 is 4, over a side of length 2 → 8
    assertClose(discreteQuantities(vertexField(8, 4, quad), domain)["east-flux"], 8, {
      rel: 1e-12,
    });
    assertClose(discreteQuantities(cellField(8, 4, quad), domain)["east-flux"], 8, { rel: 1e-12 });
  });
});

Deno.test("refinedMaximum() finds the peak of a quadratic exactly, off the nodes", () => {
  // derived: the quadratic fit reproduces a quadratic, so its peak is the exact peak
  const peak = (x: number, y: number) =>
    3 - (x - 0.83) ** 2 - 2 * (y + 0.21) ** 2 + 0.5 * (x - 0.83) * (y + 0.21);
  const q = discreteQuantities(vertexField(10, 10, peak), domain);
  assertClose(q.maximum, 3, { rel: 1e-13 });
});

Deno.test("gaussLegendre() integrates degree-15 polynomials exactly (8-point rule, A&S 25.4)", () => {
  const g = gaussLegendre(-1, 3, 2);
  let s = 0;
  for (let k = 0; k < g.x.length; k++) s += g.w[k] * g.x[k] ** 15;
  assertClose(s, (3 ** 16 - 1) / 16, { rel: 1e-13 });
});

Deno.test("exactQuantities() matches closed forms of a known solution", () => {
  // u = sin(πx/2)·cos(πy/2) on [0,2]×[−1,1]: ∫∫ u = (4/π)·(4/π); max = 1 at (1, 0);
  // east flux: ∂u/∂x = (π/2)cos(π)cos(πy/2) integrated over y → −(π/2)·(4/π) = −2 (derived)
  const u = (x: number, y: number) => Math.sin(Math.PI * x / 2) * Math.cos(Math.PI * y / 2);
  const kase = {
    domain,
    exact: u,
    exactDx: (x: number, y: number) =>
      Math.PI / 2 * Math.cos(Math.PI * x / 2) * Math.cos(Math.PI * y / 2),
  } as unknown as CompiledCase;
  const q = exactQuantities(kase);
  assertClose(q.integral, 16 / Math.PI ** 2, { rel: 1e-13 });
  assertClose(q.maximum, 1, { rel: 1e-12 });
  assertClose(q["east-flux"], -2, { rel: 1e-13 });
  assertClose(q.point, u(1, 0), { rel: 1e-15 });
});
