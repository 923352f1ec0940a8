/**
 * The first screen of a terminal report as plain lines: the builds under test, then what the
 * campaign found (failures by defect, undecided studies, warnings by criterion with their
 * reasons), every long line wrapped at word boundaries. Shared by the text report and the summary
 * `check` and `demo` print.
 *
 * @module
 */
import type { CampaignResult, VerdictStatus } from "../result/mod.ts";
import { buildRows, reportedLine, shortDigest } from "./builds.ts";
import { escapeTerminal } from "./escape.ts";
import { type Finding, findingsOf, measuresPhrase, pairsPhrase } from "./findings.ts";
import { STATUS_WORD } from "./_shared.ts";

/** Options of {@link foundLines}. */
export interface FoundOptions {
  /** Columns to wrap at. Default 100. */
  width?: number;
  /** ANSI colour for the status words. Default false. */
  color?: boolean;
  /** At most this many reasons shown per warning criterion (the rest counted). Default 6. */
  reasonsPerWarning?: number;
  /**
   * At most this many lines of each failure's reason; a longer one ends with a pointer to the
   * full report. Default: every line.
   */
  reasonLines?: number;
}

const ANSI: Partial<Record<VerdictStatus, string>> = {
  fail: "\x1b[1;31m",
  inconclusive: "\x1b[1;35m",
  warn: "\x1b[33m",
};

/**
 * Wraps text at word boundaries: the first line starts with `first`, the others with `rest`
 * (a hanging indent); a word longer than a line is left whole on its own line, never cut.
 *
 * @param text The text (line breaks in it are kept).
 * @param width Columns per line.
 * @param first Prefix of the first line.
 * @param rest Prefix of the following lines. Default: spaces as wide as `first`.
 * @returns The wrapped lines.
 *
 * @example
 * ```ts
 * import assert from "node:assert/strict";
 * import { wrapWords } from "./found_text.ts";
 * assert.deepEqual(wrapWords("the order returns to 2", 12, "- "), ["- the order", "  returns to", "  2"]);
 * ```
 */
export function wrapWords(
  text: string,
  width: number,
  first: string,
  rest = " ".repeat([...first].length),
): string[] {
  const out: string[] = [];
  let prefix = first;
  for (const paragraph of text.split("\n")) {
    let line = prefix;
    let empty = true;
    for (const word of paragraph.split(/ +/).filter((w) => w !== "")) {
      const candidate = empty ? line + word : `${line} ${word}`;
      if (!empty && [...candidate].length > width) {
        out.push(line);
        prefix = rest;
        line = rest + word;
      } else {
        line = candidate;
      }
      empty = false;
    }
    out.push(line);
    prefix = rest;
  }
  return out;
}

function word(status: VerdictStatus, color: boolean): string {
  const w = STATUS_WORD[status];
  return color && ANSI[status] ? `${ANSI[status]}${w}\x1b[0m` : w;
}

function findingLines(f: Finding, width: number, color: boolean, most = Infinity): string[] {
  const measures = f.measures.length > 0 ? ` (${measuresPhrase(f.measures)})` : "";
  const head = `${f.caseId} × ${f.solver}  ${f.criterion}${measures}`;
  const body = f.isolation ? `isolated: ${f.isolation}` : f.reason;
  let lines = wrapWords(escapeTerminal(body), width, "        ");
  if (lines.length > most) {
    lines = wrapWords(
      lines.slice(0, most).join(" ").replace(/\s+/g, " ").trim() + " … (in full in the report)",
      width,
      "        ",
    ).slice(0, most + 1);
  }
  return [`  ${word(f.status, color)}  ${escapeTerminal(head)}`, ...lines];
}

/**
 * The builds and the findings of a result as terminal lines (no trailing newline).
 *
 * @param result The campaign result.
 * @param options Width, colour and how many warning reasons to show.
 * @returns Lines to print.
 */
export function foundLines(result: CampaignResult, options: FoundOptions = {}): string[] {
  const width = Math.max(40, options.width ?? 100);
  const color = options.color ?? false;
  const shown = options.reasonsPerWarning ?? 6;
  const out: string[] = ["Builds under test:"];
  const rows = buildRows(result);
  const nameWidth = Math.max(...rows.map((r) => [...r.solver].length));
  for (const row of rows) {
    const files = [
      ...(row.solverFile ? [`solver file ${shortDigest(row.solverFile)}`] : []),
      ...row.files.map(shortDigest),
    ];
    const parts = [
      reportedLine(row) + (row.changed ? " — THE BUILD CHANGED DURING THE CAMPAIGN" : ""),
      row.command,
      ...files,
      ...row.unread.map((u) => `not read: ${u}`),
    ];
    const first = `  ${row.solver.padEnd(nameWidth)}  `;
    out.push(
      ...wrapWords(escapeTerminal(parts.join(" · ")), width, first, " ".repeat(first.length)),
    );
  }
  const found = findingsOf(result);
  if (found.failures.length > 0) {
    const verdicts = found.failures.reduce((n, f) => n + f.verdicts.length, 0);
    out.push("", `Failed (${found.failures.length}, from ${verdicts} failing verdicts):`);
    for (const f of found.failures) {
      out.push(...findingLines(f, width, color, options.reasonLines));
    }
  }
  if (found.undecided.length > 0) {
    out.push(
      "",
      `Undecided (${found.undecided.length}; the evidence does not decide — refine further or ` +
        `fix what blocks it):`,
    );
    for (const f of found.undecided) {
      out.push(...findingLines(f, width, color, options.reasonLines));
    }
  }
  if (found.warnings.length > 0) {
    const total = found.warnings.reduce((n, g) => n + g.count, 0);
    out.push("", `Warnings (${total}; advice, they never change the exit code):`);
    for (const g of found.warnings) {
      out.push(
        `  ${word("warn", color)}  ${escapeTerminal(g.criterion)}: ${g.count} in ` +
          `${g.cases.length} case${g.cases.length === 1 ? "" : "s"}`,
      );
      for (const r of g.reasons.slice(0, shown)) {
        out.push(
          ...wrapWords(escapeTerminal(r.reason), width, "        - ", "          "),
          ...wrapWords(
            escapeTerminal(`in ${pairsPhrase(r.pairs)}`),
            width,
            "          ",
            "             ",
          ),
        );
      }
      if (g.reasons.length > shown) {
        out.push(`          … and ${g.reasons.length - shown} more reasons (see the report)`);
      }
    }
  }
  return out;
}
