/**
 * The nine-point kernels, the four-colour smoother, line smoothers with corner couplings and the
 * banded LU of a nine-point level, each against a property that follows from its definition.
 */
import assert from "node:assert/strict";
import { assembleMatrix } from "./assemble.ts";
import { buildLevel } from "./hierarchy.ts";
import { createDirectSolver } from "./direct_solver.ts";
import { isNinePoint } from "./level.ts";
import { lineFactors, lineXSweep, lineYSweep, redBlackSweep, residual } from "./_kernels.ts";
import type { Problem } from "./problem.ts";

function mixed(nx: number, ny: number): Problem {
  const n = (nx + 1) * (ny + 1);
  const f = (fn: (i: number, j: number) => number) =>
    Float64Array.from({ length: n }, (_, q) => fn(q % (nx + 1), Math.floor(q / (nx + 1))));
  const side = (kind: "dirichlet" | "neumann", len: number) => ({
    kind,
    values: Float64Array.from({ length: len + 1 }, (_, k) => Math.sin(k)),
  });
  return {
    domain: { x0: 0, x1: 1, y0: 0, y1: 1.5 },
    nx,
    ny,
    a: f((i, j) => 1 + 0.1 * i + 0.05 * j),
    b: f((i) => 0.3 * Math.cos(i)),
    c: f((i, j) => 2 - 0.02 * i * j),
    d: f((_i, j) => -0.2 * j),
    e: f(() => -1),
    f: f((i, j) => Math.cos(i + 2 * j)),
    m: f((i, j) => 0.8 * Math.sin(i - j)),
    boundary: {
      // Neumann sides that never meet, so m may be non-zero at every corner
      west: side("neumann", ny),
      east: side("neumann", ny),
      south: side("dirichlet", nx),
      north: side("dirichlet", nx),
    },
  };
}

function random(length: number, seed: number): Float64Array {
  let s = seed >>> 0;
  return Float64Array.from({ length }, () => {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    return s / 2 ** 32 - 0.5;
  });
}

Deno.test("residual() of a nine-point level equals rhs − A·u of the assembled CSR matrix", () => {
  const p = mixed(10, 7);
  const op = buildLevel(p);
  assert.ok(isNinePoint(op));
  const u = random((p.nx + 1) * (p.ny + 1), 3), f = random(u.length, 5);
  const r = op.vector();
  residual(op, op.pad(u), op.pad(f), r);
  const A = assembleMatrix(p);
  const got = op.unpad(r);
  for (let q = 0; q < A.n; q++) {
    let t = f[q];
    for (let m = A.rowPtr[q]; m < A.rowPtr[q + 1]; m++) t -= A.val[m] * u[A.col[m]];
    assert.ok(Math.abs(got[q] - t) <= 1e-12 * (1 + Math.abs(t)), `row ${q}: ${got[q]} vs ${t}`);
  }
});

Deno.test("the red-black smoother on a nine-point level is Gauss–Seidel in four-colour order", () => {
  // Definition: colours (i mod 2, j mod 2) in the order (0,0), (1,0), (0,1), (1,1), each node
  // updated from the newest values; written here as a plain dense Gauss–Seidel over the CSR rows.
  const p = mixed(8, 6), op = buildLevel(p), A = assembleMatrix(p);
  const u0 = random(A.n, 11), f = random(A.n, 13);
  const u = Float64Array.from(u0);
  for (const [i0, j0] of [[0, 0], [1, 0], [0, 1], [1, 1]]) {
    for (let j = j0; j <= p.ny; j += 2) {
      for (let i = i0; i <= p.nx; i += 2) {
        const q = j * (p.nx + 1) + i;
        let t = f[q], diag = 0;
        for (let m = A.rowPtr[q]; m < A.rowPtr[q + 1]; m++) {
          if (A.col[m] === q) diag = A.val[m];
          else t -= A.val[m] * u[A.col[m]];
        }
        u[q] = t / diag;
      }
    }
  }
  const v = op.pad(u0);
  redBlackSweep(op, v, op.pad(f));
  const got = op.unpad(v);
  for (let q = 0; q < A.n; q++) assert.ok(Math.abs(got[q] - u[q]) <= 1e-12, `node ${q}`);
});

Deno.test("line smoothers on a nine-point level solve each line exactly, corners taken explicitly", () => {
  // Definition: after the sweep of one line, that line's equations hold with the current values of
  // the neighbouring lines, so the residual vanishes on it (up to round-off).
  const p = mixed(8, 6), op = buildLevel(p);
  const count = (p.nx + 1) * (p.ny + 1);
  const u = op.pad(random(count, 17)), f = op.pad(random(count, 19));
  const r = op.vector();
  lineXSweep(op, u, f, lineFactors(op, "x"), 3, 100);
  residual(op, u, f, r);
  for (let i = 0; i <= p.nx; i++) {
    assert.ok(Math.abs(r[op.index(i, 3)]) < 1e-10, `row 3, node ${i}`);
  }
  lineYSweep(op, u, f, lineFactors(op, "y"), 5, 100);
  residual(op, u, f, r);
  for (let j = 0; j <= p.ny; j++) {
    assert.ok(Math.abs(r[op.index(5, j)]) < 1e-10, `column 5, node ${j}`);
  }
});

Deno.test("createDirectSolver() solves a nine-point level exactly in both node orderings", () => {
  // The band of a nine-point level is min(nx, ny) + 2 wide (corners one past the row stride):
  // a banded LU that missed a corner would throw "outside the band" or leave a residual.
  for (const [nx, ny] of [[6, 9], [9, 6]]) {
    const p = mixed(nx, ny), op = buildLevel(p);
    const f = op.pad(random((nx + 1) * (ny + 1), 23)), u = op.vector(), r = op.vector();
    createDirectSolver(op).solve(u, f);
    residual(op, u, f, r);
    let worst = 0;
    for (let k = 0; k < r.length; k++) worst = Math.max(worst, Math.abs(r[k]));
    assert.ok(worst < 1e-10, `${nx}×${ny}: largest residual ${worst}`);
  }
});
