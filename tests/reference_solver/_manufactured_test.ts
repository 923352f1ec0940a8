/**
 * Checks the hand-derived derivatives of the manufactured solutions and the outward-normal boundary
 * data against central finite differences of the value at random points (common practice: an
 * independent check of derived source terms, docs/check-values.md, "Independent libraries").
 */
import assert from "node:assert/strict";
import { assertClose } from "../../testing/mod.ts";
import { CUBIC, expSinCos, type Field, QUADRATIC, SMOOTH, VARIABLE } from "./_manufactured.ts";
import { manufacturedProblem, MIXED } from "./_build.ts";
import type { ValuedCondition } from "../../reference-solver/mod.ts";

/** A small deterministic generator (LCG) so failures are reproducible. */
function randomPoints(count: number, seed: number): [number, number][] {
  let s = seed >>> 0;
  const next = () => {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    return s / 2 ** 32;
  };
  return Array.from({ length: count }, () => [-1 + 2.5 * next(), -0.5 + 2 * next()]);
}

// Central differences with step δ: first derivative error (δ²/6)·u''' and second (δ²/12)·u'''',
// so with δ = 1e-4 both agree with the exact derivative to ~1e-8 absolute; round-off of the second
// difference is ~1e-16·|u|/δ² ≈ 1e-8·|u|. A tolerance of 1e-6 (scaled by 1 + |value|) separates
// a right derivation from any wrong sign, factor or term.
const DELTA = 1e-4;
const TOL = 1e-6;

function checkField(field: Field, seed: number): void {
  for (const [x, y] of randomPoints(25, seed)) {
    const u = field.u;
    const fdx = (u(x + DELTA, y) - u(x - DELTA, y)) / (2 * DELTA);
    const fdy = (u(x, y + DELTA) - u(x, y - DELTA)) / (2 * DELTA);
    const fdxx = (u(x + DELTA, y) - 2 * u(x, y) + u(x - DELTA, y)) / (DELTA * DELTA);
    const fdyy = (u(x, y + DELTA) - 2 * u(x, y) + u(x, y - DELTA)) / (DELTA * DELTA);
    const scale = 1 + Math.abs(u(x, y));
    const at = `${field.name} at (${x.toFixed(4)}, ${y.toFixed(4)})`;
    assertClose(field.ux(x, y), fdx, { abs: TOL * scale }, `u_x of ${at}`);
    assertClose(field.uy(x, y), fdy, { abs: TOL * scale }, `u_y of ${at}`);
    assertClose(field.uxx(x, y), fdxx, { abs: TOL * scale * 10 }, `u_xx of ${at}`);
    assertClose(field.uyy(x, y), fdyy, { abs: TOL * scale * 10 }, `u_yy of ${at}`);
  }
}

Deno.test("hand-derived derivatives of the manufactured solutions match central finite differences at random points", async (t) => {
  await t.step("quadratic", () => checkField(QUADRATIC, 1));
  await t.step("cubic", () => checkField(CUBIC, 2));
  await t.step("smooth exp·sin·cos of the order tests", () => checkField(SMOOTH, 3));
  await t.step(
    "exp·sin·cos with other parameters",
    () => checkField(expSinCos(-1.1, 3, 1, 2, 0.5), 4),
  );
  await t.step("a deliberately wrong derivative is caught (the check can fail)", () => {
    const wrong: Field = { ...SMOOTH, uxx: (x, y) => SMOOTH.uxx(x, y) * (1 + 1e-4) };
    assert.throws(() => checkField(wrong, 5), /u_xx of/);
  });
});

Deno.test("boundary data of a manufactured problem use the outward normal on every side", () => {
  // The data are built from the hand-derived u_x, u_y; here they are compared with one-sided
  // finite differences of u taken along the outward normal (second order, step δ).
  const domain = { x0: -0.25, x1: 1.0, y0: 0.1, y1: 0.9 };
  const grid = { domain, nx: 10, ny: 8, sides: MIXED };
  const p = manufacturedProblem(SMOOTH, VARIABLE, grid);
  const u = SMOOTH.u;
  const dOut = (x: number, y: number, nxo: number, nyo: number) =>
    // second-order one-sided difference inward: (3u(0) − 4u(−δn) + u(−2δn))/(2δ)
    (3 * u(x, y) - 4 * u(x - DELTA * nxo, y - DELTA * nyo) +
      u(x - 2 * DELTA * nxo, y - 2 * DELTA * nyo)) /
    (2 * DELTA);
  for (let j = 0; j <= grid.ny; j++) {
    const y = domain.y0 + j * (domain.y1 - domain.y0) / grid.ny;
    assertClose(
      (p.boundary.west as ValuedCondition).values[j],
      u(domain.x0, y),
      { abs: 1e-14 },
      `west Dirichlet, j=${j}`,
    );
    assertClose(
      (p.boundary.east as ValuedCondition).values[j],
      dOut(domain.x1, y, 1, 0),
      { abs: 1e-6 },
      `east Neumann, j=${j}`,
    );
  }
  const south = MIXED.south;
  if (south.kind !== "robin") throw new Error("MIXED.south is expected to be Robin");
  for (let i = 0; i <= grid.nx; i++) {
    const x = domain.x0 + i * (domain.x1 - domain.x0) / grid.nx;
    const robin = south.alpha * u(x, domain.y0) + south.beta * dOut(x, domain.y0, 0, -1);
    assertClose(
      (p.boundary.south as ValuedCondition).values[i],
      robin,
      { abs: 1e-6 },
      `south Robin, i=${i}`,
    );
    assertClose(
      (p.boundary.north as ValuedCondition).values[i],
      dOut(x, domain.y1, 0, 1),
      { abs: 1e-6 },
      `north Neumann, i=${i}`,
    );
  }
});
