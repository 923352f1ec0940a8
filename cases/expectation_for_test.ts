import assert from "node:assert/strict";
import { expectationFor } from "./expectation_for.ts";
import { loadCase } from "./load.ts";
import type { ExpectedOrder, SchemeName } from "./types.ts";

// The merge rules checked here are the ones docs/cases.md states ("Expectations per layout"):
// formal, exactToRoundOff and orderTolerance replace the scheme's, achievable is merged per norm, grids stay the
// scheme's, and the result carries no layouts.
const central: ExpectedOrder = {
  formal: 2,
  achievable: {
    max: { order: 1.5, reason: "scheme max" },
    l2: { order: 1.5, reason: "scheme l2" },
  },
  grids: [16, 32, 64],
  orderTolerance: 0.2,
  layouts: {
    cell: {
      reason: "cell differs",
      exactToRoundOff: false,
      orderTolerance: 0.3,
      achievable: { max: { order: 1, reason: "cell max" } },
    },
    points: { reason: "points differs", formal: 1 },
  },
};
const kase = {
  expected: { central, upwind: { formal: 1 } } satisfies Record<SchemeName, ExpectedOrder>,
};

Deno.test("expectationFor() returns the scheme's expectation for a layout without override", () => {
  const { layouts: _layouts, ...scheme } = central;
  assert.deepEqual(expectationFor(kase, "central", "vertex"), scheme);
  assert.deepEqual(expectationFor(kase, "upwind", "cell"), { formal: 1 });
});

Deno.test("expectationFor() merges a layout's achievable per norm and replaces its other fields", () => {
  assert.deepEqual(expectationFor(kase, "central", "cell"), {
    formal: 2,
    achievable: {
      max: { order: 1, reason: "cell max" },
      l2: { order: 1.5, reason: "scheme l2" },
    },
    exactToRoundOff: false,
    grids: [16, 32, 64],
    orderTolerance: 0.3,
  });
  assert.deepEqual(expectationFor(kase, "central", "points"), {
    formal: 1,
    achievable: central.achievable,
    grids: [16, 32, 64],
    orderTolerance: 0.2,
  });
});

Deno.test("expectationFor() shares no object with the case", () => {
  const got = expectationFor(kase, "central", "cell");
  got.achievable!.l2!.order = 0;
  got.grids!.push(128);
  assert.equal(central.achievable?.l2?.order, 1.5);
  assert.deepEqual(central.grids, [16, 32, 64]);
  assert.equal("layouts" in got, false);
});

Deno.test("expectationFor() keeps quadratic-exact exact for the vertex layout only", async () => {
  // derived: the vertex scheme with ghost-node boundary rows reproduces quadratics to round-off;
  // the cell-centred Dirichlet ghost 2g − u₁ and the cell-centre average of nodal values make an
  // O(h²) error on a quadratic (both measured: see the case's reasons)
  const c = await loadCase("quadratic-exact");
  assert.equal(expectationFor(c, "central", "vertex").exactToRoundOff, true);
  for (const layout of ["cell", "points"] as const) {
    const e = expectationFor(c, "central", layout);
    assert.equal(e.exactToRoundOff, false, layout);
    assert.equal(e.formal, 2, layout);
  }
});
