import type { OrderRecord } from "../../result/types.ts";
import { locateDefect, type PlaceEvidence } from "../locate.ts";
import { type OrderTrend, orderTrend } from "../order_trend.ts";
import type { Criterion, JudgeContext, NormName } from "./types.ts";
import { e1, f2, NORM_LABEL, NORMS } from "./_words.ts";

/**
 * Errors at or below this share of max |u| (or ten times the requested residual reduction, when
 * larger) are at the floor of round-off and iteration: no order can be read from them.
 */
export const ERROR_FLOOR = 1e-11;

/** The place evidence of a study (max norm, finest grid), for {@link locateDefect}. */
export function placeEvidence(context: JudgeContext): PlaceEvidence[] {
  return (context.input.places ?? []).map((p) => {
    let error: number | null = null;
    for (let i = p.errors.length - 1; i >= 0 && error === null; i--) error = p.errors[i];
    return { place: p.place, error, order: p.order };
  });
}

function trendWords(t: OrderTrend, expected: number): string {
  const pairs = t.deviations.map((d) => f2(d === null ? null : d + expected)).join(", ");
  switch (t.kind) {
    case "within":
      return `within the tolerance`;
    case "falling-within":
      return `within the tolerance on the finest pair but falling away from ${expected} ` +
        `(pairwise ${pairs}): not decided yet — refine further`;
    case "above":
      return `at least the expected order`;
    case "approaching-above":
      return `above ${expected} and still falling toward it (pairwise ${pairs}): not decided yet`;
    case "two-grids":
      return `below ${expected} on the only pair of grids: two grids never decide a failure — ` +
        `add a grid`;
    case "approaching":
      return `below ${expected} but rising toward it (pairwise ${pairs}${
        t.limit !== null ? `, heading to about ${f2(t.limit)}` : ""
      }): pre-asymptotic, not decided yet — refine further`;
    case "settled-below":
      return t.outcome === "inconclusive"
        ? `below ${expected} and not rising (pairwise ${pairs}): not decided on three grids — ` +
          `refine further`
        : t.limit !== null
        ? `rising toward a limit below ${expected} (pairwise ${pairs}; their rises shrink ` +
          `geometrically toward order ${f2(t.limit)}): a lower-order error term remains`
        : `settled below ${expected} (pairwise ${pairs}; the gap to ${expected} no longer ` +
          `closes): the errors converge at about order ${f2(t.heading)}`;
    case "moving-away":
      return `moving away from ${expected} as the grid is refined (pairwise ${pairs}): a ` +
        `lower-order error term takes over${
          t.heading !== null ? `, heading to about order ${f2(t.heading)}` : ""
        }`;
    case "none":
      return `no observed order on the finest pair: the errors are missing, zero or not finite`;
  }
}

function judgeNorm(context: JudgeContext, norm: NormName) {
  const { input, options, blockers } = context;
  const tol = options.tolerance ?? 0.1;
  const override = options.expected.achievable?.[norm];
  const expected = override?.order ?? options.expected.formal;
  const rec: OrderRecord | undefined = input.orders.find((o) =>
    o.region === "all" && o.norm === norm
  );
  const errors = input.errors.map((e) => (e ? e.all[norm] : null));
  const pairwise = rec?.pairwise ?? [];
  const trend = orderTrend(input.h, errors, pairwise, expected, tol);
  const details: Record<string, unknown> = {
    norm,
    region: "all",
    expected,
    tolerance: tol,
    finestPair: trend.finest,
    pairwise,
    fitted: rec?.fitted.order ?? null,
    interval: rec ? [rec.fitted.low, rec.fitted.high] : null,
    trend: trend.kind,
    shrinkRatio: trend.ratio,
    limit: trend.limit,
    heading: trend.heading,
  };
  const why = override ? ` (the case expects ${expected} here: ${override.reason})` : "";
  const interval = rec && rec.fitted.low !== null
    ? `, 95 % interval ${f2(rec.fitted.low)}–${f2(rec.fitted.high)}`
    : "";
  const observed = `observed order ${f2(trend.finest)} on the finest pair and ` +
    `${f2(rec?.fitted.order)} fitted over ${rec?.fitted.points ?? 0} grids${interval} in the ` +
    `${NORM_LABEL[norm]}, expected ${expected} ± ${tol}${why}`;
  const finestError = [...errors].reverse().find((e) => e !== null && e !== undefined) ?? null;
  const floor = Math.max(ERROR_FLOOR, 10 * (options.requestedTolerance ?? 0)) *
    (options.solutionScale ?? 1);
  if (finestError !== null && finestError <= floor) {
    return {
      criterion: "order",
      status: "pass" as const,
      reason: `the errors in the ${NORM_LABEL[norm]} are at the round-off and iteration floor ` +
        `(${e1(finestError)} ≤ ${
          e1(floor)
        }): the scheme reproduces this solution, no order to read`,
      details,
    };
  }
  if (blockers.length > 0 && trend.outcome !== "pass") {
    return {
      criterion: "order",
      status: "inconclusive" as const,
      reason: `${observed}: not judged, because ${blockers.join(" and ")} (see that verdict); ` +
        `the discretization is not to blame on this evidence`,
      details: { ...details, blocked: blockers.slice() },
    };
  }
  let reason = `${observed}: ${trendWords(trend, expected)}`;
  if (trend.outcome === "fail") {
    const where = locateDefect(
      placeEvidence(context),
      options.boundaryKinds ?? {},
      expected,
      tol,
    );
    details.location = { blamed: where.blamed, largest: where.largest };
    if (where.text) reason += `; ${where.text}`;
  }
  return { criterion: "order", status: trend.outcome, reason, details };
}

/**
 * "order" (one verdict per norm, over all points): the whole sequence of pairwise orders decides,
 * by the rule of {@link orderTrend}: pass within tolerance (or above), fail only with three or
 * more grids when the order has settled below or moves away from the expected one (naming the
 * order it heads to and the place: {@link locateDefect}), inconclusive while it approaches. A
 * failed precondition (convergence, iterative error, imposed data) makes a non-passing order
 * inconclusive: the discretization is not blamed for what the solve did.
 */
export const order: Criterion = {
  name: "order",
  measures: "the error falls at the expected order as the grid is refined",
  judge(context) {
    if (context.options.expected.exactToRoundOff) {
      return [{
        criterion: "order",
        status: "not-applicable",
        reason: "exact case: errors should stay at round-off, so the order is not judged",
      }];
    }
    return NORMS.map((norm) => judgeNorm(context, norm));
  },
};
