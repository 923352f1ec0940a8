import assert from "node:assert/strict";
import { createSmoother, SMOOTHERS } from "./smoothers.ts";
import { buildLevel } from "./hierarchy.ts";
import { ALL_DIRICHLET, LAPLACE, manufactured, SMOOTH, VARIABLE } from "./_test_problems.ts";
import { residual } from "./_kernels.ts";

const zeroSolution = {
  u: () => 0,
  ux: () => 0,
  uy: () => 0,
  uxx: () => 0,
  uyy: () => 0,
};

Deno.test("jacobi smoother multiplies a discrete sine mode by exactly 1 − ω(sin²(kπh/2) + sin²(lπh/2))", async (t) => {
  // Derived (docs/check-values.md, "Exact facts of central differences"): sin(kπx)·sin(lπy) is an
  // eigenvector of the 5-point Laplacian with Dirichlet sides, so one weighted Jacobi sweep on
  // A·e = 0 scales it by that factor.
  const n = 16, h = 1 / n;
  const level = buildLevel(manufactured(LAPLACE, zeroSolution, { nx: n, ny: n }, ALL_DIRICHLET));
  for (const [k, l, omega] of [[1, 1, 0.8], [3, 5, 0.8], [8, 8, 0.8], [15, 2, 0.5], [7, 12, 1]]) {
    await t.step(`mode (${k}, ${l}) with ω = ${omega}`, () => {
      const mode = new Float64Array((n + 1) ** 2);
      for (let j = 0; j <= n; j++) {
        for (let i = 0; i <= n; i++) {
          mode[j * (n + 1) + i] = Math.sin(k * Math.PI * i * h) * Math.sin(l * Math.PI * j * h);
        }
      }
      const g = 1 -
        omega * (Math.sin(k * Math.PI * h / 2) ** 2 + Math.sin(l * Math.PI * h / 2) ** 2);
      const u = level.pad(mode);
      createSmoother("jacobi", level, { omega }).smooth(u, level.vector(), 1);
      const out = level.unpad(u);
      for (let q = 0; q < out.length; q++) {
        assert.ok(
          Math.abs(out[q] - g * mode[q]) <= 1e-13,
          `node ${q}: ${out[q]} vs ${g * mode[q]}`,
        );
      }
    });
  }
});

Deno.test("every smoother reduces the error of a random start and keeps a solution fixed", async (t) => {
  const n = 12;
  const level = buildLevel(manufactured(LAPLACE, zeroSolution, { nx: n, ny: n }, ALL_DIRICHLET));
  for (const name of Object.keys(SMOOTHERS) as (keyof typeof SMOOTHERS)[]) {
    await t.step(name, () => {
      const s = createSmoother(name, level);
      // A fixed point: the zero solution of A·u = 0 stays zero.
      const z = level.vector();
      s.smooth(z, level.vector(), 3);
      assert.ok(z.every((v) => v === 0));
      // Energy of a rough start falls.
      const u = level.vector();
      let seed = 7;
      for (let j = 1; j < n; j++) {
        for (let i = 1; i < n; i++) {
          seed = (seed * 16807) % 2147483647;
          u[level.index(i, j)] = seed / 2147483647 - 0.5;
        }
      }
      const r = level.vector(), f = level.vector();
      residual(level, u, f, r);
      const before = Math.hypot(...r);
      s.smooth(u, f, 2);
      residual(level, u, f, r);
      assert.ok(Math.hypot(...r) < 0.5 * before, `${name}: ${Math.hypot(...r)} vs ${before}`);
      assert.equal(s.describe().name, name);
    });
  }
});

Deno.test("createSmoother() refuses an unknown name and lists the valid ones", () => {
  const level = buildLevel(manufactured(LAPLACE, zeroSolution, { nx: 4, ny: 4 }, ALL_DIRICHLET));
  assert.throws(
    () => createSmoother("sor" as never, level),
    (e: unknown) =>
      e instanceof RangeError && /Unknown smoother "sor"/.test(e.message) &&
      /jacobi, gauss-seidel, red-black, line-x, line-y, alternating-line/.test(e.message),
  );
});

Deno.test("the fused red-black sweep equals a full red pass followed by a full black pass, bit for bit", async (t) => {
  // Derived: each colour's update reads only the other colour, so the fused order changes nothing.
  const cases = [
    [
      "symmetric arrays (Dirichlet, b = d = 0)",
      { ...VARIABLE, b: () => 0, d: () => 0 },
      ALL_DIRICHLET,
    ],
    ["general arrays (mixed sides, convection)", VARIABLE, {
      west: "neumann",
      east: "dirichlet",
      south: { alpha: 1, beta: 2 },
      north: "neumann",
    }],
  ] as const;
  for (const [name, coef, sides] of cases) {
    await t.step(name, () => {
      for (const [nx, ny] of [[9, 6], [10, 7], [4, 4]]) {
        const level = buildLevel(manufactured(coef, SMOOTH, { nx, ny }, sides as never));
        assert.equal(level.W === level.E && level.S === level.N, name.startsWith("symmetric"));
        const f = level.vector(), u = level.vector();
        for (let j = 0; j <= ny; j++) {
          for (let i = 0; i <= nx; i++) {
            f[level.index(i, j)] = Math.sin(i + 2 * j);
            u[level.index(i, j)] = Math.cos(3 * i - j);
          }
        }
        const ref = u.slice();
        for (const colour of [0, 1]) {
          for (let j = 0; j <= ny; j++) {
            for (let i = 0; i <= nx; i++) {
              if ((i + j) % 2 !== colour) continue;
              const k = level.index(i, j), s = level.stride;
              // Same arithmetic as the kernel: the symmetric form factors W and S out.
              ref[k] = level.W === level.E
                ? level.invC[k] *
                  (f[k] - level.W[k] * (ref[k - 1] + ref[k + 1]) -
                    level.S[k] * (ref[k - s] + ref[k + s]))
                : level.invC[k] *
                  (f[k] - level.W[k] * ref[k - 1] - level.E[k] * ref[k + 1] -
                    level.S[k] * ref[k - s] - level.N[k] * ref[k + s]);
            }
          }
        }
        createSmoother("red-black", level).smooth(u, f, 1);
        assert.deepEqual(u, ref);
      }
    });
  }
});
