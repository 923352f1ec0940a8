import assert from "node:assert/strict";
import { assertClose } from "./mod.ts";

Deno.test("assertClose() accepts values within tolerance and rejects others", () => {
  // exact identity: 0.1 + 0.2 differs from 0.3 by one ulp-scale amount (IEEE 754 double)
  assertClose(0.1 + 0.2, 0.3, { rel: 1e-15 });
  assert.throws(() => assertClose(1, 1.1, { rel: 1e-3 }), /expected 1.1/);
});
