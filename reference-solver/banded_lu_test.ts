import assert from "node:assert/strict";
import { assertClose } from "../testing/mod.ts";
import { bandedLU } from "./banded_lu.ts";

function dense(n: number, kl: number, ku: number, seed: number, weakDiagonal: boolean) {
  const A: number[][] = Array.from({ length: n }, () => new Array(n).fill(0));
  let s = seed;
  const rnd = () => ((s = (s * 16807) % 2147483647) / 2147483647) - 0.5;
  for (let i = 0; i < n; i++) {
    for (let j = Math.max(0, i - kl); j <= Math.min(n - 1, i + ku); j++) A[i][j] = rnd();
    if (weakDiagonal) A[i][i] *= 1e-3; // forces row interchanges
  }
  return A;
}

Deno.test("bandedLU() solves a banded system with a known solution to round-off", async (t) => {
  // Derived: b = A·x for a chosen x, so the exact solution is known.
  for (
    const [n, kl, ku, weak] of [[7, 2, 3, false], [40, 6, 6, true], [25, 1, 4, true], [
      1,
      0,
      0,
      false,
    ]] as const
  ) {
    await t.step(`n = ${n}, kl = ${kl}, ku = ${ku}${weak ? ", pivoting needed" : ""}`, () => {
      const A = dense(n, kl, ku, 11 + n, weak);
      const x = Array.from({ length: n }, (_, i) => Math.cos(i + 1) * (i + 2));
      const b = Float64Array.from(A.map((row) => row.reduce((s, v, j) => s + v * x[j], 0)));
      const lu = bandedLU(n, kl, ku, (set) => {
        for (let i = 0; i < n; i++) {
          for (let j = 0; j < n; j++) if (A[i][j] !== 0) set(i, j, A[i][j]);
        }
      });
      lu.solve(b);
      for (let i = 0; i < n; i++) assertClose(b[i], x[i], { abs: 1e-10, rel: 1e-10 });
    });
  }
});

Deno.test("bandedLU() refuses a singular matrix and entries outside the band", () => {
  assert.throws(
    () => bandedLU(2, 1, 1, (set) => (set(0, 0, 1), set(0, 1, 2), set(1, 0, 2), set(1, 1, 4))),
    (e: unknown) => e instanceof RangeError && /singular at row 1/.test(e.message),
  );
  assert.throws(
    () => bandedLU(3, 0, 0, (set) => set(0, 2, 1)),
    (e: unknown) => e instanceof RangeError && /outside the band/.test(e.message),
  );
});
