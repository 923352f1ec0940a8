import assert from "node:assert/strict";
import { resolveOptions } from "./resolve_options.ts";

Deno.test("resolveOptions() fills every documented default", () => {
  const o = resolveOptions();
  assert.deepEqual({ ...o, initialGuess: undefined }, {
    scheme: { upwind: false },
    cycle: { type: "V", pre: 2, post: 1, fmgCycle: "V", fmgCyclesPerLevel: 1 },
    smoother: { name: "red-black", omega: 0.8 },
    transfer: { restriction: "full-weighting", interpolation: "auto" },
    coarse: {
      operator: "auto",
      maxDirectUnknowns: 81,
      semiCoarsening: true,
      maxLevels: 50,
    },
    stop: { tolerance: 1e-10, maxCycles: 100, divergenceFactor: 1e3 },
    singular: "refuse",
    initialGuess: undefined,
  });
  assert.equal(resolveOptions({ cycle: { type: "W", pre: 1 } }).cycle.pre, 1);
  assert.equal(resolveOptions({ coarse: { operator: "galerkin" } }).coarse.operator, "galerkin");
});

Deno.test("resolveOptions() refuses unknown keys by dotted path and lists the valid keys", async (t) => {
  await t.step("nested key", () => {
    assert.throws(
      () => resolveOptions({ cycle: { pres: 2 } } as never),
      (e: unknown) =>
        e instanceof RangeError && /option cycle\.pres/.test(e.message) &&
        /type, pre, post, fmgCycle, fmgCyclesPerLevel/.test(e.message) && !e.message.endsWith("."),
    );
  });
  await t.step("top-level key", () => {
    assert.throws(
      () => resolveOptions({ smoothers: {} } as never),
      (e: unknown) => e instanceof RangeError && /option smoothers: unknown key/.test(e.message),
    );
  });
});

Deno.test("resolveOptions() refuses unknown component names and lists the valid ones", () => {
  assert.throws(
    () => resolveOptions({ smoother: { name: "sor" as never } }),
    (e: unknown) =>
      e instanceof RangeError && /smoother\.name/.test(e.message) &&
      /jacobi, gauss-seidel, red-black, line-x, line-y, alternating-line/.test(e.message),
  );
  assert.throws(
    () => resolveOptions({ transfer: { restriction: "cubic" as never } }),
    (e: unknown) =>
      e instanceof RangeError && /injection, half-weighting, full-weighting/.test(e.message),
  );
  assert.throws(
    () => resolveOptions({ cycle: { type: "X" as never } }),
    (e: unknown) => e instanceof RangeError && /V, W, F, fmg/.test(e.message),
  );
});

Deno.test("resolveOptions() refuses bad values and an unknown coarse operator", () => {
  const bad: [unknown, RegExp][] = [
    [{ cycle: { pre: -1 } }, /cycle\.pre.*integer ≥ 0/],
    [{ cycle: { pre: 0, post: 0 } }, /at least 1 sweep/],
    [{ smoother: { omega: 2.5 } }, /smoother\.omega.*< 2/],
    [{ stop: { tolerance: 0 } }, /stop\.tolerance/],
    [{ coarse: { operator: "algebraic" } }, /coarse\.operator.*rediscretize, galerkin/],
    [
      { coarse: { operator: "rediscretize" }, transfer: { interpolation: "operator-dependent" } },
      /transfer\.interpolation.*needs Galerkin coarse operators/,
    ],
    [
      { transfer: { interpolation: "operator-dependent", restriction: "injection" } },
      /transfer\.restriction.*restriction is its transpose/,
    ],
    [{ singular: "ignore" }, /singular/],
    [{ scheme: { upwind: "yes" } }, /scheme\.upwind.*true or false/],
  ];
  for (const [options, pattern] of bad) {
    assert.throws(
      () => resolveOptions(options as never),
      (e: unknown) => e instanceof RangeError && pattern.test(e.message),
    );
  }
});
