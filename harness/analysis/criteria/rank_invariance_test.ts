import assert from "node:assert/strict";
import { RANK_SAFETY, rankInvariance } from "./rank_invariance.ts";
import type { JudgeContext, RankComparison } from "./types.ts";

function judge(checks: RankComparison[]) {
  const context = {
    input: { rankChecks: checks },
    options: { expected: { formal: 2 }, requestedTolerance: 1e-10 },
    blockers: [],
  } as unknown as JudgeContext;
  return rankInvariance.judge(context);
}

const base = { nx: 32, ny: 32, ranks: [1, 4] as [number, number], at: { x: 0.5, y: 0.25 } };

Deno.test("rank-invariance allows RANK_SAFETY times the two reductions and fails beyond", async (t) => {
  // reductions 1e-10 and 3e-10: allowed 100 · 4e-10 = 4e-8 (the rule in docs/verdicts.md)
  const reductions: [number, number] = [1e-10, 3e-10];
  await t.step("just inside passes", () => {
    const [f] = judge([{ ...base, reductions, difference: 0.99 * RANK_SAFETY * 4e-10 }]);
    assert.equal(f.status, "pass");
  });
  await t.step("just outside fails, naming the grid, the ranks and the place", () => {
    const [f] = judge([{ ...base, reductions, difference: 1.01 * RANK_SAFETY * 4e-10 }]);
    assert.equal(f.status, "fail");
    assert.match(
      f.reason,
      /32×32: the solution at 4 ranks differs from the one at 1 .* \(0\.500, 0\.250\)/,
    );
  });
  await t.step("without residual histories the requested tolerance stands in", () => {
    const [f] = judge([{ ...base, reductions: [null, null], difference: 1e-8 }]);
    assert.equal(f.status, "pass");
  });
  await t.step("a failed solve makes it inconclusive, with the reason", () => {
    const [f] = judge([{
      ...base,
      reductions,
      difference: null,
      at: null,
      reason: "at 4 ranks: boom",
    }]);
    assert.equal(f.status, "inconclusive");
    assert.match(f.reason, /boom/);
  });
  await t.step("no comparison, no verdict", () => assert.deepEqual(judge([]), []));
});
