import assert from "node:assert/strict";
import { mulberry32 } from "../random.ts";
import { solveBanded } from "./banded.ts";
import { addEntry, emptySystem, residualNorm } from "./system.ts";

Deno.test("solveBanded() exchanges rows when a diagonal is zero and still solves exactly", () => {
  // a five-point pattern (offsets ±1, ±w) with random entries and zero diagonal entries every
  // third row, so elimination without exchanges breaks down; checked by the residual identity
  const random = mulberry32(7);
  const w = 6;
  const n = 60;
  const s = emptySystem(n, w);
  for (let i = 0; i < n; i++) {
    addEntry(s, i, i, i % 3 === 0 ? 0 : 1 + random());
    for (const d of [-w, -1, 1, w]) {
      if (i + d >= 0 && i + d < n) addEntry(s, i, i + d, random() - 0.5);
    }
    s.rhs[i] = random() - 0.5;
  }
  const { u, pivoted } = solveBanded(s);
  assert.equal(pivoted, true);
  assert.ok(residualNorm(s, u) < 1e-12, `residual ${residualNorm(s, u)}`);
});

Deno.test("solveBanded() keeps the diagonal on a diagonally dominant system", () => {
  const s = emptySystem(3, 1);
  for (let i = 0; i < 3; i++) {
    addEntry(s, i, i, 4);
    if (i > 0) addEntry(s, i, i - 1, -1);
    if (i < 2) addEntry(s, i, i + 1, -1);
  }
  // exact: u = (1, 2, 3) gives rhs (2, 4, 10)
  s.rhs.set([2, 4, 10]);
  const { u, pivoted } = solveBanded(s);
  assert.equal(pivoted, false);
  assert.deepEqual([...u].map((v) => Math.round(v * 1e12) / 1e12), [1, 2, 3]);
});
