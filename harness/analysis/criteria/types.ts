import type {
  NormSet,
  OrderRecord,
  QuantityRecord,
  RankComparison,
  Region,
  ScalingRecord,
  SideName,
  SolveRecord,
  StudyRecord,
  VerdictStatus,
} from "../../result/types.ts";

/** Error norms by name. */
export type NormName = keyof NormSet;

/**
 * The order a case expects (same shape as `cases/types.ts` ExpectedOrder, restated here because
 * the analysis imports no other part).
 */
export interface OrderExpectation {
  /** Formal order of the scheme. */
  formal: number;
  /** Norms where theory says the achievable order is lower, with the order and the reason. */
  achievable?: Partial<Record<NormName, { order: number; reason: string }>>;
  /** The scheme reproduces the exact solution to round-off: judge exactness, not order. */
  exactToRoundOff?: boolean;
}

/** What the criteria look at: one case × solver over its grids, coarsest first. */
export interface StudyInput {
  caseId: string;
  solver: string;
  /** The solves, coarsest first (failed ones included). */
  solves: readonly SolveRecord[];
  /** Spacing per grid, aligned with `solves`. */
  h: number[];
  /** Error norms per grid, aligned with `solves` (null where the solve failed). */
  errors: (Record<Region, NormSet> | null | undefined)[];
  orders: OrderRecord[];
  quantities: QuantityRecord[];
  scaling: ScalingRecord;
  /** Per place: max error per grid and finest pairwise order. */
  places?: StudyRecord["places"];
  /** Solutions of one grid at two rank counts, compared (solvers with a rank-count check). */
  rankChecks?: RankComparison[];
}

/** How strictly an advisory criterion is judged. */
export type Strictness = "off" | "warn" | "fail";

/** Options of the judgement, with defaults. */
export interface JudgeOptions {
  expected: OrderExpectation;
  /** Allowed |observed − expected| order (default 0.1). */
  tolerance?: number;
  /** Relative residual reduction asked of the solver (default 1e-10). */
  requestedTolerance?: number;
  /**
   * Iteration growth the solver declares: iterations may grow like N^g with the unknowns N
   * (default 0.5, the growth of SOR with a good ω or CG without multigrid; 0 for multigrid or a
   * direct solver, which are then held to flat counts; 1 for Gauss–Seidel or Jacobi).
   */
  iterationGrowth?: number;
  /** Iteration growth beyond the declared one fails (default "fail"; "warn" to only warn). */
  workStrictness?: Strictness;
  /** GCI asymptotic-range check (default "warn"). */
  asymptoticRange?: Strictness;
  /** Allowed |GCI_23/(r^p·GCI_12) − 1| (default 0.1). */
  asymptoticTolerance?: number;
  /** Allowed change of a quantity's observed order between the finest and the next grid triple (default 0.1). */
  settleTolerance?: number;
  /** max |u_exact| over the domain, the scale of the exactness bound (default 1). */
  solutionScale?: number;
  /** Exactness bound max error ≤ rel·solutionScale + abs (default rel 1e-9, abs 1e-12). */
  exactTolerance?: { rel?: number; abs?: number };
  /** Boundary kind per side, for the words of a location (default: unknown). */
  boundaryKinds?: Partial<Record<SideName, string>>;
}

/** A verdict before the study's case and solver are attached. */
export interface Finding {
  criterion: string;
  status: VerdictStatus;
  reason: string;
  details?: Record<string, unknown>;
}

/** What a criterion gets: the study, the options, and the preconditions that failed so far. */
export interface JudgeContext {
  input: StudyInput;
  options: JudgeOptions;
  /**
   * Failed preconditions (convergence, iterative error, imposed data), each a short phrase: while
   * any stands, order and exactness verdicts are inconclusive and say so instead of blaming the
   * discretization.
   */
  blockers: string[];
}

/**
 * One criterion of the registry: its name (as in results, reports and JUnit), what it measures,
 * and its judgement. A precondition's failure blocks the order verdicts.
 */
export interface Criterion {
  name: string;
  measures: string;
  precondition?: boolean;
  judge(context: JudgeContext): Finding[];
}

export type { RankComparison };
