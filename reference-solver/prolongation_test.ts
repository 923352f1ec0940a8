import assert from "node:assert/strict";
import { assertClose } from "../testing/mod.ts";
import { buildLevel } from "./hierarchy.ts";
import { galerkinOperator } from "./galerkin.ts";
import { operatorProlongation } from "./prolongation.ts";
import { createProlongationTransfer } from "./prolongation_transfer.ts";
import type { Problem } from "./problem.ts";

/** ∇·(k∇u) on the unit square, k = 1 left of x = 3h and 100 right of it (an odd fine line). */
function jump(n: number, sides: "dirichlet" | "neumann"): Problem {
  const N = (n + 1) * (n + 1), zero = new Float64Array(N);
  const side = { kind: sides, values: new Float64Array(n + 1) };
  const k11 = Float64Array.from({ length: n * (n + 1) }, (_, q) => ((q % n) < 3 ? 1 : 100));
  const k22 = Float64Array.from({ length: (n + 1) * n }, (_, q) => {
    const i = q % (n + 1);
    return i < 3 ? 1 : i > 3 ? 100 : 50.5; // a y-edge on the interface: arithmetic mean
  });
  return {
    domain: { x0: 0, x1: 1, y0: 0, y1: 1 },
    nx: n,
    ny: n,
    a: zero,
    b: zero,
    c: zero,
    d: zero,
    e: sides === "neumann" ? new Float64Array(N).fill(-1) : zero,
    f: zero,
    boundary: { west: side, east: side, south: side, north: side },
    conductivity: { alongX: { k11 }, alongY: { k22 } },
  };
}

Deno.test("operatorProlongation() weights the two parents across a jump by k1/(k1 + k2) and k2/(k1 + k2)", () => {
  // Derived (module doc): between two coarse nodes along x the stencil is collapsed in y, leaving
  // k1·(u − u_W) = k2·(u_E − u), so u = (k1·u_W + k2·u_E)/(k1 + k2) — continuous flux.
  const level = buildLevel(jump(8, "dirichlet"));
  const P = operatorProlongation(level, { cx: 2, cy: 2 });
  const k = level.index(3, 4);
  assertClose(P.w00[k], 1 / 101, { rel: 1e-13 });
  assertClose(P.w10[k], 100 / 101, { rel: 1e-13 });
  assert.equal(P.w00[level.index(4, 4)], 1, "a node on a coarse node takes its value");
});

Deno.test("operator-dependent Galerkin and its transfer equal P, R = M_c⁻¹·Pᵀ·M and R·A·P formed densely", () => {
  // Independent construction from the weights: P as a dense matrix, R = M_c⁻¹·Pᵀ·M with the
  // control volumes (1, ½, ¼), Dirichlet rows and columns out; compared with the transfer's
  // restrict / interpolate and with the stencil arrays of the Galerkin operator.
  for (const sides of ["dirichlet", "neumann"] as const) {
    const n = 8, nc = 4, fine = buildLevel(jump(n, sides));
    const P = operatorProlongation(fine, { cx: 2, cy: 2 });
    const coarse = galerkinOperator(fine, { coarsening: { cx: 2, cy: 2 }, prolongation: P });
    const t = createProlongationTransfer(P, fine, coarse);
    const weight = (i: number, j: number, I: number, J: number) => {
      const k = fine.index(i, j), a = I - (i >> 1), b = J - (j >> 1);
      if (a < 0 || a > 1 || b < 0 || b > 1) return 0;
      return [P.w00, P.w10, P.w01, P.w11][a + 2 * b][k];
    };
    const frac = (i: number, m: number) => (i === 0 || i === m ? 0.5 : 1);
    const cDir = new Set(Array.from(coarse.dirichlet));
    const fDir = new Set(Array.from(fine.dirichlet));
    // interpolate a coarse vector with a 1 at (2, 1): the fine values are P's column
    const c = coarse.vector();
    c[coarse.index(2, 1)] = 1;
    const f = fine.vector();
    t.interpolate(c, f);
    for (let j = 0; j <= n; j++) {
      for (let i = 0; i <= n; i++) {
        assertClose(f[fine.index(i, j)], weight(i, j, 2, 1), { abs: 1e-15 });
      }
    }
    // restrict a fine unit vector at (3, 3): coarse values are R's column
    for (const [fi, fj] of [[3, 3], [0, 1], [4, 0]]) {
      const r = fine.vector();
      r[fine.index(fi, fj)] = 1;
      const out = coarse.vector();
      t.restrict(r, out);
      for (let J = 0; J <= nc; J++) {
        for (let I = 0; I <= nc; I++) {
          const kc = coarse.index(I, J);
          const want = cDir.has(kc)
            ? 0
            : weight(fi, fj, I, J) * frac(fi, n) * frac(fj, n) / (4 * frac(I, nc) * frac(J, nc));
          assertClose(out[kc], want, { abs: 1e-15 }, `R at (${I}, ${J}) from (${fi}, ${fj})`);
        }
      }
    }
    // R·A·P entry by entry
    // the fine level is five-point (k12 absent)
    const row = (i: number, j: number): [number, number, number][] => {
      const k = fine.index(i, j);
      return ([
        [i, j, fine.C[k]],
        [i - 1, j, fine.W[k]],
        [i + 1, j, fine.E[k]],
        [i, j - 1, fine.S[k]],
        [i, j + 1, fine.N[k]],
      ] as [number, number, number][]).filter(([, , v]) => v !== 0);
    };
    for (let J = 0; J <= nc; J++) {
      for (let I = 0; I <= nc; I++) {
        const kc = coarse.index(I, J);
        if (cDir.has(kc)) continue;
        for (let dJ = -1; dJ <= 1; dJ++) {
          for (let dI = -1; dI <= 1; dI++) {
            const X = I + dI, Y = J + dJ;
            if (X < 0 || X > nc || Y < 0 || Y > nc || cDir.has(coarse.index(X, Y))) continue;
            let v = 0;
            for (let j = 0; j <= n; j++) {
              for (let i = 0; i <= n; i++) {
                const rw = weight(i, j, I, J) * frac(i, n) * frac(j, n) /
                  (4 * frac(I, nc) * frac(J, nc));
                if (rw === 0 || fDir.has(fine.index(i, j))) continue;
                for (const [ii, jj, a] of row(i, j)) {
                  if (!fDir.has(fine.index(ii, jj))) v += rw * a * weight(ii, jj, X, Y);
                }
              }
            }
            const key =
              (["SW", "S", "SE", "W", "C", "E", "NW", "N", "NE"] as const)[(dJ + 1) * 3 + dI + 1];
            const got = (coarse[key] as Float64Array | undefined)?.[kc] ?? 0;
            assertClose(
              got,
              v,
              { abs: 1e-9 * Math.abs(coarse.C[kc]) },
              `${sides}: ${key} at (${I}, ${J})`,
            );
          }
        }
      }
    }
  }
});
