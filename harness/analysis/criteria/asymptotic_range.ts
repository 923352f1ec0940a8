import type { QuantityRecord } from "../../result/types.ts";
import { celikThreeGrid } from "../celik.ts";
import type { Criterion, Finding, Strictness } from "./types.ts";
import { f2 } from "./_words.ts";

/**
 * "asymptotic-range" (advisory, warns by default): |GCI_23/(r^p·GCI_12) − 1| ≤ 0.1 for every
 * quantity (Roache 1994: the ratio is 1 in the asymptotic range), and, with four or more grids, the
 * quantity's observed order from the finest three grids and from the next three differ by at most
 * 0.1. The second test is needed because, with p observed from the same three grids and a constant
 * ratio, the GCI ratio equals |f1/f2| identically (derived) and only flags large changes.
 */
export const asymptoticRange: Criterion = {
  name: "asymptotic-range",
  measures: "the quantities of interest are in the asymptotic range, so their GCI is reliable",
  judge({ input, options }) {
    const strict: Strictness = options.asymptoticRange ?? "warn";
    if (strict === "off") return [];
    if (options.expected.exactToRoundOff) {
      return [{
        criterion: "asymptotic-range",
        status: "not-applicable",
        reason: "exact case: quantities converge to round-off, the GCI does not apply",
      }];
    }
    return [judgeAsymptotic(input.quantities, input.h, strict, {
      ratio: options.asymptoticTolerance ?? 0.1,
      settle: options.settleTolerance ?? 0.1,
    })];
  },
};

function judgeAsymptotic(
  quantities: QuantityRecord[],
  h: number[],
  strict: Strictness,
  tol: { ratio: number; settle: number },
): Finding {
  const settle = quantities.map((q) => ({ name: q.name, ...settledOrders(q, h) }));
  const details = {
    tolerance: tol.ratio,
    settleTolerance: tol.settle,
    ratios: Object.fromEntries(quantities.map((q) => [q.name, q.asymptoticRatio])),
    orders: Object.fromEntries(settle.map((s) => [s.name, [s.previous, s.finest]])),
  };
  const rated = quantities.filter((q) => q.asymptoticRatio !== null);
  if (rated.length === 0) {
    return {
      criterion: "asymptotic-range",
      status: "not-applicable",
      reason: "no quantity had three grids with an observed order, so the GCI ratio is unknown",
      details,
    };
  }
  const off = rated.filter((q) => Math.abs(q.asymptoticRatio! - 1) > tol.ratio);
  const moving = settle.filter((s) =>
    s.previous !== null && s.finest !== null && Math.abs(s.finest - s.previous) > tol.settle
  );
  const list = (qs: QuantityRecord[]) =>
    qs.map((q) => `${q.name} ${q.asymptoticRatio!.toFixed(3)}`).join(", ");
  if (off.length === 0 && moving.length === 0) {
    return {
      criterion: "asymptotic-range",
      status: "pass",
      reason: `GCI_23/(r^p·GCI_12) is within 1 ± ${tol.ratio} for every quantity (${list(rated)})` +
        (settle.some((s) => s.previous !== null)
          ? ` and the observed orders have settled within ${tol.settle}`
          : ""),
      details,
    };
  }
  const parts: string[] = [];
  if (off.length > 0) {
    parts.push(`GCI_23/(r^p·GCI_12) is outside 1 ± ${tol.ratio} for ${list(off)}`);
  }
  if (moving.length > 0) {
    parts.push(
      `the observed order still moves between the last two grid triples for ${
        moving.map((s) => `${s.name} (${f2(s.previous)} → ${f2(s.finest)})`).join(", ")
      }`,
    );
  }
  return {
    criterion: "asymptotic-range",
    status: strict === "fail" ? "fail" : "warn",
    reason: `${parts.join("; ")}: these quantities are not yet in the asymptotic range, so ` +
      `their GCI is not reliable — refine further`,
    details,
  };
}

/** Observed orders of a quantity from the finest three grids and from the three before. */
function settledOrders(
  q: QuantityRecord,
  h: number[] | undefined,
): { finest: number | null; previous: number | null } {
  const finest = q.order;
  if (!h || h.length !== q.values.length) return { finest, previous: null };
  const usable = q.values.map((v, i) => (v === null ? -1 : i)).filter((i) => i >= 0);
  if (usable.length < 4) return { finest, previous: null };
  const [c, m, f] = usable.slice(-4, -1);
  const r = celikThreeGrid({
    fine: { h: h[f], value: q.values[f]! },
    medium: { h: h[m], value: q.values[m]! },
    coarse: { h: h[c], value: q.values[c]! },
  });
  return { finest, previous: r.order };
}
