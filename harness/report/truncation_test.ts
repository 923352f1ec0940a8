import assert from "node:assert/strict";
import { buildStudy } from "../analysis/mod.ts";
import type { SolveRecord } from "../result/mod.ts";
import { truncationReading } from "./truncation.ts";

/** A solve whose error is exactly h² and whose truncation error is exactly h^p (exact power laws). */
function solve(n: number, p: number | null): SolveRecord {
  const h = 1 / n, e = h * h;
  const norms = { max: e, l2: e, l1: e };
  return {
    caseId: "c",
    solver: "s",
    nx: n,
    ny: n,
    h,
    unknowns: (n + 1) ** 2,
    status: "ok",
    errors: { all: norms, interior: norms, boundary: norms },
    ...(p === null ? {} : { truncation: { max: h ** p, l2: h ** p } }),
    residualHistory: [1, 1e-12],
    iterations: 1,
    converged: true,
    averageFactor: 1e-12,
    asymptoticFactor: 1e-12,
    seconds: 0,
  };
}

const study = (p: number | null) =>
  buildStudy([16, 32, 64].map((n) => solve(n, p)), {
    caseId: "c",
    solver: "s",
    expected: { formal: 2 },
  });

Deno.test("truncationReading(): orders from exact power laws, the paragraph only when lower", () => {
  assert.equal(truncationReading(study(null)), null, "old results have no truncation orders");
  const first = truncationReading(study(1))!;
  assert.match(first.line, /max 1\.00 .*solution error order \(max\) 2\.00/);
  assert.equal(first.lower, true);
  const second = truncationReading(study(2))!;
  assert.match(second.line, /max 2\.00/);
  assert.equal(second.lower, false);
});
