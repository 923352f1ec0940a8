import assert from "node:assert/strict";
import { interpolateCubic } from "./cubic_interpolation.ts";
import { levelLayout } from "./level.ts";

/** A bicubic with every monomial x^p·y^q, p, q ≤ 3, present. */
const bicubic = (x: number, y: number) =>
  (1 + x - 2 * x * x + 0.7 * x * x * x) * (0.5 - y + 0.3 * y * y - 1.1 * y * y * y) + x * y;

const GRIDS: { cnx: number; cny: number; cx: 1 | 2; cy: 1 | 2 }[] = [
  { cnx: 8, cny: 6, cx: 2, cy: 2 },
  { cnx: 3, cny: 5, cx: 2, cy: 2 },
  { cnx: 4, cny: 7, cx: 2, cy: 1 },
  { cnx: 6, cny: 3, cx: 1, cy: 2 },
];

Deno.test("cubic FMG interpolation reproduces every bicubic exactly (four-point Lagrange, interior and one-sided)", async (t) => {
  // Exact identity: Lagrange interpolation through four nodes reproduces polynomials of degree 3,
  // and the tensor product of two such reproduces x^p·y^q, p, q ≤ 3.
  for (const g of GRIDS) {
    await t.step(`${g.cnx}×${g.cny}, coarsening (${g.cx}, ${g.cy})`, () => {
      const C = levelLayout(g.cnx, g.cny), F = levelLayout(g.cx * g.cnx, g.cy * g.cny);
      const c = C.vector(), f = F.vector();
      for (let J = 0; J <= g.cny; J++) {
        for (let I = 0; I <= g.cnx; I++) c[C.index(I, J)] = bicubic(I / g.cnx, J / g.cny);
      }
      interpolateCubic(c, f, g);
      let err = 0;
      for (let j = 0; j <= F.ny; j++) {
        for (let i = 0; i <= F.nx; i++) {
          err = Math.max(err, Math.abs(f[F.index(i, j)] - bicubic(i / F.nx, j / F.ny)));
        }
      }
      assert.ok(err < 1e-14, `max error ${err}`);
    });
  }
});

Deno.test("cubic FMG interpolation falls back to the linear mean on fewer than three coarse intervals", () => {
  // Exact identity: the mean of two nodes reproduces linear functions (and not a quadratic).
  const g = { cnx: 2, cny: 2, cx: 2 as const, cy: 2 as const };
  const C = levelLayout(2, 2), F = levelLayout(4, 4);
  const c = C.vector(), f = F.vector();
  for (let J = 0; J <= 2; J++) for (let I = 0; I <= 2; I++) c[C.index(I, J)] = 3 * I - J;
  interpolateCubic(c, f, g);
  for (let j = 0; j <= 4; j++) {
    for (let i = 0; i <= 4; i++) {
      assert.ok(Math.abs(f[F.index(i, j)] - (1.5 * i - 0.5 * j)) < 1e-14);
    }
  }
});

/** The module doc's formulas node by node (the implementation before it ran row by row). */
function byNode(
  coarse: Float64Array,
  fine: Float64Array,
  g: { cnx: number; cny: number; cx: 1 | 2; cy: 1 | 2 },
): void {
  const mid = (v: Float64Array, base: number, step: number, m: number, count: number) => {
    const p = base + m * step;
    if (count < 3) return 0.5 * (v[p] + v[p + step]);
    if (m === 0) {
      return 0.0625 * (5 * v[p] + 15 * v[p + step] - 5 * v[p + 2 * step] + v[p + 3 * step]);
    }
    if (m === count - 1) {
      return 0.0625 * (5 * v[p + step] + 15 * v[p] - 5 * v[p - step] + v[p - 2 * step]);
    }
    return 0.0625 * (9 * (v[p] + v[p + step]) - v[p - step] - v[p + 2 * step]);
  };
  const cs = g.cnx + 3, fs = g.cx * g.cnx + 3;
  for (let J = 0; J <= g.cny; J++) {
    const cb = (J + 1) * cs + 1, fb = (g.cy * J + 1) * fs + 1;
    for (let I = 0; I <= g.cnx; I++) fine[fb + g.cx * I] = coarse[cb + I];
    if (g.cx === 2) {
      for (let I = 0; I < g.cnx; I++) fine[fb + 2 * I + 1] = mid(coarse, cb, 1, I, g.cnx);
    }
  }
  if (g.cy === 1) return;
  for (let J = 0; J < g.cny; J++) {
    for (let i = 0; i <= g.cx * g.cnx; i++) {
      fine[(2 * J + 2) * fs + 1 + i] = mid(fine, fs + 1 + i, 2 * fs, J, g.cny);
    }
  }
}

Deno.test("cubic FMG interpolation row by row equals the node-by-node formulas bit for bit", () => {
  // Reference: the module doc's formulas applied node by node (same expressions, so exact).
  for (const g of [...GRIDS, { cnx: 2, cny: 2, cx: 2 as const, cy: 2 as const }]) {
    const C = levelLayout(g.cnx, g.cny), F = levelLayout(g.cx * g.cnx, g.cy * g.cny);
    const c = C.vector();
    for (let J = 0; J <= g.cny; J++) {
      for (let I = 0; I <= g.cnx; I++) c[C.index(I, J)] = Math.sin(3 * I + 7 * J * J + 1);
    }
    const fast = F.vector(), slow = F.vector();
    interpolateCubic(c, fast, g);
    byNode(c, slow, g);
    for (let k = 0; k < fast.length; k++) assert.ok(Object.is(fast[k], slow[k]), `index ${k}`);
  }
});
