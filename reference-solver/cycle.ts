/**
 * Multigrid cycles on a {@link Hierarchy} (levels[0] finest). One recursive coarse-grid correction
 * serves V (γ = 1) and W (γ = 2); the F-cycle and full multigrid are short drivers on top.
 *
 * @module
 */
import type { Hierarchy } from "./hierarchy.ts";
import type { CycleName } from "./options.ts";
import { removeMean, residual } from "./_kernels.ts";
import { correctAndSweep } from "./_kernels_pipelined.ts";

/** Sweeps before and after the coarse-grid correction, and FMG settings. */
export interface CycleParams {
  /** Pre-smoothing sweeps ν1. */
  pre: number;
  /** Post-smoothing sweeps ν2. */
  post: number;
  /** Cycle used per level inside full multigrid. Default "V". */
  fmgCycle?: "V" | "W" | "F";
  /** Cycles per level inside full multigrid. Default 1. */
  fmgCyclesPerLevel?: number;
}

/**
 * Coarse-grid correction on level l for levels[l].u, levels[l].f: relax ν1 times, restrict the
 * residual, solve the error equation on level l + 1 with `solveCoarse` (exactly on the coarsest),
 * interpolate and correct, relax ν2 times. On a singular level the restricted residual has its
 * mean removed first (compatibility with the constant null space). On a five-point red–black level
 * (`Level.redBlack`) the pre-smoothing sweeps and the restriction of the residual run in one pass
 * (`sweepAndRestrict`): the residual is restricted from its red nodes only (the black ones are
 * zero after the sweep) and never stored; after the coarse solve the correction is added
 * at the black nodes only, fused into the first post-smoothing pass (`correctAndSweep`: the red
 * nodes are overwritten by the sweep without being read). Every cycle is this one function with a
 * different coarse solve.
 */
function correct(
  h: Hierarchy,
  l: number,
  params: CycleParams,
  solveCoarse: (coarse: number) => void,
): void {
  const L = h.levels[l];
  if (L.direct !== undefined) {
    L.direct.solve(L.u, L.f);
    return;
  }
  const Lc = h.levels[l + 1];
  // Level.redBlack: the pre-smoothing sweeps and the restriction in one pass over memory.
  if (L.redBlack && params.pre > 0) L.transfer!.restrictResidual!(L.op, L.u, L.f, Lc.f, params.pre);
  else {
    L.smoother!.smooth(L.u, L.f, params.pre);
    if (L.r.length !== L.op.length) L.r = L.op.vector();
    residual(L.op, L.u, L.f, L.r);
    if (L.op.singular) removeMean(L.op, L.r);
    L.transfer!.restrict(L.r, Lc.f);
  }
  Lc.u.fill(0);
  solveCoarse(l + 1);
  // Level.redBlack: five-point red–black level, bilinear transfer coarsened both ways.
  if (L.redBlack && params.post > 0) correctAndSweep(L.op, Lc.u, L.u, L.f, params.post);
  else {
    L.transfer!.interpolateAdd(Lc.u, L.u);
    L.smoother!.smooth(L.u, L.f, params.post);
  }
}

/**
 * V-cycle (γ = 1) or W-cycle (γ = 2) on level l: the coarse error equation is solved by γ
 * recursive cycles (one exact solve when the coarse level is the coarsest).
 *
 * @param h The hierarchy.
 * @param l The level (0 = finest).
 * @param gamma 1 for a V-cycle, 2 for a W-cycle.
 * @param params Sweep counts.
 */
export function cycle(h: Hierarchy, l: number, gamma: number, params: CycleParams): void {
  correct(h, l, params, (lc) => {
    const times = h.levels[lc].direct !== undefined ? 1 : gamma;
    for (let g = 0; g < times; g++) cycle(h, lc, gamma, params);
  });
}

/** F-cycle on level l: like {@link cycle}, but the coarse error is found by an F-cycle followed by a V-cycle. */
export function fCycle(h: Hierarchy, l: number, params: CycleParams): void {
  correct(h, l, params, (lc) => {
    fCycle(h, lc, params);
    if (h.levels[lc].direct === undefined) cycle(h, lc, 1, params);
  });
}

function oneCycle(h: Hierarchy, l: number, type: "V" | "W" | "F", params: CycleParams): void {
  if (type === "F") fCycle(h, l, params);
  else cycle(h, l, type === "V" ? 1 : 2, params);
}

/**
 * Full multigrid: solve each level's own problem (rhs) exactly on the coarsest grid, interpolate
 * to the next finer level as its first guess (cubic, `Transfer.interpolateFmg`, where the transfer
 * offers it; otherwise the transfer's own interpolation, e.g. operator-dependent), run `fmgCyclesPerLevel` cycles of
 * `fmgCycle` there, and so on up to the finest, whose result is left in levels[0].u. Coarse
 * levels take their own `rhs`; the finest level uses levels[0].f as the caller left it.
 *
 * @throws {RangeError} For a hierarchy built for another cycle (its coarse levels share rhs and f).
 */
export function fullMultigrid(h: Hierarchy, params: CycleParams): void {
  const levels = h.levels;
  const last = levels.length - 1;
  const type = params.fmgCycle ?? "V", times = params.fmgCyclesPerLevel ?? 1;
  for (let l = 1; l <= last; l++) {
    if (levels[l].f === levels[l].rhs) {
      throw new RangeError(
        'Cannot run full multigrid on this hierarchy: its coarse levels keep no right-hand side of their own; build it with cycle.type "fmg"',
      );
    }
  }
  const C = levels[last];
  if (last > 0) C.f.set(C.rhs);
  C.direct!.solve(C.u, C.f);
  for (let l = last - 1; l >= 0; l--) {
    const L = levels[l];
    const T = L.transfer!;
    if (T.interpolateFmg !== undefined) T.interpolateFmg(levels[l + 1].u, L.u);
    else T.interpolate(levels[l + 1].u, L.u);
    const dir = L.op.dirichlet;
    for (let m = 0; m < dir.length; m++) L.u[dir[m]] = L.rhs[dir[m]];
    // Level 0 works on levels[0].f, which the caller owns (a singular solve shifts it).
    if (l > 0) L.f.set(L.rhs);
    for (let t = 0; t < times; t++) oneCycle(h, l, type, params);
  }
}

/** Runs one cycle of the named kind on the finest level. */
export type CycleRunner = (h: Hierarchy, params: CycleParams) => void;

/**
 * Registered cycles: `V`, `W`, `F`, and `fmg` (one full-multigrid pass; a solve continues with
 * `fmgCycle` cycles after it).
 */
export const CYCLES = {
  V: (h, p) => cycle(h, 0, 1, p),
  W: (h, p) => cycle(h, 0, 2, p),
  F: (h, p) => fCycle(h, 0, p),
  fmg: (h, p) => fullMultigrid(h, p),
} satisfies Record<CycleName, CycleRunner>;
