import assert from "node:assert/strict";
import { levelLayout, unpadInPlace } from "./level.ts";

Deno.test("unpadInPlace() gives the values unpad() gives, on the same buffer", async (t) => {
  // Reference: `unpad`, which copies into a new array (exact identity: both move the same values).
  for (const [nx, ny] of [[1, 1], [4, 3], [7, 9]]) {
    await t.step(`${nx}×${ny}`, () => {
      const l = levelLayout(nx, ny);
      const values = Float64Array.from({ length: (nx + 1) * (ny + 1) }, (_, k) => k * 1.5 - 7);
      const padded = l.pad(values);
      const copy = l.unpad(padded);
      const view = unpadInPlace(l, padded);
      assert.deepEqual([...view], [...copy]);
      assert.deepEqual([...view], [...values]);
      assert.equal(view.buffer, padded.buffer);
    });
  }
});
