import assert from "node:assert/strict";
import { assertClose } from "../../testing/mod.ts";
import { headingOrder, orderTrend } from "./order_trend.ts";
import { pairwiseOrders } from "./pairwise_orders.ts";

const H = [1 / 16, 1 / 32, 1 / 64, 1 / 128];

/** Every row is an error model E(h) with a known asymptotic order (derived, exact arithmetic). */
const ROWS: { model: string; e: (h: number) => number; outcome: string; kind: string }[] = [
  { model: "A·h² (a correct scheme)", e: (h) => 3 * h * h, outcome: "pass", kind: "within" },
  {
    model: "h²(1 + 2h) approaching 2 from above",
    e: (h) => h * h * (1 + 2 * h),
    outcome: "pass",
    kind: "within",
  },
  { model: "h³ (superconvergent)", e: (h) => h ** 3, outcome: "pass", kind: "above" },
  { model: "h (first order)", e: (h) => h, outcome: "fail", kind: "settled-below" },
  {
    model: "0.05h + 3h² (falls away from 2 toward 1)",
    e: (h) => 0.05 * h + 3 * h * h,
    outcome: "fail",
    kind: "moving-away",
  },
  {
    model: "h(1 − 6h) approaching 1 from below",
    e: (h) => h * (1 - 6 * h),
    outcome: "fail",
    kind: "settled-below",
  },
  { model: "constant (inconsistent)", e: () => 1e-2, outcome: "fail", kind: "settled-below" },
];

Deno.test("orderTrend() decides the error models of docs/verdicts.md", async (t) => {
  for (const row of ROWS) {
    await t.step(row.model, () => {
      const e = H.map(row.e);
      const trend = orderTrend(H, e, pairwiseOrders(H, e), 2, 0.1);
      assert.equal(trend.outcome, row.outcome, JSON.stringify(trend));
      assert.equal(trend.kind, row.kind, JSON.stringify(trend));
    });
  }
});

Deno.test("orderTrend() never fails on two grids, and leaves a fast approach undecided", () => {
  const e = (h: number) => h * h * (1 - 4 * h);
  const two = [1 / 8, 1 / 16];
  assert.equal(
    orderTrend(two, two.map(e), pairwiseOrders(two, two.map(e)), 2, 0.1).outcome,
    "inconclusive",
  );
  // derived: pairwise orders 1.42, 1.78 on 8, 16, 32 — the gap shrinks to 0.38 < 2^(−1/2)
  const three = [1 / 8, 1 / 16, 1 / 32];
  const t = orderTrend(three, three.map(e), pairwiseOrders(three, three.map(e)), 2, 0.1);
  assert.equal(t.kind, "approaching");
  assertClose(t.ratio!, 0.38, { abs: 0.01 });
});

Deno.test("headingOrder() recovers the hidden lower order of a two-term error", () => {
  // exact: E = A·h^q + B·h² through three grids determines q (derived)
  for (const q of [0, 0.5, 1, 1.5]) {
    const h = [1 / 16, 1 / 32, 1 / 64];
    assertClose(headingOrder(h, h.map((x) => 0.02 * x ** q + 2 * x * x), 2)!, q, { abs: 0.011 });
  }
});
