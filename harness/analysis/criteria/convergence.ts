import { residualMetrics } from "../residual_metrics.ts";
import type { Criterion } from "./types.ts";
import { e1, gridName } from "./_words.ts";

/**
 * Slack on the requested reduction: a solve counts as converged when its residual record shows a
 * reduction within this factor of the tolerance asked (solvers measure ‖r‖ in norms of their own
 * choice and stop on criteria of their own; a factor 100 is two orders of magnitude, our choice).
 */
export const REDUCTION_SLACK = 100;

/**
 * A reduction short of the request still only warns when the iterative error it leaves (estimated
 * as the reduction itself, see iterative_error.ts) is below this share of the grid's
 * discretization error: it cannot move any observed order (our choice, a fifth of the
 * iterative-error criterion's 5 %).
 */
export const NEGLIGIBLE_SHARE = 0.01;

/** The reduction a residual record shows (last / first), or null without a usable record. */
export function achievedReduction(history: readonly number[]): number | null {
  if (history.length < 2 || !(history[0] > 0) || !Number.isFinite(history[0])) return null;
  const last = history[history.length - 1];
  return Number.isFinite(last) ? last / history[0] : Infinity;
}

/**
 * "convergence": judged from the residual record and the request, not from the solver's claim.
 * Every grid must have solved; where a record exists, its reduction ‖r_k‖/‖r_0‖ must reach the
 * requested tolerance within {@link REDUCTION_SLACK}; divergence and stagnation are read from the
 * record; a solver that reports `converged: true` while its record shows less is failed for that,
 * by name — unless the iterative error the shortfall leaves is negligible against the grid's
 * discretization error ({@link NEGLIGIBLE_SHARE}), which only warns. Without a record the
 * solver's word is all there is: a warning says so.
 */
export const convergence: Criterion = {
  name: "convergence",
  measures: "every grid solved, and the residual record reaches the requested reduction",
  precondition: true,
  judge({ input, options, blockers }) {
    const requested = options.requestedTolerance ?? 1e-10;
    const relevant = input.solves.filter((s) => s.status !== "not-applicable");
    if (relevant.length === 0) {
      return [{
        criterion: "convergence",
        status: "not-applicable",
        reason: "no solve applies to this case and solver",
      }];
    }
    const bad: string[] = [];
    const lies: string[] = [];
    const silent: string[] = [];
    const short: string[] = [];
    const scale = options.solutionScale ?? 1;
    const reductions: Record<string, number | null> = {};
    for (const s of relevant) {
      const g = gridName(s);
      const errors = input.errors[input.solves.indexOf(s)];
      const discretization = errors ? errors.all.max / scale : null;
      if (s.status === "failed") {
        bad.push(`${g} failed${s.reason ? ` (${s.reason})` : ""}`);
        continue;
      }
      const reduction = achievedReduction(s.residualHistory);
      reductions[g] = reduction;
      if (reduction === null) {
        if (s.converged === false) {
          bad.push(`${g} stopped without converging${s.stopReason ? ` (${s.stopReason})` : ""}`);
        } else silent.push(g);
        continue;
      }
      const m = residualMetrics(s.residualHistory, { tolerance: requested * REDUCTION_SLACK });
      if (m.diverged) {
        bad.push(`${g}: the residual diverged`);
        continue;
      }
      if (reduction <= requested * REDUCTION_SLACK) continue;
      const shown = `its residual fell by ${e1(reduction)} where ${e1(requested)} was requested`;
      if (
        !options.expected.exactToRoundOff && discretization !== null &&
        reduction <= NEGLIGIBLE_SHARE * discretization
      ) {
        short.push(
          `${g} (${e1(reduction)} against a discretization error of ${e1(discretization)})`,
        );
        continue;
      }
      if (s.converged === true) {
        lies.push(`${g} reports converged, but ${shown}`);
      } else if (m.stagnated) {
        bad.push(`${g}: the residual stagnated (${shown})`);
      } else {
        bad.push(`${g} stopped early: ${shown}${s.stopReason ? ` (${s.stopReason})` : ""}`);
      }
    }
    const details = {
      requested,
      slack: REDUCTION_SLACK,
      reductions,
      problems: bad,
      lies,
      silent,
      shortButNegligible: short,
    };
    if (lies.length > 0 || bad.length > 0) {
      blockers.push(
        lies.length > 0
          ? "the solver claims a convergence it did not reach"
          : "not every grid converged",
      );
      const parts = [];
      if (lies.length > 0) {
        parts.push(
          `the solver claims a convergence its residual record does not show: ${lies.join("; ")}`,
        );
      }
      if (bad.length > 0) parts.push(`not every grid converged: ${bad.join("; ")}`);
      return [{
        criterion: "convergence",
        status: "fail",
        reason: `${parts.join("; ")} — results on these grids are not solutions of the discrete ` +
          `equations, so no order can be read from them; fix the stopping test or raise the ` +
          `iteration limit`,
        details,
      }];
    }
    if (silent.length > 0 || short.length > 0) {
      const parts = [];
      if (silent.length > 0) {
        parts.push(
          `no residual record on ${silent.join(", ")}: convergence there rests on the solver's ` +
            `word; send residualHistory so gridproof can judge it`,
        );
      }
      if (short.length > 0) {
        parts.push(
          `the residual did not reach the requested ${e1(requested)} on ${short.join(", ")}, ` +
            `but the iterative error it leaves is below ${NEGLIGIBLE_SHARE * 100} % of the ` +
            `discretization error there, too small to move an order`,
        );
      }
      return [{ criterion: "convergence", status: "warn", reason: parts.join("; "), details }];
    }
    return [{
      criterion: "convergence",
      status: "pass",
      reason:
        `every grid reached the requested reduction ${e1(requested)} (${relevant.length} grids, ` +
        `judged from the residual records)`,
      details,
    }];
  },
};
