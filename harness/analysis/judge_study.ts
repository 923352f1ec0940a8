import type { Verdict } from "../result/types.ts";
import { CRITERIA } from "./criteria/registry.ts";
import type { JudgeOptions, StudyInput } from "./criteria/types.ts";

export type {
  JudgeOptions,
  NormName,
  OrderExpectation,
  Strictness,
  StudyInput,
} from "./criteria/types.ts";

/**
 * Verdicts for one case × solver: every criterion of the registry ({@link CRITERIA}) in its
 * order, each with a reason in plain words and its evidence in `details`. Preconditions
 * (imposed data, convergence, iterative error) are judged first; while one fails, order and
 * exactness verdicts that do not pass are inconclusive and say why, so the discretization is
 * never blamed for what the solve did. The decision rules are documented in docs/verdicts.md.
 *
 * @param input The study's figures.
 * @param options Expected order and judgement options (see {@link JudgeOptions}).
 * @returns The verdicts, in the order of the criteria.
 *
 * @example
 * ```ts
 * import assert from "node:assert/strict";
 * import { buildStudy } from "./build_study.ts";
 * // a first-order error term under the second-order one: the order moves away from 2
 * const solve = (n: number) => {
 *   const h = 1 / n, e = 0.2 * h + 3 * h * h;
 *   const norms = { max: e, l2: e, l1: e };
 *   return {
 *     caseId: "c", solver: "s", nx: n, ny: n, h, unknowns: (n + 1) ** 2, status: "ok" as const,
 *     errors: { all: norms, interior: norms, boundary: norms }, residualHistory: [1, 1e-12],
 *     iterations: 8, converged: true, averageFactor: 0.03, asymptoticFactor: 0.03,
 *     seconds: n * n * 1e-6,
 *   };
 * };
 * const study = buildStudy([16, 32, 64, 128].map(solve), {
 *   caseId: "c", solver: "s", expected: { formal: 2 },
 * });
 * const max = study.verdicts.find((v) => v.criterion === "order")!;
 * assert.equal(max.status, "fail");
 * assert.match(max.reason, /moving away/);
 * ```
 */
export function judgeStudy(input: StudyInput, options: JudgeOptions): Verdict[] {
  const context = { input, options, blockers: [] as string[] };
  const out: Verdict[] = [];
  for (const criterion of CRITERIA) {
    for (const f of criterion.judge(context)) {
      out.push({ caseId: input.caseId, solver: input.solver, ...f });
    }
  }
  return out;
}
