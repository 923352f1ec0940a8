/**
 * One weighted-Jacobi sweep on a discrete sine mode (derived, docs/check-values.md, "Exact facts of
 * central differences"): the modes sin(kπx)·sin(lπy) are eigenvectors of the 5-point Dirichlet
 * Laplacian, with eigenvalue
 * −(4/hx²)·sin²(kπhx/2) − (4/hy²)·sin²(lπhy/2), and weighted Jacobi for A·u = 0 maps u to
 * (I − ω·D⁻¹A)·u with D = −2/hx² − 2/hy², so one sweep multiplies the mode by exactly
 *   g = 1 − 2ω·(sin²(kπhx/2)/hx² + sin²(lπhy/2)/hy²)/(1/hx² + 1/hy²),
 * which for hx = hy = h is 1 − ω·(sin²(kπh/2) + sin²(lπh/2)).
 */
import { buildLevel, createSmoother } from "../../reference-solver/mod.ts";
import { assertClose } from "../../testing/mod.ts";

function checkMode(nx: number, ny: number, k: number, l: number, omega: number): void {
  const count = (nx + 1) * (ny + 1);
  const bc = (n: number) => ({ kind: "dirichlet" as const, values: new Float64Array(n + 1) });
  const problem = {
    domain: { x0: 0, x1: 1, y0: 0, y1: 1 },
    nx,
    ny,
    a: new Float64Array(count).fill(1),
    b: new Float64Array(count),
    c: new Float64Array(count).fill(1),
    d: new Float64Array(count),
    e: new Float64Array(count),
    f: new Float64Array(count),
    boundary: { west: bc(ny), east: bc(ny), south: bc(nx), north: bc(nx) },
  };
  const hx = 1 / nx, hy = 1 / ny;
  const mode = new Float64Array(count);
  // interior only: the boundary values are exactly zero (sin(kπ) in floating point is not)
  for (let j = 1; j < ny; j++) {
    for (let i = 1; i < nx; i++) {
      mode[j * (nx + 1) + i] = Math.sin(k * Math.PI * i * hx) * Math.sin(l * Math.PI * j * hy);
    }
  }
  const level = buildLevel(problem);
  const u = level.pad(mode);
  createSmoother("jacobi", level, { omega }).smooth(u, level.vector(), 1);
  const after = level.unpad(u);
  const sx = Math.sin(k * Math.PI * hx / 2) ** 2 / (hx * hx);
  const sy = Math.sin(l * Math.PI * hy / 2) ** 2 / (hy * hy);
  const g = 1 - 2 * omega * (sx + sy) / (1 / (hx * hx) + 1 / (hy * hy));
  if (nx === ny) {
    // the form quoted in docs/check-values.md ("Exact facts of central differences") for
    // hx = hy = h
    const h = hx;
    const quoted = 1 -
      omega * (Math.sin(k * Math.PI * h / 2) ** 2 + Math.sin(l * Math.PI * h / 2) ** 2);
    assertClose(g, quoted, { rel: 1e-14 }, "general formula against the quoted one");
  }
  for (let q = 0; q < count; q++) {
    // round-off only: a few ulps of the O(1) mode values
    assertClose(
      after[q],
      g * mode[q],
      { abs: 1e-14 },
      `node ${q}, mode (${k}, ${l}), ω = ${omega}`,
    );
  }
}

Deno.test("one weighted-Jacobi sweep multiplies a discrete sine mode by exactly 1 − ω(sin²(kπh/2) + sin²(lπh/2))", async (t) => {
  for (const omega of [0.8, 2 / 3, 1]) {
    for (const [k, l] of [[1, 1], [3, 5], [8, 2], [15, 15], [12, 7]]) {
      await t.step(
        `mode (${k}, ${l}) with ω = ${omega.toFixed(4)} on a 16 × 16 grid`,
        () => checkMode(16, 16, k, l, omega),
      );
    }
  }
  await t.step(
    "mode (5, 3) with ω = 0.8 on a 16 × 8 grid (hx ≠ hy, the weighted form of the formula)",
    () => checkMode(16, 8, 5, 3, 0.8),
  );
});
