import assert from "node:assert/strict";
import { assertClose } from "../../testing/mod.ts";
import { pairwiseOrders } from "./pairwise_orders.ts";
import { fittedOrder } from "./fitted_order.ts";
import { asymptoticRange, orderRecord } from "./order_record.ts";
import { mulberry32, normalDeviates } from "../../testing/mod.ts";

const H = [1 / 8, 1 / 12, 1 / 18, 1 / 27, 1 / 40.5]; // ratio 1.5, non-integer grids

Deno.test("pairwiseOrders() recovers p from exact power-law errors to round-off", () => {
  // derived: E = C·h^p gives ln(E_i/E_{i+1})/ln(h_i/h_{i+1}) = p exactly
  for (const p of [1, 2, 2.5, 4]) {
    const e = H.map((h) => 0.37 * h ** p);
    for (const q of pairwiseOrders(H, e)) assertClose(q!, p, { rel: 1e-12 });
  }
});

Deno.test("pairwiseOrders() approaches p from data with an h^(p+1) term", () => {
  // derived: E = h²(1 + 3h) gives p_i = 2 + ln((1 + 3h_i)/(1 + 3h_{i+1}))/ln r exactly
  const e = H.map((h) => h * h * (1 + 3 * h));
  const p = pairwiseOrders(H, e);
  for (let i = 0; i < p.length; i++) {
    const expected = 2 + Math.log((1 + 3 * H[i]) / (1 + 3 * H[i + 1])) / Math.log(H[i] / H[i + 1]);
    assertClose(p[i]!, expected, { rel: 1e-12 });
  }
  assert.ok(p[3]! - 2 < p[0]! - 2, "the deviation shrinks with refinement");
});

Deno.test("pairwiseOrders() gives null for zero, negative or missing errors", () => {
  assert.deepEqual(pairwiseOrders([0.2, 0.1, 0.05], [0, 1e-3, null]), [null, null]);
  assert.throws(() => pairwiseOrders([0.1], [1, 2]), RangeError);
});

Deno.test("fittedOrder() recovers p exactly and gives a zero-width interval on exact data", () => {
  // derived: a perfect straight line in log–log has zero residual, hence zero standard error
  const e = H.map((h) => 2.1 * h ** 1.5);
  const f = fittedOrder(H, e, { points: 4 });
  assert.equal(f.points, 4);
  assertClose(f.order!, 1.5, { rel: 1e-12 });
  assertClose(f.low!, 1.5, { rel: 1e-10 });
  assertClose(f.high!, 1.5, { rel: 1e-10 });
});

Deno.test("fittedOrder() with two points gives the pairwise order and no interval", () => {
  const f = fittedOrder([0.2, 0.1], [0.05, 0.0125], { points: 2 });
  assertClose(f.order!, 2);
  assert.equal(f.low, null);
  assert.equal(f.high, null);
});

Deno.test("fittedOrder() uses only the finest points", () => {
  // the coarsest grid is far off the power law; the finest three are exact h²
  const e = [1, 0.04, 0.01, 0.0025];
  const f = fittedOrder([0.4, 0.2, 0.1, 0.05], e, { points: 3 });
  assertClose(f.order!, 2, { rel: 1e-12 });
});

Deno.test("fittedOrder() 95 % intervals cover the true slope at the nominal rate", async (t) => {
  // derived (statistics of OLS with Gaussian errors): the t interval covers the true slope with
  // probability exactly 0.95. Over N = 4000 fixed seeds the count is Binomial(4000, 0.95):
  // mean 3800, sd sqrt(4000·0.95·0.05) = 13.8; we accept ±4.5 sd (rate within ±0.0155), a bound
  // a correct implementation misses with probability below 1e-5 — while using the normal
  // quantile 1.96 instead of t would give about 0.70 with k = 3 and about 0.86 with k = 5.
  const N = 4000;
  for (const k of [3, 5]) {
    await t.step(`k = ${k} grids (${k - 2} degrees of freedom)`, () => {
      let covered = 0;
      const h = Array.from({ length: k }, (_, i) => 0.1 / 1.7 ** i);
      for (let seed = 1; seed <= N; seed++) {
        const normal = normalDeviates(mulberry32(seed * 7919));
        const e = h.map((hi) => 0.8 * hi ** 2 * Math.exp(0.05 * normal()));
        const f = fittedOrder(h, e, { points: k });
        if (f.low! <= 2 && 2 <= f.high!) covered++;
      }
      const rate = covered / N;
      assert.ok(Math.abs(rate - 0.95) <= 0.0155, `coverage ${rate} outside 0.95 ± 0.0155`);
    });
  }
});

Deno.test("asymptoticRange() needs the last two pairwise orders to agree within tolerance", () => {
  assert.equal(asymptoticRange([1.5, 1.9, 1.97]), true);
  assert.equal(asymptoticRange([1.5, 1.7, 1.9]), false);
  assert.equal(asymptoticRange([1.9, null]), false);
  assert.equal(asymptoticRange([2]), false);
  assert.equal(asymptoticRange([1.7, 1.9], { tolerance: 0.25 }), true);
});

Deno.test("orderRecord() assembles pairwise, fitted and asymptotic parts", () => {
  const e = H.map((h) => h * h * (1 + 0.1 * h));
  const r = orderRecord("interior", "l2", H, e, { points: 4 });
  assert.equal(r.region, "interior");
  assert.equal(r.norm, "l2");
  assert.equal(r.pairwise.length, 4);
  assert.equal(r.fitted.points, 4);
  assert.ok(r.asymptotic);
  assert.ok(r.fitted.low! < r.fitted.order! && r.fitted.order! < r.fitted.high!);
});
