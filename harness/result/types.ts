/**
 * The one result object of a campaign: configuration, every solve, every analysis figure and
 * every verdict. Reports are rendered from it alone; it is saved as `result.json` and its JSON
 * Schema is `harness/result/result.schema.json`. Bump {@link RESULT_VERSION} on any change that
 * an older reader cannot ignore.
 *
 * Numbers that could not be computed are `null` (JSON has no NaN).
 *
 * @module
 */

/** Identifies the format. */
export const RESULT_FORMAT = "gridproof-result";
/** Current version of the format. */
export const RESULT_VERSION = 1;

/** Error norms. `l2` is the discrete area-weighted L2 norm, `l1` likewise. */
export interface NormSet {
  max: number;
  l2: number;
  l1: number;
}

/** Where an error norm is measured: every node, interior nodes only, a band of boundary nodes. */
export type Region = "all" | "interior" | "boundary";

/** The sides of the rectangle (the one list of sides). */
export type SideName = "west" | "east" | "south" | "north";

/**
 * Places a defect is located in: the band along each side (two point layers, corner blocks
 * excluded), the four corner blocks together, and the interior beyond the bands.
 */
export type Place = SideName | "corners" | "interior";

/** Every place, in report order. */
export const PLACES: readonly Place[] = ["west", "east", "south", "north", "corners", "interior"];

/**
 * How the values a vertex-layout solver returned at Dirichlet nodes compare with the data it was
 * given there (they must agree to round-off for any vertex scheme).
 */
export interface ImposedDataCheck {
  /** Per Dirichlet side: max |u_h − g| over the side's nodes, relative to max |u| of the case. */
  sides: Partial<Record<SideName, number>>;
  /**
   * When the data do not come back: a reordering of the returned values under which they would
   * (e.g. "y-fastest instead of x-fastest"), or null when none of the tried ones does.
   */
  reordering: string | null;
}

/** Status of a single solve. */
export type SolveStatus = "ok" | "failed" | "not-applicable";

/** One solve of one case on one grid by one solver. */
export interface SolveRecord {
  caseId: string;
  solver: string;
  nx: number;
  ny: number;
  /** Representative spacing: sqrt(area / cells) (Celik et al. 2008) — equals h on square cells. */
  h: number;
  unknowns: number;
  status: SolveStatus;
  /** Why the solve failed or does not apply (plain words); absent when ok. */
  reason?: string;
  /**
   * true when the case is singular (solution fixed up to a constant) and the volume-weighted mean
   * was removed from both the computed and the exact field before measuring (and before the
   * comparison with the reference solver).
   */
  meanRemoved?: boolean;
  /** Error norms against the exact solution per region (present when ok). */
  errors?: Record<Region, NormSet>;
  /**
   * The local truncation error over the interior nodes: τ = A·u − f, the residual of the exact
   * solution in the solver's discrete operator, in the units of the PDE's source. `max` is
   * max |τ|, `l2` the volume-weighted RMS sqrt(Σ w·τ² / Σ w). Present for solvers that give τ
   * (the reference solver); absent in results written before it existed.
   */
  truncation?: { max: number; l2: number };
  /** Quantities of interest computed from the discrete solution, by name. */
  quantities?: Record<string, number>;
  /** ‖r‖ history as the solver reported it (may be empty for solvers that give none). */
  residualHistory: number[];
  iterations: number | null;
  converged: boolean | null;
  stopReason?: string;
  averageFactor: number | null;
  asymptoticFactor: number | null;
  /** Wall time of the solve as measured by the harness. */
  seconds: number;
  /** The solver's own timing when it reported one. */
  solverSeconds?: number | null;
  /** Max-norm difference from the reference solver's discrete solution on the same grid, when both ran. */
  differenceFromReference?: number | null;
  /** Where that difference is largest: the point and its place. */
  differenceAt?: { x: number; y: number; place: Place } | null;
  /** Error norms per place (side bands, corners, interior), when the layout has places. */
  places?: Partial<Record<Place, NormSet>>;
  /** Vertex layouts with Dirichlet sides: whether the imposed data came back. */
  imposed?: ImposedDataCheck;
  /**
   * Where the error sits: block maxima of |u_h − u| (at most 16 × 16 blocks, rows from the south,
   * west first). Kept in the result for the finest grid of a failing study only.
   */
  errorMap?: { columns: number; rows: number; values: number[] };
  /** Like `errorMap`, for |u_h − u_ref| against the reference's discrete solution on the same grid. */
  differenceMap?: { columns: number; rows: number; values: number[] };
  /**
   * Vertex and cell layouts: a reordering of the returned values that matches the exact solution
   * ten times better than the values as given (the output is in the wrong point order).
   */
  outputOrder?: string;
  /**
   * The rank count of a solve of the rank-count check (such solves are journaled, and reported in
   * the "rank-invariance" verdict, not among the study's solves).
   */
  ranks?: number;
  /** On the second solve of a rank-count pair: the comparison of the two solutions. */
  rankComparison?: RankComparison;
  /** Last 64 KiB of an external solver's stderr. */
  stderrTail?: string;
  /** The solver's describe() record or reported name/version/notes. */
  description?: Record<string, unknown>;
}

/** One grid solved at two rank counts and the two solutions compared. */
export interface RankComparison {
  nx: number;
  ny: number;
  /** The two rank counts, fewer first (1 and N). */
  ranks: [number, number];
  /** max |u_N − u_1| / max |u_1| over the points; null when a solve failed or the points differ. */
  difference: number | null;
  /** Where the difference is largest. */
  at: { x: number; y: number } | null;
  /**
   * The relative residual reduction each solve reached (last over first residual norm), fewer
   * ranks first; null when a solve reported no history.
   */
  reductions: [number | null, number | null];
  /** Why the solutions could not be compared (a solve failed or does not apply). */
  reason?: string;
}

/** Observed orders of one norm in one region over the grid sequence. */
export interface OrderRecord {
  region: Region;
  norm: keyof NormSet;
  /** Pairwise orders between successive grids, coarsest pair first (length grids − 1). */
  pairwise: (number | null)[];
  /** Least-squares slope of log E against log h over the finest `points` grids. */
  fitted: { order: number | null; low: number | null; high: number | null; points: number };
  /** Successive pairwise orders settled (in the asymptotic range). */
  asymptotic: boolean;
}

/** Grid-convergence study of one quantity of interest. */
export interface QuantityRecord {
  name: string;
  /** What the quantity is, in words (e.g. "integral of u over the domain"). */
  label: string;
  /** The exact value (from the manufactured solution). */
  exact: number | null;
  /** Value per grid, coarsest first, aligned with the study's grids. */
  values: (number | null)[];
  /** Observed order from the finest three grids (null when not computable). */
  order: number | null;
  /** Richardson-extrapolated value from the finest pair at the observed order. */
  extrapolated: number | null;
  /** Roache GCI of the finest grid (fraction, not percent) with its safety factor. */
  gciFine: number | null;
  /** Roache GCI of the next pair (fraction). */
  gciCoarse: number | null;
  safetyFactor: number | null;
  /** GCI_23 / (r^p · GCI_12): near 1 in the asymptotic range. */
  asymptoticRatio: number | null;
  /** Celik et al. (2008) three-grid procedure. */
  celik: {
    order: number | null;
    extrapolated: number | null;
    relativeError: number | null;
    extrapolatedRelativeError: number | null;
    gciFine: number | null;
    convergence: "monotone" | "oscillatory" | "divergent" | "unknown";
  } | null;
  /** Eça & Hoekstra (2014) least-squares estimate (four or more grids). */
  leastSquares: {
    fit: string;
    order: number | null;
    extrapolated: number | null;
    uncertainty: number | null;
    safetyFactor: number | null;
  } | null;
  /** Does the finest-grid GCI band |φ1 − φexact| ≤ GCI·|φ1| contain the true error? */
  covered: boolean | null;
}

/** Residual behaviour across the grid sequence. */
export interface ScalingRecord {
  /** Fitted exponent of iterations against unknowns (≈ 0: grid-independent). */
  iterationsExponent: number | null;
  /** Fitted exponent of the average convergence factor against unknowns. */
  factorExponent: number | null;
  /** Fitted exponent of solve time against unknowns (≈ 1 for an optimal solver). */
  timeExponent: number | null;
  /** Iterations exponent ≤ 0.1 (flat), null when unknown. */
  gridIndependent: boolean | null;
  /** Unknowns of the smallest grid the exponents were fitted over. */
  fittedFrom?: number | null;
  /** Solves that stagnated, diverged or stopped without converging, as "nx×ny: reason". */
  problems: string[];
}

/** What isolation found for one failing study. */
export interface IsolationRecord {
  /** The grids the variants ran on (intervals along x). */
  grids: number[];
  variants: {
    key: string;
    /** The change in words, e.g. "the Robin condition on the north side replaced by Dirichlet". */
    change: string;
    /** Where the defect is when this change restores the order. */
    place: string;
    /** Pairwise max-norm orders of the variant, coarsest pair first. */
    orders: (number | null)[];
    outcome: "restored" | "not restored" | "undecided" | "failed";
  }[];
  /** Changes not tried for lack of budget. */
  skipped: string[];
  /** The finding in words. */
  finding: string;
  /** Solve time the variants took. */
  seconds: number;
}

/** Outcome of one criterion. */
/**
 * Outcome of one criterion. "fail": the evidence says defect and the reason says what and where;
 * "inconclusive": the evidence does not decide (more grids needed, or a precondition failed);
 * "warn": advisory, never decides the exit code; "not-applicable": the criterion does not apply.
 */
export type VerdictStatus = "pass" | "fail" | "inconclusive" | "warn" | "not-applicable";

/** One judgement with a reason in plain words a reviewer can act on. */
export interface Verdict {
  caseId: string;
  solver: string;
  /** e.g. "order", "convergence", "flat-iterations", "asymptotic-range", "baseline-order". */
  criterion: string;
  status: VerdictStatus;
  reason: string;
  /** Numbers behind the judgement (expected, observed, tolerance …). */
  details?: Record<string, unknown>;
}

/** The study of one case by one solver over the grid sequence. */
export interface StudyRecord {
  caseId: string;
  solver: string;
  /** nx of each grid, coarsest first. */
  grids: number[];
  /** h of each grid, coarsest first. */
  h: number[];
  expectedOrder: number;
  orderTolerance: number;
  orders: OrderRecord[];
  /**
   * Observed orders of the local truncation error (`SolveRecord.truncation`), region "interior",
   * norms "max" and "l2", fitted like the solution error's; reported beside the solution order,
   * never judged. Absent when no solve of the study gave a truncation error.
   */
  truncationOrders?: OrderRecord[];
  quantities: QuantityRecord[];
  /** Fraction of GCI bands that contained the true error (null when none computed). */
  coverage: number | null;
  scaling: ScalingRecord;
  /** Max-norm error per place on each grid (coarsest first) and the finest pairwise order. */
  places?: { place: Place; errors: (number | null)[]; order: number | null }[];
  /** Grids added to the case's sequence to reach a decisive verdict, and why. */
  added?: { grids: number[]; reason: string };
  /** Cross-case reading of this solver's failures (never changes a verdict). */
  diagnosis?: string;
  /** Isolation runs of a failing study: variants that change one ingredient (never change a verdict). */
  isolation?: IsolationRecord;
  verdicts: Verdict[];
}

/** What a report needs to show about a case. */
export interface CaseInfo {
  id: string;
  title: string;
  motivation: string;
  origin: string;
  domain: { x0: number; x1: number; y0: number; y1: number };
  parameters: Record<string, number>;
  tags: string[];
  expected: Record<string, unknown>;
  formulas: {
    a: string;
    b: string;
    c: string;
    d: string;
    e: string;
    exact: string;
    source: string;
    boundary: Record<string, string>;
  };
  boundaryKinds: Record<string, string>;
}

/** A solver that took part. */
export interface SolverInfo {
  name: string;
  kind: "reference" | "external";
  /** Command as an argument array (external solvers). */
  command?: string[];
  layout: "vertex" | "cell" | "points";
  scheme: "central" | "upwind";
  /** Declared iteration growth g (iterations ~ N^g); absent: 0.5 (SOR, CG). */
  iterationGrowth?: number;
  description?: Record<string, unknown>;
  /**
   * What the harness read of an external solver's build before the campaign (absent in results
   * written before this field existed). The name, version and build id the solver reports come
   * with each solve, in `SolveRecord.description.solver`.
   */
  build?: SolverBuildRecord;
}

/** A file as the harness read it: the path as written (relative to the working folder when inside it). */
export interface FileDigest {
  path: string;
  /** SHA-256 of the content, lower-case hex. */
  sha256: string;
  bytes: number;
}

/** The files behind an external solver: the solver file that declared it, and what its command runs. */
export interface SolverBuildRecord {
  /** The solver file (`--solvers`) that declared the solver. */
  solverFile?: FileDigest;
  /** Every file the command names that exists: the program, then script or input files. */
  files: FileDigest[];
  /** Files the command names that could not be read, with the reason. */
  unread?: string[];
}

/** The whole campaign result. */
export interface CampaignResult {
  format: typeof RESULT_FORMAT;
  version: number;
  tool: { name: "gridproof"; version: string };
  createdAt: string;
  environment: { deno: string; os: string; arch: string; cpus: number; hostname: string };
  configuration: {
    cases: string[];
    grids: number[];
    jobs: number;
    orderTolerance: number;
    requireGridIndependence: boolean;
    baseline?: string;
    /** Budget of grids added to inconclusive studies. */
    refine?: { maxAdded: number; maxUnknowns: number; seconds: number };
    /** Isolation runs of failing studies: seconds per study, 0 when off. */
    isolationSeconds?: number;
  };
  cases: CaseInfo[];
  solvers: SolverInfo[];
  solves: SolveRecord[];
  studies: StudyRecord[];
  /** Verdicts that compare with a saved baseline (not tied to one study's grids). */
  baselineVerdicts: Verdict[];
  /** What the campaign repaired or noticed on the way (e.g. a torn journal line dropped). */
  notes?: string[];
  summary: {
    pass: number;
    fail: number;
    inconclusive?: number;
    warn: number;
    notApplicable: number;
    exitCode: number;
  };
}
