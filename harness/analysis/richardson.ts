/**
 * Richardson extrapolation of a grid-converging quantity to zero spacing.
 *
 * Formula: f_ext = f1 + (f1 − f2)/(r^p − 1), f1 on the fine grid, f2 on the coarse grid,
 * r = h2/h1 > 1 (Richardson 1910; Roache 1998, "Verification and Validation in Computational
 * Science and Engineering", §5.4; NASA NPARC tutorial "Examining Spatial (Grid) Convergence").
 *
 * @param fine Value on the fine grid f1.
 * @param coarse Value on the coarse grid f2.
 * @param ratio Refinement ratio r = h_coarse/h_fine (> 1).
 * @param order Order p (> 0).
 * @returns The extrapolated value.
 * @throws {RangeError} when r ≤ 1 or p ≤ 0.
 *
 * @example
 * ```ts
 * import assert from "node:assert/strict";
 * import { richardsonExtrapolate } from "./richardson.ts";
 * // f = 1 + h²: f(0.1) = 1.01, f(0.2) = 1.04 → exactly 1
 * assert.ok(Math.abs(richardsonExtrapolate(1.01, 1.04, 2, 2) - 1) < 1e-14);
 * ```
 */
export function richardsonExtrapolate(
  fine: number,
  coarse: number,
  ratio: number,
  order: number,
): number {
  checkRatioOrder(ratio, order, "extrapolate");
  return fine + (fine - coarse) / (ratio ** order - 1);
}

/** Roache's grid convergence index of one grid pair, as fractions (0.01 = 1 %). */
export interface GciPair {
  /** GCI_fine = Fs·|ε|/(r^p − 1): uncertainty band of the fine-grid value. */
  fine: number;
  /** GCI_coarse = Fs·|ε|·r^p/(r^p − 1): the same band expressed for the coarse-grid value. */
  coarse: number;
  /** ε = (f2 − f1)/f1, the relative change between the grids. */
  relativeChange: number;
}

/**
 * Roache's grid convergence index (GCI) of a fine/coarse grid pair.
 *
 * Formulas (Roache, J. Fluids Eng. 116:405–413, 1994; AIAA J. 36:696–702, 1998):
 * ε = (f2 − f1)/f1, GCI_fine = Fs·|ε|/(r^p − 1), GCI_coarse = Fs·|ε|·r^p/(r^p − 1). The safety
 * factor Fs is 3 for a two-grid study (or when the formal rather than an observed p is used) and
 * 1.25 when p is observed from three or more grids (same sources).
 *
 * @param fine f1 (≠ 0).
 * @param coarse f2.
 * @param options `ratio` r = h2/h1 > 1, `order` p > 0, `safetyFactor` Fs (default 1.25).
 * @returns GCI_fine, GCI_coarse and ε as fractions.
 * @throws {RangeError} when r ≤ 1, p ≤ 0, Fs ≤ 0 or f1 = 0 (the relative change is undefined).
 *
 * @example
 * ```ts
 * import assert from "node:assert/strict";
 * import { roacheGci } from "./richardson.ts";
 * const g = roacheGci(0.9705, 0.96854, { ratio: 2, order: 1.786170 });
 * assert.ok(Math.abs(g.fine - 0.00103083) < 1e-8); // NASA NPARC tutorial: 0.103083 %
 * ```
 */
export function roacheGci(
  fine: number,
  coarse: number,
  options: { ratio: number; order: number; safetyFactor?: number },
): GciPair {
  const { ratio, order } = options;
  const fs = options.safetyFactor ?? 1.25;
  checkRatioOrder(ratio, order, "compute a GCI");
  if (!(fs > 0)) {
    throw new RangeError(`Cannot compute a GCI: safety factor must be positive, got ${fs}`);
  }
  if (fine === 0 || !Number.isFinite(fine)) {
    throw new RangeError(
      `Cannot compute a GCI: the fine-grid value is ${fine}, so the relative change is undefined`,
    );
  }
  const relativeChange = (coarse - fine) / fine;
  const rp = ratio ** order;
  return {
    fine: (fs * Math.abs(relativeChange)) / (rp - 1),
    coarse: (fs * Math.abs(relativeChange) * rp) / (rp - 1),
    relativeChange,
  };
}

function checkRatioOrder(ratio: number, order: number, what: string): void {
  if (!(ratio > 1 && Number.isFinite(ratio))) {
    throw new RangeError(
      `Cannot ${what}: refinement ratio must be greater than 1 (coarse h / fine h), got ${ratio}`,
    );
  }
  if (!(order > 0 && Number.isFinite(order))) {
    throw new RangeError(`Cannot ${what}: order must be positive, got ${order}`);
  }
}
