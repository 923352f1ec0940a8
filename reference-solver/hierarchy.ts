/**
 * The level hierarchy: operators rediscretized on coarser grids, with smoothers, transfers and the
 * coarsest-grid direct solver, all set up once.
 *
 * @module
 */
import type { Domain, Problem } from "./problem.ts";
import type { LevelOperator } from "./level.ts";
import { discretize } from "./discretize.ts";
import { createSmoother, type Smoother } from "./smoothers.ts";
import { createTransfer, type Transfer } from "./transfer.ts";
import { createDirectSolver, type DirectSolver } from "./direct_solver.ts";
import { type ResolvedSolveOptions, resolveOptions } from "./resolve_options.ts";
import type { SolveOptions } from "./options.ts";
import { validateProblem } from "./validate.ts";

/** How a level passes to the next coarser one; "direct" marks the coarsest, solved by banded LU. */
export type Coarsening = "both" | "x" | "y" | "direct";

/** One level with its work vectors (all padded, see `level.ts`). */
export interface Level {
  /** The level's operator. */
  op: LevelOperator;
  /** Right-hand side of this level's own discretized problem (coarse f and boundary data injected). */
  rhs: Float64Array;
  /** Iterate on the finest level, error of the coarse-grid equation on coarser ones. */
  u: Float64Array;
  /** Right-hand side of the current equation (on the finest level: `rhs` itself). */
  f: Float64Array;
  /** Residual work vector. */
  r: Float64Array;
  /** How this level passes to the next coarser one. */
  coarsening: Coarsening;
  /** Present on every level but the coarsest. */
  smoother?: Smoother;
  /** Transfer to the next coarser level (absent on the coarsest). */
  transfer?: Transfer;
  /** Present on the coarsest level only. */
  direct?: DirectSolver;
}

/**
 * The hierarchy. Level numbering: `levels[0]` is the finest grid, `levels[levels.length − 1]`
 * the coarsest; level l + 1 is coarser than level l.
 */
export interface Hierarchy {
  /** The levels, finest first. */
  levels: Level[];
}

/**
 * The coarsening of an nx × ny level with mesh widths hx, hy at depth `depth` (0 = finest).
 *
 * Rules, in order: the direct solve when the level is the last allowed (`maxLevels`) or has at
 * most `maxDirectUnknowns` nodes; a direction can be coarsened when its count is even and ≥ 4 (a
 * coarse grid keeps at least 2 intervals). With `semiCoarsening`, a direction whose mesh width is
 * at most 1/√2 of the other's is coarsened alone (grid-induced anisotropy, e.g. 100×30 on a
 * square, is thus removed level by level so point smoothers stay effective; anisotropy of the
 * coefficients a, c is left to line smoothers); otherwise both when both can, else the one that
 * can. Without `semiCoarsening`, both or none.
 */
export function chooseCoarsening(
  grid: { nx: number; ny: number; hx: number; hy: number },
  depth: number,
  coarse: ResolvedSolveOptions["coarse"],
): Coarsening {
  const { nx, ny, hx, hy } = grid;
  if (depth + 1 >= coarse.maxLevels) return "direct";
  if ((nx + 1) * (ny + 1) <= coarse.maxDirectUnknowns) return "direct";
  const canX = nx % 2 === 0 && nx >= 4, canY = ny % 2 === 0 && ny >= 4;
  if (!coarse.semiCoarsening) return canX && canY ? "both" : "direct";
  const ratio = hx / hy;
  if (canX && ratio <= Math.SQRT1_2) return "x";
  if (canY && ratio >= Math.SQRT2) return "y";
  if (canX && canY) return "both";
  return canX ? "x" : canY ? "y" : "direct";
}

/** Injects a problem onto the grid coarsened by (cx, cy): every sample taken, never re-evaluated. */
export function coarsenProblem(p: Problem, cx: 1 | 2, cy: 1 | 2): Problem {
  const nx = p.nx / cx, ny = p.ny / cy;
  const inject = (v: Float64Array) => {
    const out = new Float64Array((nx + 1) * (ny + 1));
    for (let j = 0; j <= ny; j++) {
      for (let i = 0; i <= nx; i++) out[j * (nx + 1) + i] = v[cy * j * (p.nx + 1) + cx * i];
    }
    return out;
  };
  const side = (v: Float64Array, c: 1 | 2, n: number) =>
    Float64Array.from({ length: n + 1 }, (_, k) => v[c * k]);
  const b = p.boundary;
  return {
    domain: p.domain,
    nx,
    ny,
    a: inject(p.a),
    b: inject(p.b),
    c: inject(p.c),
    d: inject(p.d),
    e: inject(p.e),
    f: inject(p.f),
    boundary: {
      west: { ...b.west, values: side(b.west.values, cy, ny) },
      east: { ...b.east, values: side(b.east.values, cy, ny) },
      south: { ...b.south, values: side(b.south.values, cx, nx) },
      north: { ...b.north, values: side(b.north.values, cx, nx) },
    },
  };
}

/**
 * Builds the hierarchy of a validated problem with resolved options.
 *
 * @throws {RangeError} If the coarsest grid is too large for banded LU or singular.
 */
export function buildHierarchy(problem: Problem, options: ResolvedSolveOptions): Hierarchy {
  const levels: Level[] = [];
  let p = problem;
  for (let depth = 0;; depth++) {
    const { op, rhs } = discretize(p, options.scheme.upwind);
    const coarsening = chooseCoarsening(
      { nx: p.nx, ny: p.ny, hx: op.hx, hy: op.hy },
      depth,
      options.coarse,
    );
    const level: Level = {
      op,
      rhs,
      u: op.vector(),
      f: depth === 0 ? rhs : op.vector(),
      r: op.vector(),
      coarsening,
    };
    levels.push(level);
    if (coarsening === "direct") {
      level.direct = createDirectSolver(op);
      break;
    }
    level.smoother = createSmoother(options.smoother.name, op, { omega: options.smoother.omega });
    p = coarsenProblem(p, coarsening === "y" ? 1 : 2, coarsening === "x" ? 1 : 2);
  }
  for (let l = 0; l + 1 < levels.length; l++) {
    levels[l].transfer = createTransfer(
      options.transfer.restriction,
      levels[l].op,
      levels[l + 1].op,
    );
  }
  return { levels };
}

/**
 * Lists the levels a solve would use, finest first, without building them.
 *
 * @param grid The finest grid counts and the domain (default the unit square; it sets hx/hy).
 * @param options Solve options (defaults as in `resolveOptions`).
 * @returns One entry per level; the last has coarsening "direct" (banded LU).
 *
 * @example
 * ```ts
 * import { describeLevels } from "./hierarchy.ts";
 * const levels = describeLevels({ nx: 64, ny: 64 });
 * // 64×64 → 32×32 → 16×16 (both) → 8×8 (direct: 9² = 81 unknowns)
 * if (levels.length !== 4) throw new Error("levels");
 * ```
 */
export function describeLevels(
  grid: { nx: number; ny: number; domain?: Domain },
  options?: SolveOptions,
): { nx: number; ny: number; coarsening: Coarsening }[] {
  const o = resolveOptions(options);
  const out: { nx: number; ny: number; coarsening: Coarsening }[] = [];
  const d = grid.domain ?? { x0: 0, x1: 1, y0: 0, y1: 1 };
  let { nx, ny } = grid;
  for (let depth = 0;; depth++) {
    const hx = (d.x1 - d.x0) / nx, hy = (d.y1 - d.y0) / ny;
    const coarsening = chooseCoarsening({ nx, ny, hx, hy }, depth, o.coarse);
    out.push({ nx, ny, coarsening });
    if (coarsening === "direct") return out;
    if (coarsening !== "y") nx /= 2;
    if (coarsening !== "x") ny /= 2;
  }
}

/**
 * Discretizes a problem on its own grid and returns the level operator: the entry point for
 * component tests (one smoother sweep, a direct solve, transfers) on the padded layout.
 *
 * @param problem The problem (validated here).
 * @param options `upwind` (default false) and `singular` (default "refuse").
 * @returns The level operator; its `rhs` is available via {@link discretize}.
 * @throws {RangeError} For an invalid problem (see `validateProblem`).
 *
 * @example
 * ```ts
 * import { buildLevel } from "./hierarchy.ts";
 * const n = 4, N = (n + 1) ** 2, one = new Float64Array(N).fill(1), zero = new Float64Array(N);
 * const bc = { kind: "dirichlet" as const, values: new Float64Array(n + 1) };
 * const level = buildLevel({
 *   domain: { x0: 0, x1: 1, y0: 0, y1: 1 }, nx: n, ny: n, a: one, b: zero, c: one, d: zero,
 *   e: zero, f: zero, boundary: { west: bc, east: bc, south: bc, north: bc },
 * });
 * if (level.C[level.index(2, 2)] !== -64) throw new Error("−4/h² at h = 1/4");
 * ```
 */
export function buildLevel(
  problem: Problem,
  options: { upwind?: boolean; singular?: "refuse" | "mean-zero" } = {},
): LevelOperator {
  validateProblem(problem, { singular: options.singular });
  return discretize(problem, options.upwind ?? false).op;
}
