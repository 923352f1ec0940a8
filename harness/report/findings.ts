/**
 * What a campaign found, in the order a reviewer reads it: failures grouped by defect (one entry
 * per case × solver × criterion, the verdicts of the several norms and regions folded into it),
 * then the undecided studies the same way, then the warnings grouped by criterion with their
 * counts and their distinct reasons. Every human-readable format shows this first.
 *
 * @module
 */
import type { CampaignResult, Verdict, VerdictStatus } from "../result/mod.ts";
import { allVerdicts } from "./_shared.ts";

/** One defect: every verdict of one status, case, solver and criterion. */
export interface Finding {
  status: "fail" | "inconclusive";
  caseId: string;
  solver: string;
  criterion: string;
  /**
   * The norms and regions the verdicts were given for, e.g. `["max", "L2", "L1"]` or
   * `["max, interior"]` (empty when the criterion has none).
   */
  measures: string[];
  /** The reason of the first verdict (the max norm on all points for the order criterion). */
  reason: string;
  /** Isolation's finding for the study, when isolation ran. */
  isolation?: string;
  verdicts: Verdict[];
}

/** One reason given by several warnings of a criterion, and the case × solver pairs that gave it. */
export interface WarningReason {
  reason: string;
  pairs: { caseId: string; solver: string }[];
}

/** The warnings of one criterion. */
export interface WarningGroup {
  criterion: string;
  count: number;
  /** Distinct cases that warned. */
  cases: string[];
  reasons: WarningReason[];
}

/** Everything found, most severe first. */
export interface Findings {
  failures: Finding[];
  undecided: Finding[];
  warnings: WarningGroup[];
}

const NORM_WORD: Record<string, string> = { max: "max", l2: "L2", l1: "L1" };

/**
 * The norm and region a verdict was given for, from its details (`norm`, `region`), in words:
 * "max", "L2, interior"; "" when it names neither. The region "all" (every point) goes unsaid.
 *
 * @param verdict A verdict.
 * @returns The measure in words.
 *
 * @example
 * ```ts
 * import assert from "node:assert/strict";
 * import { measureOf } from "./findings.ts";
 * const v = { caseId: "c", solver: "s", criterion: "order", status: "pass" as const, reason: "" };
 * assert.equal(measureOf({ ...v, details: { norm: "l2", region: "all" } }), "L2");
 * assert.equal(measureOf({ ...v, details: { norm: "max", region: "interior" } }), "max, interior");
 * assert.equal(measureOf(v), "");
 * ```
 */
export function measureOf(verdict: Verdict): string {
  const norm = verdict.details?.norm;
  const region = verdict.details?.region;
  const parts: string[] = [];
  if (typeof norm === "string") parts.push(NORM_WORD[norm] ?? norm);
  if (typeof region === "string" && region !== "all") parts.push(region);
  return parts.join(", ");
}

function group(
  verdicts: Verdict[],
  status: Finding["status"],
  result: CampaignResult,
): Finding[] {
  const groups = new Map<string, Finding>();
  for (const v of verdicts) {
    if (v.status !== status) continue;
    const key = JSON.stringify([v.caseId, v.solver, v.criterion]);
    let f = groups.get(key);
    if (!f) {
      const study = result.studies.find((s) => s.caseId === v.caseId && s.solver === v.solver);
      f = {
        status,
        caseId: v.caseId,
        solver: v.solver,
        criterion: v.criterion,
        measures: [],
        reason: v.reason,
        verdicts: [],
        ...(study?.isolation && v.criterion === "order"
          ? { isolation: study.isolation.finding }
          : {}),
      };
      groups.set(key, f);
    }
    f.verdicts.push(v);
    const m = measureOf(v);
    if (m !== "" && !f.measures.includes(m)) f.measures.push(m);
  }
  return [...groups.values()];
}

/**
 * Groups every verdict of the result (study and baseline) into what a reviewer reads first.
 * Failures and undecided verdicts keep the result's order (case, then solver); warnings are grouped
 * by criterion, most frequent first, and within a criterion by identical reason.
 *
 * @param result The campaign result.
 * @returns Failures, undecided studies and warning groups.
 *
 * @example
 * ```ts
 * import assert from "node:assert/strict";
 * import { findingsOf } from "./findings.ts";
 * import { makeFixtureResult } from "../../testdata/report/fixture.ts";
 * const found = findingsOf(makeFixtureResult());
 * assert.ok(found.failures.every((f) => f.status === "fail"));
 * ```
 */
export function findingsOf(result: CampaignResult): Findings {
  const all = allVerdicts(result);
  const warnings = new Map<string, WarningGroup>();
  for (const v of all) {
    if (v.status !== "warn") continue;
    let g = warnings.get(v.criterion);
    if (!g) {
      g = { criterion: v.criterion, count: 0, cases: [], reasons: [] };
      warnings.set(v.criterion, g);
    }
    g.count++;
    if (!g.cases.includes(v.caseId)) g.cases.push(v.caseId);
    const same = g.reasons.find((r) => r.reason === v.reason);
    if (same) same.pairs.push({ caseId: v.caseId, solver: v.solver });
    else g.reasons.push({ reason: v.reason, pairs: [{ caseId: v.caseId, solver: v.solver }] });
  }
  return {
    failures: group(all, "fail", result),
    undecided: group(all, "inconclusive", result),
    warnings: [...warnings.values()].sort((a, b) => b.count - a.count),
  };
}

/**
 * The criteria behind a cell of the overview: those of the worst status among the verdicts, each
 * once, in the order of the verdicts (for a passing cell, none).
 *
 * @param verdicts The verdicts of one case and solver.
 * @param status Their worst status.
 * @returns Criterion names.
 */
export function criteriaAt(verdicts: Verdict[], status: VerdictStatus): string[] {
  if (status === "pass" || status === "not-applicable") return [];
  return [...new Set(verdicts.filter((v) => v.status === status).map((v) => v.criterion))];
}

/**
 * "max, L2 and L1 norms" style phrase for the measures of a finding ("" when none).
 *
 * @param measures The measures of a finding.
 * @returns The phrase.
 */
export function measuresPhrase(measures: string[]): string {
  if (measures.length === 0) return "";
  const plain = measures.every((m) => !m.includes(","));
  const list = measures.length === 1
    ? measures[0]
    : `${measures.slice(0, -1).join(plain ? ", " : "; ")} and ${measures[measures.length - 1]}`;
  const noun = plain ? " norm" : "";
  return `${list}${noun}${measures.length > 1 && noun ? "s" : ""}`;
}

/**
 * The pairs of a warning reason in short form: "case (solver, solver); case (solver)".
 *
 * @param pairs Case × solver pairs.
 * @returns One phrase.
 */
export function pairsPhrase(pairs: { caseId: string; solver: string }[]): string {
  const byCase = new Map<string, string[]>();
  for (const p of pairs) byCase.set(p.caseId, [...(byCase.get(p.caseId) ?? []), p.solver]);
  return [...byCase.entries()].map(([c, solvers]) => `${c} (${solvers.join(", ")})`).join("; ");
}
