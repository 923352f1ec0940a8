import assert from "node:assert/strict";
import { assertClose } from "../testing/mod.ts";
import { discretize } from "./discretize.ts";
import { discretizeConservative } from "./discretize_conservative.ts";
import type { Conductivity, Problem } from "./problem.ts";

const DOMAIN = { x0: -0.5, x1: 1.0, y0: 0.25, y1: 1.25 };

function conductivity(
  nx: number,
  ny: number,
  k11: (x: number, y: number) => number,
  k12: ((x: number, y: number) => number) | undefined,
  k22: (x: number, y: number) => number,
): Conductivity {
  const hx = (DOMAIN.x1 - DOMAIN.x0) / nx, hy = (DOMAIN.y1 - DOMAIN.y0) / ny;
  const X = (i: number) => DOMAIN.x0 + i * hx, Y = (j: number) => DOMAIN.y0 + j * hy;
  const ax = Float64Array.from(
    { length: nx * (ny + 1) },
    (_, q) => k11(X(q % nx + 0.5), Y(Math.floor(q / nx))),
  );
  const ay = Float64Array.from(
    { length: (nx + 1) * ny },
    (_, q) => k22(X(q % (nx + 1)), Y(Math.floor(q / (nx + 1)) + 0.5)),
  );
  if (k12 === undefined) return { alongX: { k11: ax }, alongY: { k22: ay } };
  const cx = Float64Array.from(
    { length: nx * (ny + 1) },
    (_, q) => k12(X(q % nx + 0.5), Y(Math.floor(q / nx))),
  );
  const cy = Float64Array.from(
    { length: (nx + 1) * ny },
    (_, q) => k12(X(q % (nx + 1)), Y(Math.floor(q / (nx + 1)) + 0.5)),
  );
  return { alongX: { k11: ax, k12: cx }, alongY: { k12: cy, k22: ay } };
}

function problem(nx: number, ny: number, over: Partial<Problem>): Problem {
  const n = (nx + 1) * (ny + 1);
  const dir = (m: number) => ({ kind: "dirichlet" as const, values: new Float64Array(m + 1) });
  return {
    domain: DOMAIN,
    nx,
    ny,
    a: new Float64Array(n),
    b: new Float64Array(n),
    c: new Float64Array(n),
    d: new Float64Array(n),
    e: new Float64Array(n),
    f: new Float64Array(n),
    boundary: { west: dir(ny), east: dir(ny), south: dir(nx), north: dir(nx) },
    ...over,
  };
}

Deno.test("discretizeConservative() with K = k·I is k times the five-point Laplacian of discretize()", () => {
  // Derived: with k11 = k22 = k constant and k12 absent, each flux is k·(difference)/h, so the
  // flux balance is k·(u_W − 2u + u_E)/hx² + k·(u_S − 2u + u_N)/hy² (module doc).
  const nx = 6, ny = 4, n = (nx + 1) * (ny + 1), k = 3.5;
  const e = Float64Array.from({ length: n }, (_, q) => -1 - 0.1 * q);
  const cons = discretizeConservative(problem(nx, ny, {
    e,
    conductivity: conductivity(nx, ny, () => k, undefined, () => k),
  })).op;
  const five = discretize(problem(nx, ny, {
    a: new Float64Array(n).fill(k),
    c: new Float64Array(n).fill(k),
    e,
  })).op;
  assert.equal(cons.NE, undefined, "a diagonal K keeps the level five-point");
  for (let j = 1; j < ny; j++) {
    for (let i = 1; i < nx; i++) {
      const q = cons.index(i, j);
      for (const key of ["W", "E", "S", "N", "C"] as const) {
        assertClose(cons[key][q], five[key][q], { rel: 1e-13 }, `${key} at (${i}, ${j})`);
      }
    }
  }
});

Deno.test("discretizeConservative() gives the nine-point stencil of ∇·(K∇u) for K = [[2, 1], [1, 2]]", () => {
  // Derived from the interior formulas of the module doc with κ = 1/(4hx·hy): E = W = 2/hx²,
  // N = S = 2/hy², NE = SW = 2κ, NW = SE = −2κ, C = −4/hx² − 4/hy² — the 5-point part of
  // 2·u_xx + 2·u_yy plus 2·k12 times the four-corner difference of u_xy.
  const nx = 6, ny = 4, hx = 1.5 / nx, hy = 1 / ny, kap = 1 / (4 * hx * hy);
  const { op } = discretizeConservative(problem(nx, ny, {
    conductivity: conductivity(nx, ny, () => 2, () => 1, () => 2),
  }));
  const k = op.index(3, 2);
  const expected = {
    W: 2 / hx ** 2,
    E: 2 / hx ** 2,
    S: 2 / hy ** 2,
    N: 2 / hy ** 2,
    C: -4 / hx ** 2 - 4 / hy ** 2,
    NE: 2 * kap,
    SW: 2 * kap,
    NW: -2 * kap,
    SE: -2 * kap,
  };
  for (const [key, v] of Object.entries(expected)) {
    assertClose(op[key as keyof typeof expected]![k], v, { rel: 1e-13 }, key);
  }
});

Deno.test("discretizeConservative() is conservative: volume-weighted rows of a closed domain sum to zero", () => {
  // Derived: with zero Neumann data and b = d = e = 0, volume × row is the sum of the fluxes
  // through the volume's faces; every interior face flux appears in exactly two rows with opposite
  // signs (one-sided cross terms on the boundary rows included, since both neighbours use the same
  // face formula), and boundary faces carry φ = 0, so Σ vol·(A·u) = 0 for every u.
  const nx = 8, ny = 6, hx = 1.5 / nx, hy = 1 / ny;
  const zero = (m: number) => ({ kind: "neumann" as const, values: new Float64Array(m + 1) });
  const { op } = discretizeConservative(problem(nx, ny, {
    boundary: { west: zero(ny), east: zero(ny), south: zero(nx), north: zero(nx) },
    conductivity: conductivity(
      nx,
      ny,
      (x, y) => 2 + Math.sin(3 * x + y),
      (x, y) => 0.4 * Math.cos(x - 2 * y),
      (x, y) => 1.5 + x * y,
    ),
  }));
  let s = 0, scale = 0, seed = 7;
  const u = op.vector();
  for (let j = 0; j <= ny; j++) {
    for (let i = 0; i <= nx; i++) {
      seed = (Math.imul(seed, 1664525) + 1013904223) >>> 0;
      u[op.index(i, j)] = seed / 2 ** 32 - 0.5;
    }
  }
  const st = op.stride;
  for (let j = 0; j <= ny; j++) {
    for (let i = 0; i <= nx; i++) {
      const k = op.index(i, j);
      const vol = (i === 0 || i === nx ? hx / 2 : hx) * (j === 0 || j === ny ? hy / 2 : hy);
      const row = op.C[k] * u[k] + op.W[k] * u[k - 1] + op.E[k] * u[k + 1] +
        op.S[k] * u[k - st] + op.N[k] * u[k + st] + op.SW![k] * u[k - st - 1] +
        op.SE![k] * u[k - st + 1] + op.NW![k] * u[k + st - 1] + op.NE![k] * u[k + st + 1];
      s += vol * row;
      scale += Math.abs(vol * row);
    }
  }
  assert.ok(Math.abs(s) <= 1e-14 * scale, `Σ vol·(A·u) = ${s} against Σ |vol·(A·u)| = ${scale}`);
});
