/**
 * Work units of a cycle or of full multigrid on a built hierarchy, counted from the floating-point
 * operations of the kernels the cycle runs (not timed). One work unit (WU) is one smoothing sweep
 * on the finest grid: its floating-point operations (flops) per node times the finest node count.
 * Every other step is its flop count on its level divided by that.
 *
 * Counts per node, read off the loops in `_kernels.ts`, `_kernels_pipelined.ts`,
 * `cubic_interpolation.ts` and `banded_lu.ts` (a "symmetric" level has E = W and N = S and runs
 * the loops that add the two neighbours first):
 * - point sweep: 7 flops symmetric (u = D⁻¹(f − W(u_W + u_E) − S(u_S + u_N))), 9 otherwise;
 * - residual f − A·u: 8 symmetric, 10 otherwise;
 * - fused red-residual restriction (red–black levels): the residual at the red nodes that enter
 *   (coinciding and odd–odd nodes) plus 6 per coarse node ((4r + four neighbours)/16);
 * - unfused restriction: the residual at every node plus 17 per coarse node (nine weights);
 * - correction: red–black levels add it at the black nodes only, 3 flops each (mean of two coarse
 *   values, added); otherwise bilinear at every fine node, 1 (coinciding), 3 (edge), 5 (centre);
 * - cubic FMG interpolation: 5 per fine node that is not a coarse node ((−1, 9, 9, −1)/16);
 * - coarsest solve: banded LU forward and back substitution, 6·unknowns·bandwidth.
 * Copies and fills (f ← rhs, u ← 0, Dirichlet values) cost memory traffic but no flops and are not
 * counted; neither are the stop test's norms. The timed measure of the bench (FMG seconds over one
 * fine sweep's) includes them and the per-call overhead on small grids, so it is higher.
 *
 * @module
 */
import type { Hierarchy, Level } from "./hierarchy.ts";
import type { CycleParams } from "./cycle.ts";

/** What to count. */
export type CountedCycle = "V" | "W" | "F" | "fmg";

function nodes(L: Level): number {
  return (L.op.nx + 1) * (L.op.ny + 1);
}

function symmetric(L: Level): boolean {
  return L.op.W === L.op.E && L.op.S === L.op.N;
}

function sweepFlops(L: Level): number {
  return symmetric(L) ? 7 : 9;
}

/** Flops of level l's own work in one coarse-grid correction (its sweeps and both transfers). */
function levelFlops(h: Hierarchy, l: number, params: CycleParams): number {
  const L = h.levels[l];
  if (L.direct !== undefined) {
    const n = nodes(L), band = Math.min(L.op.nx, L.op.ny) + 1;
    return 6 * n * band;
  }
  const C = h.levels[l + 1];
  const cnx = C.op.nx, cny = C.op.ny, coarseNodes = nodes(C);
  const residual = symmetric(L) ? 8 : 10;
  let flops = (params.pre + params.post) * sweepFlops(L) * nodes(L);
  if (L.redBlack && params.pre > 0) {
    flops += residual * ((cnx + 1) * (cny + 1) + cnx * cny) + 6 * coarseNodes;
  } else flops += residual * nodes(L) + 17 * coarseNodes;
  if (L.redBlack && params.post > 0) {
    flops += 3 * ((cny + 1) * cnx + cny * (cnx + 1));
  } else {
    // Coinciding nodes 1 flop, nodes on a coarse edge 3, cell centres 5 (both directions
    // coarsened; semi-coarsening has only coinciding and edge nodes).
    const fine = nodes(L), centres = L.coarsening === "both" ? cnx * cny : 0;
    flops += coarseNodes + 3 * (fine - coarseNodes - centres) + 5 * centres;
  }
  return flops;
}

function cycleFlops(h: Hierarchy, l: number, kind: "V" | "W" | "F", params: CycleParams): number {
  const own = levelFlops(h, l, params);
  if (h.levels[l].direct !== undefined) return own;
  const coarseDirect = h.levels[l + 1].direct !== undefined;
  if (kind === "F") {
    return own + cycleFlops(h, l + 1, "F", params) +
      (coarseDirect ? 0 : cycleFlops(h, l + 1, "V", params));
  }
  const times = coarseDirect ? 1 : kind === "W" ? 2 : 1;
  return own + times * cycleFlops(h, l + 1, kind, params);
}

/**
 * Work units of one cycle (`V`, `W`, `F`) on the finest level, or of one full-multigrid pass
 * (`fmg`: the coarsest solve, then on each finer level a cubic interpolation and
 * `fmgCyclesPerLevel` cycles of `fmgCycle`), counted as in the module doc.
 *
 * @param h A built hierarchy (its operators tell symmetric loops and red–black levels apart).
 * @param kind What to count.
 * @param params Sweep counts and FMG settings, as the cycle takes them.
 * @returns Flops over the flops of one point sweep on the finest level.
 *
 * @example
 * ```ts
 * import { buildHierarchy, resolveOptions } from "./mod.ts";
 * import { workUnits } from "./work_units.ts";
 * const n = 64, N = (n + 1) ** 2, one = new Float64Array(N).fill(1), zero = new Float64Array(N);
 * const bc = { kind: "dirichlet" as const, values: new Float64Array(n + 1) };
 * const h = buildHierarchy({
 *   domain: { x0: 0, x1: 1, y0: 0, y1: 1 }, nx: n, ny: n, a: one, b: zero, c: one, d: zero,
 *   e: zero, f: one, boundary: { west: bc, east: bc, south: bc, north: bc },
 * }, resolveOptions());
 * const wu = workUnits(h, "V", { pre: 2, post: 1 });
 * if (!(wu > 3 && wu < 6)) throw new Error(`V(2,1) costs about 4·4/3 WU, got ${wu}`);
 * ```
 */
export function workUnits(h: Hierarchy, kind: CountedCycle, params: CycleParams): number {
  const unit = sweepFlops(h.levels[0]) * nodes(h.levels[0]);
  if (kind !== "fmg") return cycleFlops(h, 0, kind, params) / unit;
  const type = params.fmgCycle ?? "V", times = params.fmgCyclesPerLevel ?? 1;
  const last = h.levels.length - 1;
  let flops = levelFlops(h, last, params);
  for (let l = last - 1; l >= 0; l--) {
    flops += 5 * (nodes(h.levels[l]) - nodes(h.levels[l + 1]));
    flops += times * cycleFlops(h, l, type, params);
  }
  return flops / unit;
}
