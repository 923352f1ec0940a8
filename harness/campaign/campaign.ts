/**
 * A whole campaign, from chosen cases and solvers to the one {@link CampaignResult}: plan, run
 * (in parallel, journaled, resumable), measure, analyse, judge.
 *
 * @module
 */
import type { CompiledCase } from "../../cases/types.ts";
import type { CampaignResult, CaseInfo, SolveRecord, StudyRecord, Verdict } from "../result/mod.ts";
import { RESULT_FORMAT, RESULT_VERSION } from "../result/mod.ts";
import type { JobNote, Solver } from "../solvers/mod.ts";
import { VERSION } from "../version.ts";
import {
  JOURNAL_FILE,
  type JournaledSolve,
  type JournalHeader,
  JournalWriter,
  readJournal,
  repairJournal,
  solveKey,
} from "./journal.ts";
import { gridFor, plannedInputs, type PlannedSolve, type ProgressEvent, runSolves } from "./run.ts";
import { buildStudies, type StudiesOptions } from "./study.ts";
import { isolateFailures } from "./isolation.ts";
import { lockFolder } from "./folder_lock.ts";
import { runRankChecks } from "./rank_check.ts";

/** Options of {@link runCampaign}. */
export interface CampaignOptions {
  /** Grid sequence (nx values) for every case; default: each case's suggested grids. */
  grids?: number[];
  /** Solves at once. Default: 1. */
  jobs?: number;
  /** Relative residual tolerance asked of every solver. Default: 1e-10. */
  tolerance?: number;
  /** Tolerance on observed orders. Default: 0.1; a case's own `expected.<scheme>.orderTolerance` takes precedence. */
  orderTolerance?: number;
  /**
   * Iterations that grow faster than the solver declares fail the "flat-iterations" criterion
   * (true) or only warn (false). Default: true.
   */
  requireFlatIterations?: boolean;
  /**
   * Budget for grids added to studies whose order is inconclusive: at most `maxAdded` grids per
   * study (default 2), none above `maxUnknowns` unknowns (default 1 100 000, about 1024×1024), and
   * no new solve once the added solves of a study have taken, or are predicted to take, more than
   * `seconds` (default 120). `maxAdded: 0` turns refinement off.
   */
  refine?: { maxAdded?: number; maxUnknowns?: number; seconds?: number };
  /**
   * Isolation runs for studies whose order fails: the failing solver solves variants of the case
   * that change one ingredient, on the study's finest three grids, within `seconds` of predicted
   * solve time per study (default 60). `false` turns isolation off.
   */
  isolation?: { seconds?: number } | false;
  /** Folder for the journal; none means no journal. */
  outDir?: string;
  /** Continue from the journal in outDir. Default: false. */
  resume?: boolean;
  onProgress?: (event: ProgressEvent) => void;
  signal?: AbortSignal;
  /** Environment record (the CLI fills it from Deno APIs; tests may pass a fixed one). */
  environment?: CampaignResult["environment"];
  /** Clock for createdAt. Default: now. */
  now?: () => Date;
}

/**
 * The grids a case runs on for a scheme: the campaign's grids when given, else the grids the case
 * suggests for that scheme, else the case's grids.
 */
export function gridsOf(
  kase: CompiledCase,
  options: { grids?: number[] },
  scheme: "central" | "upwind" = "central",
): number[] {
  return options.grids ?? kase.expected[scheme]?.grids ?? kase.grids;
}

/** A fingerprint of what determines the solves (for refusing a resume with another setup). */
export function fingerprint(
  cases: CompiledCase[],
  solvers: Solver[],
  options: CampaignOptions,
): string {
  return JSON.stringify({
    cases: cases.map((c) => [c.id, c.origin, c.parameters, gridsOf(c, options), c.expected]),
    solvers: solvers.map((
      s,
    ) => [s.info.name, s.info.scheme, s.info.layout, s.info.command ?? null, solverFileOf(s)]),
    tolerance: options.tolerance ?? 1e-10,
  });
}

/** The solver file that declared an external solver, with its SHA-256 (null for the reference). */
function solverFileOf(s: Solver): { path: string; sha256: string } | null {
  const file = s.info.build?.solverFile;
  return file ? { path: file.path, sha256: file.sha256 } : null;
}

/**
 * The solvers whose solver file changed between two fingerprints, in words (empty when none did,
 * or when the earlier fingerprint is not one of ours): what a refused resume names.
 */
export function changedSolverFiles(earlier: string, now: string): string[] {
  type Entry = [string, unknown, unknown, unknown, { path: string; sha256: string } | null];
  const solversOf = (print: string): Entry[] => {
    try {
      const parsed = JSON.parse(print);
      return Array.isArray(parsed?.solvers) ? parsed.solvers : [];
    } catch {
      // a fingerprint from another version of gridproof: nothing to compare
      return [];
    }
  };
  const before = new Map(solversOf(earlier).map((e) => [e[0], e[4] ?? null]));
  const out: string[] = [];
  for (const [name, , , , file] of solversOf(now)) {
    const old = before.get(name);
    if (!file || !old || old.sha256 === file.sha256) continue;
    out.push(
      `solver ${name}: its solver file ${file.path} changed since the journal was written ` +
        `(SHA-256 ${old.sha256.slice(0, 12)}… then, ${file.sha256.slice(0, 12)}… now)`,
    );
  }
  return out;
}

/** What a report needs to know about a case. */
export function caseInfo(kase: CompiledCase): CaseInfo {
  const boundaryKinds: Record<string, string> = {};
  for (const [side, b] of Object.entries(kase.boundary)) {
    boundaryKinds[side] = b.kind === "robin"
      ? `robin(α=${b.weightsText!.alpha}, β=${b.weightsText!.beta})`
      : b.kind;
  }
  return {
    id: kase.id,
    title: kase.title,
    motivation: kase.motivation,
    origin: kase.origin,
    domain: { ...kase.domain },
    parameters: { ...kase.parameters },
    tags: [...kase.tags],
    expected: structuredClone(kase.expected) as Record<string, unknown>,
    formulas: structuredClone(kase.formulas),
    boundaryKinds,
  };
}

/**
 * Runs the campaign and returns its result. Solver faults are recorded as failed solves; the
 * campaign goes on. With an abort signal, the solves finished so far are analysed.
 */
export async function runCampaign(
  cases: CompiledCase[],
  solvers: Solver[],
  options: CampaignOptions = {},
): Promise<CampaignResult> {
  const plan: PlannedSolve[] = [];
  for (const kase of cases) {
    for (const solver of solvers) {
      for (const n of gridsOf(kase, options, solver.info.scheme)) {
        const grid = gridFor(kase, n);
        const misses = kase.gridMisses(grid.nx, grid.ny);
        if (misses) {
          throw new RangeError(`case ${kase.id}, grid ${grid.nx}×${grid.ny}: ${misses}`);
        }
        plan.push({ kase, solver, ...grid });
      }
    }
  }
  const print = fingerprint(cases, solvers, options);
  const notes: string[] = [];
  let unlock = () => {};
  if (options.outDir !== undefined) {
    Deno.mkdirSync(options.outDir, { recursive: true });
    const lock = lockFolder(options.outDir);
    unlock = lock.release;
    if (lock.staleFrom !== null) {
      notes.push(
        `${options.outDir}: took over the lock of a campaign that no longer runs ` +
          `(process ${lock.staleFrom})`,
      );
    }
  }
  try {
    return await campaignIn(cases, solvers, options, plan, print, notes);
  } finally {
    unlock();
  }
}

/** The campaign itself, once its output folder (if any) is locked. */
async function campaignIn(
  cases: CompiledCase[],
  solvers: Solver[],
  options: CampaignOptions,
  plan: PlannedSolve[],
  print: string,
  notes: string[],
): Promise<CampaignResult> {
  let journal: JournalWriter | undefined;
  let finished: Map<string, JournaledSolve> | undefined;
  let submitted: Map<string, JobNote> | undefined;
  if (options.outDir !== undefined) {
    const path = `${options.outDir}/${JOURNAL_FILE}`;
    if (options.resume) {
      let text = "";
      try {
        text = Deno.readTextFileSync(path);
      } catch (error) {
        if (!(error instanceof Deno.errors.NotFound)) throw error;
      }
      const earlier = readJournal(text, path);
      if (earlier.header && earlier.header.fingerprint !== print) {
        const changed = changedSolverFiles(earlier.header.fingerprint, print);
        if (changed.length > 0) {
          throw new RangeError(
            `${path}: cannot resume: ${changed.join("; ")}; its finished solves may not answer ` +
              `for the edited solver: restore the solver file to resume, or run the campaign ` +
              `afresh (without --resume, or with another --out folder)`,
          );
        }
        throw new RangeError(
          `${path} belongs to a campaign with other cases, grids, solvers or tolerance: ` +
            `resume with the same options, or choose another --out folder`,
        );
      }
      finished = new Map(earlier.solves.map((s) => [solveKey(s.record), s]));
      submitted = earlier.jobs;
      refuseChangedInputs(finished, plan, options.tolerance ?? 1e-10, path);
      const torn = repairJournal(path, earlier);
      if (torn !== null) {
        notes.push(
          `${path}: dropped an incomplete last line left by an interrupted write ` +
            `(${torn.length} characters); its solve runs again`,
        );
      }
      journal = JournalWriter.open(
        path,
        earlier.header ? undefined : header(print, options),
      );
    } else {
      Deno.writeTextFileSync(path, "");
      journal = JournalWriter.open(path, header(print, options));
    }
  }
  // One journal for every solve of the campaign: the planned grids, the grids added to decide and
  // the isolation variants.
  const runOptions = {
    jobs: options.jobs,
    tolerance: options.tolerance,
    journal,
    finished,
    submitted,
    onProgress: options.onProgress,
    signal: options.signal,
  };
  let records: SolveRecord[];
  let studies: StudyRecord[];
  const orderTolerance = options.orderTolerance ?? 0.1;
  const studyOptions: StudiesOptions = {
    orderTolerance,
    requireFlatIterations: options.requireFlatIterations ?? true,
    tolerance: options.tolerance ?? 1e-10,
  };
  const budget = {
    maxAdded: options.refine?.maxAdded ?? 2,
    maxUnknowns: options.refine?.maxUnknowns ?? 1_100_000,
    seconds: options.refine?.seconds ?? 120,
  };
  const isolationSeconds = options.isolation === false ? 0 : options.isolation?.seconds ?? 60;
  try {
    records = await runSolves(plan, runOptions);
    if (solvers.some((s) => s.rankCheck) && !options.signal?.aborted) {
      studyOptions.rankChecks = await runRankChecks(
        cases,
        solvers,
        (kase, solver) => gridsOf(kase, options, solver.info.scheme),
        runOptions,
      );
    }
    studies = buildStudies(cases, solvers, records, studyOptions);
    const added = new Map<string, { grids: number[]; reasons: string[]; seconds: number }>();
    for (let round = 0; round < budget.maxAdded && !options.signal?.aborted; round++) {
      const extra = planRefinement(studies, records, cases, solvers, added, budget);
      if (extra.length === 0) break;
      const more = await runSolves(extra, runOptions);
      records = [...records, ...more];
      for (const r of more) {
        const a = added.get(`${r.caseId}\u0000${r.solver}`);
        if (a) a.seconds += r.seconds;
      }
      studies = buildStudies(cases, solvers, records, studyOptions);
    }
    for (const s of studies) {
      const a = added.get(`${s.caseId}\u0000${s.solver}`);
      if (a) s.added = { grids: a.grids, reason: a.reasons.join("; ") };
    }
    if (isolationSeconds > 0 && !options.signal?.aborted) {
      const { found } = await isolateFailures(studies, records, cases, solvers, {
        ...runOptions,
        seconds: isolationSeconds,
      });
      for (const s of studies) {
        const iso = found.get(`${s.caseId}\u0000${s.solver}`);
        if (!iso) continue;
        s.isolation = iso;
        const v = s.verdicts.find((v) => v.criterion === "order" && v.status === "fail");
        if (v) v.reason += `. Isolation: ${iso.finding}`;
      }
    }
  } finally {
    journal?.close();
  }
  keepErrorMaps(records, studies);
  const result: CampaignResult = {
    format: RESULT_FORMAT,
    version: RESULT_VERSION,
    tool: { name: "gridproof", version: VERSION },
    createdAt: (options.now ?? (() => new Date()))().toISOString(),
    environment: options.environment ?? { deno: "", os: "", arch: "", cpus: 0, hostname: "" },
    configuration: {
      cases: cases.map((c) => c.id),
      grids: options.grids ?? [],
      jobs: options.jobs ?? 1,
      orderTolerance,
      requireGridIndependence: options.requireFlatIterations ?? true,
      refine: budget,
      isolationSeconds,
    },
    cases: cases.map(caseInfo),
    solvers: solvers.map((s) => structuredClone(s.info)),
    solves: records,
    studies,
    baselineVerdicts: [],
    ...(notes.length > 0 ? { notes } : {}),
    summary: { pass: 0, fail: 0, inconclusive: 0, warn: 0, notApplicable: 0, exitCode: 0 },
  };
  result.summary = summarize(result);
  return result;
}

/**
 * Refuses a resume when a journaled solve of the plan was computed from other inputs than the
 * plan's (a case file edited since, another tolerance, another solver command): its record would
 * otherwise be reused as if it answered this campaign's question.
 */
function refuseChangedInputs(
  finished: Map<string, JournaledSolve>,
  plan: PlannedSolve[],
  tolerance: number,
  path: string,
): void {
  for (const p of plan) {
    const key = solveKey({ caseId: p.kase.id, solver: p.solver.info.name, nx: p.nx, ny: p.ny });
    const earlier = finished.get(key);
    if (earlier?.inputs === undefined || earlier.inputs === plannedInputs(p, tolerance)) continue;
    throw new RangeError(
      `${path}: line ${earlier.line} (case ${p.kase.id}, solver ${p.solver.info.name}, ` +
        `${p.nx}×${p.ny}) was computed from other inputs than this run's (the case text, the ` +
        `solver's command, its solver file or the tolerance changed since): resume with the same inputs, or ` +
        `choose another --out folder`,
    );
  }
}

function header(print: string, options: CampaignOptions): JournalHeader {
  return {
    kind: "campaign",
    fingerprint: print,
    startedAt: (options.now ?? (() => new Date()))().toISOString(),
  };
}

/** Every verdict of a result: per study and against the baseline. */
export function allVerdicts(result: CampaignResult): Verdict[] {
  return [...result.studies.flatMap((s) => s.verdicts), ...result.baselineVerdicts];
}

/**
 * Error maps stay on the finest solved grid of each study with a failed verdict (where a reader
 * needs to see where the error sits) and leave every other solve, to keep the result small.
 */
function keepErrorMaps(records: SolveRecord[], studies: StudyRecord[]): void {
  const keep = new Set<SolveRecord>();
  for (const s of studies) {
    if (!s.verdicts.some((v) => v.status === "fail")) continue;
    const finest = records.filter((r) =>
      r.caseId === s.caseId && r.solver === s.solver && r.status === "ok" && r.errorMap
    ).sort((a, b) =>
      b.nx - a.nx
    )[0];
    if (finest) keep.add(finest);
  }
  for (const r of records) if (!keep.has(r)) delete r.errorMap;
}

/** Exit code of a campaign with an inconclusive verdict and no failure. */
export const EXIT_INCONCLUSIVE = 4;

/**
 * Counts verdicts; exit code 1 when any failed, else {@link EXIT_INCONCLUSIVE} (4) when any is
 * inconclusive, else 0. Warnings never change the exit code.
 */
export function summarize(result: CampaignResult): CampaignResult["summary"] {
  const summary = { pass: 0, fail: 0, inconclusive: 0, warn: 0, notApplicable: 0, exitCode: 0 };
  for (const v of allVerdicts(result)) {
    if (v.status === "pass") summary.pass++;
    else if (v.status === "fail") summary.fail++;
    else if (v.status === "inconclusive") summary.inconclusive++;
    else if (v.status === "warn") summary.warn++;
    else summary.notApplicable++;
  }
  summary.exitCode = summary.fail > 0 ? 1 : summary.inconclusive > 0 ? EXIT_INCONCLUSIVE : 0;
  return summary;
}

/** A study's order or exactness is undecided on its evidence alone (not blocked by a precondition). */
function undecided(study: StudyRecord): string | null {
  const v = study.verdicts.find((v) =>
    (v.criterion === "order" || v.criterion === "exactness") && v.status === "inconclusive" &&
    typeof v.details?.trend === "string" && v.details.blocked === undefined
  );
  return v ? `${v.details!.norm} norm ${v.details!.trend}` : null;
}

/**
 * The next finer grid of every study whose order is undecided, within the budget: the sequence's
 * own ratio continued from its finest grid.
 */
function planRefinement(
  studies: StudyRecord[],
  records: SolveRecord[],
  cases: CompiledCase[],
  solvers: Solver[],
  added: Map<string, { grids: number[]; reasons: string[]; seconds: number }>,
  budget: { maxAdded: number; maxUnknowns: number; seconds: number },
): PlannedSolve[] {
  const plan: PlannedSolve[] = [];
  for (const study of studies) {
    const why = undecided(study);
    if (!why) continue;
    const key = `${study.caseId}\u0000${study.solver}`;
    const soFar = added.get(key) ?? { grids: [], reasons: [], seconds: 0 };
    if (soFar.grids.length >= budget.maxAdded) continue;
    const kase = cases.find((c) => c.id === study.caseId);
    const solver = solvers.find((s) => s.info.name === study.solver);
    const mine = records.filter((r) =>
      r.caseId === study.caseId && r.solver === study.solver && r.status === "ok"
    ).sort((a, b) => a.nx - b.nx);
    if (!kase || !solver || mine.length < 2) continue;
    const [prev, last] = mine.slice(-2);
    const nx = Math.round(last.nx * last.nx / prev.nx);
    const grid = gridFor(kase, nx);
    if (kase.gridMisses(grid.nx, grid.ny)) continue;
    const unknowns = last.unknowns * (grid.nx * grid.ny) / (last.nx * last.ny);
    const growth = Math.max(1, study.scaling.timeExponent ?? 1);
    const predicted = last.seconds * (unknowns / last.unknowns) ** growth;
    if (unknowns > budget.maxUnknowns || soFar.seconds + predicted > budget.seconds) continue;
    soFar.grids.push(grid.nx);
    soFar.reasons.push(`${grid.nx} added because the order was undecided (${why})`);
    added.set(key, soFar);
    plan.push({ kase, solver, ...grid });
  }
  return plan;
}
