/**
 * Multigrid on the stretched hierarchy (`stretched_hierarchy.ts`) and the solve loop of problems
 * with node coordinates or periodic sides; `solve` hands such problems here after validation.
 *
 * Cycles: V (γ = 1), W (γ = 2) and F (an F-cycle on the coarse level followed by a V-cycle) with
 * `cycle.pre` / `cycle.post` sweeps of the level's smoother (`stretched_smoothers.ts`); "fmg"
 * runs its `fmgCycle` cycles from the start (no full-multigrid pass on this path). Stopping rules
 * as in `solve.ts` (converged, max-cycles, diverged, stagnated without the round-off gate).
 *
 * Singular problems (only Neumann or periodic sides, e ≡ 0) with `singular: "mean-zero"`: the
 * solve finds u and λ with A·u = f − λ and the volume-weighted mean of u zero (weights of
 * `stretched_grid.ts`, the trapezoid rule on the node grid). Before every cycle the residual's
 * volume-weighted mean is moved into λ; every coarse level's restricted residual has its
 * volume-weighted mean removed (the null space projected in the cycle); the coarsest level solves
 * the bordered system with the mean of the correction fixed at zero; after every cycle the
 * volume-weighted mean of u is removed.
 *
 * @module
 */
import type { Problem } from "./problem.ts";
import { convergenceFactors } from "./factors.ts";
import type { SolveResult, StopReason } from "./options.ts";
import type { ResolvedSolveOptions } from "./resolve_options.ts";
import { stretchedResidual, toNodes, toUnknowns } from "./discretize_stretched.ts";
import { buildStretchedLevels, type StretchedLevel } from "./stretched_hierarchy.ts";
import { STAGNATION_CYCLES, STAGNATION_FACTOR } from "./solve.ts";

function weightedMean(w: Float64Array, v: Float64Array): number {
  let s = 0, t = 0;
  for (let k = 0; k < v.length; k++) s += w[k] * v[k], t += w[k];
  return s / t;
}

function cycleAt(
  levels: StretchedLevel[],
  l: number,
  kind: "V" | "W" | "F",
  o: ResolvedSolveOptions,
) {
  const L = levels[l];
  if (L.direct !== undefined) {
    L.direct(L.f, L.u);
    return;
  }
  const C = levels[l + 1];
  L.smoother!.smooth(L.u, L.f, o.cycle.pre);
  stretchedResidual(L.op, L.u, L.f, L.r);
  L.transfer!.restrict(L.r, C.f);
  if (C.op.singular) {
    const mean = weightedMean(C.op.weights, C.f);
    for (let k = 0; k < C.f.length; k++) C.f[k] -= mean;
  }
  C.u.fill(0);
  if (kind === "F") {
    cycleAt(levels, l + 1, "F", o);
    cycleAt(levels, l + 1, "V", o);
  } else {
    cycleAt(levels, l + 1, kind, o);
    if (kind === "W" && C.direct === undefined) cycleAt(levels, l + 1, "W", o);
  }
  L.transfer!.interpolateAdd(C.u, L.u);
  L.smoother!.smooth(L.u, L.f, o.cycle.post);
}

/**
 * Solves a validated problem with node coordinates or periodic sides (module doc).
 *
 * @param problem The problem, validated by `validateProblem`.
 * @param o Resolved options.
 * @param singular Whether the problem is singular (accepted with `singular: "mean-zero"`).
 * @returns The solve result; the solution on the public layout, periodic images equal.
 */
export function solveStretched(
  problem: Problem,
  o: ResolvedSolveOptions,
  singular: boolean,
): SolveResult {
  const t0 = performance.now();
  const { levels } = buildStretchedLevels(problem, o);
  const setupSeconds = (performance.now() - t0) / 1000;
  const L = levels[0];
  const { op, u, f, r } = L;
  if (o.initialGuess !== undefined) u.set(toUnknowns(op, o.initialGuess));
  for (let k = 0; k < u.length; k++) if (op.dirichlet[k]) u[k] = f[k];
  let shift = 0;
  const measure = (): number => {
    stretchedResidual(op, u, f, r);
    if (singular) {
      const mean = weightedMean(op.weights, r);
      for (let k = 0; k < r.length; k++) r[k] -= mean, f[k] -= mean;
      shift += mean;
    }
    let s = 0;
    for (let k = 0; k < r.length; k++) s += r[k] * r[k];
    return Math.sqrt(s);
  };
  const removeMean = () => {
    const mean = weightedMean(op.weights, u);
    for (let k = 0; k < u.length; k++) u[k] -= mean;
  };
  if (singular) removeMean();
  const type = o.cycle.type === "fmg" ? o.cycle.fmgCycle : o.cycle.type;
  const r0 = measure();
  const history = [r0];
  let reason: StopReason = "max-cycles";
  let cycles = 0, slow = 0;
  if (r0 === 0) reason = "converged";
  while (reason === "max-cycles" && cycles < o.stop.maxCycles) {
    if (levels.length === 1) L.direct!(f, u);
    else cycleAt(levels, 0, type, o);
    if (singular) removeMean();
    cycles++;
    const rk = measure(), prev = history[history.length - 1];
    history.push(rk);
    if (!Number.isFinite(rk) || rk > o.stop.divergenceFactor * r0) reason = "diverged";
    else if (rk <= o.stop.tolerance * r0) reason = "converged";
    else {
      slow = rk > STAGNATION_FACTOR * prev ? slow + 1 : 0;
      if (slow >= STAGNATION_CYCLES && rk < 1e-10 * r0) reason = "stagnated";
    }
  }
  const seconds = (performance.now() - t0) / 1000;
  const result: SolveResult = {
    solution: toNodes(op, u),
    converged: reason === "converged",
    reason,
    cycles,
    residualHistory: history,
    ...convergenceFactors(history, r0, cycles),
    seconds,
    description: {
      solver: "gridproof-multigrid",
      scheme: o.scheme.upwind ? "upwind" : "central",
      cycle: o.cycle.type === "fmg" ? `${o.cycle.fmgCycle} (fmg not on stretched grids)` : type,
      pre: o.cycle.pre,
      post: o.cycle.post,
      smoother: L.smoother?.describe() ?? { name: o.smoother.name, unused: "direct solve only" },
      // Full weighting and bilinear interpolation in physical coordinates (`stretched_transfer.ts`).
      restriction: "full-weighting",
      interpolation: "bilinear",
      coarseOperator: "rediscretize",
      levels: levels.map((l) => ({ nx: l.op.nx, ny: l.op.ny, coarsening: l.coarsening })),
      tolerance: o.stop.tolerance,
      maxCycles: o.stop.maxCycles,
    },
    setupSeconds,
  };
  if (singular) result.compatibilityShift = shift;
  return result;
}
