import { locateDefect } from "../locate.ts";
import type { Criterion } from "./types.ts";
import { e1, gridName } from "./_words.ts";
import { placeEvidence } from "./order.ts";

/**
 * "exactness" (cases the scheme reproduces exactly): max error on every grid ≤
 * rel·max|u| + abs (defaults 1e-9 and 1e-12; the campaign widens rel for a loose residual
 * tolerance). A solver stopped at a relative residual of about 1e-10 leaves algebraic errors well
 * under this, while any truncation error of a smooth non-polynomial term on practical grids is far
 * above it (our choice of bound).
 */
export const exactness: Criterion = {
  name: "exactness",
  measures: "a solution the scheme reproduces exactly comes back to round-off",
  judge(context) {
    const { input, options, blockers } = context;
    if (!options.expected.exact) return [];
    const rel = options.exactTolerance?.rel ?? 1e-9;
    const abs = options.exactTolerance?.abs ?? 1e-12;
    const scale = options.solutionScale ?? 1;
    const bound = rel * scale + abs;
    const details: Record<string, unknown> = { bound, rel, abs, solutionScale: scale };
    let worst = -1;
    let worstAt = -1;
    input.errors.forEach((e, i) => {
      if (e && !(e.all.max <= worst)) {
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
    const where = locateDefect(placeEvidence(context), options.boundaryKinds ?? {}, 99, 0);
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
