/**
 * The validated entry point: checks the problem and options, builds the hierarchy, and cycles until
 * a stopping rule fires. Non-convergence is returned as data.
 *
 * @module
 */
import type { Problem } from "./problem.ts";
import { convergenceFactors } from "./factors.ts";
import type { SolveOptions, SolverDescription, SolveResult, StopReason } from "./options.ts";
import { validateProblem } from "./validate.ts";
import { isStretched } from "./validate_stretched.ts";
import { solveStretched } from "./stretched_solve.ts";
import { type ResolvedSolveOptions, resolveOptions } from "./resolve_options.ts";
import { buildHierarchy, type Hierarchy } from "./hierarchy.ts";
import { unpadInPlace } from "./level.ts";
import { type CycleParams, CYCLES } from "./cycle.ts";
import {
  addToNodes,
  norm2,
  redResidualNorm2,
  removeMean,
  removeTrapezoidMean,
  residual,
  residualNorm2,
  roundoffScale,
} from "./_kernels.ts";

/** Per-cycle factor above which a cycle counts as making no progress. */
export const STAGNATION_FACTOR = 0.9;
/** Consecutive no-progress cycles that, at the round-off floor, mean stagnation. */
export const STAGNATION_CYCLES = 3;
/**
 * The round-off floor of a relative residual is estimated as ε·‖|f| + |A|·|u|‖₂ / ‖r₀‖₂; slow
 * cycles below this multiple of it are stagnation, not divergence.
 */
export const FLOOR_MULTIPLE = 100;

function describe(h: Hierarchy, o: ResolvedSolveOptions): SolverDescription {
  const finest = h.levels[0];
  return {
    solver: "gridproof-multigrid",
    scheme: o.scheme.upwind ? "upwind" : "central",
    cycle: o.cycle.type === "fmg" ? `fmg+${o.cycle.fmgCycle}` : o.cycle.type,
    pre: o.cycle.pre,
    post: o.cycle.post,
    smoother: finest.smoother?.describe() ?? { name: o.smoother.name, unused: "direct solve only" },
    restriction: o.transfer.restriction,
    interpolation: h.interpolation,
    coarseOperator: h.coarseOperator,
    levels: h.levels.map((L) => ({ nx: L.op.nx, ny: L.op.ny, coarsening: L.coarsening })),
    tolerance: o.stop.tolerance,
    maxCycles: o.stop.maxCycles,
  };
}

/**
 * Solves a·u_xx + m·u_xy + c·u_yy + b·u_x + d·u_y + e·u = f, or with a conductivity
 * ∇·(K∇u) + b·u_x + d·u_y + e·u = f, by geometric multigrid (discretizations in `discretize.ts`
 * and `discretize_conservative.ts`; coarse operators in `hierarchy.ts`).
 *
 * Stopping: converged when ‖r_k‖₂ ≤ tolerance·‖r₀‖₂; diverged when ‖r_k‖ is not finite or exceeds
 * divergenceFactor·‖r₀‖; stagnated when {@link STAGNATION_CYCLES} consecutive cycles each reduce
 * the residual by less than {@link STAGNATION_FACTOR} while the relative residual is already below
 * {@link FLOOR_MULTIPLE} × its estimated round-off floor; otherwise max-cycles. With `cycle.type:
 * "fmg"`, the first cycle is one full-multigrid pass and later ones are `fmgCycle` cycles.
 *
 * Singular problems (only Neumann-like sides, e ≡ 0) with `singular: "mean-zero"`: the discrete
 * system A·u = f is then solvable only for compatible f, and u only up to a constant. The solve
 * finds u and a constant λ with A·u = f − λ and the trapezoid-rule mean of u (its discrete
 * ∫u/area) zero. Before every cycle the residual's mean is moved into λ (the working right-hand
 * side is shifted by it, so the residual becomes mean-free); every level removes the mean of its
 * residual before restricting it; the coarsest level solves its bordered system exactly (see
 * `createDirectSolver`); after every cycle the mean of u is removed. λ is returned as
 * `compatibilityShift` (close to zero for data compatible up to truncation error); residual norms
 * are those of the shifted system.
 *
 * Problems with node coordinates (stretched grids) or periodic sides are solved by the multigrid
 * of `stretched_solve.ts` (same options and result; the singular case there fixes the
 * volume-weighted mean, which on a uniform grid is the trapezoid mean above).
 *
 * @param problem The discrete problem (validated here).
 * @param options Solve options; defaults in `resolveOptions`.
 * @returns The solution and convergence record. Never throws for non-convergence.
 * @throws {RangeError} For an invalid problem or options (see `validateProblem`, `resolveOptions`).
 *
 * @example
 * ```ts
 * import { solve } from "./solve.ts";
 * const n = 16, N = (n + 1) ** 2, one = new Float64Array(N).fill(1), zero = new Float64Array(N);
 * const bc = { kind: "dirichlet" as const, values: new Float64Array(n + 1) };
 * const result = solve({
 *   domain: { x0: 0, x1: 1, y0: 0, y1: 1 }, nx: n, ny: n, a: one, b: zero, c: one, d: zero,
 *   e: zero, f: one, boundary: { west: bc, east: bc, south: bc, north: bc },
 * }, { coarse: { maxDirectUnknowns: 25 } });
 * if (!result.converged) throw new Error(result.reason);
 * ```
 */
export function solve(problem: Problem, options?: SolveOptions): SolveResult {
  const o = resolveOptions(options);
  const singular = validateProblem(problem, { singular: o.singular });
  const guess = o.initialGuess;
  if (guess !== undefined) {
    const count = (problem.nx + 1) * (problem.ny + 1);
    if (guess.length !== count) {
      throw new RangeError(
        `Invalid solver option initialGuess: expected ${count} values for a ${problem.nx}×${problem.ny} grid, got ${guess.length}`,
      );
    }
    for (let k = 0; k < count; k++) {
      if (!Number.isFinite(guess[k])) {
        throw new RangeError(
          `Invalid solver option initialGuess[${k}]: value ${
            guess[k]
          } is not finite; give a finite guess or none`,
        );
      }
    }
  }
  // Node coordinates or periodic sides: the stretched path (`stretched_solve.ts`).
  if (isStretched(problem)) return solveStretched(problem, o, singular);
  const t0 = performance.now();
  const h = buildHierarchy(problem, o);
  const setupSeconds = (performance.now() - t0) / 1000;
  const L = h.levels[0];
  // A singular solve shifts its own copy of the right-hand side (see the doc above).
  if (singular) L.f = L.rhs.slice();
  const { op, u, f, r } = L;
  if (guess !== undefined) u.set(op.pad(guess));
  // Dirichlet rows hold their values from the start, so their residual is zero.
  for (let m = 0; m < op.dirichlet.length; m++) u[op.dirichlet[m]] = f[op.dirichlet[m]];
  const params: CycleParams = {
    pre: o.cycle.pre,
    post: o.cycle.post,
    fmgCycle: o.cycle.fmgCycle,
    fmgCyclesPerLevel: o.cycle.fmgCyclesPerLevel,
  };
  let shift = 0;
  // After red–black post-smoothing the black residuals are zero: measure the red ones only.
  const redOnly = L.redBlack === true && o.cycle.post > 0;
  const measure = (after: boolean): number => {
    if (!singular) return after && redOnly ? redResidualNorm2(op, u, f) : residualNorm2(op, u, f);
    residual(op, u, f, r);
    const mean = removeMean(op, r);
    addToNodes(op, f, -mean);
    shift += mean;
    return norm2(r);
  };
  const r0 = measure(false);
  const history = [r0];
  let reason: StopReason = "max-cycles";
  let cycles = 0;
  if (r0 === 0) reason = "converged";
  else {
    const first = CYCLES[o.cycle.type];
    const next = CYCLES[o.cycle.type === "fmg" ? o.cycle.fmgCycle : o.cycle.type];
    let slow = 0;
    let floorGate = -1;
    while (cycles < o.stop.maxCycles) {
      (cycles === 0 ? first : next)(h, params);
      if (singular) removeTrapezoidMean(op, u);
      cycles++;
      const rk = measure(true);
      const prev = history[history.length - 1];
      history.push(rk);
      if (!Number.isFinite(rk)) {
        reason = "diverged";
        break;
      }
      if (rk <= o.stop.tolerance * r0) {
        reason = "converged";
        break;
      }
      if (rk > o.stop.divergenceFactor * r0) {
        reason = "diverged";
        break;
      }
      slow = rk > STAGNATION_FACTOR * prev ? slow + 1 : 0;
      if (slow >= STAGNATION_CYCLES) {
        if (floorGate < 0) floorGate = FLOOR_MULTIPLE * Number.EPSILON * roundoffScale(op, u, f);
        if (rk < floorGate) {
          reason = "stagnated";
          break;
        }
      }
    }
  }
  const seconds = (performance.now() - t0) / 1000;
  const result: SolveResult = {
    // Memory (issue 16): the finished iterate becomes the solution in place, no new array.
    solution: unpadInPlace(op, u),
    converged: reason === "converged",
    reason,
    cycles,
    residualHistory: history,
    ...convergenceFactors(history, r0, cycles),
    seconds,
    description: describe(h, o),
    setupSeconds,
  };
  if (singular) result.compatibilityShift = shift;
  return result;
}
