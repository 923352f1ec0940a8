/**
 * Builds the study of every case × solver from the finished solves: the analysis's
 * {@link buildStudy} with the case's expectation for the solver's layout and scheme, the exact
 * values of the quantities of interest and the solver's declared iteration growth; plus a
 * judgement of how far an external solver that declares the reference's scheme lies from the
 * reference's discrete solution — which separates discretization defects from convergence
 * defects — and a cross-case reading of each solver's failures.
 *
 * @module
 */
import { expectationFor, isStretchedCase } from "../../cases/mod.ts";
import type { CompiledCase } from "../../cases/types.ts";
import { buildStudy, pairwiseOrders } from "../analysis/mod.ts";
import type { RankComparison, SideName, SolveRecord, StudyRecord, Verdict } from "../result/mod.ts";
import type { Solver } from "../solvers/mod.ts";
import { diagnoseAcrossCases } from "./diagnosis.ts";
import { chosenSpecs, exactQuantity, fluxMeasure, quantityLabel } from "./chosen_quantities.ts";
import { builtInQuantities, exactQuantities } from "./quantities.ts";

/** Options of {@link buildStudies}. */
export interface StudiesOptions {
  /** Default tolerance on observed orders (0.1). */
  orderTolerance: number;
  /** Iteration growth beyond the declared one fails (true) or only warns (false). */
  requireFlatIterations: boolean;
  /** Residual tolerance the solvers were asked for. */
  tolerance: number;
  /** Rank-count comparisons by study key (`caseId`, NUL, `solver`); default none. */
  rankChecks?: Map<string, RankComparison[]>;
}

/**
 * A solver with the reference's scheme and layout should match its discrete solution far below
 * the discretization error: we ask for a difference at most 1 % of the max-norm error, or at most
 * 1e-8 relative when the error itself is at round-off (our choice; the iterative tolerance 1e-10
 * leaves a difference of that order).
 */
export const AGREEMENT_FRACTION = 0.01;

/** Boundary kind per side in words ("dirichlet", "neumann", "robin"). */
export function boundaryKinds(kase: CompiledCase): Record<SideName, string> {
  const out = {} as Record<SideName, string>;
  for (const side of ["west", "east", "south", "north"] as SideName[]) {
    out[side] = kase.boundary[side].kind;
  }
  return out;
}

/** Studies of every case × solver, in the order of cases, then solvers. */
export function buildStudies(
  cases: CompiledCase[],
  solvers: Solver[],
  records: SolveRecord[],
  options: StudiesOptions,
): StudyRecord[] {
  const studies: StudyRecord[] = [];
  const referenceSolvers = solvers.filter((s) => s.info.kind === "reference");
  const referenceNames = new Set(referenceSolvers.map((s) => s.info.name));
  const referenceScheme = referenceSolvers[0]?.info.scheme;
  const references = records.filter((r) => referenceNames.has(r.solver) && r.status === "ok");
  for (const kase of cases) {
    const exact = exactQuantities(kase);
    const scale = Math.max(Math.abs(exact.maximum), maxAbs(kase));
    const builtIn = builtInQuantities(isStretchedCase(kase));
    const quantities: Record<string, { label: string; exact: number }> = Object.fromEntries(
      builtIn.map((q) => [q.name, { label: q.label, exact: exact[q.name] }]),
    );
    // the case's own quantities, after the built-in ones
    for (const spec of chosenSpecs(kase)) {
      quantities[spec.name] = {
        label: quantityLabel(spec, fluxMeasure(kase)),
        exact: exactQuantity(kase, spec),
      };
    }
    for (const solver of solvers) {
      const mine = records.filter((r) => r.caseId === kase.id && r.solver === solver.info.name);
      if (mine.length === 0) continue;
      const expected = expectationFor(kase, solver.info.scheme, solver.info.layout);
      // Grids the solver declined (not applicable, e.g. beyond its largest grid) leave the
      // sequence: the study judges the grids it did solve, and says which it did not.
      const declined = mine.filter((r) => r.status === "not-applicable");
      const judged = declined.length < mine.length
        ? mine.filter((r) => !declined.includes(r))
        : mine;
      const study = buildStudy(judged, {
        caseId: kase.id,
        solver: solver.info.name,
        expected,
        tolerance: expected.orderTolerance ?? options.orderTolerance,
        requestedTolerance: options.tolerance,
        iterationGrowth: solver.info.iterationGrowth,
        workStrictness: options.requireFlatIterations ? "fail" : "warn",
        solutionScale: scale,
        exactTolerance: { rel: exactnessBound(options.tolerance), abs: 1e-12 },
        boundaryKinds: boundaryKinds(kase),
        quantities,
        rankChecks: options.rankChecks?.get(`${kase.id}\u0000${solver.info.name}`),
      });
      const base = { caseId: kase.id, solver: solver.info.name, criterion: "applicability" };
      if (declined.length === mine.length) {
        study.verdicts = [{
          ...base,
          status: "not-applicable",
          reason: mine[0].reason ?? "the solver does not handle this case",
        }];
      } else if (declined.length > 0) {
        const grids = declined.map((r) => `${r.nx}×${r.ny}`).join(", ");
        const few = judged.length < 3;
        study.verdicts.push({
          ...base,
          status: few ? "not-applicable" : "warn",
          reason: `the solver declined ${grids} (${declined[0].reason ?? "not applicable"}); ` +
            (few
              ? `only ${judged.length} grid${
                judged.length === 1 ? "" : "s"
              } remain, too few to judge an order`
              : `judged on the ${judged.length} grids it solved`),
        });
        if (few) {
          study.verdicts = study.verdicts.map((v) =>
            v.criterion === "order"
              ? { ...v, status: "not-applicable", reason: `too few grids solved: ${v.reason}` }
              : v
          );
        }
      }
      const agreement = solver.info.scheme === referenceScheme
        ? agreementVerdict(kase, solver, mine, references, expected.formal)
        : undefined;
      if (agreement) study.verdicts.push(agreement);
      studies.push(study);
    }
  }
  diagnoseAcrossCases(studies, cases);
  return studies;
}

/**
 * Relative error bound of the exactness verdict: round-off (1e-9) or, for a solver stopped at a
 * relative residual `tolerance`, the algebraic error that leaves — ‖e‖ ≤ κ(A)·tolerance·‖u‖ with
 * κ(A) = O(h⁻²) ≈ 1e3 on the exactness case's small grids (derived bound; a wrong scheme shows
 * errors of 1e-4 or more on a quadratic, so the bound still catches every defect).
 */
export function exactnessBound(tolerance: number): number {
  return Math.max(1e-9, 1e3 * tolerance);
}

function maxAbs(kase: CompiledCase): number {
  const { x0, x1, y0, y1 } = kase.domain;
  let m = 0;
  for (let j = 0; j <= 64; j++) {
    for (let i = 0; i <= 64; i++) {
      m = Math.max(m, Math.abs(kase.exact(x0 + (i / 64) * (x1 - x0), y0 + (j / 64) * (y1 - y0))));
    }
  }
  return m;
}

/**
 * "agreement-with-reference": a solver that declares the reference's layout and scheme should
 * reproduce its discrete solution up to the two iterative errors. Pass when the difference is at
 * most {@link AGREEMENT_FRACTION} of the discretization error on every grid; pass with a note
 * when it is larger but shrinks at about the formal order (another, equally consistent closure —
 * e.g. a different second-order Neumann treatment); fail when it is larger and does not shrink
 * so: the discrete equations solved are not the declared ones, or not solved fully — naming the
 * grid and the place where the difference is largest.
 */
function agreementVerdict(
  kase: CompiledCase,
  solver: Solver,
  mine: SolveRecord[],
  references: SolveRecord[],
  formal: number,
): Verdict | undefined {
  if (solver.info.kind === "reference" || solver.info.layout !== "vertex") return undefined;
  const compared = mine.filter((r) =>
    r.status === "ok" && typeof r.differenceFromReference === "number"
  ).sort((a, b) => b.h - a.h);
  if (compared.length === 0) return undefined;
  const base = { caseId: kase.id, solver: solver.info.name, criterion: "agreement-with-reference" };
  const scale = Math.max(maxAbs(kase), 1e-300);
  let worst: { record: SolveRecord; ratio: number; error: number } | undefined;
  for (const r of compared) {
    const ref = references.find((q) => q.caseId === r.caseId && q.nx === r.nx && q.ny === r.ny);
    const error = ref?.errors?.all.max ?? r.errors?.all.max ?? 0;
    const allowed = Math.max(AGREEMENT_FRACTION * error / scale, 1e-8);
    const ratio = (r.differenceFromReference as number) / allowed;
    if (!worst || ratio > worst.ratio) worst = { record: r, ratio, error: error / scale };
  }
  const w = worst!;
  const diff = w.record.differenceFromReference as number;
  const at = w.record.differenceAt;
  const diffs = compared.map((r) => r.differenceFromReference as number);
  const orders = pairwiseOrders(compared.map((r) => r.h), diffs);
  const shrink = orders.length > 0 ? orders[orders.length - 1] : null;
  const details = {
    grid: `${w.record.nx}×${w.record.ny}`,
    relativeDifference: diff,
    relativeDiscretizationError: w.error,
    fraction: AGREEMENT_FRACTION,
    differenceOrder: shrink,
    at: at ?? null,
  };
  if (w.ratio <= 1) {
    return {
      ...base,
      status: "pass",
      reason: `matches the reference discrete solution to ${diff.toExponential(1)} (relative) on ` +
        `${details.grid}, far below the discretization error ${w.error.toExponential(1)}`,
      details,
    };
  }
  const where = at
    ? ` (largest at (${at.x.toPrecision(3)}, ${at.y.toPrecision(3)}), ${
      at.place === "interior"
        ? "in the interior"
        : at.place === "corners"
        ? "in a corner block"
        : `in the band along the ${at.place} side`
    })`
    : "";
  if (shrink !== null && shrink >= formal - 0.5 && compared.length >= 2) {
    return {
      ...base,
      status: "pass",
      reason: `differs from the reference discrete solution by ${diff.toExponential(1)} ` +
        `(relative) on ${details.grid}${where}, but the difference shrinks at order ` +
        `${shrink.toFixed(2)}: another consistent discretization of the same order (e.g. a ` +
        `different boundary closure), not a defect`,
      details,
    };
  }
  return {
    ...base,
    status: "fail",
    reason: `differs from the reference discrete solution by ${diff.toExponential(1)} (relative) ` +
      `on ${details.grid}${where}, not far below the discretization error ` +
      `${w.error.toExponential(1)}, and the difference does not shrink at order ${formal} ` +
      `(${shrink === null ? "n/a" : shrink.toFixed(2)}): either its discrete equations differ ` +
      `from the declared ${solver.info.scheme} 5-point scheme (see the order verdicts) or it does ` +
      `not solve them fully (see the convergence verdict)`,
    details,
  };
}
