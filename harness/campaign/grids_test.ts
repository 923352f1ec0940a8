import assert from "node:assert/strict";
import { gridSequence } from "./grids.ts";

Deno.test("gridSequence() builds geometric sequences with integer and non-integer ratios", async (t) => {
  await t.step("ratio 2 from 16, five levels (default)", () => {
    assert.deepEqual(gridSequence(), [16, 32, 64, 128, 256]);
  });
  await t.step("ratio 1.5 from 32 gives 32, 48, 72, 108 (exact products 32·1.5^k)", () => {
    assert.deepEqual(gridSequence({ ratio: 1.5, levels: 4, coarsest: 32 }), [32, 48, 72, 108]);
  });
  await t.step("explicit grids are sorted", () => {
    assert.deepEqual(gridSequence({ grids: [64, 16, 32] }), [16, 32, 64]);
  });
});

Deno.test("gridSequence() refuses ratios below 1.1, repeats and tiny grids", () => {
  // NPARC tutorial: refinement ratio at least 1.1 (published)
  assert.throws(() => gridSequence({ ratio: 1.05 }), /below 1\.1/);
  assert.throws(() => gridSequence({ grids: [16, 16, 32] }), /given twice/);
  assert.throws(() => gridSequence({ grids: [1, 4] }), /≥ 2/);
  assert.throws(() => gridSequence({ ratio: 1.1, coarsest: 4, levels: 3 }), /same count/);
});

Deno.test("gridSequence() refuses more levels than the largest grid allows, saying how many fit (issue 12, item 15)", () => {
  // before, --levels 1000000 ran a million rounds and said "rounds two grids to the same count
  // Infinity: start from a finer coarsest grid"
  assert.throws(
    () => gridSequence({ levels: 1_000_000 }),
    (e: unknown) => {
      assert.ok(e instanceof RangeError);
      assert.equal(
        e.message,
        "1000000 levels with ratio 2 from 16: grid 11 would have 16384 intervals along x, more " +
          "than the largest grid (134217728 nodes, 11584 intervals a side); use at most 10 " +
          "levels (grids 16, 32, 64, 128, 256, 512, 1024, 2048, 4096, 8192), or a smaller ratio " +
          "or coarsest grid",
      );
      return true;
    },
  );
  assert.throws(() => gridSequence({ levels: 3, coarsest: 20000 }), /use a smaller coarsest grid$/);
  assert.equal(gridSequence({ levels: 10 }).at(-1), 8192);
});
