import type { Verdict, VerdictStatus } from "./types.ts";

/** Severity order of statuses (failures first), the one ranking reports and comparisons use. */
export const SEVERITY: Record<VerdictStatus, number> = {
  fail: 0,
  inconclusive: 1,
  warn: 2,
  pass: 3,
  "not-applicable": 4,
};

/**
 * The worst status among verdicts ("not-applicable" when there are none).
 *
 * @example
 * ```ts
 * import assert from "node:assert/strict";
 * import { worstStatus } from "./severity.ts";
 * const v = (status: "pass" | "inconclusive") =>
 *   ({ caseId: "c", solver: "s", criterion: "order", status, reason: "" });
 * assert.equal(worstStatus([v("pass"), v("inconclusive")]), "inconclusive");
 * ```
 */
export function worstStatus(verdicts: readonly Pick<Verdict, "status">[]): VerdictStatus {
  let out: VerdictStatus = "not-applicable";
  for (const v of verdicts) if (SEVERITY[v.status] < SEVERITY[out]) out = v.status;
  return out;
}
