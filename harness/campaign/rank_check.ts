/**
 * The rank-count check: for every study whose solver asks for it (a solver file's `rankCheck`),
 * one grid is solved at 1 rank and at N ranks and the two solutions are compared; the
 * "rank-invariance" criterion judges the difference. Both solves are journaled (keyed with their
 * rank count), the comparison on the second, so a resume does not solve them again.
 *
 * @module
 */
import type { CompiledCase } from "../../cases/types.ts";
import type { RankComparison, SolveRecord } from "../result/mod.ts";
import type { SolveOutcome, Solver } from "../solvers/mod.ts";
import { type JournaledSolve, type JournalWriter, solveKey } from "./journal.ts";
import { measureOutcome } from "./measure.ts";
import { gridFor, plannedInputs } from "./run.ts";

/** Options of {@link runRankChecks}. */
export interface RankCheckOptions {
  /** Relative residual tolerance asked of the solver. Default 1e-10. */
  tolerance?: number;
  /** Journal to append the solves to. Default: none. */
  journal?: JournalWriter;
  /** Solves journaled by an earlier run, by key: a finished pair is not solved again. */
  finished?: Map<string, JournaledSolve>;
  /** When aborted, no pair starts and a pair that ends after the abort is not recorded. */
  signal?: AbortSignal;
}

/** The relative residual reduction a solve reached, or null without a history. */
function reduction(outcome: SolveOutcome): number | null {
  const h = outcome.residualHistory;
  if (h.length < 2 || !(h[0] > 0)) return null;
  return h[h.length - 1] / h[0];
}

/**
 * Compares two outcomes of one grid: max |b − a| / max |a| and where it is largest; null
 * difference with a reason when they cannot be compared.
 */
export function compareRanks(
  a: SolveOutcome,
  b: SolveOutcome,
  ranks: [number, number],
): RankComparison {
  const base = {
    nx: a.nx,
    ny: a.ny,
    ranks,
    reductions: [reduction(a), reduction(b)] as [number | null, number | null],
  };
  for (const [o, n] of [[a, ranks[0]], [b, ranks[1]]] as const) {
    if (o.status !== "ok") {
      return { ...base, difference: null, at: null, reason: `at ${n} ranks: ${o.reason}` };
    }
  }
  const same = a.values.length === b.values.length &&
    a.x.every((x, k) => x === b.x[k] && a.y[k] === b.y[k]);
  if (!same) {
    return {
      ...base,
      difference: null,
      at: null,
      reason: "the two solves replied on different points",
    };
  }
  let scale = 0, worst = -1, at = 0;
  for (let k = 0; k < a.values.length; k++) {
    scale = Math.max(scale, Math.abs(a.values[k]));
    const d = Math.abs(b.values[k] - a.values[k]);
    if (!(d <= worst)) [worst, at] = [d, k];
  }
  return {
    ...base,
    difference: worst / (scale > 0 ? scale : 1),
    at: { x: a.x[at], y: a.y[at] },
  };
}

/**
 * Runs the rank-count pairs of every case × solver with a `rankCheck`, on its grid (default the
 * finest of `grids(kase, solver)`), one pair at a time.
 *
 * @returns the comparisons by study key (`caseId`, NUL, `solver`); a pair whose solves do not
 *   apply to the case is left out
 */
export async function runRankChecks(
  cases: CompiledCase[],
  solvers: Solver[],
  grids: (kase: CompiledCase, solver: Solver) => number[],
  options: RankCheckOptions = {},
): Promise<Map<string, RankComparison[]>> {
  const tolerance = options.tolerance ?? 1e-10;
  const found = new Map<string, RankComparison[]>();
  for (const kase of cases) {
    for (const solver of solvers) {
      const check = solver.rankCheck;
      if (!check || options.signal?.aborted) continue;
      const n = check.grid ?? Math.max(...grids(kase, solver));
      const grid = gridFor(kase, n);
      const ranks: [number, number] = [1, check.ranks];
      const inputs = plannedInputs({ kase, solver, ...grid }, tolerance);
      const keyOf = (r: number) =>
        solveKey({ caseId: kase.id, solver: solver.info.name, ...grid, ranks: r });
      const earlier = options.finished?.get(keyOf(ranks[1]));
      let comparison: RankComparison | undefined;
      if (earlier?.record.rankComparison && earlier.inputs === inputs) {
        comparison = earlier.record.rankComparison;
      } else {
        const outcomes = await Promise.all(
          ranks.map((r) =>
            solver.solve({ case: kase, ...grid, scheme: solver.info.scheme, tolerance, ranks: r })
          ),
        );
        if (options.signal?.aborted) return found;
        if (outcomes.some((o) => o.status === "not-applicable")) continue;
        comparison = compareRanks(outcomes[0], outcomes[1], ranks);
        const records: SolveRecord[] = outcomes.map((o, k) => ({
          ...measureOutcome(kase, solver.info.name, o, tolerance),
          ranks: ranks[k],
        }));
        records[1].rankComparison = comparison;
        for (const r of records) options.journal?.append(r, inputs);
      }
      const key = `${kase.id}\u0000${solver.info.name}`;
      found.set(key, [...(found.get(key) ?? []), comparison]);
    }
  }
  return found;
}
