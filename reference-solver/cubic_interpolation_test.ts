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
