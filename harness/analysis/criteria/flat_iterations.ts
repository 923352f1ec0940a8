import type { Criterion } from "./types.ts";
import { f2 } from "./_words.ts";

/**
 * An observed iterations exponent may exceed the declared growth by this much before the work
 * criterion fails (iteration counts are whole numbers and fits over three grids are coarse; a
 * single-level iteration sits 0.5–0.9 above multigrid's 0, our choice).
 */
export const GROWTH_MARGIN = 0.25;

/** Time may grow this much faster than N^(1 + declared growth) before a warning (noisy clocks). */
export const TIME_MARGIN = 0.5;

/** Growth assumed when a solver declares none: SOR with a good ω, or CG without multigrid. */
export const DEFAULT_GROWTH = 0.5;

/**
 * "flat-iterations": the iterations stay flat as the grid is refined, or grow no faster than the
 * solver declares — the iteration-count exponent g in iterations ∝ N^g, fitted over the finer
 * grids only (scaling record), may exceed the declared growth (default {@link DEFAULT_GROWTH};
 * multigrid and direct solvers declare 0 and are held to flat counts, Gauss–Seidel declares 1)
 * by at most {@link GROWTH_MARGIN}. A single-level iteration whose count grows like N (work like
 * N²) therefore fails by default. Counts that differ by at most one pass. The
 * time exponent is judged as advice only (a warning when it exceeds 1 + growth +
 * {@link TIME_MARGIN}): wall clocks on shared machines are too noisy to fail on.
 */
export const flatIterations: Criterion = {
  name: "flat-iterations",
  measures: "the iteration count stays flat (or grows no faster than declared) under refinement",
  judge({ input, options }) {
    const s = input.scaling;
    const growth = options.iterationGrowth ?? DEFAULT_GROWTH;
    const strict = options.workStrictness ?? "fail";
    if (strict === "off") return [];
    const details = {
      iterationsExponent: s.iterationsExponent,
      timeExponent: s.timeExponent,
      factorExponent: s.factorExponent,
      declaredGrowth: growth,
      margin: GROWTH_MARGIN,
      fittedFrom: s.fittedFrom ?? null,
    };
    if (s.iterationsExponent === null) {
      return [{
        criterion: "flat-iterations",
        status: "not-applicable",
        reason: "fewer than two of the finer grids reported iteration counts",
        details,
      }];
    }
    const from = s.fittedFrom ? ` (fitted from ${s.fittedFrom} unknowns up)` : "";
    const words = `iterations grow like N^${f2(s.iterationsExponent)} with the unknowns N${from}`;
    const declared = growth > 0.1 ? `the allowed N^${f2(growth)}` : "flat iterations";
    const over = s.iterationsExponent > growth + GROWTH_MARGIN && s.gridIndependent !== true;
    if (over) {
      return [{
        criterion: "flat-iterations",
        status: strict === "fail" ? "fail" : "warn",
        reason:
          `${words}, beyond ${declared} (margin ${GROWTH_MARGIN}): the work per solve grows ` +
          `like N^${f2(1 + s.iterationsExponent)}, as with a single-level iteration — check the ` +
          `coarse-grid correction, or declare the growth your method has ("iterationGrowth" in ` +
          `the solver file)`,
        details,
      }];
    }
    const slow = s.timeExponent !== null && s.timeExponent > 1 + growth + TIME_MARGIN;
    if (slow) {
      return [{
        criterion: "flat-iterations",
        status: "warn",
        reason: `${words}, but the solve time grows like N^${
          f2(s.timeExponent)
        }: more work per iteration than expected (advice: wall time is noisy)`,
        details,
      }];
    }
    return [{
      criterion: "flat-iterations",
      status: "pass",
      reason: `${words}: within ${declared}`,
      details,
    }];
  },
};
