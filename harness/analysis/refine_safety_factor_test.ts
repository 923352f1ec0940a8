import assert from "node:assert/strict";
import { refineSafetyFactor } from "./refine_safety_factor.ts";

Deno.test("refineSafetyFactor() follows Roache (1998) and Oberkampf & Roy (2010, §8.6)", async (t) => {
  // Rules (recalled from memory, check the sources; docs/refine.md): two grids → Fs = 3, formal p;
  // observed p within 10 % of formal → Fs = 1.25, observed p; otherwise Fs = 3,
  // p = min(max(observed, 0.5), formal). Each row's expected values follow by hand.
  const rows: {
    what: string;
    observed: number | null;
    formal: number;
    convergence: "monotone" | "oscillatory" | null;
    fs: number;
    p: number;
    basis: string;
  }[] = [
    // |1.9 − 2|/2 = 0.05 ≤ 0.1
    {
      what: "5 % below",
      observed: 1.9,
      formal: 2,
      convergence: "monotone",
      fs: 1.25,
      p: 1.9,
      basis: "observed-near-formal",
    },
    // |1.8 − 2|/2 = 0.1 (0.09999999999999998 in binary): the edge counts as within
    {
      what: "10 % below",
      observed: 1.8,
      formal: 2,
      convergence: "monotone",
      fs: 1.25,
      p: 1.8,
      basis: "observed-near-formal",
    },
    // NPARC: |1.786170 − 2|/2 = 0.107 > 0.1 → p = min(max(1.786170, 0.5), 2) = 1.786170
    {
      what: "NPARC's p against 2",
      observed: 1.78617,
      formal: 2,
      convergence: "monotone",
      fs: 3,
      p: 1.78617,
      basis: "observed-far-from-formal",
    },
    // p = min(max(3, 0.5), 2) = 2
    {
      what: "far above",
      observed: 3,
      formal: 2,
      convergence: "monotone",
      fs: 3,
      p: 2,
      basis: "observed-far-from-formal",
    },
    // p = min(max(0.2, 0.5), 2) = 0.5
    {
      what: "far below 0.5",
      observed: 0.2,
      formal: 2,
      convergence: "monotone",
      fs: 3,
      p: 0.5,
      basis: "observed-far-from-formal",
    },
    // our choice: oscillatory data never count as within 10 %
    {
      what: "oscillatory",
      observed: 1,
      formal: 1,
      convergence: "oscillatory",
      fs: 3,
      p: 1,
      basis: "oscillatory",
    },
    {
      what: "no observed order",
      observed: null,
      formal: 2,
      convergence: "monotone",
      fs: 3,
      p: 2,
      basis: "no-observed-order",
    },
    {
      what: "two grids",
      observed: null,
      formal: 1,
      convergence: null,
      fs: 3,
      p: 1,
      basis: "two-grids",
    },
  ];
  for (const row of rows) {
    await t.step(row.what, () => {
      const c = refineSafetyFactor(row);
      assert.ok(c !== null);
      assert.equal(c.safetyFactor, row.fs);
      assert.equal(c.order, row.p);
      assert.equal(c.basis, row.basis);
    });
  }
  await t.step("divergent and unchanged data get no GCI", () => {
    assert.equal(refineSafetyFactor({ observed: null, formal: 2, convergence: "divergent" }), null);
    assert.equal(refineSafetyFactor({ observed: null, formal: 2, convergence: "unchanged" }), null);
  });
  await t.step("a formal order that is not positive is refused", () => {
    assert.throws(
      () => refineSafetyFactor({ observed: 1, formal: 0, convergence: "monotone" }),
      (e: unknown) =>
        e instanceof RangeError && /formal order must be positive, got 0/.test(e.message),
    );
  });
});
