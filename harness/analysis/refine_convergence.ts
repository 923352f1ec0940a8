/** How the finest three grids of a user's study behave. */
export type RefineConvergence = "monotone" | "oscillatory" | "divergent" | "unchanged";

/** A reading of the finest three grids against the scheme's formal order. */
export interface ConvergenceReading {
  convergence: RefineConvergence;
  /** (f3 − f2)/(f2 − f1), grid 1 finest; negative when the differences change sign; null when f1 = f2. */
  differenceRatio: number | null;
  /** What |differenceRatio| is for data f = f0 + α·h^p exactly at the formal order p. */
  expectedDifferenceRatio: number;
}

/**
 * Reads the finest three grids of a study: whether the successive differences shrink (monotone or
 * oscillatory convergence), grow (divergent) or vanish (unchanged), and how their ratio compares
 * with the one the formal order predicts.
 *
 * Classes (grid 1 finest, d21 = f2 − f1, d32 = f3 − f2): both zero → unchanged; |d21| ≥ |d32| →
 * divergent (the differences do not shrink); d21·d32 < 0 → oscillatory; otherwise monotone. For
 * non-zero differences this is the classification by R = d21/d32 of Stern, Wilson, Coleman &
 * Paterson, J. Fluids Eng. 123:793–802, 2001 (from memory), also used by Celik et al. (2008);
 * equal differences (R = 1, order 0) count as divergent here, our choice.
 *
 * Expected ratio (derived): for f_i = f0 + α·h_i^p, d32/d21 = (h3^p − h2^p)/(h2^p − h1^p)
 * = r21^p·(r32^p − 1)/(r21^p − 1), which is r^p for a constant ratio r = r21 = r32. In the
 * asymptotic range the measured ratio approaches this value at the formal order.
 *
 * @param grids The three grids (h and value), named so the order cannot be mixed up.
 * @param options `formalOrder` p_f > 0 of the scheme.
 * @returns The class, the measured and the expected difference ratio.
 * @throws {RangeError} when the spacings do not grow from fine to coarse or p_f ≤ 0.
 *
 * @example
 * ```ts
 * import assert from "node:assert/strict";
 * import { refineConvergence } from "./refine_convergence.ts";
 * // NASA NPARC tutorial data: (0.96178 − 0.96854)/(0.96854 − 0.9705) = 169/49 against 2² = 4
 * const c = refineConvergence({
 *   fine: { h: 1, value: 0.9705 },
 *   medium: { h: 2, value: 0.96854 },
 *   coarse: { h: 4, value: 0.96178 },
 * }, { formalOrder: 2 });
 * assert.equal(c.convergence, "monotone");
 * assert.ok(Math.abs(c.differenceRatio! - 169 / 49) < 1e-9 && c.expectedDifferenceRatio === 4);
 * ```
 */
export function refineConvergence(
  grids: {
    fine: { h: number; value: number };
    medium: { h: number; value: number };
    coarse: { h: number; value: number };
  },
  options: { formalOrder: number },
): ConvergenceReading {
  const { fine, medium, coarse } = grids;
  const p = options.formalOrder;
  if (!(fine.h > 0 && medium.h > fine.h && coarse.h > medium.h)) {
    throw new RangeError(
      `Cannot read the convergence: spacings must grow from fine to coarse, got ` +
        `h = ${fine.h}, ${medium.h}, ${coarse.h}`,
    );
  }
  if (!(p > 0 && Number.isFinite(p))) {
    throw new RangeError(`Cannot read the convergence: formal order must be positive, got ${p}`);
  }
  const r21 = medium.h / fine.h;
  const r32 = coarse.h / medium.h;
  const d21 = medium.value - fine.value;
  const d32 = coarse.value - medium.value;
  const expectedDifferenceRatio = (r21 ** p * (r32 ** p - 1)) / (r21 ** p - 1);
  const differenceRatio = d21 === 0 ? null : d32 / d21;
  const convergence: RefineConvergence = d21 === 0 && d32 === 0
    ? "unchanged"
    : Math.abs(d21) >= Math.abs(d32)
    ? "divergent"
    : d21 * d32 < 0
    ? "oscillatory"
    : "monotone";
  return { convergence, differenceRatio, expectedDifferenceRatio };
}
