import type { Criterion } from "./types.ts";
import { achievedReduction } from "./convergence.ts";
import { e1, gridName } from "./_words.ts";

/** The iterative error must stay below this fraction of the discretization error (our choice). */
export const ITERATIVE_SHARE = 0.05;

/**
 * "iterative-error": the algebraic error left by the iteration, estimated on each grid, must be
 * well below (≤ {@link ITERATIVE_SHARE}) the discretization error, or it corrupts every observed
 * order: a 5 % error on two grids moves a pairwise order by up to log2(1.05/0.95) ≈ 0.14.
 *
 * Estimate: relative algebraic error ≈ the relative residual reduction ‖r_k‖/‖r_0‖. With a zero
 * start, e_0 = u_h and r_0 = f; once the smooth error modes dominate, ‖r‖/‖e‖ and ‖f‖/‖u‖ are both
 * of the order of the operator's smallest eigenvalue, so the two ratios agree up to an O(1) factor
 * (common practice; it is an estimate, not a bound). The discretization error is the max-norm
 * error against the exact solution relative to max |u|. Exact cases are judged by "exactness".
 */
export const iterativeError: Criterion = {
  name: "iterative-error",
  measures: "the iterative error is well below the discretization error on every grid",
  precondition: true,
  judge({ input, options, blockers }) {
    if (options.expected.exactToRoundOff) return [];
    const scale = options.solutionScale ?? 1;
    const rows: { grid: string; iterative: number; discretization: number }[] = [];
    input.solves.forEach((s, i) => {
      const e = input.errors[i];
      const reduction = achievedReduction(s.residualHistory);
      if (s.status !== "ok" || !e || reduction === null) return;
      rows.push({ grid: gridName(s), iterative: reduction, discretization: e.all.max / scale });
    });
    if (rows.length === 0) return [];
    const over = rows.filter((r) => !(r.iterative <= ITERATIVE_SHARE * r.discretization));
    const details = { share: ITERATIVE_SHARE, grids: rows };
    if (over.length === 0) {
      return [{
        criterion: "iterative-error",
        status: "pass",
        reason: `the estimated iterative error stays below ${ITERATIVE_SHARE * 100} % of the ` +
          `discretization error on every grid`,
        details,
      }];
    }
    blockers.push("the iterative error is not well below the discretization error");
    return [{
      criterion: "iterative-error",
      status: "fail",
      reason: `the iterative error is not well below the discretization error on ${
        over.map((r) => `${r.grid} (about ${e1(r.iterative)} against ${e1(r.discretization)})`)
          .join(", ")
      }: it corrupts every observed order there; ask for (or honour) a tighter residual tolerance`,
      details,
    }];
  },
};
