/**
 * The Markdown summary: short enough for a merge-request comment, failures first.
 *
 * @module
 */
import type { CampaignResult, Verdict } from "../result/mod.ts";
import {
  allVerdicts,
  bySeverity,
  caseIds,
  CAUTION,
  num,
  order,
  orderOf,
  pairs,
  SEVERITY,
  STATUS_WORD,
  worst,
} from "./_shared.ts";
import { escapeMarkdown as md } from "./escape.ts";

/**
 * Failures of one case × solver as one bullet: each failing criterion once, with the reason of
 * its first verdict (the order criterion has one verdict per norm; they say the same thing).
 */
function failureItems(failures: Verdict[]): string[] {
  const groups = new Map<string, Verdict[]>();
  for (const v of failures) {
    const key = `${v.caseId}\u0000${v.solver}`;
    groups.set(key, [...(groups.get(key) ?? []), v]);
  }
  return [...groups.values()].map((vs) => {
    const first = new Map<string, Verdict>();
    for (const v of vs) if (!first.has(v.criterion)) first.set(v.criterion, v);
    const reasons = [...first.values()].map((v) => `${md(v.criterion)}: ${md(v.reason)}`);
    return `- **FAIL** ${md(vs[0].caseId)} · ${md(vs[0].solver)} — ${reasons.join("; ")}`;
  });
}

/** Warnings grouped by criterion: how many, which pairs (the first few), and one reason. */
function warningItems(warnings: Verdict[], shown = 4): string[] {
  const groups = new Map<string, Verdict[]>();
  for (const v of warnings) groups.set(v.criterion, [...(groups.get(v.criterion) ?? []), v]);
  return [...groups.entries()].map(([criterion, vs]) => {
    const pairs = vs.slice(0, shown).map((v) => `${md(v.caseId)} · ${md(v.solver)}`);
    const more = vs.length > shown ? ` and ${vs.length - shown} more` : "";
    return `- **WARN** ${md(criterion)} (${vs.length}): ${pairs.join(", ")}${more} — e.g. ` +
      `${md(vs[0].reason)}`;
  });
}

/**
 * Renders a short Markdown summary: a headline with the counts, the failures (one bullet per
 * case × solver, each failing criterion with its reason), the warnings grouped by criterion, one
 * table row per case × solver (failing rows first), and the caution.
 *
 * @param result The campaign result.
 * @returns Markdown text (GitHub/GitLab flavoured tables).
 *
 * @example
 * ```ts ignore
 * await Deno.writeTextFile("summary.md", renderMarkdown(result));
 * ```
 */
export function renderMarkdown(result: CampaignResult): string {
  const all = allVerdicts(result);
  const failures = all.filter((v) => v.status === "fail");
  const warnings = all.filter((v) => v.status === "warn");
  const undecided = all.filter((v) => v.status === "inconclusive");
  const passed = all.filter((v) => v.status === "pass").length;
  const out: string[] = [];
  out.push(
    `### gridproof: ${failures.length} failed, ${undecided.length} undecided, ` +
      `${warnings.length} warnings, ${passed} passed`,
  );
  out.push("");
  out.push(
    `Result of ${md(result.createdAt)} · gridproof ${md(result.tool.version)} · ` +
      `${caseIds(result).length} cases × ${result.solvers.length} solvers · exit code ` +
      `${result.summary.exitCode}`,
  );
  if (failures.length > 0) {
    out.push("", "**Failures**", "", ...failureItems(failures));
  }
  if (warnings.length > 0) {
    out.push("", "**Warnings** (grouped by criterion; every one is in the full report)", "");
    out.push(...warningItems(warnings));
  }
  const rows: { status: Verdict["status"]; line: string }[] = [];
  for (const id of caseIds(result)) {
    for (const solver of pairs(result, id)) {
      const study = result.studies.find((s) => s.caseId === id && s.solver === solver);
      const verdicts = [
        ...(study?.verdicts ?? []),
        ...result.baselineVerdicts.filter((v) => v.caseId === id && v.solver === solver),
      ];
      const status = worst(verdicts);
      const max = orderOf(study, "all", "max");
      const finest = result.solves
        .filter((s) => s.caseId === id && s.solver === solver)
        .sort((a, b) => b.unknowns - a.unknowns)[0];
      const failed = [
        ...new Set(
          bySeverity(verdicts).filter((v) => v.status === "fail").map((v) => md(v.criterion)),
        ),
      ];
      rows.push({
        status,
        line: `| ${md(id)} | ${md(solver)} | ${order(max?.fitted.order)} | ` +
          `${study ? num(study.expectedOrder) : "—"} | ${
            finest?.iterations === null || finest === undefined ? "—" : finest.iterations
          } | ${STATUS_WORD[status]}${failed.length ? ": " + failed.join(", ") : ""} |`,
      });
    }
  }
  rows.sort((a, b) => SEVERITY[a.status] - SEVERITY[b.status]);
  out.push(
    "",
    "| case | solver | observed order (max error) | expected | iterations on finest grid | result |",
    "| --- | --- | ---: | ---: | ---: | --- |",
    ...rows.map((r) => r.line),
  );
  out.push("", `> **Caution.** ${CAUTION}`);
  return out.join("\n") + "\n";
}
