import assert from "node:assert/strict";
import { InputError } from "../errors/mod.ts";
import { buildCase } from "./engine.ts";
import { loadCase } from "./load.ts";
import { testCase } from "./_test_case.ts";
import { validateCaseText } from "./validate.ts";
import { compatibilityBalance } from "./compatibility.ts";

function assertAlmostEquals(actual: number, expected: number, tolerance: number): void {
  assert.ok(
    Math.abs(actual - expected) <= tolerance,
    `${actual} is not within ${tolerance} of ${expected}`,
  );
}

/** The problems of the InputError that `run` throws. */
async function problemsOf(run: () => Promise<unknown>): Promise<string> {
  try {
    await run();
  } catch (error) {
    assert.ok(error instanceof InputError, String(error));
    return error.problems.join("\n");
  }
  throw new Error("expected an InputError");
}

const neumann = { kind: "neumann" as const };
const allNeumann = { west: neumann, east: neumann, south: neumann, north: neumann };

Deno.test("compatibilityBalance() matches the divergence theorem worked by hand for u = x²y, Δu = 2y", async () => {
  // exact identity, integrals by hand on the unit square: ∫ 2y dA = 1; the outward normal
  // derivative integrates to 0 (west, u_x = 0) + 1 (east, ∫ 2y dy) − 1/3 (south, −∫ x² dx)
  // + 1/3 (north) = 1
  const kase = await buildCase(testCase({ exact: "x^2*y", boundary: allNeumann }), {
    origin: "test",
  });
  assert.equal(kase.singular, true);
  const b = compatibilityBalance(kase);
  assertAlmostEquals(b.source, 1, 1e-13);
  assertAlmostEquals(b.flux, 1, 1e-13);
  assertAlmostEquals(b.volume, 0, 1e-13);
});

Deno.test("compatibilityBalance() accounts for a variable a in the non-conservative form by hand", async () => {
  // a = 1 + x, u = x²: f = 2(1 + x), ∫ f = 3; flux a·u_x at x = 1: 2·2 = 4 (west 0);
  // remainder (b − a_x)·u_x = −2x, ∫ = −1; so 3 = 4 − 1 (worked by hand)
  const kase = await buildCase(
    testCase({
      exact: "x^2",
      coefficients: { a: "1 + x", b: "0", c: "1", d: "0", e: "0" },
      boundary: allNeumann,
    }),
    { origin: "test" },
  );
  const b = compatibilityBalance(kase);
  assertAlmostEquals(b.source, 3, 1e-12);
  assertAlmostEquals(b.flux, 4, 1e-12);
  assertAlmostEquals(b.volume, -1, 1e-9);
  assert.ok(b.relative < 1e-10);
});

Deno.test("the case engine refuses singular data that do not balance (a kink the source misses)", async () => {
  // u = |x − 0.3|: the symbolic u_xx is 0, but the flux 1 leaves through both west and east
  // (hand: ∫ f = 0, ∮ ∂u/∂n = 2): the imbalance is 2
  const text = await problemsOf(
    () =>
      buildCase(testCase({ exact: "abs(x - 0.3) + y^2", boundary: allNeumann }), {
        origin: "test",
      }),
  );
  assert.ok(text.includes("do not balance"), text);
  assert.ok(text.includes("imbalance -2") || text.includes("imbalance 2"), text);
});

Deno.test("pure-neumann-pressure is singular and balances; periodic-channel is not singular", async () => {
  const pressure = await loadCase("pure-neumann-pressure");
  assert.equal(pressure.singular, true);
  assert.ok(compatibilityBalance(pressure).relative < 1e-12);
  const channel = await loadCase("periodic-channel");
  assert.equal(channel.singular, undefined);
  assert.equal(channel.boundary.west.kind, "periodic");
});

Deno.test("a lone periodic side is refused naming the side and its partner", () => {
  const { problems } = validateCaseText(
    JSON.stringify(testCase({
      boundary: {
        west: { kind: "periodic" },
        east: neumann,
        south: neumann,
        north: { kind: "dirichlet" },
      },
    })),
    "lone.json",
  );
  const text = problems.map((p) => p.message).join("\n");
  assert.ok(text.includes("west is periodic but its partner east is neumann"), text);
});

Deno.test("a periodic pair whose exact solution does not repeat is refused with the seam point and mismatch", async () => {
  const text = await problemsOf(
    () =>
      buildCase(
        testCase({
          exact: "x*sin(2*pi*y) + y",
          boundary: {
            west: { kind: "periodic" },
            east: { kind: "periodic" },
            south: { kind: "dirichlet" },
            north: { kind: "dirichlet" },
          },
        }),
        { origin: "test" },
      ),
  );
  assert.ok(
    text.includes("west–east sides are periodic but the exact solution u does not repeat"),
    text,
  );
  assert.ok(text.includes("mismatch"), text);
});

Deno.test("a periodic pair with a repeating solution samples equal values on the images", async () => {
  const kase = await loadCase("periodic-channel");
  const p = kase.sample(8, 8);
  for (let j = 0; j <= 8; j++) assert.equal(p.f[j * 9 + 8], p.f[j * 9]);
  assert.equal(p.boundary.west.kind, "periodic");
});
