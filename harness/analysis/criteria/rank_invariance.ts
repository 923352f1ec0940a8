import type { Criterion } from "./types.ts";
import { e1, gridName } from "./_words.ts";

/**
 * How far two solutions of the same equations, each converged to a relative residual reduction
 * ρ, may differ: `RANK_SAFETY · (ρ₁ + ρ_N)` relative to max |u|. The reduction estimates the
 * relative algebraic error only up to an O(1) factor (see "iterative-error"), and the max norm of
 * the difference may exceed the norm the residual was measured in by the grid's size; 100 covers
 * both on the grids a study uses (our choice). A rank-dependent defect moves the solution by the
 * size of the data it gets wrong, orders of magnitude beyond this.
 */
export const RANK_SAFETY = 100;

/**
 * Below this relative difference two solutions agree to round-off whatever their reductions say
 * (about 1000 ulp of a unit value: summation order alone moves a converged solution this much).
 */
export const RANK_ROUNDOFF = 1e-13;

/**
 * "rank-invariance": a parallel solver must give the same discrete solution on any rank count, up
 * to what its iterative tolerance allows. The campaign solves one grid at 1 rank and at N ranks
 * (a solver file's `rankCheck`) and compares the solutions; a difference beyond
 * {@link RANK_SAFETY} times the two solves' residual reductions is a parallel defect — a Neumann
 * side split between ranks, boundary data assigned per process, a missing halo exchange, a
 * reduction over one rank's part only. Judged only when the solver file asks for it.
 */
export const rankInvariance: Criterion = {
  name: "rank-invariance",
  measures: "the solution does not depend on the number of ranks beyond the iterative tolerance",
  judge({ input, options }) {
    const checks = input.rankChecks ?? [];
    if (checks.length === 0) return [];
    const requested = options.requestedTolerance ?? 1e-10;
    const rows = checks.map((c) => {
      const allowed = Math.max(
        RANK_ROUNDOFF,
        RANK_SAFETY * ((c.reductions[0] ?? requested) + (c.reductions[1] ?? requested)),
      );
      return { ...c, allowed };
    });
    const details = { safety: RANK_SAFETY, comparisons: rows };
    const broken = rows.filter((r) => r.difference === null);
    if (broken.length > 0) {
      return [{
        criterion: "rank-invariance",
        status: "inconclusive",
        reason: broken.map((r) =>
          `${gridName(r)} at ${r.ranks[0]} and ${r.ranks[1]} ranks could not be compared: ${
            r.reason ?? "a solve did not finish"
          }`
        ).join("; "),
        details,
      }];
    }
    const over = rows.filter((r) => !(r.difference! <= r.allowed));
    if (over.length === 0) {
      return [{
        criterion: "rank-invariance",
        status: "pass",
        reason: rows.map((r) =>
          `${gridName(r)}: the solutions at ${r.ranks[0]} and ${r.ranks[1]} ranks differ by ` +
          `${e1(r.difference)} (relative), within the ${
            e1(r.allowed)
          } the iterative tolerance allows`
        ).join("; "),
        details,
      }];
    }
    return [{
      criterion: "rank-invariance",
      status: "fail",
      reason: over.map((r) =>
        `${gridName(r)}: the solution at ${r.ranks[1]} ranks differs from the one at ` +
        `${r.ranks[0]} by ${e1(r.difference)} (relative), beyond the ${e1(r.allowed)} the ` +
        `iterative tolerance allows${
          r.at ? `, most at (${r.at.x.toPrecision(3)}, ${r.at.y.toPrecision(3)})` : ""
        }: the result depends on the rank count — look for boundary data or a boundary ` +
        `condition handled per rank, a missing halo exchange, or a sum over one rank's part`
      ).join("; "),
      details,
    }];
  },
};
