/**
 * The level hierarchy: coarse operators either rediscretized on coarser grids or formed as Galerkin
 * products R·A·P (`galerkin.ts`), with smoothers, transfers and the coarsest-grid direct solver,
 * all set up once.
 *
 * Which coarse operator: `coarse.operator` when given; by default ("auto") Galerkin for a problem
 * with a conductivity (a coefficient that may jump by orders of magnitude is not resampled on a
 * coarse grid well by any local average, while R·A·P keeps the fine fluxes) and rediscretization
 * otherwise (the behaviour before Galerkin existed, kept unchanged; a mixed term m rediscretizes
 * without difficulty, being sampled at the nodes like a and c).
 *
 * Which interpolation: `transfer.interpolation` when given; by default operator-dependent for a
 * Galerkin hierarchy of a problem with a conductivity (`prolongation.ts`; its restriction is its
 * volume-scaled transpose), bilinear otherwise. Why (V(2,1), red–black / four-colour Gauss–Seidel,
 * measured with `tests/reference_solver/_factor.ts`, see `bench/jump_bench.ts`):
 * - a jump of 10⁴ or 10⁶ across x = ½, a grid line on every level: 0.029 on 64 … 512 with either
 *   interpolation (Galerkin alone suffices);
 * - a jump of 10⁴ across x = ½ + h, a fine grid line that no coarse grid has: bilinear 0.39,
 *   0.42, 0.44, 0.44 on 32 … 256, operator-dependent 0.042, 0.063, 0.084, 0.10; a checkerboard
 *   meeting at (½ + h, ½ + h): bilinear 0.43 … 0.66, operator-dependent 0.056 … 0.098;
 * - a smooth full tensor, K = [[2, 1], [1, 2]]: bilinear 0.10, operator-dependent 0.058, flat;
 * - left open: a checkerboard of 10⁴ meeting at (½, ½), a coarse node on every level. Both
 *   interpolations coincide there and the V-cycle factor grows by about 0.07 per refinement
 *   (0.15, 0.22, 0.29, 0.36, 0.42 on 32 … 512); the F-cycle stays at 0.10 … 0.15.
 *
 * @module
 */
import type { Conductivity, Domain, Problem, Side, ValuedCondition } from "./problem.ts";
import { isNinePoint, type LevelOperator } from "./level.ts";
import { discretize } from "./discretize.ts";
import { createSmoother, type Smoother } from "./smoothers.ts";
import { createTransfer, type Transfer } from "./transfer.ts";
import { createDirectSolver, type DirectSolver } from "./direct_solver.ts";
import { type ResolvedSolveOptions, resolveOptions } from "./resolve_options.ts";
import type { CoarseOperatorName, SolveOptions } from "./options.ts";
import { validateProblem } from "./validate.ts";
import { galerkinOperator } from "./galerkin.ts";
import { type InterpolationName, operatorProlongation } from "./prolongation.ts";
import { createProlongationTransfer } from "./prolongation_transfer.ts";
import { residual } from "./_kernels.ts";

/** How a level passes to the next coarser one; "direct" marks the coarsest, solved by banded LU. */
export type Coarsening = "both" | "x" | "y" | "direct";

/** One level with its work vectors (all padded, see `level.ts`). */
export interface Level {
  /** The level's operator. */
  op: LevelOperator;
  /**
   * Right-hand side of this level's own problem, used by full multigrid: rediscretized levels take
   * their injected f and boundary data; a Galerkin level takes R·(rhs − A·g) of the level above
   * (g its Dirichlet values, so the boundary data enter the coarse rows) and the injected
   * Dirichlet values in its Dirichlet rows. On the coarse levels of a hierarchy built for any
   * cycle but `fmg` it is the same array as `f` (no full multigrid will read it, and f is
   * overwritten by every restriction); `fullMultigrid` refuses such a hierarchy.
   */
  rhs: Float64Array;
  /** Iterate on the finest level, error of the coarse-grid equation on coarser ones. */
  u: Float64Array;
  /** Right-hand side of the current equation (on the finest level: `rhs` itself). */
  f: Float64Array;
  /**
   * Residual work vector; empty (length 0) on a level that restricts fused after red–black
   * pre-smoothing (`redBlack` and pre ≥ 1) and never needs it: the cycle allocates it on first use
   * should it take the unfused path after all.
   */
  r: Float64Array;
  /** How this level passes to the next coarser one. */
  coarsening: Coarsening;
  /** Present on every level but the coarsest. */
  smoother?: Smoother;
  /** Transfer to the next coarser level (absent on the coarsest). */
  transfer?: Transfer;
  /** Present on the coarsest level only. */
  direct?: DirectSolver;
  /**
   * True when the level's smoother is red–black on a five-point, non-singular level and its
   * transfer restricts the residual fused (`Transfer.restrictResidual`): after any red–black sweep
   * the black residuals are zero, so the cycle restricts without storing the residual and the
   * stop test measures the red residuals only. Such a transfer is always the bilinear one of
   * `transfer.ts` coarsened both ways, so the cycle also adds the correction fused into the first
   * post-smoothing sweep (`correctAndSweep`).
   */
  redBlack?: boolean;
}

/**
 * The hierarchy. Level numbering: `levels[0]` is the finest grid, `levels[levels.length − 1]`
 * the coarsest; level l + 1 is coarser than level l.
 */
export interface Hierarchy {
  /** The levels, finest first. */
  levels: Level[];
  /** How the coarse operators were built (the resolved choice, never "auto"). */
  coarseOperator: CoarseOperatorName;
  /** The interpolation between levels (the resolved choice, never "auto"). */
  interpolation: InterpolationName;
}

/**
 * The coarse operator a problem gets: the option when it names one, otherwise ("auto") Galerkin
 * for a problem with a conductivity and rediscretization for every other problem.
 *
 * @example
 * ```ts
 * import { coarseOperatorFor } from "./hierarchy.ts";
 * if (coarseOperatorFor({} as never, "auto") !== "rediscretize") throw new Error("default");
 * ```
 */
export function coarseOperatorFor(
  problem: Problem,
  option: CoarseOperatorName | "auto",
): CoarseOperatorName {
  if (option !== "auto") return option;
  return problem.conductivity !== undefined ? "galerkin" : "rediscretize";
}

/**
 * The interpolation a hierarchy gets: the option when it names one, otherwise ("auto")
 * operator-dependent for Galerkin hierarchies of problems with a conductivity and bilinear for
 * every other.
 *
 * @throws {RangeError} For operator-dependent interpolation with rediscretized coarse operators.
 *
 * @example
 * ```ts
 * import { interpolationFor } from "./hierarchy.ts";
 * if (interpolationFor({} as never, "galerkin", "auto") !== "bilinear") throw new Error("default");
 * ```
 */
export function interpolationFor(
  problem: Problem,
  coarseOperator: CoarseOperatorName,
  option: InterpolationName | "auto",
): InterpolationName {
  if (option === "operator-dependent" && coarseOperator !== "galerkin") {
    throw new RangeError(
      'Invalid solver option transfer.interpolation: "operator-dependent" needs Galerkin coarse operators (the coarse operator must be formed from the interpolation), got coarse operator "rediscretize"; set coarse.operator to "galerkin" or use "bilinear"',
    );
  }
  if (option !== "auto") return option;
  return coarseOperator === "galerkin" && problem.conductivity !== undefined
    ? "operator-dependent"
    : "bilinear";
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

/**
 * A conductivity on the grid coarsened by (cx, cy): a coarse edge is made of cx (x-edges) or cy
 * (y-edges) fine edges in series, so k11 (along x) and k22 (along y) take the harmonic mean of
 * their fine values, and k12 the arithmetic mean.
 */
function coarsenConductivity(
  K: Conductivity,
  p: { nx: number; ny: number },
  cx: 1 | 2,
  cy: 1 | 2,
): Conductivity {
  const nx = p.nx / cx, ny = p.ny / cy;
  const alongX = (v: Float64Array, harmonic: boolean) => {
    const out = new Float64Array(nx * (ny + 1));
    for (let J = 0; J <= ny; J++) {
      for (let I = 0; I < nx; I++) {
        const q = cy * J * p.nx + cx * I;
        out[J * nx + I] = cx === 1
          ? v[q]
          : harmonic
          ? 2 / (1 / v[q] + 1 / v[q + 1])
          : 0.5 * (v[q] + v[q + 1]);
      }
    }
    return out;
  };
  const alongY = (v: Float64Array, harmonic: boolean) => {
    const out = new Float64Array((nx + 1) * ny);
    for (let J = 0; J < ny; J++) {
      for (let I = 0; I <= nx; I++) {
        const q = cy * J * (p.nx + 1) + cx * I, q1 = q + p.nx + 1;
        out[J * (nx + 1) + I] = cy === 1
          ? v[q]
          : harmonic
          ? 2 / (1 / v[q] + 1 / v[q1])
          : 0.5 * (v[q] + v[q1]);
      }
    }
    return out;
  };
  const x12 = K.alongX.k12, y12 = K.alongY.k12;
  return {
    alongX: {
      k11: alongX(K.alongX.k11, true),
      ...(x12 === undefined ? {} : { k12: alongX(x12, false) }),
    },
    alongY: {
      k22: alongY(K.alongY.k22, true),
      ...(y12 === undefined ? {} : { k12: alongY(y12, false) }),
    },
  };
}

/**
 * Injects a problem onto the grid coarsened by (cx, cy): every node sample taken (m included),
 * never re-evaluated; a conductivity is combined edge by edge (harmonic mean of k11 along x and of
 * k22 along y over the fine edges that make up a coarse edge, arithmetic mean of k12).
 */
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
  const b = p.boundary as Record<Side, ValuedCondition>;
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
    ...(p.m === undefined ? {} : { m: inject(p.m) }),
    ...(p.conductivity === undefined
      ? {}
      : { conductivity: coarsenConductivity(p.conductivity, p, cx, cy) }),
  };
}

/**
 * The right-hand side of a Galerkin level's own problem (see {@link Level.rhs}): R·(rhs − A·g) of
 * the finer level, and the finer level's Dirichlet values in the Dirichlet rows.
 */
function galerkinRhs(fine: Level, transfer: Transfer, coarse: LevelOperator): Float64Array {
  const g = fine.op.vector();
  for (const k of fine.op.dirichlet) g[k] = fine.rhs[k];
  const t = fine.op.vector();
  residual(fine.op, g, fine.rhs, t);
  const out = coarse.vector();
  transfer.restrict(t, out);
  const cx = fine.op.nx / coarse.nx, cy = fine.op.ny / coarse.ny;
  for (const k of coarse.dirichlet) {
    const I = (k % coarse.stride) - 1, J = Math.floor(k / coarse.stride) - 1;
    out[k] = fine.rhs[fine.op.index(cx * I, cy * J)];
  }
  return out;
}

/**
 * Builds the hierarchy of a validated problem with resolved options: level 0 discretized from
 * the problem, coarser ones rediscretized or formed by Galerkin products (see the module doc);
 * transfers of a Galerkin hierarchy use the volume scaling of `transfer.ts`.
 *
 * @throws {RangeError} If the coarsest grid is too large for banded LU or singular.
 */
export function buildHierarchy(problem: Problem, options: ResolvedSolveOptions): Hierarchy {
  const levels: Level[] = [];
  const coarseOperator = coarseOperatorFor(problem, options.coarse.operator);
  const galerkin = coarseOperator === "galerkin";
  const restriction = options.transfer.restriction;
  const interpolation = interpolationFor(problem, coarseOperator, options.transfer.interpolation);
  let p = problem;
  const keepCoarseRhs = options.cycle.type === "fmg";
  for (let depth = 0;; depth++) {
    let op: LevelOperator, rhs: Float64Array;
    const above = levels[depth - 1];
    if (depth === 0 || !galerkin) ({ op, rhs } = discretize(p, options.scheme.upwind));
    else {
      const cx = above.coarsening === "y" ? 1 : 2, cy = above.coarsening === "x" ? 1 : 2;
      if (interpolation === "operator-dependent") {
        const prolongation = operatorProlongation(above.op, { cx, cy });
        op = galerkinOperator(above.op, { coarsening: { cx, cy }, prolongation });
        above.transfer = createProlongationTransfer(prolongation, above.op, op);
      } else {
        op = galerkinOperator(above.op, { coarsening: { cx, cy }, restriction });
        above.transfer = createTransfer(restriction, above.op, op, { scaling: "volume" });
      }
      rhs = galerkinRhs(above, above.transfer, op);
    }
    const coarsening = chooseCoarsening(
      { nx: op.nx, ny: op.ny, hx: op.hx, hy: op.hy },
      depth,
      options.coarse,
    );
    const level: Level = {
      op,
      rhs,
      u: op.vector(),
      // Only full multigrid reads a coarse level's own rhs; other cycles overwrite f by every
      // restriction, so it may take the rhs array (memory, issue 16).
      f: depth === 0 || !keepCoarseRhs ? rhs : op.vector(),
      r: new Float64Array(0), // allocated below where the cycle stores a residual
      coarsening,
    };
    levels.push(level);
    if (coarsening === "direct") {
      level.direct = createDirectSolver(op);
      break;
    }
    level.smoother = createSmoother(options.smoother.name, op, { omega: options.smoother.omega });
    if (!galerkin) p = coarsenProblem(p, coarsening === "y" ? 1 : 2, coarsening === "x" ? 1 : 2);
  }
  for (let l = 0; l + 1 < levels.length && !galerkin; l++) {
    levels[l].transfer = createTransfer(restriction, levels[l].op, levels[l + 1].op);
  }
  for (const L of levels) {
    L.redBlack = options.smoother.name === "red-black" && !isNinePoint(L.op) && !L.op.singular &&
      L.transfer?.restrictResidual !== undefined;
    // Memory (issue 16): the fused path never stores a residual on this level.
    if (!(L.redBlack && options.cycle.pre > 0)) L.r = L.op.vector();
  }
  return { levels, coarseOperator, interpolation };
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
