import assert from "node:assert/strict";
import { buildHierarchy } from "./hierarchy.ts";
import { resolveOptions } from "./resolve_options.ts";
import { fullMultigrid } from "./cycle.ts";
import { ALL_DIRICHLET, LAPLACE, manufactured, SMOOTH } from "./_test_problems.ts";

Deno.test("fullMultigrid() refuses a hierarchy whose coarse levels keep no right-hand side", () => {
  const p = manufactured(LAPLACE, SMOOTH, { nx: 32, ny: 32 }, ALL_DIRICHLET);
  const v = buildHierarchy(p, resolveOptions());
  assert.equal(v.levels[1].f, v.levels[1].rhs, "a V hierarchy shares rhs and f on coarse levels");
  assert.throws(
    () => fullMultigrid(v, { pre: 2, post: 1 }),
    (e: Error) => e instanceof RangeError && /build it with cycle.type "fmg"/.test(e.message),
  );
  const fmg = buildHierarchy(p, resolveOptions({ cycle: { type: "fmg" } }));
  assert.notEqual(fmg.levels[1].f, fmg.levels[1].rhs);
  fullMultigrid(fmg, { pre: 2, post: 1 });
});
