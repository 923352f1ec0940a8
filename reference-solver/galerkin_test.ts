import assert from "node:assert/strict";
import { assertClose } from "../testing/mod.ts";
import { galerkinOperator } from "./galerkin.ts";
import { buildLevel } from "./hierarchy.ts";
import type { LevelOperator } from "./level.ts";
import { type Problem, robinCondition, type Side } from "./problem.ts";

const KINDS = ["dirichlet", "neumann", "robin"] as const;

function conservative(
  nx: number,
  ny: number,
  sides: Record<Side, (typeof KINDS)[number]>,
  e = 0,
): Problem {
  const n = (nx + 1) * (ny + 1), hx = 1 / nx, hy = 1 / ny;
  const side = (kind: (typeof KINDS)[number], len: number) =>
    kind === "robin"
      ? robinCondition(1.5, 0.5, new Float64Array(len + 1))
      : { kind, values: new Float64Array(len + 1) };
  const along = (len: number, fn: (q: number) => number) =>
    Float64Array.from({ length: len }, (_, q) => fn(q));
  return {
    domain: { x0: 0, x1: 1, y0: 0, y1: 1 },
    nx,
    ny,
    a: new Float64Array(n),
    b: new Float64Array(n),
    c: new Float64Array(n),
    d: new Float64Array(n),
    e: new Float64Array(n).fill(e),
    f: new Float64Array(n),
    boundary: {
      west: side(sides.west, ny),
      east: side(sides.east, ny),
      south: side(sides.south, nx),
      north: side(sides.north, nx),
    },
    conductivity: {
      alongX: {
        k11: along(nx * (ny + 1), (q) => 1 + 10 * ((q % nx) * hx > 0.5 ? 1 : 0) + 0.1 * q),
        k12: along(nx * (ny + 1), (q) => 0.3 * Math.sin(q)),
      },
      alongY: {
        k12: along((nx + 1) * ny, (q) => 0.2 * Math.cos(q)),
        k22: along((nx + 1) * ny, (q) => 2 + Math.sin(0.7 * q) + (q * hy > 3 ? 5 : 0)),
      },
    },
  };
}

/** The level's matrix, dense, row-major (nodes x fastest). */
function dense(op: LevelOperator): number[][] {
  const { nx, ny, stride: s } = op;
  const n = (nx + 1) * (ny + 1);
  const A = Array.from({ length: n }, () => new Array<number>(n).fill(0));
  const entries: [keyof LevelOperator, number, number][] = [
    ["C", 0, 0],
    ["W", -1, 0],
    ["E", 1, 0],
    ["S", 0, -1],
    ["N", 0, 1],
    ["SW", -1, -1],
    ["SE", 1, -1],
    ["NW", -1, 1],
    ["NE", 1, 1],
  ];
  for (let j = 0; j <= ny; j++) {
    for (let i = 0; i <= nx; i++) {
      const k = (j + 1) * s + i + 1;
      for (const [key, di, dj] of entries) {
        const arr = op[key] as Float64Array | undefined;
        if (arr === undefined || arr[k] === 0) continue;
        A[j * (nx + 1) + i][(j + dj) * (nx + 1) + i + di] = arr[k];
      }
    }
  }
  return A;
}

Deno.test("galerkinOperator() of the five-point Laplacian is (1/H²)·[[¼, ½, ¼], [½, −3, ½], [¼, ½, ¼]]", () => {
  // Derived by tensor products: with A = A_x ⊗ I + I ⊗ A_y, R = R_x ⊗ R_y, P = P_x ⊗ P_y and
  // R = Pᵀ/4 = (½P_xᵀ) ⊗ (½P_yᵀ) inside, R·A·P = (R_x A_x P_x) ⊗ (R_y P_y) + (R_x P_x) ⊗ (R_y A_y P_y),
  // where R_x A_x P_x = [1, −2, 1]/H² (the 1-D Galerkin operator is the rediscretized one) and
  // R_y P_y = ½·PᵀP = [⅛, ¾, ⅛]. Corner: 2·⅛ = ¼; edge: ¾ − 2·⅛ = ½; centre: −2·¾·2 = −3.
  const n = 16, N = (n + 1) ** 2, H = 2 / n;
  const bc = { kind: "dirichlet" as const, values: new Float64Array(n + 1) };
  const fine = buildLevel({
    domain: { x0: 0, x1: 1, y0: 0, y1: 1 },
    nx: n,
    ny: n,
    a: new Float64Array(N).fill(1),
    b: new Float64Array(N),
    c: new Float64Array(N).fill(1),
    d: new Float64Array(N),
    e: new Float64Array(N),
    f: new Float64Array(N),
    boundary: { west: bc, east: bc, south: bc, north: bc },
  });
  const c = galerkinOperator(fine, { coarsening: { cx: 2, cy: 2 } });
  const want = { C: -3, W: 0.5, E: 0.5, S: 0.5, N: 0.5, SW: 0.25, SE: 0.25, NW: 0.25, NE: 0.25 };
  for (let J = 1; J < n / 2; J++) {
    for (let I = 1; I < n / 2; I++) {
      const k = c.index(I, J);
      for (const [key, v] of Object.entries(want)) {
        const [di, dj] = [
          key.includes("W") ? -1 : key.includes("E") ? 1 : 0,
          key.includes("S") ? -1 : key.includes("N") ? 1 : 0,
        ];
        // couplings to the Dirichlet boundary drop out (the coarse error is zero there)
        const onBoundary = I + di === 0 || I + di === n / 2 || J + dj === 0 || J + dj === n / 2;
        const got = (c[key as keyof typeof want] as Float64Array)[k];
        assertClose(
          got,
          onBoundary ? 0 : v / (H * H),
          { rel: 1e-13, abs: 1e-13 },
          `${key} at (${I}, ${J})`,
        );
      }
    }
  }
  for (const k of c.dirichlet) assert.equal(c.C[k], 1);
});

Deno.test("galerkinOperator() equals R·A·P formed from dense matrices of the textbook definitions", async (t) => {
  // Independent construction: P bilinear as a dense matrix, M and M_c the diagonal control volumes
  // (1, ½, ¼ of hx·hy inside, on a side, at a corner), R = M_c⁻¹·Pᵀ·M, Dirichlet rows and columns
  // of A removed (the error is zero there); the product is compared with the stencil arrays.
  const cases: [string, Problem, 1 | 2, 1 | 2][] = [
    [
      "10×8 → 5×4, Dirichlet west, Neumann east and north, Robin south",
      conservative(10, 8, { west: "dirichlet", east: "neumann", south: "robin", north: "neumann" }),
      2,
      2,
    ],
    [
      "8×6 → 4×6 (x only), Robin west, Dirichlet north, Neumann east and south",
      conservative(8, 6, { west: "robin", east: "neumann", south: "neumann", north: "dirichlet" }),
      2,
      1,
    ],
    [
      "6×8 → 6×4 (y only), all sides Neumann, e = −1",
      conservative(
        6,
        8,
        { west: "neumann", east: "neumann", south: "neumann", north: "neumann" },
        -1,
      ),
      1,
      2,
    ],
  ];
  for (const [label, problem, cx, cy] of cases) {
    await t.step(label, () => {
      const fine = buildLevel(problem);
      const coarse = galerkinOperator(fine, { coarsening: { cx, cy } });
      const { nx, ny } = problem, cnx = nx / cx, cny = ny / cy;
      const nf = (nx + 1) * (ny + 1), nc = (cnx + 1) * (cny + 1);
      const A = dense(fine), Ac = dense(coarse);
      const fineDir = new Set<number>(), coarseDir = new Set<number>();
      for (const k of fine.dirichlet) {
        fineDir.add((Math.floor(k / fine.stride) - 1) * (nx + 1) + (k % fine.stride) - 1);
      }
      for (const k of coarse.dirichlet) {
        coarseDir.add((Math.floor(k / coarse.stride) - 1) * (cnx + 1) + (k % coarse.stride) - 1);
      }
      const phi = (f: number, C: number, c: number) =>
        c === 1 ? (f === C ? 1 : 0) : f === 2 * C ? 1 : Math.abs(f - 2 * C) === 1 ? 0.5 : 0;
      const vol = (i: number, n: number) => (i === 0 || i === n ? 0.5 : 1);
      const P = (qf: number, qc: number) => {
        const i = qf % (nx + 1), j = Math.floor(qf / (nx + 1));
        const I = qc % (cnx + 1), J = Math.floor(qc / (cnx + 1));
        return phi(i, I, cx) * phi(j, J, cy);
      };
      const M = (qf: number) =>
        vol(qf % (nx + 1), nx) * vol(Math.floor(qf / (nx + 1)), ny) / (cx * cy);
      const Mc = (qc: number) => vol(qc % (cnx + 1), cnx) * vol(Math.floor(qc / (cnx + 1)), cny);
      // AP[qf][qc] with Dirichlet rows and columns out
      const AP = Array.from({ length: nf }, () => new Array<number>(nc).fill(0));
      for (let r = 0; r < nf; r++) {
        if (fineDir.has(r)) continue;
        for (let l = 0; l < nf; l++) {
          if (A[r][l] === 0 || fineDir.has(l)) continue;
          for (let qc = 0; qc < nc; qc++) {
            if (!coarseDir.has(qc)) AP[r][qc] += A[r][l] * P(l, qc);
          }
        }
      }
      let scale = 0;
      for (const row of Ac) for (const v of row) scale = Math.max(scale, Math.abs(v));
      for (let qc = 0; qc < nc; qc++) {
        if (coarseDir.has(qc)) {
          assert.equal(Ac[qc][qc], 1, "Dirichlet rows stay identity");
          continue;
        }
        for (let qc2 = 0; qc2 < nc; qc2++) {
          let v = 0;
          for (let r = 0; r < nf; r++) v += P(r, qc) * M(r) * AP[r][qc2];
          v /= Mc(qc);
          assertClose(Ac[qc][qc2], v, { abs: 1e-12 * scale }, `row ${qc}, column ${qc2}`);
        }
      }
    });
  }
});

Deno.test("galerkinOperator() keeps constants in the null space of an all-Neumann problem", () => {
  // Derived: P·1 = 1 (bilinear interpolation reproduces constants) and A·1 = 0, so A_c·1 = R·A·1 = 0.
  const fine = buildLevel(
    conservative(12, 8, { west: "neumann", east: "neumann", south: "neumann", north: "neumann" }),
    { singular: "mean-zero" },
  );
  const c = galerkinOperator(fine, { coarsening: { cx: 2, cy: 2 } });
  assert.ok(c.singular);
  const Ac = dense(c);
  for (const row of Ac) {
    const sum = row.reduce((s, v) => s + v, 0), size = row.reduce((s, v) => s + Math.abs(v), 0);
    assert.ok(Math.abs(sum) <= 1e-13 * size, `row sum ${sum} of ${size}`);
  }
});
