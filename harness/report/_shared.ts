/**
 * Small helpers shared by the renderers: number formatting and lookups in the result object.
 * Private to `harness/report/`.
 *
 * @module
 */
import type {
  CampaignResult,
  CaseInfo,
  OrderRecord,
  Region,
  SolveRecord,
  StudyRecord,
  Verdict,
  VerdictStatus,
} from "../result/mod.ts";

/** A number in 4 significant figures, exponent form when small or large; "—" for null/NaN. */
export function num(value: number | null | undefined, digits = 4): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return "—";
  if (value === 0) return "0";
  const abs = Math.abs(value);
  if (abs < 1e-3 || abs >= 1e5) return value.toExponential(digits - 1);
  return String(Number(value.toPrecision(digits)));
}

/** An observed order with two decimals; "—" for null. */
export function order(value: number | null | undefined): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return "—";
  return value.toFixed(2);
}

/** Seconds in a readable unit. */
export function seconds(value: number | null | undefined): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return "—";
  if (value < 1e-3) return `${(value * 1e6).toFixed(0)} µs`;
  if (value < 1) return `${(value * 1e3).toPrecision(3)} ms`;
  return `${value.toPrecision(3)} s`;
}

/** A fraction as a percentage with up to 3 significant figures. */
export function percent(value: number | null | undefined): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return "—";
  return `${Number((value * 100).toPrecision(3))} %`;
}

export { SEVERITY } from "../result/mod.ts";
import { SEVERITY, worstStatus } from "../result/mod.ts";

/** Upper-case word shown for a status in text and Markdown. */
export const STATUS_WORD: Record<VerdictStatus, string> = {
  fail: "FAIL",
  inconclusive: "UNDECIDED",
  warn: "WARN",
  pass: "PASS",
  "not-applicable": "N/A",
};

/** The worst status among verdicts ("not-applicable" when there are none). */
export function worst(verdicts: Verdict[]): VerdictStatus {
  return worstStatus(verdicts);
}

/** Every verdict of the result (study verdicts, then baseline verdicts). */
export function allVerdicts(result: CampaignResult): Verdict[] {
  return [...result.studies.flatMap((s) => s.verdicts), ...result.baselineVerdicts];
}

/** Verdicts sorted failures first, keeping the original order within a status. */
export function bySeverity(verdicts: Verdict[]): Verdict[] {
  return verdicts
    .map((v, i) => ({ v, i }))
    .sort((a, b) => SEVERITY[a.v.status] - SEVERITY[b.v.status] || a.i - b.i)
    .map((x) => x.v);
}

/** The solves of one case and solver, coarsest grid first. */
export function solvesOf(result: CampaignResult, caseId: string, solver: string): SolveRecord[] {
  return result.solves
    .filter((s) => s.caseId === caseId && s.solver === solver)
    .sort((a, b) => a.unknowns - b.unknowns || a.nx - b.nx);
}

/** The studies of one case, in the result's order. */
export function studiesOf(result: CampaignResult, caseId: string): StudyRecord[] {
  return result.studies.filter((s) => s.caseId === caseId);
}

/**
 * The case ids to show, in the order of the configuration, then any others found in cases,
 * studies or solves (so a result with an incomplete case list still shows everything).
 */
export function caseIds(result: CampaignResult): string[] {
  const ids = [
    ...result.configuration.cases,
    ...result.cases.map((c) => c.id),
    ...result.studies.map((s) => s.caseId),
    ...result.solves.map((s) => s.caseId),
  ];
  return [...new Set(ids)];
}

/** The case description, when the result has one. */
export function caseInfo(result: CampaignResult, caseId: string): CaseInfo | undefined {
  return result.cases.find((c) => c.id === caseId);
}

/** The (case, solver) pairs that have solves or a study, in a stable order. */
export function pairs(result: CampaignResult, caseId: string): string[] {
  const names = [
    ...result.studies.filter((s) => s.caseId === caseId).map((s) => s.solver),
    ...result.solves.filter((s) => s.caseId === caseId).map((s) => s.solver),
  ];
  return [...new Set(names)];
}

/** The order record of one region and norm, if present. */
export function orderOf(
  study: StudyRecord | undefined,
  region: Region,
  norm: OrderRecord["norm"],
): OrderRecord | undefined {
  return study?.orders.find((o) => o.region === region && o.norm === norm);
}

/**
 * The pairwise observed order ending at a grid (the order between it and the next coarser grid of
 * the study), or null on the coarsest grid or when unknown.
 */
export function pairwiseAt(
  study: StudyRecord | undefined,
  record: OrderRecord | undefined,
  nx: number,
): number | null {
  if (!study || !record) return null;
  const k = study.grids.indexOf(nx);
  if (k < 1) return null;
  return record.pairwise[k - 1] ?? null;
}

/** A command as one line a shell user could paste (arguments with spaces are quoted). */
export function commandLine(command: string[] | undefined): string {
  if (!command || command.length === 0) return "";
  return command
    .map((a) => /^[\w@%+=:,./-]+$/.test(a) ? a : `'${a.replace(/'/g, `'\\''`)}'`)
    .join(" ");
}

/** The caution every human-facing report carries. */
export const CAUTION = "Code verification shows that the discrete equations are solved correctly " +
  "and converge at the expected order; it does not validate the physical model. Engineering use " +
  "must follow the applicable codes and standards and licensed review.";

/**
 * The note for a study whose solves were compared after mean removal (a singular case), or
 * undefined when none was.
 */
export function meanRemovedNote(solves: { meanRemoved?: boolean }[]): string | undefined {
  return solves.some((s) => s.meanRemoved === true)
    ? "the solution is fixed only up to a constant: errors are measured after removing the " +
      "volume-weighted mean from both the computed and the exact field"
    : undefined;
}
