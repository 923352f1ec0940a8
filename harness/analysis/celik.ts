/** A grid of a three-grid study: representative spacing and the quantity's value. */
export interface GridValue {
  h: number;
  value: number;
}

/** How a quantity behaves over three grids. */
export type ConvergenceType = "monotone" | "oscillatory" | "divergent" | "unknown";

/** Result of the three-grid procedure of Celik et al. (2008); relative figures are fractions. */
export interface CelikResult {
  /** Apparent order p (null when not computable). */
  order: number | null;
  /** φext21 = (r21^p φ1 − φ2)/(r21^p − 1). */
  extrapolated: number | null;
  /** φext32 = (r32^p φ2 − φ3)/(r32^p − 1). */
  extrapolatedCoarse: number | null;
  /** e_a21 = |(φ1 − φ2)/φ1|. */
  relativeError: number | null;
  /** e_ext21 = |(φext21 − φ1)/φext21|. */
  extrapolatedRelativeError: number | null;
  /** GCI_fine21 = Fs·e_a21/(r21^p − 1). */
  gciFine: number | null;
  /** GCI32 = Fs·e_a32/(r32^p − 1), the fine-grid GCI of the coarser pair (grid 2). */
  gciCoarse: number | null;
  r21: number;
  r32: number;
  /** s = sign(ε32/ε21). */
  sign: number;
  /** R = ε21/ε32: 0 < R < 1 monotone, −1 < R < 0 oscillatory, |R| ≥ 1 divergent. */
  convergenceRatio: number | null;
  convergence: ConvergenceType;
  /** Fixed-point iterations used for p, and whether they settled. */
  iterations: number;
  settled: boolean;
}

/**
 * The three-grid procedure of Celik, Ghia, Roache, Freitas, Coleman & Raad, "Procedure for
 * Estimation and Reporting of Uncertainty Due to Discretization in CFD Applications", J. Fluids
 * Eng. 130(7):078001, 2008, for any (non-constant) refinement ratios.
 *
 * Formulas (grid 1 finest): r21 = h2/h1, r32 = h3/h2, ε21 = φ2 − φ1, ε32 = φ3 − φ2,
 * s = sign(ε32/ε21); the apparent order is the fixed point of
 * p = |ln|ε32/ε21| + q(p)| / ln r21, q(p) = ln((r21^p − s)/(r32^p − s)), started from q = 0;
 * φext21 = (r21^p φ1 − φ2)/(r21^p − 1); e_a21 = |(φ1 − φ2)/φ1|;
 * e_ext21 = |(φext21 − φ1)/φext21|; GCI_fine21 = Fs·e_a21/(r21^p − 1) with Fs = 1.25.
 * s < 0 signals oscillatory convergence (the paper's note). The classification by
 * R = ε21/ε32 (monotone 0 < R < 1, oscillatory −1 < R < 0, divergent |R| ≥ 1) is that of Stern,
 * Wilson, Coleman & Paterson, J. Fluids Eng. 123:793–802, 2001 (from memory).
 *
 * @param grids The three grids, named so the order cannot be mixed up.
 * @param options `safetyFactor` (default 1.25), `maxIterations` (default 200),
 *   `tolerance` on successive p (default 1e-13 relative).
 * @returns Every figure of the procedure; figures that cannot be computed are null.
 * @throws {RangeError} when the spacings are not strictly increasing from fine to coarse.
 *
 * @example
 * ```ts
 * import assert from "node:assert/strict";
 * import { celikThreeGrid } from "./celik.ts";
 * // Celik et al. (2008) worked example, first column (from memory): p ≈ 1.53, φext21 ≈ 6.1685
 * const c = celikThreeGrid({
 *   fine: { h: Math.sqrt(1 / 18000), value: 6.063 },
 *   medium: { h: Math.sqrt(1 / 8000), value: 5.972 },
 *   coarse: { h: Math.sqrt(1 / 4500), value: 5.863 },
 * });
 * assert.ok(Math.abs(c.order! - 1.53) < 0.005);
 * ```
 */
export function celikThreeGrid(
  grids: { fine: GridValue; medium: GridValue; coarse: GridValue },
  options: { safetyFactor?: number; maxIterations?: number; tolerance?: number } = {},
): CelikResult {
  const { fine, medium, coarse } = grids;
  const fs = options.safetyFactor ?? 1.25;
  const maxIterations = options.maxIterations ?? 200;
  const tolerance = options.tolerance ?? 1e-13;
  if (!(fine.h > 0 && medium.h > fine.h && coarse.h > medium.h)) {
    throw new RangeError(
      `Cannot apply the three-grid procedure: spacings must grow from fine to coarse, got ` +
        `h = ${fine.h}, ${medium.h}, ${coarse.h}`,
    );
  }
  const r21 = medium.h / fine.h;
  const r32 = coarse.h / medium.h;
  const e21 = medium.value - fine.value;
  const e32 = coarse.value - medium.value;
  const empty: CelikResult = {
    order: null,
    extrapolated: null,
    extrapolatedCoarse: null,
    relativeError: fine.value !== 0 ? Math.abs(e21 / fine.value) : null,
    extrapolatedRelativeError: null,
    gciFine: null,
    gciCoarse: null,
    r21,
    r32,
    sign: 0,
    convergenceRatio: null,
    convergence: "unknown",
    iterations: 0,
    settled: false,
  };
  if (!Number.isFinite(e21) || !Number.isFinite(e32) || e21 === 0 || e32 === 0) return empty;
  const s = Math.sign(e32 / e21);
  const R = e21 / e32;
  const convergence: ConvergenceType = Math.abs(R) >= 1
    ? "divergent"
    : R > 0
    ? "monotone"
    : "oscillatory";
  const lnRatio = Math.log(Math.abs(e32 / e21));
  let p = Math.abs(lnRatio) / Math.log(r21);
  let iterations = 0;
  let settled = false;
  for (; iterations < maxIterations; iterations++) {
    const q = Math.log((r21 ** p - s) / (r32 ** p - s));
    const next = Math.abs(lnRatio + q) / Math.log(r21);
    if (!Number.isFinite(next)) break;
    const change = Math.abs(next - p);
    p = next;
    if (change <= tolerance * Math.max(1, Math.abs(p))) {
      settled = true;
      iterations++;
      break;
    }
  }
  const base = { ...empty, sign: s, convergenceRatio: R, convergence, iterations, settled };
  // a divergent sequence has no meaningful order: the absolute value in the formula would still
  // give a positive p, and extrapolating with it would mislead
  if (!settled || !(p > 0) || convergence === "divergent") return base;
  const rp21 = r21 ** p;
  const rp32 = r32 ** p;
  const extrapolated = (rp21 * fine.value - medium.value) / (rp21 - 1);
  const extrapolatedCoarse = (rp32 * medium.value - coarse.value) / (rp32 - 1);
  const relativeError = fine.value !== 0 ? Math.abs(e21 / fine.value) : null;
  const relativeError32 = medium.value !== 0 ? Math.abs(e32 / medium.value) : null;
  return {
    ...base,
    order: p,
    extrapolated,
    extrapolatedCoarse,
    relativeError,
    extrapolatedRelativeError: extrapolated !== 0
      ? Math.abs((extrapolated - fine.value) / extrapolated)
      : null,
    gciFine: relativeError === null ? null : (fs * relativeError) / (rp21 - 1),
    gciCoarse: relativeError32 === null ? null : (fs * relativeError32) / (rp32 - 1),
  };
}
