import type { RefineConvergence } from "./refine_convergence.ts";

/** Why a safety factor and an order were chosen for a GCI. */
export type SafetyFactorBasis =
  | "observed-near-formal"
  | "observed-far-from-formal"
  | "oscillatory"
  | "no-observed-order"
  | "two-grids";

/** The safety factor and the order a GCI uses, and why. */
export interface SafetyFactorChoice {
  safetyFactor: number;
  order: number;
  basis: SafetyFactorBasis;
  /** The rule in plain words, with its source. */
  reason: string;
}

/** What the rule looks at. */
export interface OrderObservation {
  /** Observed order from the finest three grids (null when none could be computed). */
  observed: number | null;
  /** Formal order of the scheme (> 0). */
  formal: number;
  /** How the finest three grids behave; null when only two grids have a value. */
  convergence: RefineConvergence | null;
}

/**
 * Chooses the safety factor Fs and the order p of a GCI by the trade's published rules.
 *
 * - Two grids: Fs = 3 with the formal order (Roache 1998, "Verification and Validation in
 *   Computational Science and Engineering", Hermosa; Roache, J. Fluids Eng. 116:405–413, 1994).
 * - Observed order within `tolerance` (10 %) of the formal order: Fs = 1.25 with the observed
 *   order; otherwise Fs = 3 with p = min(max(p_observed, `minOrder` 0.5), p_formal) (Oberkampf &
 *   Roy 2010, "Verification and Validation in Scientific Computing", Cambridge, §8.6 — recalled
 *   from memory, check the source). Fs = 1.25 with three or more grids and the observed order is
 *   Roache's (1998) value.
 * - Oscillatory convergence never counts as "within 10 %": the observed order is not trusted, so
 *   the second branch (Fs = 3) applies — our choice, after Roache's rule of Fs = 3 when the
 *   observed order is not used.
 * - No observed order (the finest two grids agree, or the order's fixed point did not settle):
 *   Fs = 3 with the formal order, as for two grids.
 * - Divergent or unchanged data: no GCI (returns null).
 *
 * @param observation Observed and formal order, and the convergence class.
 * @param options `tolerance` on |p_observed − p_formal|/p_formal (default 0.1), `minOrder` the
 *   lower clip (default 0.5).
 * @returns The choice, or null when no GCI should be given.
 * @throws {RangeError} when the formal order is not positive.
 *
 * @example
 * ```ts
 * import assert from "node:assert/strict";
 * import { refineSafetyFactor } from "./refine_safety_factor.ts";
 * // NASA NPARC tutorial: p = 1.786170 is 10.7 % below a formal order of 2 → Fs = 3, p = 1.786170
 * const c = refineSafetyFactor({ observed: 1.78617, formal: 2, convergence: "monotone" });
 * assert.equal(c?.safetyFactor, 3);
 * assert.equal(c?.order, 1.78617);
 * ```
 */
export function refineSafetyFactor(
  observation: OrderObservation,
  options: { tolerance?: number; minOrder?: number } = {},
): SafetyFactorChoice | null {
  const { observed, formal, convergence } = observation;
  const tolerance = options.tolerance ?? 0.1;
  const minOrder = options.minOrder ?? 0.5;
  if (!(formal > 0 && Number.isFinite(formal))) {
    throw new RangeError(
      `Cannot choose a safety factor: formal order must be positive, got ${formal}`,
    );
  }
  if (convergence === "divergent" || convergence === "unchanged") return null;
  const clipped = (p: number) => Math.min(Math.max(p, minOrder), formal);
  if (convergence === null) {
    return {
      safetyFactor: 3,
      order: formal,
      basis: "two-grids",
      reason: "two grids: Fs = 3 with the formal order (Roache 1998)",
    };
  }
  if (observed === null) {
    return {
      safetyFactor: 3,
      order: formal,
      basis: "no-observed-order",
      reason: "no observed order: Fs = 3 with the formal order (Roache 1998)",
    };
  }
  if (convergence === "oscillatory") {
    return {
      safetyFactor: 3,
      order: clipped(observed),
      basis: "oscillatory",
      reason: `oscillatory convergence, observed order not trusted: Fs = 3 with ` +
        `p = min(max(p_observed, ${minOrder}), p_formal) (Oberkampf & Roy 2010, §8.6)`,
    };
  }
  const off = Math.abs(observed - formal) / formal;
  if (off <= tolerance) {
    return {
      safetyFactor: 1.25,
      order: observed,
      basis: "observed-near-formal",
      reason: `observed order within ${100 * tolerance} % of the formal order: Fs = 1.25 with ` +
        `the observed order (Roache 1998; Oberkampf & Roy 2010, §8.6)`,
    };
  }
  return {
    safetyFactor: 3,
    order: clipped(observed),
    basis: "observed-far-from-formal",
    reason: `observed order ${observed > formal ? "above" : "below"} the formal order by more ` +
      `than ${100 * tolerance} %: Fs = 3 with p = min(max(p_observed, ${minOrder}), p_formal) ` +
      `(Oberkampf & Roy 2010, §8.6)`,
  };
}
