import assert from "node:assert/strict";
import type { CompiledCase } from "../../cases/types.ts";
import { freePoints, gridPoints, type SolveOutcome } from "../solvers/mod.ts";
import { measureOutcome } from "./measure.ts";

const DOMAIN = { x0: 0, x1: 2, y0: 0, y1: 1 };
/** Only what measureOutcome reads of a case: its id, domain and exact solution u = x². */
const KASE = {
  id: "x-squared",
  domain: DOMAIN,
  exact: (x: number) => x * x,
} as unknown as CompiledCase;

/**
 * The 5 × 3 nodes of a 4 × 2 grid on [0, 2] × [0, 1] sent as a solver's own points (not in grid
 * order) with trapezoid weights, values exact except `delta` at the corner (2, 1).
 */
function ownPoints(delta: number): SolveOutcome {
  const xs: number[] = [], ys: number[] = [], ws: number[] = [], vs: number[] = [];
  for (let i = 4; i >= 0; i--) {
    for (let j = 0; j <= 2; j++) {
      const x = i * 0.5, y = j * 0.5;
      xs.push(x);
      ys.push(y);
      ws.push(0.25 * (i === 0 || i === 4 ? 0.5 : 1) * (j === 0 || j === 2 ? 0.5 : 1));
      vs.push(x * x + (i === 4 && j === 2 ? delta : 0));
    }
  }
  const p = freePoints(DOMAIN, new Float64Array(xs), new Float64Array(ys), new Float64Array(ws));
  return {
    status: "ok",
    layout: "points",
    nx: 4,
    ny: 2,
    ...p,
    values: new Float64Array(vs),
    residualHistory: [],
    iterations: null,
    converged: null,
    solverSeconds: null,
    seconds: 0,
  };
}

Deno.test("measureOutcome() counts a points reply's own points and takes h = sqrt(area / N)", () => {
  const r = measureOutcome(KASE, "own", ownPoints(0), 1e-10);
  assert.equal(r.unknowns, 15);
  // docs/protocol.md: the representative spacing is sqrt(area / N), here sqrt(2 / 15)
  assert.equal(r.h, Math.sqrt(2 / 15));
});

Deno.test("measureOutcome() integrates a points reply with the solver's weights", () => {
  const r = measureOutcome(KASE, "own", ownPoints(0), 1e-10);
  // derived: trapezoid rule for ∫₀² x² dx with h = 0.5 is 0.5·(0/2 + 0.25 + 1 + 2.25 + 4/2) =
  // 2.75, times the height 1; equal weights area/N would give 2·mean(x²) = 3
  assert.ok(Math.abs(r.quantities!.integral - 2.75) < 1e-14, `${r.quantities!.integral}`);
  assert.equal(r.quantities!.maximum, 4);
  // the bilinear point value and the east flux need a structured grid
  assert.deepEqual(Object.keys(r.quantities!).sort(), ["integral", "maximum"]);
});

Deno.test("measureOutcome() measures a points reply's errors at its points, weighted", () => {
  const r = measureOutcome(KASE, "own", ownPoints(1e-3), 1e-10);
  assert.ok(Math.abs(r.errors!.all.max - 1e-3) < 1e-15);
  // derived: one error of 1e-3 at a corner of weight 0.0625, over the area 2
  assert.ok(Math.abs(r.errors!.all.l1 - 0.0625e-3 / 2) < 1e-16, `${r.errors!.all.l1}`);
  assert.ok(Math.abs(r.errors!.all.l2 - Math.sqrt(0.0625e-6 / 2)) < 1e-16);
  // the corner is within 2·sqrt(2/15) of the boundary: it counts in the band, not the interior
  assert.ok(Math.abs(r.errors!.boundary.max - 1e-3) < 1e-15);
  assert.equal(r.errors!.interior.max, 0);
});

Deno.test("measureOutcome() records an empty region as zero norms instead of throwing", async (t) => {
  await t.step("own points all in the boundary band (the 15 nodes above: 2h ≈ 0.73)", () => {
    const r = measureOutcome(KASE, "own", ownPoints(1e-3), 1e-10);
    assert.deepEqual(r.errors!.interior, { max: 0, l2: 0, l1: 0 });
    assert.deepEqual(r.errors!.boundary, r.errors!.all);
  });
  await t.step(
    "36 own points near the centre: none within 2h = 2·sqrt(2/36) ≈ 0.47 of a side",
    () => {
      const x = Float64Array.from({ length: 36 }, (_, k) => 0.975 + (k % 6) * 0.01);
      const y = Float64Array.from({ length: 36 }, (_, k) => 0.475 + Math.floor(k / 6) * 0.01);
      const p = freePoints(DOMAIN, x, y);
      const values = x.map((v) => v * v + 0.5);
      const r = measureOutcome(KASE, "own", { ...ownPoints(0), ...p, values }, 1e-10);
      // every error is 0.5, weights area/N: all three norms are 0.5 (derived)
      for (const norm of ["max", "l2", "l1"] as const) {
        assert.ok(Math.abs(r.errors!.all[norm] - 0.5) < 1e-14, norm);
      }
      assert.deepEqual(r.errors!.interior, r.errors!.all);
      assert.deepEqual(r.errors!.boundary, { max: 0, l2: 0, l1: 0 });
    },
  );
  await t.step(
    "a 2 × 2 vertex grid (every node in the band of boundary nodes and one layer in)",
    () => {
      const p = gridPoints("vertex", DOMAIN, 2, 2);
      const values = p.x.map((x) => x * x + 0.01);
      const r = measureOutcome(KASE, "ref", {
        ...ownPoints(0),
        layout: "vertex",
        nx: 2,
        ny: 2,
        ...p,
        values,
      }, 1e-10);
      assert.equal(r.h, Math.sqrt(2 / 4)); // Celik et al. 2008: sqrt(area / cells), published
      assert.ok(Math.abs(r.errors!.all.max - 0.01) < 1e-15);
      assert.deepEqual(r.errors!.interior, { max: 0, l2: 0, l1: 0 });
      assert.deepEqual(r.errors!.boundary, r.errors!.all);
    },
  );
});
