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
import { buildRows, reportedLine, shortDigest } from "./builds.ts";
import {
  type Finding,
  findingsOf,
  measuresPhrase,
  pairsPhrase,
  type WarningGroup,
} from "./findings.ts";
import { SUPRACONVERGENCE, truncationReading } from "./truncation.ts";

/** Failures or undecided studies, one bullet per case × solver × criterion (norms folded in). */
function findingItems(items: Finding[]): string[] {
  return items.map((f) => {
    const measures = f.measures.length > 0 ? ` (${md(measuresPhrase(f.measures))})` : "";
    const body = f.isolation ? `isolated: ${f.isolation}` : f.reason;
    return `- **${STATUS_WORD[f.status]}** ${md(f.caseId)} · ${md(f.solver)} · ` +
      `${md(f.criterion)}${measures} — ${md(body)}`;
  });
}

/** Warnings grouped by criterion: how many, then each distinct reason and the pairs that gave it. */
function warningItems(groups: WarningGroup[], shown = 4): string[] {
  return groups.flatMap((g) => [
    `- **WARN** ${md(g.criterion)}: ${g.count} in ${g.cases.length} case` +
    `${g.cases.length === 1 ? "" : "s"}`,
    ...g.reasons.slice(0, shown).map((r) => `  - ${md(r.reason)} — ${md(pairsPhrase(r.pairs))}`),
    ...(g.reasons.length > shown
      ? [`  - … and ${g.reasons.length - shown} more reasons (every one is in the full report)`]
      : []),
  ]);
}

/** The builds under test as a table. */
function buildTable(result: CampaignResult): string[] {
  return [
    "| solver | reported by the solver | command | files (SHA-256) |",
    "| --- | --- | --- | --- |",
    ...buildRows(result).map((row) => {
      const files = [
        ...(row.solverFile ? [`solver file ${shortDigest(row.solverFile)}`] : []),
        ...row.files.map(shortDigest),
        ...row.unread.map((u) => `not read: ${u}`),
      ];
      return `| ${md(row.solver)} | ${md(reportedLine(row))}${
        row.changed ? " **(the build changed during the campaign)**" : ""
      } | \`${row.command.replaceAll("`", "'").replaceAll("|", "\\|")}\` | ${
        files.length > 0
          ? files.map(md).join("<br>")
          : row.kind === "reference"
          ? "part of gridproof"
          : "—"
      } |`;
    }),
  ];
}

/**
 * Renders a short Markdown summary: a headline with the counts, the builds under test, the
 * failures (one bullet per case × solver × criterion, norms folded in), the undecided studies, the
 * warnings grouped by criterion with their reasons, one table row per case × solver (failing rows
 * first), and the caution.
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
  const found = findingsOf(result);
  const out: string[] = [];
  out.push(
    `### gridproof: ${found.failures.length} failure${found.failures.length === 1 ? "" : "s"} ` +
      `(${failures.length} failing verdicts), ${undecided.length} undecided, ` +
      `${warnings.length} warnings, ${passed} passed`,
  );
  out.push("");
  out.push(
    `Result of ${md(result.createdAt)} · gridproof ${md(result.tool.version)} · ` +
      `${caseIds(result).length} cases × ${result.solvers.length} solvers · exit code ` +
      `${result.summary.exitCode}`,
  );
  out.push("", "**Builds under test**", "", ...buildTable(result));
  if (found.failures.length > 0) {
    out.push(
      "",
      `**Failures** (${found.failures.length}: each case × solver × criterion once)`,
      "",
      ...findingItems(found.failures),
    );
  }
  if (found.undecided.length > 0) {
    out.push("", "**Undecided** (refine further or fix what blocks it)", "");
    out.push(...findingItems(found.undecided));
  }
  if (found.warnings.length > 0) {
    out.push("", "**Warnings** (grouped by criterion; every one is in the full report)", "");
    out.push(...warningItems(found.warnings));
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
  const truncation = result.studies
    .map((study) => ({ study, reading: truncationReading(study) }))
    .filter((t) => t.reading !== null);
  if (truncation.length > 0) {
    out.push("", "**Truncation and solution orders** (the verdicts judge the solution order)", "");
    for (const { study, reading } of truncation) {
      out.push(`- ${md(study.caseId)} · ${md(study.solver)}: ${md(reading!.line)}`);
    }
    if (truncation.some((t) => t.reading!.lower)) out.push("", SUPRACONVERGENCE);
  }
  out.push("", `> **Caution.** ${CAUTION}`);
  return out.join("\n") + "\n";
}
