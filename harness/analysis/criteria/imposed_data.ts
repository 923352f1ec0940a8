import { IMPOSED_BOUND } from "../imposed_data.ts";
import { sideWords } from "../locate.ts";
import type { SideName } from "../../result/types.ts";
import type { Criterion } from "./types.ts";
import { e1, gridName } from "./_words.ts";

/**
 * "imposed-data": on vertex layouts the values returned at Dirichlet nodes must equal the data
 * sent, to round-off ({@link IMPOSED_BOUND} relative to max |u|), for any vertex scheme. When they
 * do not, the verdict names the sides and tests the likely causes: an output in another point
 * order (does a reordered field reproduce the data?), dropped or shifted values, the side's data
 * mishandled. A precondition: a field that does not return its own boundary data cannot be judged
 * for order.
 */
export const imposedData: Criterion = {
  name: "imposed-data",
  measures: "Dirichlet values come back unchanged at the nodes of a vertex-layout reply",
  precondition: true,
  judge({ input, options, blockers }) {
    const checked = input.solves.filter((s) => s.status === "ok" && s.imposed);
    if (checked.length === 0) return [];
    const bad: { grid: string; sides: SideName[]; worst: number; reordering: string | null }[] = [];
    for (const s of checked) {
      const sides = (Object.keys(s.imposed!.sides) as SideName[]).filter((k) =>
        !(s.imposed!.sides[k]! <= IMPOSED_BOUND)
      );
      if (sides.length > 0) {
        const worst = Math.max(...sides.map((k) => s.imposed!.sides[k]!));
        bad.push({ grid: gridName(s), sides, worst, reordering: s.imposed!.reordering });
      }
    }
    const details = { bound: IMPOSED_BOUND, grids: bad };
    const kinds = options.boundaryKinds ?? {};
    if (bad.length === 0) {
      return [{
        criterion: "imposed-data",
        status: "pass",
        reason: `the Dirichlet values come back to round-off on every grid (bound ` +
          `${e1(IMPOSED_BOUND)}·max|u|)`,
        details,
      }];
    }
    const sides = [...new Set(bad.flatMap((b) => b.sides))];
    const where = sides.map((k) => sideWords(k, kinds)).join(", ");
    const reorder = bad.find((b) => b.reordering !== null)?.reordering;
    const cause = reorder
      ? `the field read in another order reproduces the data — ${reorder}: the solver writes its ` +
        `output in the wrong point order (the protocol wants x fastest, index j·(nx+1)+i), the ` +
        `values themselves may be right`
      : `no simple reordering (y-fastest, rows or columns reversed, shifted by one) reproduces ` +
        `them: the boundary nodes are dropped, shifted or overwritten, or the side's data are ` +
        `read or applied wrongly`;
    blockers.push(
      reorder ? "the output is in the wrong point order" : "the Dirichlet values do not come back",
    );
    return [{
      criterion: "imposed-data",
      status: "fail",
      reason: `the values returned at the Dirichlet nodes of ${where} differ from the imposed ` +
        `data by up to ${e1(Math.max(...bad.map((b) => b.worst)))}·max|u| (on ${
          bad.map((b) => b.grid).join(", ")
        }; round-off is ${e1(IMPOSED_BOUND)}): ${cause}`,
      details: { ...details, sides, reordering: reorder ?? null },
    }];
  },
};
