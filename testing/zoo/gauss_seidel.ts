/**
 * Lexicographic Gauss–Seidel on a {@link LinearSystem}, for the defects that stop an iteration
 * early or do all their work on one level.
 *
 * @module
 */
import { type LinearSystem, residualNorm } from "./system.ts";

/** Stopping rule of {@link gaussSeidel}. */
export interface SweepStop {
  /** Stop once ‖r‖/‖r₀‖ is at or below this. */
  relative: number;
  /** Stop after this many sweeps regardless. */
  maxSweeps: number;
}

/** Iterate, residual norms (‖r₀‖ first, one per sweep) and whether `relative` was reached. */
export interface SweepResult {
  u: Float64Array;
  history: number[];
  sweeps: number;
  reached: boolean;
}

/**
 * Runs Gauss–Seidel sweeps in row order from u = 0, recording the true residual after each.
 *
 * @param system the system (every row must hold its diagonal)
 * @param stop relative target and sweep cap
 * @returns the iterate and its honest history
 *
 * @example
 * ```ts
 * import { addEntry, emptySystem } from "./system.ts";
 * import { gaussSeidel } from "./gauss_seidel.ts";
 * const s = emptySystem(1, 0);
 * addEntry(s, 0, 0, 2);
 * s.rhs[0] = 2;
 * gaussSeidel(s, { relative: 1e-12, maxSweeps: 5 }).sweeps; // 1
 * ```
 */
export function gaussSeidel(system: LinearSystem, stop: SweepStop): SweepResult {
  const { n, cols, vals, rhs, slots } = system;
  const u = new Float64Array(n);
  const r0 = residualNorm(system, u);
  const history = [r0];
  if (r0 === 0) return { u, history, sweeps: 0, reached: true };
  let sweeps = 0;
  while (sweeps < stop.maxSweeps) {
    for (let i = 0; i < n; i++) {
      let s = rhs[i];
      let diag = 0;
      const base = i * slots;
      for (let t = 0; t < slots; t++) {
        const c = cols[base + t];
        if (c === i) diag = vals[base + t];
        else if (c >= 0) s -= vals[base + t] * u[c];
      }
      u[i] = s / diag;
    }
    sweeps++;
    const r = residualNorm(system, u);
    history.push(r);
    if (r <= stop.relative * r0) return { u, history, sweeps, reached: true };
  }
  return { u, history, sweeps, reached: false };
}
