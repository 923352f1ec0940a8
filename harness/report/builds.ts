/**
 * The build of every solver that took part, as the first screen of each human-readable report
 * names it: what each solver reported with its replies (name, version, build id; counted per
 * solve, so a build that changed during the campaign shows), the command, and the digests of the
 * solver file and of the files the command runs.
 *
 * @module
 */
import type { CampaignResult, FileDigest, SolverInfo } from "../result/mod.ts";
import { commandLine } from "./_shared.ts";

/** One identity a solver reported, and on how many solves. */
export interface ReportedIdentity {
  /** "name version (build id)" as reported, or a note when the solver reported none. */
  text: string;
  solves: number;
}

/** What a report shows of one solver's build. */
export interface BuildRow {
  solver: string;
  kind: SolverInfo["kind"];
  /** Distinct identities the solves reported, most frequent first. */
  reported: ReportedIdentity[];
  /** The command as one shell line ("in process" for the reference solver). */
  command: string;
  solverFile?: FileDigest;
  files: FileDigest[];
  /** Files the harness could not read, with the reason. */
  unread: string[];
  /** More than one identity was reported: the build changed during the campaign. */
  changed: boolean;
}

/** Reported identity of one solve, from `description.solver`; undefined when none was reported. */
function identityText(description: Record<string, unknown> | undefined): string | undefined {
  const s = description?.solver;
  if (typeof s !== "object" || s === null) return undefined;
  const { name, version, build } = s as Record<string, unknown>;
  const parts = [name, version].filter((x) => typeof x === "string" && x !== "") as string[];
  if (typeof build === "string" && build !== "") parts.push(`(build ${build})`);
  return parts.length > 0 ? parts.join(" ") : undefined;
}

/**
 * The build rows of a result, one per solver in the result's order. Results written before the
 * harness recorded digests give rows without files.
 *
 * @param result The campaign result.
 * @returns One row per solver.
 *
 * @example
 * ```ts
 * import assert from "node:assert/strict";
 * import { buildRows } from "./builds.ts";
 * import { makeFixtureResult } from "../../testdata/report/fixture.ts";
 * const rows = buildRows(makeFixtureResult());
 * assert.equal(rows[0].solver, "reference");
 * assert.match(rows[0].reported[0].text, /gridproof reference solver/);
 * ```
 */
export function buildRows(result: CampaignResult): BuildRow[] {
  return result.solvers.map((info) => {
    const counts = new Map<string, number>();
    const solves = result.solves.filter((s) => s.solver === info.name);
    for (const s of solves) {
      const text = info.kind === "reference"
        ? `gridproof reference solver ${result.tool.version}`
        : identityText(s.description) ??
          (s.status === "ok" ? "no name or version reported" : undefined);
      if (text !== undefined) counts.set(text, (counts.get(text) ?? 0) + 1);
    }
    if (counts.size === 0 && info.kind === "reference") {
      counts.set(`gridproof reference solver ${result.tool.version}`, 0);
    }
    const reported = [...counts.entries()]
      .map(([text, n]) => ({ text, solves: n }))
      .sort((a, b) => b.solves - a.solves);
    return {
      solver: info.name,
      kind: info.kind,
      reported,
      command: info.kind === "reference" ? "in process" : commandLine(info.command),
      ...(info.build?.solverFile ? { solverFile: info.build.solverFile } : {}),
      files: info.build?.files ?? [],
      unread: info.build?.unread ?? [],
      changed: reported.filter((r) => !r.text.startsWith("no name")).length > 1,
    };
  });
}

/**
 * A digest shortened for a table: the first 12 hex digits (the full one is in result.json).
 *
 * @param digest A file digest.
 * @returns e.g. "main.ts sha256:1a2b3c4d5e6f".
 */
export function shortDigest(digest: FileDigest): string {
  return `${digest.path} sha256:${digest.sha256.slice(0, 12)}`;
}

/**
 * The reported identities of a row in one line: "deno-sor 1.0.0 (build plain)", with solve counts
 * when there are several.
 *
 * @param row A build row.
 * @returns One line.
 */
export function reportedLine(row: BuildRow): string {
  if (row.reported.length === 0) return "nothing reported (no solve finished)";
  if (row.reported.length === 1) return row.reported[0].text;
  return row.reported.map((r) => `${r.text} on ${r.solves} solves`).join("; ");
}
