/**
 * The contract between the case engine and the rest of gridproof: what a loaded, derived and
 * compiled manufactured-solution case offers. Other parts (campaign, protocol requests, reports)
 * use only these types.
 *
 * @module
 */
import type { BoundaryKind, Domain, Side } from "../reference-solver/mod.ts";
import type { SampledProblem } from "../problem/mod.ts";
import type { CaseFile } from "./case_file.ts";
import type { OperatorForm } from "./operator.ts";
import type { Expr } from "./expression.ts";
import type { Interfaces } from "./regions.ts";
import type { Axis, AxisMapping } from "../grid/mod.ts";

/** A compiled point function: plain JavaScript built from a whitelisted expression tree. */
export type PointFn = (x: number, y: number) => number;

/** Error norms a case may declare an expected observed order for. */
export type NormName = "max" | "l2" | "l1";

/** Discretizations a case declares orders for. */
export type SchemeName = "central" | "upwind";

/**
 * Where a solver's values sit: grid nodes (`vertex`), cell centres of a cell-centred scheme
 * (`cell`), or points the solver chose itself (`points`, e.g. cell-centre averages of nodal values).
 * The same names as a solver file's `layout`.
 */
export type LayoutName = "vertex" | "cell" | "points";

/** The fields of an {@link ExpectedOrder} a layout may override (not `grids`: they are the scheme's). */
export type LayoutOverridable = "formal" | "achievable" | "exactToRoundOff" | "orderTolerance";

/**
 * One layout's departure from its scheme's expectation, with the reason it departs (for example:
 * the cell-centred Dirichlet ghost `2g − u₁` is only second-order, so a quadratic is not reproduced
 * to round-off). `achievable` is merged per norm into the scheme's; the other fields replace it.
 */
export type LayoutOverride = Partial<Pick<ExpectedOrder, LayoutOverridable>> & {
  /** Why this layout expects something else than the scheme says (the theory, or a measurement). */
  reason: string;
};

/** The order a case expects under one discretization. */
export interface ExpectedOrder {
  /** Formal order of the scheme (central 2, upwind 1). */
  formal: number;
  /**
   * Where theory says the achievable order is lower than formal: per norm, the order and the
   * reason (case file name; old name `observed`).
   */
  achievable?: Partial<Record<NormName, { order: number; reason: string }>>;
  /**
   * true for a case whose exact solution the scheme reproduces to round-off (an exactness check,
   * not an order check): the verdict asks for errors at round-off level instead of an order
   * (old name `exact`).
   */
  exactToRoundOff?: boolean;
  /**
   * Grid sequence on which this scheme shows its order, when it differs from the case's `grids`
   * (a first-order scheme often needs finer grids to leave the pre-asymptotic range).
   */
  grids?: number[];
  /**
   * Allowed |measured − expected| order for this case; default: the campaign's order tolerance
   * (0.1). Old name `tolerance`.
   */
  orderTolerance?: number;
  /**
   * Per-layout overrides of `formal`, `achievable`, `exactToRoundOff` and `orderTolerance`, each
   * with its reason.
   * Read an expectation for one layout with `expectationFor`, which merges them in.
   */
  layouts?: Partial<Record<LayoutName, LayoutOverride>>;
}

/** One side's boundary condition of a compiled case, with its derived data as a point function. */
export interface CaseBoundary {
  kind: BoundaryKind;
  /** Robin α(x, y) (only for robin): constant, or varying along the side. */
  alpha?: PointFn;
  /** Robin β(x, y) (only for robin); either 0 along the whole side or of one strict sign. */
  beta?: PointFn;
  /** α and β as the case file gives them (only for robin), for reports and messages. */
  weightsText?: { alpha: string; beta: string };
  /** true when α or β depends on the point (only for robin): protocol 1 cannot carry it. */
  weightsVary?: boolean;
  /** Boundary data g(x, y): u for dirichlet, ∂u/∂n for neumann, α·u + β·∂u/∂n for robin. */
  data: PointFn;
}

/**
 * Readable formulas of a case (mathjs text after simplification). `a`…`e` and `m` are the
 * non-conservative coefficients (for the conservative form, its expansion, see `operator.ts`);
 * a case with interfaces shows its first region here and every region in `regions`.
 */
export interface CaseFormulas {
  a: string;
  b: string;
  c: string;
  d: string;
  e: string;
  /** Coefficient of u_xy (absent when it is 0). */
  m?: string;
  exact: string;
  source: string;
  boundary: Record<Side, string>;
  /** The conservative form's own terms. */
  conservative?: { k11: string; k12: string; k22: string; bx: string; by: string; sigma: string };
  /** Per region of a case with interfaces: its exact solution, source and (conservative) K. */
  regions?: { exact: string; source: string; k11?: string; k12?: string; k22?: string }[];
}

/**
 * The conservative form's terms as point functions (on an interface: the mean of the one-sided
 * values), and K where flux-form schemes need it: at faces (or edge midpoints) whose flux runs
 * along x (`faceX`) or along y (`faceY`), with the interface rule of `regions.ts` (harmonic mean
 * across an interface, arithmetic mean along it).
 */
export interface ConservativeTerms {
  k11: PointFn;
  k12: PointFn;
  k22: PointFn;
  bx: PointFn;
  by: PointFn;
  sigma: PointFn;
  faceX: { k11: PointFn; k12: PointFn };
  faceY: { k12: PointFn; k22: PointFn };
  /** The terms whose expressions involve neither x nor y (in every region), with their value. */
  constant: Partial<Record<"k11" | "k12" | "k22" | "bx" | "by" | "sigma", number>>;
}

/**
 * One region's expression trees with the parameters substituted (the engine's own small trees, see
 * `expression.ts`): what a code generator needs to write the case in another language.
 */
export interface RegionExpressions {
  exact: Expr;
  /** u_x and u_y. */
  ux: Expr;
  uy: Expr;
  source: Expr;
  /** The non-conservative coefficients (the conservative form's expansion). */
  coefficients: Record<"a" | "b" | "c" | "d" | "e" | "m", Expr>;
  /** The conservative form's terms. */
  conservative?: Record<"k11" | "k12" | "k22" | "bx" | "by" | "sigma", Expr>;
  /** The boundary data of each side (u, the normal flux, or α·u + β·normal flux). */
  boundary: Record<Side, Expr>;
  /** The Robin weights α and β of each Robin side (the same in every region). */
  robin: Partial<Record<Side, { alpha: Expr; beta: Expr }>>;
}

/** A case ready to sample onto any grid. */
export interface CompiledCase {
  id: string;
  title: string;
  motivation: string;
  /** Where the case came from: "library" or the path of a user's file. */
  origin: string;
  /**
   * Deprecation warnings of the case file, formatted (`file:line:column: field: message`): old
   * field names read under their new ones (`old_names.ts`). Absent when there are none. Library
   * code never prints them; the CLI does.
   */
  warnings?: string[];
  domain: Domain;
  /** Parameter values in effect (defaults merged with overrides). */
  parameters: Record<string, number>;
  expected: Record<SchemeName, ExpectedOrder>;
  tags: string[];
  /** Suggested grid sequence (intervals along x; ny follows the interval ratio). */
  grids: number[];
  /**
   * Ratio of interval counts: ny = round(nx · intervalRatio) (case file `intervalRatio`, old name
   * `aspect`). 1 gives square cells on a square domain.
   */
  intervalRatio: number;
  /**
   * The stretched grid family (the case file's `spacing`): per axis, the fixed map every grid of
   * the family comes from. Absent or empty: uniform grids. Grids of the case are made by
   * `caseGrid` (cases/grid_of.ts); `sample` and `sampleExact` then use the mapped nodes.
   */
  mappings?: Partial<Record<Axis, AxisMapping>>;
  /** The operator's form (the case file's `form`; default non-conservative). */
  form: OperatorForm;
  /** Material interfaces (conservative form only); none: `{ x: [], y: [] }`. */
  interfaces: Interfaces;
  exact: PointFn;
  exactDx: PointFn;
  exactDy: PointFn;
  /**
   * The non-conservative coefficients; for the conservative form its expansion (a = k11,
   * m = 2k12, c = k22, b = βx + ∂x k11 + ∂y k12, d = βy + ∂x k12 + ∂y k22, e = σ), exact inside
   * each region. `m` multiplies u_xy.
   */
  coefficients: { a: PointFn; b: PointFn; c: PointFn; d: PointFn; e: PointFn; m: PointFn };
  /**
   * The coefficients whose expressions do not involve x or y, with their value (as the samplers
   * write it at every point); a request may send such an array as one number.
   */
  constantCoefficients: Partial<Record<"a" | "b" | "c" | "d" | "e" | "m", number>>;
  /** The conservative form's terms (absent for the non-conservative form). */
  conservative?: ConservativeTerms;
  /**
   * Per region (west to east, then south to north; one without interfaces), its expression trees
   * with the parameters substituted. Absent for cases made in code.
   */
  expressions?: RegionExpressions[];
  /**
   * Why an nx × ny grid does not suit the case (an interface between grid lines), or null when it
   * does. Campaigns refuse such grids before any solve.
   */
  gridMisses(nx: number, ny: number): string | null;
  source: PointFn;
  boundary: Record<Side, CaseBoundary>;
  formulas: CaseFormulas;
  /**
   * Samples the case onto a vertex-centred grid with nx × ny intervals. Checks ellipticity and
   * finiteness. For the conservative form the problem carries `conductivity` (K at the edge
   * midpoints), b, d, e are β and σ, and a, c, m are k11, k22, 2k12 at the nodes.
   */
  sample(nx: number, ny: number): SampledProblem;
  /** How the case follows the manufactured-solution guidance (the case file's `manufactured`). */
  manufactured: string;
  /**
   * The validated case file it was built from (a copy): variants of the case (an operator term
   * switched off, a side made Dirichlet) are new files built the same way. Absent for cases made
   * in code (the probe's).
   */
  file?: CaseFile;
  /** The same formulas as TeX (mathjs `toTex`). */
  tex: CaseFormulas;
  /**
   * true when no side fixes u and there is no reaction term (every side Neumann, periodic or
   * Robin with α ≡ 0, e ≡ 0): the solution is fixed only up to a constant. The engine has checked
   * that the data balance (`compatibility.ts`); solutions are compared after removing the
   * volume-weighted mean of both the computed and the exact field. Absent: false.
   */
  singular?: boolean;
  /** Advice for the reference solver (the case file's `solver`), when given. */
  solver?: { smoother?: string; cycle?: string; maxCycles?: number };
  /** The grid for a suggested size: nx = n, ny = round(n · intervalRatio). */
  gridFor(n: number): { nx: number; ny: number };
  /** The exact solution at every node of an nx × ny grid (x fastest), one fused compiled pass. */
  sampleExact(nx: number, ny: number): Float64Array;
  /**
   * Like {@link CompiledCase.sample}, with the rows of large grids split between this thread and
   * Deno workers (SharedArrayBuffer-backed arrays). Defaults: `threads` 2 (this thread and one
   * worker), grids below `minNodes` = 2^17 nodes on this thread alone.
   */
  sampleAsync(
    nx: number,
    ny: number,
    options?: { threads?: number; minNodes?: number },
  ): Promise<SampledProblem>;
}
