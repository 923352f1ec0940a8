/** Residual behaviour of one iterative solve. */
export interface ResidualMetrics {
  /** Iterations recorded (history length − 1). */
  iterations: number;
  /** Average factor ρ̄ = (‖r_k‖/‖r_0‖)^(1/k); null without two entries or with a zero start. */
  averageFactor: number | null;
  /** Geometric mean of the last `window` step factors ‖r_j‖/‖r_{j−1}‖. */
  asymptoticFactor: number | null;
  /** First k with ‖r_k‖ ≤ tolerance·‖r_0‖; null when never reached. */
  iterationsToTolerance: number | null;
  /** The last `stagnationRun` step factors all lie in [stagnationFactor, 1] and the tolerance was not reached. */
  stagnated: boolean;
  /** A non-finite residual, or ‖r_k‖ > divergenceLimit·‖r_0‖. */
  diverged: boolean;
}

/** Options of {@link residualMetrics}, with defaults. */
export interface ResidualOptions {
  /** Relative reduction that counts as converged (default 1e-8). */
  tolerance?: number;
  /** Steps in the asymptotic-factor window (default 5). */
  window?: number;
  /** A step factor at or above this counts as making no progress (default 0.95). */
  stagnationFactor?: number;
  /** Consecutive no-progress steps that make a stagnation (default 5). */
  stagnationRun?: number;
  /** Growth over the initial residual that counts as divergence (default 1e5; PETSc's default dtol, from memory). */
  divergenceLimit?: number;
}

/**
 * Convergence metrics of one residual history ‖r_0‖, ‖r_1‖, … (‖r_0‖ the initial residual).
 *
 * Formulas: average convergence factor ρ̄ = (‖r_k‖/‖r_0‖)^(1/k) (Trottenberg, Oosterlee &
 * Schüller, Multigrid, 2001, §2.5 — their q̂^(m)); asymptotic factor = geometric mean of the last
 * `window` step factors ‖r_j‖/‖r_{j−1}‖ (an estimate of the spectral radius of the iteration);
 * stagnation = the final `stagnationRun` step factors all in [stagnationFactor, 1] while the
 * tolerance was not reached; divergence = a non-finite residual or growth above
 * divergenceLimit·‖r_0‖.
 *
 * @param history Residual norms, initial first (may be empty).
 * @param options See {@link ResidualOptions}.
 * @returns The metrics; factors are null when they cannot be computed.
 *
 * @example
 * ```ts
 * import assert from "node:assert/strict";
 * import { residualMetrics } from "./residual_metrics.ts";
 * const m = residualMetrics([1, 0.1, 0.01, 0.001], { tolerance: 0.005 });
 * assert.ok(Math.abs(m.averageFactor! - 0.1) < 1e-12 && m.iterationsToTolerance === 3);
 * ```
 */
export function residualMetrics(
  history: readonly number[],
  options: ResidualOptions = {},
): ResidualMetrics {
  const tolerance = options.tolerance ?? 1e-8;
  const window = options.window ?? 5;
  const stagnationFactor = options.stagnationFactor ?? 0.95;
  const stagnationRun = options.stagnationRun ?? 5;
  const divergenceLimit = options.divergenceLimit ?? 1e5;
  const k = Math.max(0, history.length - 1);
  const r0 = history[0];
  const diverged = history.some((r) => !Number.isFinite(r)) ||
    (r0 > 0 && history.some((r) => r > divergenceLimit * r0));
  const result: ResidualMetrics = {
    iterations: k,
    averageFactor: null,
    asymptoticFactor: null,
    iterationsToTolerance: null,
    stagnated: false,
    diverged,
  };
  if (history.length === 0 || !(r0 > 0) || !Number.isFinite(r0)) return result;
  for (let j = 0; j < history.length; j++) {
    if (history[j] <= tolerance * r0) {
      result.iterationsToTolerance = j;
      break;
    }
  }
  if (k === 0) return result;
  const last = history[k];
  if (Number.isFinite(last) && last >= 0) result.averageFactor = (last / r0) ** (1 / k);
  const w = Math.min(window, k);
  const start = history[k - w];
  if (start > 0 && Number.isFinite(start) && Number.isFinite(last) && last >= 0) {
    result.asymptoticFactor = (last / start) ** (1 / w);
  }
  if (result.iterationsToTolerance === null && k >= stagnationRun) {
    let run = 0;
    for (let j = k; j > k - stagnationRun; j--) {
      const f = history[j] / history[j - 1];
      if (f >= stagnationFactor && f <= 1) run++;
    }
    result.stagnated = run === stagnationRun;
  }
  return result;
}
