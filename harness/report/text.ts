/**
 * The terminal report: per case and solver a table of the grid sequence, then the verdict lines.
 *
 * @module
 */
import type { CampaignResult, SolveRecord, Verdict, VerdictStatus } from "../result/mod.ts";
import { escapeTerminal } from "./escape.ts";
import { foundLines } from "./found_text.ts";
import {
  allVerdicts,
  bySeverity,
  caseIds,
  caseInfo,
  meanRemovedNote,
  num,
  order,
  orderOf,
  pairs,
  pairwiseAt,
  seconds,
  STATUS_WORD,
} from "./_shared.ts";
import { SUPRACONVERGENCE, truncationReading } from "./truncation.ts";

/** Options of {@link renderText}. */
export interface TextOptions {
  /**
   * Colour the status words with ANSI escape codes. Default false. The CLI turns it on only when
   * standard output is a terminal and `NO_COLOR` is not set.
   */
  color?: boolean;
  /** Columns the builds and findings at the top wrap at. Default 100. */
  width?: number;
}

const ANSI: Record<VerdictStatus, string> = {
  fail: "\x1b[1;31m",
  inconclusive: "\x1b[1;35m",
  warn: "\x1b[33m",
  pass: "\x1b[32m",
  "not-applicable": "\x1b[2m",
};

function table(rows: string[][], indent: string): string[] {
  const widths: number[] = [];
  const full = Math.max(...rows.map((r) => r.length));
  for (const row of rows) {
    // a short row (a failed solve) ends in free text that must not widen the columns
    row.forEach((cell, i) => {
      if (row.length === full || i < row.length - 1) {
        widths[i] = Math.max(widths[i] ?? 0, [...cell].length);
      }
    });
  }
  return rows.map((row) =>
    indent +
    row.map((cell, i) =>
      i === row.length - 1 ? cell : cell + " ".repeat(widths[i] - [...cell].length)
    ).join("  ").trimEnd()
  );
}

function verdictLines(verdicts: Verdict[], color: boolean, indent: string): string[] {
  const width = Math.max(0, ...verdicts.map((v) => v.criterion.length));
  return bySeverity(verdicts).map((v) => {
    const word = STATUS_WORD[v.status].padEnd(4);
    const shown = color ? `${ANSI[v.status]}${word}\x1b[0m` : word;
    return `${indent}${shown}  ${v.criterion.padEnd(width)}  ${oneLine(v.reason)}`;
  });
}

/** Control characters from the result must not move the cursor or recolour the terminal. */
const oneLine = escapeTerminal;

function solveRow(
  s: SolveRecord,
  pMax: number | null,
  pL2: number | null,
): string[] {
  const grid = `${s.nx}×${s.ny}`;
  if (s.status !== "ok") {
    return [grid, num(s.h), `${s.status}: ${oneLine(s.reason ?? "no reason given")}`];
  }
  return [
    grid,
    num(s.h),
    num(s.errors?.all.max),
    num(s.errors?.all.l2),
    order(pMax),
    order(pL2),
    s.iterations === null ? "—" : String(s.iterations),
    num(s.averageFactor, 3),
    seconds(s.seconds),
  ];
}

/**
 * Renders the result as plain text for a terminal.
 *
 * @param result The campaign result.
 * @param options Colour or not.
 * @returns The report, ending with a newline.
 *
 * @example
 * ```ts ignore
 * console.log(renderText(result, { color: Deno.stdout.isTerminal() }));
 * ```
 */
export function renderText(result: CampaignResult, options: TextOptions = {}): string {
  const color = options.color ?? false;
  const out: string[] = [];
  out.push(
    `gridproof ${oneLine(result.tool.version)} · result of ${oneLine(result.createdAt)} · ` +
      `${caseIds(result).length} cases × ${result.solvers.length} solvers`,
  );
  out.push("", ...foundLines(result, { color, width: options.width }));
  for (const id of caseIds(result)) {
    const info = caseInfo(result, id);
    out.push("");
    out.push(`${oneLine(id)}${info ? " — " + oneLine(info.title) : ""}`);
    for (const solver of pairs(result, id)) {
      const study = result.studies.find((s) => s.caseId === id && s.solver === solver);
      const solves = result.solves
        .filter((s) => s.caseId === id && s.solver === solver)
        .sort((a, b) => a.unknowns - b.unknowns);
      out.push(
        `  solver ${oneLine(solver)}` +
          (study ? ` (expected order ${num(study.expectedOrder)})` : " (no study)"),
      );
      const max = orderOf(study, "all", "max");
      const l2 = orderOf(study, "all", "l2");
      const rows = [[
        "grid",
        "h",
        "max error",
        "L2 error",
        "order max",
        "order L2",
        "iterations",
        "factor",
        "time",
      ]];
      for (const s of solves) {
        rows.push(solveRow(s, pairwiseAt(study, max, s.nx), pairwiseAt(study, l2, s.nx)));
      }
      out.push(...table(rows, "    "));
      const meanNote = meanRemovedNote(solves);
      if (meanNote) out.push(`    mean removed: ${meanNote}`);
      if (study) {
        const fitted = [max, l2].filter((r) => r !== undefined).map((r) =>
          `${r!.norm === "l2" ? "L2" : r!.norm} ${order(r!.fitted.order)} ` +
          `[${order(r!.fitted.low)}, ${order(r!.fitted.high)}]`
        );
        if (fitted.length > 0) {
          out.push(
            `    fitted order over the finest ${max?.fitted.points ?? l2?.fitted.points} grids: ` +
              fitted.join(", "),
          );
        }
        const truncation = truncationReading(study);
        if (truncation) {
          out.push(`    ${truncation.line}`);
          if (truncation.lower) out.push(`    ${SUPRACONVERGENCE}`);
        }
        if (study.added) out.push(`    grids added to decide: ${oneLine(study.added.reason)}`);
        if (study.isolation) out.push(`    isolation: ${oneLine(study.isolation.finding)}`);
        if (study.diagnosis) out.push(`    diagnosis: ${oneLine(study.diagnosis)}`);
        out.push(...verdictLines(study.verdicts, color, "    "));
      }
    }
  }
  if (result.baselineVerdicts.length > 0) {
    out.push("");
    out.push(
      `compared with the baseline${
        result.configuration.baseline ? " " + oneLine(result.configuration.baseline) : ""
      }`,
    );
    const labelled = result.baselineVerdicts.map((v) => ({
      ...v,
      criterion: `${v.caseId} · ${v.solver} · ${v.criterion}`,
    }));
    out.push(...verdictLines(labelled, color, "  "));
  }
  const all = allVerdicts(result);
  const count = (s: VerdictStatus) => all.filter((v) => v.status === s).length;
  out.push("");
  out.push(
    `${count("pass")} pass · ${count("fail")} fail · ${count("inconclusive")} undecided · ` +
      `${count("warn")} warn · ` +
      `${count("not-applicable")} not applicable — exit code ${result.summary.exitCode}`,
  );
  return out.join("\n") + "\n";
}
