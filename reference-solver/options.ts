/**
 * Options and result of a reference-solver solve. Every option has a documented default; unknown
 * keys are refused by `resolveOptions` with the dotted path of the key.
 *
 * @module
 */
import type { InterpolationName } from "./prolongation.ts";

/** Names of the interpolations (`prolongation.ts`). */
export type { InterpolationName };

/** Names of the registered smoothers (the same names appear on the command line and in reports). */
export type SmootherName =
  | "jacobi"
  | "gauss-seidel"
  | "red-black"
  | "line-x"
  | "line-y"
  | "alternating-line";

/** Names of the restriction operators. */
export type RestrictionName = "injection" | "half-weighting" | "full-weighting";

/** Names of the cycles. `fmg` is full multigrid followed by cycles of `fmgCycle` until converged. */
export type CycleName = "V" | "W" | "F" | "fmg";

/**
 * How coarse-level operators are built: "rediscretize" (the problem's coefficients and boundary
 * data injected onto the coarse grid and discretized again) or "galerkin" (R·A·P with bilinear P
 * and the restriction in its volume scaling, see `galerkin.ts`).
 */
export type CoarseOperatorName = "rediscretize" | "galerkin";

/** Options of a solve, nested by role. */
export interface SolveOptions {
  /** Discretization. */
  scheme?: {
    /** First-order upwinding of b·u_x and d·u_y (formal order 1). Default: false (central, order 2). */
    upwind?: boolean;
  };
  /** Cycle type and sweeps. */
  cycle?: {
    /** Cycle type. Default: "V". */
    type?: CycleName;
    /** Pre-smoothing sweeps ν1. Default: 2. */
    pre?: number;
    /** Post-smoothing sweeps ν2. Default: 1. */
    post?: number;
    /** Cycle used on each level during full multigrid and after it (V, W or F). Default: "V". */
    fmgCycle?: "V" | "W" | "F";
    /** Cycles per level in full multigrid. Default: 1. */
    fmgCyclesPerLevel?: number;
  };
  /** The smoother. */
  smoother?: {
    /** Default: "red-black". */
    name?: SmootherName;
    /** Weight ω of weighted Jacobi. Default: 0.8 (4/5, optimal smoothing for 2-D Poisson). */
    omega?: number;
  };
  /** Grid transfers. */
  transfer?: {
    /**
     * Default: "full-weighting". With operator-dependent interpolation the restriction is the
     * interpolation's volume-scaled transpose, and only "full-weighting" (its bilinear
     * counterpart) is accepted here.
     */
    restriction?: RestrictionName;
    /**
     * "bilinear" or "operator-dependent" (needs Galerkin coarse operators; see `prolongation.ts`).
     * Default: "operator-dependent" for a Galerkin hierarchy of a problem with a conductivity,
     * "bilinear" otherwise.
     */
    interpolation?: InterpolationName;
  };
  /** Coarse levels and the coarsest-grid solve. */
  coarse?: {
    /**
     * Default: chosen per problem — "galerkin" for a problem with a conductivity (robust for
     * jumping coefficients), "rediscretize" otherwise.
     */
    operator?: CoarseOperatorName;
    /**
     * Stop coarsening when the grid has at most this many unknowns, then solve by banded LU.
     * Default: 81 (9×9). Small, so that every grid of a study from 16 up runs real cycles and the
     * iteration counts across the study are comparable (a direct solve on the coarse grids of a
     * study would show as "iterations grow with the grid").
     */
    maxDirectUnknowns?: number;
    /**
     * Allow coarsening in one direction: when only one count is even, or when that direction's
     * mesh width is at most 1/√2 of the other's (see `chooseCoarsening`). Default: true.
     */
    semiCoarsening?: boolean;
    /**
     * Largest number of levels, finest included; the last one is solved by banded LU whatever its
     * size. `2` gives a two-grid method with an exact coarse solve. Default: 50 (no limit in practice).
     */
    maxLevels?: number;
  };
  /** Stopping rules. */
  stop?: {
    /** Relative residual tolerance ‖r‖₂/‖r₀‖₂. Default: 1e-10. */
    tolerance?: number;
    /** Maximum number of cycles. Default: 100. */
    maxCycles?: number;
    /** Declare divergence when the residual grows above this multiple of the initial. Default: 1e3. */
    divergenceFactor?: number;
  };
  /** What to do with a singular problem (only Neumann sides, e ≡ 0). Default: "refuse". */
  singular?: "refuse" | "mean-zero";
  /**
   * Initial guess (length (nx+1)(ny+1)); default: zero in the interior, Dirichlet values on the
   * boundary. Dirichlet nodes of a given guess are overwritten with their boundary values.
   */
  initialGuess?: Float64Array;
}

/** Why a solve stopped. */
export type StopReason = "converged" | "max-cycles" | "diverged" | "stagnated";

/** What a solve returns. It never throws for non-convergence: that is data. */
export interface SolveResult {
  /** The discrete solution at every node (x fastest). */
  solution: Float64Array;
  /** Whether the tolerance was reached (reason "converged"). */
  converged: boolean;
  /** Why the solve stopped. */
  reason: StopReason;
  /** Number of cycles done (FMG counts as one). */
  cycles: number;
  /** ‖r‖₂ before the first cycle and after each cycle (length cycles + 1). */
  residualHistory: number[];
  /** (‖r_k‖/‖r_0‖)^(1/k) over all cycles. */
  averageFactor: number;
  /** Geometric mean of the last few per-cycle factors (up to 3), the asymptotic convergence factor. */
  asymptoticFactor: number;
  /** Wall time of the solve, excluding validation of inputs. */
  seconds: number;
  /** Plain JSON record of levels and components. */
  description: SolverDescription;
  /** Part of `seconds` spent building the levels (operators, smoother and coarse factorizations). */
  setupSeconds: number;
  /**
   * Only with `singular: "mean-zero"`: the constant λ the solve subtracted from the right-hand side
   * to make the singular system compatible, so that A·u = f − λ holds (λ ≈ 0 for compatible data).
   * The residual history of such a solve is that of the shifted system.
   */
  compatibilityShift?: number;
}

/** The `describe()` record stored beside every number. */
export interface SolverDescription {
  /** Which solver. */
  solver: "gridproof-multigrid";
  /** Discretization of the first-order terms. */
  scheme: "central" | "upwind";
  /** Cycle type ("V", "W", "F", or "fmg+V" etc.). */
  cycle: string;
  /** Pre-smoothing sweeps. */
  pre: number;
  /** Post-smoothing sweeps. */
  post: number;
  /** The smoother's own `describe()` record. */
  smoother: Record<string, unknown>;
  /** Restriction operator. */
  restriction: RestrictionName;
  /** Interpolation operator. */
  interpolation: InterpolationName;
  /** How coarse operators were built. */
  coarseOperator: CoarseOperatorName;
  /** Finest first. */
  levels: { nx: number; ny: number; coarsening: "both" | "x" | "y" | "direct" }[];
  /** Relative residual tolerance. */
  tolerance: number;
  /** Cycle limit. */
  maxCycles: number;
}
