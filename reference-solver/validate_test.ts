import assert from "node:assert/strict";
import { validateProblem } from "./validate.ts";
import { solve } from "./solve.ts";
import { ALL_DIRICHLET, LAPLACE, manufactured, SMOOTH, VARIABLE } from "./_test_problems.ts";
import { type Problem, robinCondition, type ValuedCondition } from "./problem.ts";

const base = (): Problem => manufactured(VARIABLE, SMOOTH, { nx: 4, ny: 3 }, ALL_DIRICHLET);

function refuses(problem: Problem, pattern: RegExp, options: { singular?: "refuse" } = {}) {
  assert.throws(
    () => validateProblem(problem, options),
    (e: unknown) => e instanceof RangeError && pattern.test(e.message) && !e.message.endsWith("."),
  );
}

Deno.test("validateProblem() names the field, node, coordinates and value of bad input", async (t) => {
  await t.step("too few intervals", () => refuses({ ...base(), nx: 1 }, /problem\.nx.*got 1/));
  await t.step(
    "a cell-layout problem (the one sampled-problem type carries both layouts)",
    () =>
      refuses({ ...base(), layout: "cell" }, /problem\.layout: .*"vertex" layout only, got "cell"/),
  );
  await t.step(
    "a stated conservative form without its conductivity",
    () =>
      refuses({ ...base(), form: "conservative" }, /problem\.form: .*needs problem\.conductivity/),
  );
  await t.step(
    "wrong array length",
    () =>
      refuses(
        { ...base(), c: new Float64Array(3) },
        /problem\.c: expected .* 20 values .* got length 3/,
      ),
  );
  await t.step("non-finite coefficient", () => {
    const p = base();
    p.a[2 * 5 + 1] = NaN;
    refuses(
      p,
      /problem\.a at node \(1, 2\) at \(x, y\) = \(0\.25, 0\.666.*\): value NaN is not finite/,
    );
  });
  await t.step("non-elliptic node", () => {
    const p = base();
    p.c[5 + 3] = -1;
    refuses(p, /not elliptic at node \(3, 1\).*c = -1/);
  });
  await t.step("boundary values of the wrong length", () => {
    const p = base();
    p.boundary.west = { kind: "dirichlet", values: new Float64Array(5) };
    refuses(p, /boundary\.west\.values: expected a Float64Array of 4 values/);
  });
  await t.step("non-finite boundary value", () => {
    const p = base();
    (p.boundary.north as ValuedCondition).values[2] = Infinity;
    refuses(p, /boundary\.north\.values\[2\] at node \(2, 3\).*Infinity/);
  });
  await t.step("Robin with alpha = beta = 0", () => {
    const p = base();
    p.boundary.east = robinCondition(0, 0, new Float64Array(4));
    refuses(p, /boundary\.east at node \(4, 0\) .*Robin condition with alpha = 0 and beta = 0/);
  });
  await t.step("Robin beta 0 at some nodes of a side only", () => {
    const p = base();
    p.boundary.east = robinCondition(1, new Float64Array([0.5, 0.5, 0, 0.5]), new Float64Array(4));
    refuses(p, /boundary\.east\.beta: 0 at 1 of 4 nodes \(first node \(4, 2\)/);
  });
  await t.step("Robin weights of the wrong length", () => {
    const p = base();
    p.boundary.east = { ...robinCondition(1, 1, new Float64Array(4)), alpha: new Float64Array(3) };
    refuses(p, /boundary\.east\.alpha: expected a Float64Array of 4 values/);
  });
});

Deno.test("validateProblem() refuses a singular problem unless mean-zero is asked for", () => {
  const sides = {
    west: "neumann",
    east: { alpha: 0, beta: 2 },
    south: "neumann",
    north: "neumann",
  } as const;
  const p = manufactured(LAPLACE, SMOOTH, { nx: 8, ny: 8 }, sides);
  refuses(p, /singular.*singular: "mean-zero"/);
  assert.equal(validateProblem(p, { singular: "mean-zero" }), true);
  assert.throws(
    () => solve(p),
    (e: unknown) => e instanceof RangeError && /singular/.test(e.message),
  );
  // A Robin side with alpha ≠ 0 makes it regular.
  const q = manufactured(LAPLACE, SMOOTH, { nx: 8, ny: 8 }, {
    ...sides,
    east: { alpha: 1, beta: 1 },
  });
  assert.equal(validateProblem(q), false);
});
