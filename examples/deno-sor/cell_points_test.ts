import assert from "node:assert/strict";
import { cellPoints } from "./cell_points.ts";

const GRID = { x0: -1, x1: 2, y0: 0.5, y1: 1.5, nx: 6, ny: 4 };

function nodeValues(u: (x: number, y: number) => number): Float64Array {
  const { nx, ny } = GRID;
  const hx = (GRID.x1 - GRID.x0) / nx, hy = (GRID.y1 - GRID.y0) / ny;
  const out = new Float64Array((nx + 1) * (ny + 1));
  for (let j = 0; j <= ny; j++) {
    for (let i = 0; i <= nx; i++) out[j * (nx + 1) + i] = u(GRID.x0 + i * hx, GRID.y0 + j * hy);
  }
  return out;
}

Deno.test("cellPoints() puts nx·ny centres x fastest with weights hx·hy summing to the area", () => {
  const p = cellPoints(nodeValues(() => 0), GRID);
  assert.equal(p.x.length, 24);
  // derived: hx = 0.5, hy = 0.25; cell (1, 2) is index 2·6 + 1 at (−1 + 1.5·0.5, 0.5 + 2.5·0.25)
  assert.equal(p.x[13], -0.25);
  assert.equal(p.y[13], 1.125);
  assert.ok(p.weights.every((w) => w === 0.125));
  assert.ok(Math.abs(p.weights.reduce((s, w) => s + w, 0) - 3) < 1e-14);
});

Deno.test("cellPoints() reproduces a bilinear function at the centres exactly", () => {
  // derived: the four-node average is the bilinear interpolant at the centre, exact for 1, x, y, xy
  const u = (x: number, y: number) => 1 + 2 * x - 3 * y + 4 * x * y;
  const p = cellPoints(nodeValues(u), GRID);
  for (let k = 0; k < p.x.length; k++) {
    assert.ok(Math.abs(p.values[k] - u(p.x[k], p.y[k])) < 1e-13, `centre ${k}`);
  }
});

Deno.test("cellPoints() is off by (hx²·u_xx + hy²·u_yy)/8 for a quadratic", () => {
  // derived: ((x − h/2)² + (x + h/2)²)/2 = x² + h²/4, i.e. h²·u_xx/8 with u_xx = 2
  const u = (x: number, y: number) => x * x - 2 * y * y;
  const p = cellPoints(nodeValues(u), GRID);
  const shift = (0.5 ** 2 * 2 + 0.25 ** 2 * -4) / 8;
  for (let k = 0; k < p.x.length; k++) {
    assert.ok(Math.abs(p.values[k] - u(p.x[k], p.y[k]) - shift) < 1e-13, `centre ${k}`);
  }
});

Deno.test("cellPoints() weighted sum equals the trapezoid rule on the node values", () => {
  // derived: each interior node lies in four cells, a side node in two, a corner in one
  const nodes = nodeValues((x, y) => Math.sin(3 * x) * Math.exp(y));
  const p = cellPoints(nodes, GRID);
  const { nx, ny } = GRID;
  const hx = 0.5, hy = 0.25;
  let trapezoid = 0;
  for (let j = 0; j <= ny; j++) {
    for (let i = 0; i <= nx; i++) {
      const w = (i === 0 || i === nx ? 0.5 : 1) * (j === 0 || j === ny ? 0.5 : 1) * hx * hy;
      trapezoid += w * nodes[j * (nx + 1) + i];
    }
  }
  const midpoint = p.values.reduce((s, v, k) => s + p.weights[k] * v, 0);
  assert.ok(Math.abs(midpoint - trapezoid) < 1e-14, `${midpoint} vs ${trapezoid}`);
});

Deno.test("cellPoints() refuses node values of the wrong length, naming both counts", () => {
  assert.throws(
    () => cellPoints(new Float64Array(34), GRID),
    (e) => e instanceof RangeError && /34 node values.*expected 35/.test(e.message),
  );
});
