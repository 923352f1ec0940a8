import { REORDER_GAIN } from "../reorderings.ts";
import type { Criterion } from "./types.ts";
import { gridName } from "./_words.ts";

/**
 * "point-order" (vertex and cell layouts): the values come in the protocol's point order (x
 * fastest). It fails when, on some grid, a simple reordering of the returned values (y-fastest,
 * rows or columns reversed, shifted by one) matches the exact solution at least
 * {@link REORDER_GAIN} times better than the values as given — the values may be right, their
 * order is not. A precondition: errors of a scrambled field say nothing about the discretization.
 */
export const pointOrder: Criterion = {
  name: "point-order",
  measures: "the values come in the protocol's point order (x fastest)",
  precondition: true,
  judge({ input, blockers }) {
    const scrambled = input.solves.filter((s) => s.status === "ok" && s.outputOrder);
    if (scrambled.length === 0) return [];
    blockers.push("the output is in the wrong point order");
    const how = scrambled[0].outputOrder!;
    return [{
      criterion: "point-order",
      status: "fail",
      reason: `read in another order the values match the exact solution at least ` +
        `${REORDER_GAIN} times better on ${scrambled.map(gridName).join(", ")}: ${how}. The ` +
        `protocol wants x fastest (index j·mx + i); fix the loop that writes the reply`,
      details: { grids: scrambled.map(gridName), reordering: how, gain: REORDER_GAIN },
    }];
  },
};
