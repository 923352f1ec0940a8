import type { ScalingRecord, SolveRecord } from "../result/types.ts";
import { powerLawExponent } from "./power_law_exponent.ts";
import { residualMetrics, type ResidualOptions } from "./residual_metrics.ts";

/** The fields of a solve that the scaling analysis reads. */
export type ScalingSolve = Pick<
  SolveRecord,
  | "nx"
  | "ny"
  | "unknowns"
  | "status"
  | "reason"
  | "residualHistory"
  | "iterations"
  | "converged"
  | "stopReason"
  | "averageFactor"
  | "seconds"
>;

/** Options of {@link scalingRecord}. */
export interface ScalingOptions {
  /** Largest |iterations exponent| still called grid-independent (default 0.1). */
  independenceTolerance?: number;
  /** Passed to {@link residualMetrics} for stagnation and divergence checks. */
  residual?: ResidualOptions;
  /**
   * Smallest grid, in unknowns, that enters the iteration and time fits (default 900, about
   * 30×30): on smaller grids start-up costs and coarse-level solves dominate, so their counts and
   * times say nothing about growth (our choice).
   */
  minUnknowns?: number;
}

/** Default smallest grid of the work fits, in unknowns. */
export const MIN_FIT_UNKNOWNS = 900;

/**
 * Residual behaviour across a grid sequence: fitted exponents of iterations, average convergence
 * factor and solve time against the number of unknowns ({@link powerLawExponent}), a
 * grid-independence judgement and a list of problem solves.
 *
 * Criterion: grid-independent when the iterations exponent ≤ `independenceTolerance` (default 0.1:
 * iterations may grow by at most 2^0.1 ≈ 7 % per fourfold increase of unknowns — our choice;
 * multigrid theory predicts h-independent factors, Trottenberg et al. 2001; Briggs et al. 2000),
 * or when the iteration counts of the finest grids differ by at most one (counts are whole
 * numbers: 3, 3, 4 is no trend, though its fitted exponent is 0.2). The iterations and time
 * exponents are fitted over the finest three grids with at least `minUnknowns` unknowns (the
 * asymptotic trend: the coarsest grids of a study are often solved directly, are pre-asymptotic,
 * or cost no more than starting the solver); the factor exponent over every grid.
 * Only solves with status "ok" enter the fits. A problem is a solve that failed, stopped without
 * converging, stagnated or diverged ({@link residualMetrics}), listed as "nx×ny: reason".
 *
 * @param solves Solves of one case by one solver, any order.
 * @param options See {@link ScalingOptions}.
 * @returns A {@link ScalingRecord}.
 *
 * @example
 * ```ts
 * import assert from "node:assert/strict";
 * import { scalingRecord } from "./scaling_record.ts";
 * const s = (n: number, it: number, sec: number) => ({
 *   nx: n, ny: n, unknowns: (n - 1) ** 2, status: "ok" as const, residualHistory: [],
 *   iterations: it, converged: true, averageFactor: 0.1, seconds: sec,
 * });
 * const r = scalingRecord([s(32, 9, 0.01), s(64, 9, 0.04), s(128, 9, 0.16)]);
 * assert.ok(r.gridIndependent === true && Math.abs(r.iterationsExponent!) < 1e-12);
 * ```
 */
export function scalingRecord(
  solves: readonly ScalingSolve[],
  options: ScalingOptions = {},
): ScalingRecord {
  const tol = options.independenceTolerance ?? 0.1;
  const problems: string[] = [];
  const ok = solves.filter((s) => s.status === "ok").slice().sort((a, b) =>
    a.unknowns - b.unknowns
  );
  for (const s of solves) {
    const where = `${s.nx}×${s.ny}`;
    if (s.status === "failed") {
      problems.push(`${where}: failed${s.reason ? ` (${s.reason})` : ""}`);
      continue;
    }
    if (s.status !== "ok") continue;
    const m = residualMetrics(s.residualHistory, options.residual);
    if (m.diverged) problems.push(`${where}: the residual diverged`);
    else if (m.stagnated && s.converged !== true) {
      problems.push(`${where}: the residual stagnated (factor near 1 for several iterations)`);
    } else if (s.converged === false) {
      problems.push(
        `${where}: stopped without converging${s.stopReason ? ` (${s.stopReason})` : ""}`,
      );
    }
  }
  const unknowns = ok.map((s) => s.unknowns);
  const finest = ok.filter((s) => s.unknowns >= (options.minUnknowns ?? MIN_FIT_UNKNOWNS)).slice(
    -3,
  );
  const iterationsExponent = powerLawExponent(
    finest.map((s) => s.unknowns),
    finest.map((s) => s.iterations),
  );
  const counts = finest.map((s) => s.iterations).filter((n): n is number => n !== null);
  const spreadOfOne = counts.length >= 2 && Math.max(...counts) - Math.min(...counts) <= 1;
  const factorExponent = powerLawExponent(unknowns, ok.map((s) => s.averageFactor));
  const timeExponent = powerLawExponent(
    finest.map((s) => s.unknowns),
    finest.map((s) => s.seconds),
  );
  return {
    iterationsExponent,
    factorExponent,
    timeExponent,
    gridIndependent: iterationsExponent === null ? null : iterationsExponent <= tol || spreadOfOne,
    fittedFrom: finest.length >= 2 ? finest[0].unknowns : null,
    problems,
  };
}
