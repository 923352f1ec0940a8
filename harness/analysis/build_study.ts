import type {
  NormSet,
  OrderRecord,
  QuantityRecord,
  Region,
  SolveRecord,
  StudyRecord,
} from "../result/types.ts";
import { PLACES } from "../result/types.ts";
import { pairwiseOrders } from "./pairwise_orders.ts";
import { type JudgeOptions, judgeStudy } from "./judge_study.ts";
import type { RankComparison } from "./criteria/types.ts";
import { orderRecord } from "./order_record.ts";
import { quantityRecord } from "./quantity_record.ts";
import { type ScalingOptions, scalingRecord } from "./scaling_record.ts";

/** What {@link buildStudy} needs besides the solves. */
export interface StudySpec extends JudgeOptions {
  caseId: string;
  solver: string;
  /** Per quantity name: its label and exact value (unknown names get label = name, exact null). */
  quantities?: Record<string, { label?: string; exact?: number | null }>;
  /** Grids in the least-squares order fit, finest first (default 3). */
  points?: number;
  /** Passed to {@link scalingRecord}. */
  scaling?: ScalingOptions;
  /** Solutions of one grid at 1 and N ranks, compared (the "rank-invariance" criterion). */
  rankChecks?: RankComparison[];
}

const REGIONS: Region[] = ["all", "interior", "boundary"];
const NORMS: (keyof NormSet)[] = ["max", "l2", "l1"];

/**
 * Assembles the full {@link StudyRecord} of one case × solver from its solves: observed orders in
 * every region and norm, the grid-convergence study of every quantity, residual scaling, the GCI
 * coverage fraction and the verdicts ({@link judgeStudy}).
 *
 * Solves are sorted coarsest first by h; grids whose solve failed stay in the sequence with null
 * errors and values. Coverage = fraction of quantities whose finest GCI band contains the true
 * error, among those where both are known.
 *
 * @param solves The solves of one case by one solver (any order, one per grid).
 * @param spec Case, solver, expectation, quantities' exact values and judgement options.
 * @returns The study record.
 * @throws {RangeError} when two solves share a spacing h or a solve belongs to another
 *   case or solver.
 *
 * @example
 * ```ts
 * import assert from "node:assert/strict";
 * import { buildStudy } from "./build_study.ts";
 * const solve = (n: number) => {
 *   const e = (1 / n) ** 2;
 *   return {
 *     caseId: "c", solver: "s", nx: n, ny: n, h: 1 / n, unknowns: (n - 1) ** 2,
 *     status: "ok" as const, errors: { all: { max: e, l2: e, l1: e },
 *     interior: { max: e, l2: e, l1: e }, boundary: { max: e, l2: e, l1: e } },
 *     quantities: { mean: 1 + e }, residualHistory: [1, 1e-6, 1e-12], iterations: 2,
 *     converged: true, averageFactor: 0.1, asymptoticFactor: 0.1, seconds: n * n * 1e-6,
 *   };
 * };
 * const study = buildStudy([16, 32, 64].map(solve), {
 *   caseId: "c", solver: "s", expected: { formal: 2 }, quantities: { mean: { exact: 1 } },
 * });
 * assert.ok(study.verdicts.every((v) => v.status === "pass"));
 * ```
 */
export function buildStudy(solves: readonly SolveRecord[], spec: StudySpec): StudyRecord {
  const sorted = solves.slice().sort((a, b) => b.h - a.h);
  for (let i = 0; i < sorted.length; i++) {
    const s = sorted[i];
    if (s.caseId !== spec.caseId || s.solver !== spec.solver) {
      throw new RangeError(
        `Cannot build the study of ${spec.caseId} × ${spec.solver}: a solve belongs to ` +
          `${s.caseId} × ${s.solver}`,
      );
    }
    if (i > 0 && s.h === sorted[i - 1].h) {
      throw new RangeError(
        `Cannot build the study of ${spec.caseId} × ${spec.solver}: two solves share h = ${s.h} ` +
          `(${sorted[i - 1].nx}×${sorted[i - 1].ny} and ${s.nx}×${s.ny}); give each grid once`,
      );
    }
  }
  const h = sorted.map((s) => s.h);
  const errors = sorted.map((s) => (s.status === "ok" && s.errors ? s.errors : null));
  const orders: OrderRecord[] = [];
  for (const region of REGIONS) {
    for (const norm of NORMS) {
      const e = errors.map((x) => (x ? x[region][norm] : null));
      orders.push(orderRecord(region, norm, h, e, { points: spec.points ?? 3 }));
    }
  }
  const truncationOrders = sorted.some((s) => s.truncation)
    ? (["max", "l2"] as const).map((norm) =>
      orderRecord(
        "interior",
        norm,
        h,
        sorted.map((s) => (s.status === "ok" && s.truncation ? s.truncation[norm] : null)),
        { points: spec.points ?? 3 },
      )
    )
    : null;
  const names: string[] = [];
  for (const s of sorted) {
    for (const name of Object.keys(s.quantities ?? {})) if (!names.includes(name)) names.push(name);
  }
  const quantities: QuantityRecord[] = names.map((name) => {
    const info = spec.quantities?.[name];
    const values = sorted.map((s) =>
      s.status === "ok" && s.quantities && name in s.quantities ? s.quantities[name] : null
    );
    return quantityRecord(h, values, {
      name,
      label: info?.label ?? name,
      exact: info?.exact ?? null,
      formalOrder: spec.expected.formal,
    });
  });
  const judged = quantities.filter((q) => q.covered !== null);
  const coverage = judged.length > 0
    ? judged.filter((q) => q.covered).length / judged.length
    : null;
  const scaling = scalingRecord(sorted, spec.scaling);
  const places = PLACES.map((place) => {
    const e = sorted.map((s) => (s.status === "ok" ? s.places?.[place]?.max ?? null : null));
    const pairs = pairwiseOrders(h, e);
    return { place, errors: e, order: pairs.length > 0 ? pairs[pairs.length - 1] : null };
  }).filter((p) => p.errors.some((e) => e !== null));
  const verdicts = judgeStudy(
    {
      caseId: spec.caseId,
      solver: spec.solver,
      solves: sorted,
      errors,
      orders,
      quantities,
      scaling,
      h,
      places,
      ...(spec.rankChecks ? { rankChecks: spec.rankChecks } : {}),
    },
    spec,
  );
  return {
    caseId: spec.caseId,
    solver: spec.solver,
    grids: sorted.map((s) => s.nx),
    h,
    expectedOrder: spec.expected.formal,
    orderTolerance: spec.tolerance ?? 0.1,
    orders,
    ...(truncationOrders ? { truncationOrders } : {}),
    quantities,
    coverage,
    scaling,
    places,
    verdicts,
  };
}
