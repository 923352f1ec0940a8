import { locateDefect } from "../locate.ts";
import type { Criterion } from "./types.ts";
import { e1, gridName } from "./_words.ts";
import { placeEvidence } from "./order.ts";
import { achievedReduction } from "./convergence.ts";

/** Condition-number allowance: an algebraic error up to this times the reduction reached. */
export const KAPPA_ALLOWANCE = 1e3;

/**
 * "exactness" (cases the scheme reproduces exactly): max error on every grid ≤
 * max(rel, {@link KAPPA_ALLOWANCE}·ρ)·max|u| + abs, with ρ the residual reduction the grid's record
 * shows (defaults rel 1e-9, abs 1e-12; the campaign widens rel for a loose requested tolerance).
 * ‖e‖ ≤ κ(A)·ρ·‖u‖ with κ(A) = O(h⁻²) ≈ 1e3 on the exactness case's small grids (derived), so a
 * solver that stopped early is not mistaken for a wrong scheme (the convergence criterion judges
 * the stop), while any truncation error of a smooth non-polynomial term is far above the bound.
 */
export const exactness: Criterion = {
  name: "exactness",
  measures: "a solution the scheme reproduces exactly comes back to round-off",
  judge(context) {
    const { input, options, blockers } = context;
    if (!options.expected.exactToRoundOff) return [];
    const rel = options.exactTolerance?.rel ?? 1e-9;
    const abs = options.exactTolerance?.abs ?? 1e-12;
    const scale = options.solutionScale ?? 1;
    const boundAt = (i: number) => {
      const reduction = achievedReduction(input.solves[i]?.residualHistory ?? []);
      return Math.max(rel, KAPPA_ALLOWANCE * (reduction ?? 0)) * scale + abs;
    };
    let bound = rel * scale + abs;
    const details: Record<string, unknown> = { bound, rel, abs, solutionScale: scale };
    // the grid whose error exceeds its own bound the most (or comes closest to it)
    let worst = -1;
    let worstAt = -1;
    let worstShare = -1;
    input.errors.forEach((e, i) => {
      if (!e) return;
      const share = e.all.max / boundAt(i);
      if (!(share <= worstShare)) {
        worstShare = share;
        worst = e.all.max;
        worstAt = i;
      }
    });
    if (worstAt < 0) {
      return [{
        criterion: "exactness",
        status: "inconclusive",
        reason:
          "no grid produced errors to check: every solve failed (see the convergence verdict)",
        details,
      }];
    }
    bound = boundAt(worstAt);
    details.bound = bound;
    details.maxError = worst;
    details.grid = gridName(input.solves[worstAt]);
    if (worst <= bound) {
      return [{
        criterion: "exactness",
        status: "pass",
        reason: `errors stay at round-off: largest max error ${e1(worst)} ≤ ${e1(bound)}`,
        details,
      }];
    }
    if (blockers.length > 0) {
      return [{
        criterion: "exactness",
        status: "inconclusive",
        reason: `max error ${e1(worst)} on the ${details.grid} grid exceeds the round-off bound ` +
          `${e1(bound)}, but it is not judged, because ${blockers.join(" and ")}`,
        details,
      }];
    }
    // Any finite order is too low for an exact scheme: expected order Infinity, tolerance 0.
    const where = locateDefect(
      placeEvidence(context),
      options.boundaryKinds ?? {},
      Infinity,
      0,
    );
    return [{
      criterion: "exactness",
      status: "fail",
      reason: `max error ${e1(worst)} on the ${details.grid} grid exceeds the round-off bound ` +
        `${e1(bound)}: the scheme should reproduce this solution exactly, so a stencil or ` +
        `boundary term is wrong${where.text ? `; ${where.text}` : ""}`,
      details: { ...details, location: { blamed: where.blamed, largest: where.largest } },
    }];
  },
};
