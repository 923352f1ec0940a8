/**
 * Comparison of a campaign result with a saved result of an earlier release.
 *
 * @module
 */
import type {
  CampaignResult,
  OrderRecord,
  SolveRecord,
  StudyRecord,
  Verdict,
  VerdictStatus,
} from "../result/mod.ts";
import { worstStatus } from "../result/mod.ts";

/** Options of {@link compareWithBaseline}; every field has a default. */
export interface BaselineOptions {
  /**
   * How far (in units of order) a fitted observed order may fall below the baseline's before it
   * fails. Default: the current result's `configuration.orderTolerance`.
   */
  orderTolerance?: number;
  /** Largest allowed growth of an iteration count, as a fraction. Default 0.2 (20 %). */
  iterationGrowth?: number;
  /**
   * Largest allowed growth of a solver's time relative to the reference solver's time on the same
   * case and grid in the same run, as a fraction. Default 0.3 (30 %).
   */
  timeGrowth?: number;
  /**
   * Grids where either solver took less than this many seconds (in either run) are left out of
   * the time comparison: such times are mostly start-up noise. Default 0.01.
   */
  minSeconds?: number;
}

const NORM_WORDS: Record<OrderRecord["norm"], string> = { max: "max", l2: "L2", l1: "L1" };
const REGION_WORDS: Record<OrderRecord["region"], string> = {
  all: "all nodes",
  interior: "interior nodes",
  boundary: "boundary nodes",
};

function check(name: string, value: number, low: number): number {
  if (!Number.isFinite(value) || value < low) {
    throw new RangeError(
      `cannot compare with the baseline: option ${name} is ${value}, expected a finite number ` +
        `≥ ${low}`,
    );
  }
  return value;
}

function fix(x: number, digits = 2): string {
  return Number.isFinite(x) ? x.toFixed(digits) : String(x);
}

function pct(fraction: number): string {
  return `${Math.round(fraction * 100)} %`;
}

function grid(s: SolveRecord): string {
  return `${s.nx}×${s.ny}`;
}

function make(
  study: { caseId: string; solver: string },
  criterion: string,
  status: VerdictStatus,
  reason: string,
  details?: Record<string, unknown>,
): Verdict {
  const v: Verdict = { caseId: study.caseId, solver: study.solver, criterion, status, reason };
  if (details) v.details = details;
  return v;
}

function orderVerdict(now: StudyRecord, old: StudyRecord, tolerance: number): Verdict {
  const compared: Record<string, unknown>[] = [];
  const dropped: string[] = [];
  let largest = -Infinity;
  let largestAt = "";
  for (const record of now.orders) {
    const before = old.orders.find((o) => o.region === record.region && o.norm === record.norm);
    const a = before?.fitted.order;
    const b = record.fitted.order;
    if (a === null || a === undefined || b === null || !Number.isFinite(a) || !Number.isFinite(b)) {
      continue;
    }
    const drop = a - b;
    const what = `${NORM_WORDS[record.norm]} error on ${REGION_WORDS[record.region]}`;
    compared.push({ region: record.region, norm: record.norm, baseline: a, current: b, drop });
    if (drop > largest) {
      largest = drop;
      largestAt = what;
    }
    if (drop > tolerance) dropped.push(`${what} fell from ${fix(a)} to ${fix(b)}`);
  }
  if (compared.length === 0) {
    return make(
      now,
      "baseline-order",
      "not-applicable",
      "no fitted observed order exists in both this run and the baseline",
    );
  }
  const details = { tolerance, compared };
  if (dropped.length > 0) {
    return make(
      now,
      "baseline-order",
      "fail",
      `observed order dropped by more than ${tolerance} since the baseline: ` +
        `${dropped.join("; ")}`,
      details,
    );
  }
  return make(
    now,
    "baseline-order",
    "pass",
    largest > 0
      ? `no observed order fell by more than ${tolerance} (largest drop ${fix(largest)}, ` +
        `${largestAt})`
      : `no observed order fell below the baseline`,
    details,
  );
}

const worstOf = worstStatus;

function statusVerdict(now: StudyRecord, old: StudyRecord): Verdict {
  const wasFailing = old.verdicts.filter((v) => v.status === "fail").map((v) => v.criterion);
  const failing = now.verdicts.filter((v) => v.status === "fail").map((v) => v.criterion);
  const details = { baseline: worstOf(old.verdicts), current: worstOf(now.verdicts) };
  if (failing.length > 0 && wasFailing.length === 0) {
    return make(
      now,
      "baseline-status",
      "fail",
      `passed in the baseline and now fails: ${failing.join(", ")}`,
      details,
    );
  }
  if (failing.length > 0) {
    const fresh = failing.filter((c) => !wasFailing.includes(c));
    return make(
      now,
      "baseline-status",
      fresh.length > 0 ? "fail" : "warn",
      fresh.length > 0
        ? `already failed in the baseline (${wasFailing.join(", ")}) and now also fails ` +
          fresh.join(", ")
        : `still fails as in the baseline (${failing.join(", ")}): not a new regression, but ` +
          "not fixed either",
      details,
    );
  }
  return make(
    now,
    "baseline-status",
    "pass",
    wasFailing.length > 0
      ? `failed in the baseline (${wasFailing.join(", ")}) and passes now`
      : "passed in the baseline and passes now",
    details,
  );
}

type Pairs = { now: SolveRecord; old: SolveRecord }[];

function matchGrids(now: SolveRecord[], old: SolveRecord[]): Pairs {
  const out: Pairs = [];
  for (const s of now) {
    const o = old.find((x) => x.nx === s.nx && x.ny === s.ny);
    if (o && s.status === "ok" && o.status === "ok") out.push({ now: s, old: o });
  }
  return out;
}

function iterationVerdict(study: StudyRecord, pairs: Pairs, growth: number): Verdict {
  const compared = pairs.filter((p) =>
    p.now.iterations !== null && p.old.iterations !== null && p.old.iterations > 0
  );
  if (compared.length === 0) {
    return make(
      study,
      "baseline-iterations",
      "not-applicable",
      "no grid has an iteration count in both this run and the baseline",
    );
  }
  const rows = compared.map((p) => ({
    grid: grid(p.now),
    baseline: p.old.iterations!,
    current: p.now.iterations!,
    growth: p.now.iterations! / p.old.iterations! - 1,
  }));
  const grown = compared.filter((p) => p.now.iterations! > p.old.iterations! * (1 + growth));
  const details = { allowedGrowth: growth, grids: rows };
  if (grown.length > 0) {
    return make(
      study,
      "baseline-iterations",
      "fail",
      `iterations grew by more than ${pct(growth)} since the baseline: ` +
        grown.map((p) =>
          `${grid(p.now)} from ${p.old.iterations} to ${p.now.iterations} ` +
          `(+${pct(p.now.iterations! / p.old.iterations! - 1)})`
        ).join("; "),
      details,
    );
  }
  return make(
    study,
    "baseline-iterations",
    "pass",
    `iterations grew by no more than ${pct(growth)} on any of ${compared.length} grids`,
    details,
  );
}

function referenceName(result: CampaignResult): string | undefined {
  return result.solvers.find((s) => s.kind === "reference")?.name;
}

function timeVerdict(
  study: StudyRecord,
  pairs: Pairs,
  current: CampaignResult,
  baseline: CampaignResult,
  growth: number,
  minSeconds: number,
): Verdict {
  const refNow = referenceName(current);
  const refOld = referenceName(baseline);
  if (refNow === undefined || refOld === undefined) {
    return make(
      study,
      "baseline-time",
      "not-applicable",
      `no reference solver ran in ${refNow === undefined ? "this run" : "the baseline"}, so ` +
        "times cannot be compared across machines",
    );
  }
  if (study.solver === refNow) {
    return make(
      study,
      "baseline-time",
      "not-applicable",
      "this is the reference solver: its time is the yardstick the other solvers are measured by",
    );
  }
  const find = (r: CampaignResult, name: string, s: SolveRecord) =>
    r.solves.find((x) =>
      x.caseId === study.caseId && x.solver === name && x.nx === s.nx && x.ny === s.ny &&
      x.status === "ok"
    );
  const rows: Record<string, unknown>[] = [];
  const grown: string[] = [];
  let tooShort = 0;
  for (const p of pairs) {
    const rn = find(current, refNow, p.now);
    const ro = find(baseline, refOld, p.old);
    if (!rn || !ro) continue;
    const times = [p.now.seconds, rn.seconds, p.old.seconds, ro.seconds];
    if (times.some((t) => !(t >= minSeconds))) {
      tooShort++;
      continue;
    }
    const ratioNow = p.now.seconds / rn.seconds;
    const ratioOld = p.old.seconds / ro.seconds;
    const change = ratioNow / ratioOld - 1;
    rows.push({
      grid: grid(p.now),
      ratioBaseline: ratioOld,
      ratioCurrent: ratioNow,
      growth: change,
    });
    if (ratioNow > ratioOld * (1 + growth)) {
      grown.push(
        `${grid(p.now)} took ${fix(ratioNow)}× the reference solver's time, ` +
          `${fix(ratioOld)}× in the baseline (+${pct(change)})`,
      );
    }
  }
  const details = { allowedGrowth: growth, minSeconds, grids: rows, leftOutAsTooShort: tooShort };
  if (rows.length === 0) {
    return make(
      study,
      "baseline-time",
      "not-applicable",
      tooShort > 0
        ? `every comparable solve took less than ${minSeconds} s, too short to time reliably`
        : "no grid was solved by both this solver and the reference solver in both runs",
      details,
    );
  }
  if (grown.length > 0) {
    return make(
      study,
      "baseline-time",
      "fail",
      `solve time relative to the reference solver grew by more than ${pct(growth)}: ` +
        grown.join("; "),
      details,
    );
  }
  return make(
    study,
    "baseline-time",
    "pass",
    `time relative to the reference solver grew by no more than ${pct(growth)} on any of ` +
      `${rows.length} grids`,
    details,
  );
}

/**
 * Compares a campaign result with the saved result of an earlier release and returns verdicts of
 * their own, per case × solver found in both:
 * - `baseline-order`: a fitted observed order (any region and norm) fell by more than
 *   `orderTolerance`;
 * - `baseline-status`: the study passed in the baseline and now fails (warn when it failed then
 *   and fails now in the same criteria);
 * - `baseline-iterations`: an iteration count grew by more than `iterationGrowth` on a grid;
 * - `baseline-time`: the solver's time divided by the reference solver's time on the same case
 *   and grid grew by more than `timeGrowth` (a ratio measured within each run, so a change of
 *   machine cancels out).
 * A study missing from this run gives a `baseline-status` warning; a new study gives one
 * `baseline-status` verdict marked not applicable. Growth limits are strict: exactly 20 % more
 * iterations passes.
 *
 * @param current The new result.
 * @param baseline The saved result of the earlier release.
 * @param options Tolerances; see {@link BaselineOptions}.
 * @returns The verdicts, in the order of the current result's studies.
 * @throws {RangeError} When an option is negative or not finite.
 *
 * @example
 * ```ts ignore
 * const verdicts = compareWithBaseline(result, await readResult("release-1.4.json"));
 * ```
 */
export function compareWithBaseline(
  current: CampaignResult,
  baseline: CampaignResult,
  options: BaselineOptions = {},
): Verdict[] {
  const tolerance = check(
    "orderTolerance",
    options.orderTolerance ?? current.configuration.orderTolerance,
    0,
  );
  const iterationGrowth = check("iterationGrowth", options.iterationGrowth ?? 0.2, 0);
  const timeGrowth = check("timeGrowth", options.timeGrowth ?? 0.3, 0);
  const minSeconds = check("minSeconds", options.minSeconds ?? 0.01, 0);
  const out: Verdict[] = [];
  const solvesOf = (r: CampaignResult, s: StudyRecord) =>
    r.solves.filter((x) => x.caseId === s.caseId && x.solver === s.solver);
  for (const now of current.studies) {
    const old = baseline.studies.find((s) => s.caseId === now.caseId && s.solver === now.solver);
    if (!old) {
      out.push(
        make(
          now,
          "baseline-status",
          "not-applicable",
          "the baseline has no result for this case and solver (new since the baseline)",
        ),
      );
      continue;
    }
    const pairs = matchGrids(solvesOf(current, now), solvesOf(baseline, old));
    out.push(
      orderVerdict(now, old, tolerance),
      statusVerdict(now, old),
      iterationVerdict(now, pairs, iterationGrowth),
      timeVerdict(now, pairs, current, baseline, timeGrowth, minSeconds),
    );
  }
  for (const old of baseline.studies) {
    if (!current.studies.some((s) => s.caseId === old.caseId && s.solver === old.solver)) {
      out.push(
        make(
          old,
          "baseline-status",
          "warn",
          "ran in the baseline but not in this run: a case or solver left out can hide a " +
            "regression",
        ),
      );
    }
  }
  return out;
}
