/**
 * Isolation runs for failing studies: the failing solver solves variants of the case that change
 * one ingredient at a time (cases/variants.ts) on the finest grids of its study, and the change
 * that brings the expected order back names the defect's place — "the order returns to 2 when the
 * Robin condition on the north side is replaced by Dirichlet: the defect is in the Robin treatment
 * of the north side". Isolation solves are ordinary solves, journaled and resumable; they add a
 * diagnosis and never change a verdict.
 *
 * @module
 */
import { type CaseVariant, caseVariants, expectationFor } from "../../cases/mod.ts";
import type { CompiledCase } from "../../cases/types.ts";
import { orderTrend, pairwiseOrders } from "../analysis/mod.ts";
import type { IsolationRecord, SolveRecord, StudyRecord } from "../result/mod.ts";
import type { Solver } from "../solvers/mod.ts";
import { type PlannedSolve, type RunOptions, runSolves } from "./run.ts";

/** Options of {@link isolateFailures}. */
export interface IsolationOptions extends RunOptions {
  /**
   * Solve time one study's isolation may take, predicted from the study's own solves on the same
   * grids (default 60 s); variants that do not fit are listed as not tried.
   */
  seconds?: number;
}

/** A study whose order failed on its own evidence (not blocked by a precondition). */
function failingOrder(study: StudyRecord): boolean {
  return study.verdicts.some((v) =>
    v.criterion === "order" && v.status === "fail" && v.details?.blocked === undefined
  );
}

/**
 * Runs the isolation variants of every failing study and returns what they found, by study key
 * (`caseId`, NUL, `solver`). Studies of cases made in code (no case file) are left out.
 */
export async function isolateFailures(
  studies: StudyRecord[],
  records: SolveRecord[],
  cases: CompiledCase[],
  solvers: Solver[],
  options: IsolationOptions = {},
): Promise<{ found: Map<string, IsolationRecord>; records: SolveRecord[] }> {
  const budget = options.seconds ?? 60;
  const found = new Map<string, IsolationRecord>();
  const jobs: {
    key: string;
    study: StudyRecord;
    grids: { nx: number; ny: number }[];
    variants: CaseVariant[];
    skipped: string[];
    solver: Solver;
  }[] = [];
  const plan: PlannedSolve[] = [];
  for (const study of studies.filter(failingOrder)) {
    const kase = cases.find((c) => c.id === study.caseId);
    const solver = solvers.find((s) => s.info.name === study.solver);
    if (!kase || !solver) continue;
    const mine = records.filter((r) =>
      r.caseId === study.caseId && r.solver === study.solver && r.status === "ok"
    ).sort((a, b) => a.nx - b.nx).slice(-3);
    if (mine.length < 3) continue;
    const cost = mine.reduce((t, r) => t + r.seconds, 0);
    const all = await caseVariants(kase);
    const fit = Math.max(1, Math.floor(budget / Math.max(cost, 1e-3)));
    const variants = all.slice(0, fit);
    const skipped = all.slice(fit).map((v) => v.change);
    const grids = mine.map((r) => ({ nx: r.nx, ny: r.ny }));
    jobs.push({
      key: `${study.caseId}\u0000${study.solver}`,
      study,
      grids,
      variants,
      skipped,
      solver,
    });
    for (const v of variants) {
      for (const g of grids) {
        const grid = v.kase.gridFor(g.nx);
        plan.push({ kase: v.kase, solver, ...grid });
      }
    }
  }
  if (plan.length === 0) return { found, records: [] };
  const done = await runSolves(plan, options);
  for (const job of jobs) {
    const expected = expectationFor(
      cases.find((c) => c.id === job.study.caseId)!,
      job.solver.info.scheme,
      job.solver.info.layout,
    );
    const target = expected.achievable?.max?.order ?? expected.formal;
    const tol = job.study.orderTolerance;
    let seconds = 0;
    const variants = job.variants.map((v) => {
      const solves = done.filter((r) => r.caseId === v.kase.id && r.solver === job.study.solver)
        .sort((a, b) => a.nx - b.nx);
      seconds += solves.reduce((t, r) => t + r.seconds, 0);
      const ok = solves.length === job.grids.length && solves.every((r) => r.status === "ok");
      const h = solves.map((r) => r.h);
      const e = solves.map((r) => r.errors?.all.max ?? null);
      const orders = ok ? pairwiseOrders(h, e) : [];
      const trend = orderTrend(h, e, orders, target, tol);
      const outcome: IsolationRecord["variants"][number]["outcome"] = !ok
        ? "failed"
        : trend.outcome === "pass"
        ? "restored"
        : trend.outcome === "fail"
        ? "not restored"
        : "undecided";
      return { key: v.key, change: v.change, place: v.place, orders, outcome };
    });
    const own = job.study.orders.find((o) => o.region === "all" && o.norm === "max");
    const failing = own?.pairwise[own.pairwise.length - 1] ?? null;
    found.set(job.key, {
      grids: job.grids.map((g) => g.nx),
      variants,
      skipped: job.skipped,
      finding: finding(variants, job.skipped, target, failing),
      seconds,
    });
  }
  return { found, records: done };
}

/** The finding in words: which change restores the order, or what the failures rule out. */
export function finding(
  variants: IsolationRecord["variants"],
  skipped: string[],
  target: number,
  failing: number | null = null,
): string {
  const restored = variants.filter((v) => v.outcome === "restored");
  const last = (v: IsolationRecord["variants"][number]) => {
    const o = v.orders[v.orders.length - 1];
    return o === null || o === undefined ? "n/a" : o.toFixed(2);
  };
  const untried = skipped.length > 0 ? `; not tried for lack of time: ${skipped.join("; ")}` : "";
  if (restored.length === 1) {
    const v = restored[0];
    return `the order returns to ${target} (${last(v)}) when ${v.change}: the defect is in ` +
      `${v.place}`;
  }
  if (restored.length > 1) {
    // The narrowest restoring change names the place: one side or term before a group of one
    // kind, before every derivative side, before every Dirichlet side.
    const rank = (v: IsolationRecord["variants"][number]) =>
      v.key === "dirichlet:all" || v.key.startsWith("robin:")
        ? 3
        : v.key.startsWith("dirichlet:all-") || v.key === "b=d=0"
        ? 2
        : 1;
    const narrowest = Math.min(...restored.map(rank));
    const named = restored.filter((v) => rank(v) === narrowest);
    if (named.length === 1) {
      return `the order returns to ${target} (${last(named[0])}) when ${named[0].change}: the ` +
        `defect is in ${named[0].place}`;
    }
    return `the order returns to ${target} when any one of these changes is made: ${
      named.map((v) => `${v.change} (${last(v)})`).join("; ")
    }: the defect involves ${named.map((v) => v.place).join(", or ")}`;
  }
  if (variants.length === 0) return `no variant could be tried${untried}`;
  // Not restored within the tolerance, but brought at least halfway back from the failing order:
  // on the short grid sequence of a variant that is the same signal, still pre-asymptotic.
  const halfway = failing === null ? [] : variants.filter((v) => {
    const o = v.orders[v.orders.length - 1];
    return v.outcome !== "failed" && o !== null && o !== undefined &&
      o >= failing + 0.5 * (target - failing) && target - failing > 0.3;
  });
  if (halfway.length > 0) {
    return `no single change restored the order ${target} within the tolerance, but ${
      halfway.map((v) => `when ${v.change} it rises to ${last(v)}`).join("; ")
    } (from ${failing!.toFixed(2)}): the defect most likely involves ${
      halfway.map((v) => v.place).join(", or ")
    }${untried}`;
  }
  return `no single change restored the order ${target} (tried: ${
    variants.map((v) => `${v.change} → ${v.outcome === "failed" ? "solve failed" : last(v)}`)
      .join("; ")
  }): the defect is not confined to one side's condition, one operator term, one coefficient's ` +
    `variation or the cell shape — it sits in what every variant keeps (the second-derivative ` +
    `stencil, the source, the output) or in more than one place${untried}`;
}
