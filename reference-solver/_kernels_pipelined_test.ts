import assert from "node:assert/strict";
import { ALL_DIRICHLET, LAPLACE, manufactured, SMOOTH, VARIABLE } from "./_test_problems.ts";
import { discretize } from "./discretize.ts";
import { interpolateAddBoth, redBlackSweep, restrictRedResidual } from "./_kernels.ts";
import { correctAndSweep, redBlackSweeps, sweepAndRestrict } from "./_kernels_pipelined.ts";
import type { Side } from "./problem.ts";
import type { SideSpec } from "./_test_problems.ts";

// Reference: the unfused kernels themselves (consecutive `redBlackSweep` calls, and
// `interpolateAddBoth` before them). The identity is exact (module doc of _kernels_pipelined.ts:
// every value is formed from the same inputs by the same expression), so the test asks for bitwise
// equality; a kernel that skipped or reordered a dependency would differ in the last bits at least.

const MIXED: Record<Side, SideSpec> = {
  west: "neumann",
  east: { alpha: 1.5, beta: 0.5 },
  south: "dirichlet",
  north: "neumann",
};

const CASES = [
  {
    name: "16×12 Laplacian, Dirichlet (symmetric loops)",
    coef: LAPLACE,
    upwind: false,
    sides: ALL_DIRICHLET,
    nx: 16,
    ny: 12,
  },
  {
    name: "20×16 variable, mixed sides, upwind (general loops)",
    coef: VARIABLE,
    upwind: true,
    sides: MIXED,
    nx: 20,
    ny: 16,
  },
  {
    name: "8×4 variable, Dirichlet",
    coef: VARIABLE,
    upwind: false,
    sides: ALL_DIRICHLET,
    nx: 8,
    ny: 4,
  },
];

/** A deterministic rough vector with a zero halo (every mode present). */
function rough(op: { length: number; stride: number; nx: number; ny: number }, seed: number) {
  const u = new Float64Array(op.length);
  let s = seed;
  for (let k = 0; k < op.length; k++) {
    s = (s * 1103515245 + 12345) % 2147483648;
    const i = (k % op.stride) - 1, j = Math.floor(k / op.stride) - 1;
    u[k] = i < 0 || i > op.nx || j < 0 || j > op.ny ? 0 : s / 2147483648 - 0.5;
  }
  return u;
}

function firstDifference(a: Float64Array, b: Float64Array): number {
  for (let k = 0; k < a.length; k++) if (!Object.is(a[k], b[k])) return k;
  return -1;
}

Deno.test("redBlackSweeps() equals consecutive red–black sweeps bit for bit", async (t) => {
  for (const c of CASES) {
    for (const count of [1, 2, 3]) {
      await t.step(`${c.name}, ${count} sweep(s)`, () => {
        const { op, rhs } = discretize(manufactured(c.coef, SMOOTH, c, c.sides), c.upwind);
        const plain = rough(op, 777), piped = plain.slice();
        for (let s = 0; s < count; s++) redBlackSweep(op, plain, rhs);
        redBlackSweeps(op, piped, rhs, count);
        assert.equal(firstDifference(plain, piped), -1);
        // The sweeps changed the iterate (the comparison is not of two untouched copies).
        assert.notEqual(firstDifference(plain, rough(op, 777)), -1);
      });
    }
  }
});

Deno.test("correctAndSweep() equals bilinear correction then red–black sweeps bit for bit", async (t) => {
  for (const c of CASES) {
    for (const sweeps of [1, 2]) {
      await t.step(`${c.name}, ${sweeps} post-sweep(s)`, () => {
        const { op, rhs } = discretize(manufactured(c.coef, SMOOTH, c, c.sides), c.upwind);
        const cnx = c.nx / 2, cny = c.ny / 2;
        const coarse = rough(
          { length: (cnx + 3) * (cny + 3), stride: cnx + 3, nx: cnx, ny: cny },
          4242,
        );
        const plain = rough(op, 99), fused = plain.slice();
        interpolateAddBoth(coarse, plain, cnx, cny, cnx + 3, op.stride);
        for (let s = 0; s < sweeps; s++) redBlackSweep(op, plain, rhs);
        correctAndSweep(op, coarse, fused, rhs, sweeps);
        assert.equal(firstDifference(plain, fused), -1);
        // Without the correction the result differs: the test sees a missing correction.
        const bare = rough(op, 99);
        for (let s = 0; s < sweeps; s++) redBlackSweep(op, bare, rhs);
        assert.notEqual(firstDifference(plain, bare), -1);
      });
    }
  }
});

Deno.test("sweepAndRestrict() equals red–black sweeps then the red-residual restriction bit for bit", async (t) => {
  for (const c of CASES) {
    for (const sweeps of [1, 2, 3]) {
      await t.step(`${c.name}, ${sweeps} pre-sweep(s)`, () => {
        const { op, rhs } = discretize(manufactured(c.coef, SMOOTH, c, c.sides), c.upwind);
        const cnx = c.nx / 2, cny = c.ny / 2, cs = cnx + 3, len = cs * (cny + 3);
        const plain = rough(op, 31), fused = plain.slice();
        const outPlain = new Float64Array(len), outFused = new Float64Array(len).fill(NaN);
        const rows = () => [new Float64Array(cnx + 2), new Float64Array(cnx + 2)] as const;
        for (let s = 0; s < sweeps; s++) redBlackSweep(op, plain, rhs);
        restrictRedResidual(op, plain, rhs, outPlain, cs, ...rows());
        sweepAndRestrict(op, fused, rhs, sweeps, outFused, cs, ...rows());
        assert.equal(firstDifference(plain, fused), -1);
        // Every coarse node is written (NaN left anywhere would differ), halo aside.
        for (let J = 0; J <= cny; J++) {
          for (let I = 0; I <= cnx; I++) {
            const k = (J + 1) * cs + I + 1;
            assert.ok(Object.is(outPlain[k], outFused[k]), `coarse (${I}, ${J})`);
          }
        }
        assert.ok(outPlain.some((v) => Math.abs(v) > 1e-6), "the restricted residual is not zero");
      });
    }
  }
});
