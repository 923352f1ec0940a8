import assert from "node:assert/strict";
import { allZero, formOf } from "./form.ts";

Deno.test("formOf() implies the form from the conductivity and refuses a stated form that disagrees", () => {
  const z = new Float64Array(0);
  const k = { alongX: { k11: z }, alongY: { k22: z } };
  assert.equal(formOf({}), "non-conservative");
  assert.equal(formOf({ conductivity: k }), "conservative");
  assert.equal(formOf({ conductivity: k, form: "conservative" }), "conservative");
  assert.throws(
    () => formOf({ form: "conservative" }),
    (e: Error) =>
      e instanceof RangeError && /problem\.form.*needs problem\.conductivity/.test(e.message),
  );
  assert.throws(
    () => formOf({ conductivity: k, form: "non-conservative" }),
    (e: Error) => e instanceof RangeError && /drop the conductivity/.test(e.message),
  );
});

Deno.test("allZero() takes an absent array and zeros of either sign as zero", () => {
  assert.equal(allZero(undefined), true);
  assert.equal(allZero(new Float64Array([0, -0])), true);
  assert.equal(allZero(new Float64Array([0, 1e-300])), false);
});
