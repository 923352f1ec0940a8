/**
 * A whole campaign, from chosen cases and solvers to the one {@link CampaignResult}: plan, run
 * (in parallel, journaled, resumable), measure, analyse, judge.
 *
 * @module
 */
import type { CompiledCase } from "../../cases/types.ts";
import type { CampaignResult, CaseInfo, SolveRecord, Verdict } from "../result/types.ts";
import { RESULT_FORMAT, RESULT_VERSION } from "../result/types.ts";
import type { Solver } from "../solvers/mod.ts";
import { VERSION } from "../version.ts";
import {
  JOURNAL_FILE,
  type JournalHeader,
  JournalWriter,
  readJournal,
  solveKey,
} from "./journal.ts";
import { gridFor, type PlannedSolve, type ProgressEvent, runSolves } from "./run.ts";
import { buildStudies } from "./study.ts";

/** Options of {@link runCampaign}. */
export interface CampaignOptions {
  /** Grid sequence (nx values) for every case; default: each case's suggested grids. */
  grids?: number[];
  /** Solves at once. Default: 1. */
  jobs?: number;
  /** Relative residual tolerance asked of every solver. Default: 1e-10. */
  tolerance?: number;
  /** Tolerance on observed orders. Default: 0.1; a case's own `expected.<scheme>.tolerance` takes precedence. */
  orderTolerance?: number;
  /** Fail (not only warn) when iterations grow with the grid. Default: false. */
  requireGridIndependence?: boolean;
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
    ) => [s.info.name, s.info.scheme, s.info.layout, s.info.command ?? null]),
    tolerance: options.tolerance ?? 1e-10,
  });
}

/** What a report needs to know about a case. */
export function caseInfo(kase: CompiledCase): CaseInfo {
  const boundaryKinds: Record<string, string> = {};
  for (const [side, b] of Object.entries(kase.boundary)) {
    boundaryKinds[side] = b.kind === "robin" ? `robin(α=${b.alpha}, β=${b.beta})` : b.kind;
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
        plan.push({ kase, solver, ...gridFor(kase, n) });
      }
    }
  }
  const print = fingerprint(cases, solvers, options);
  let journal: JournalWriter | undefined;
  let finished: Map<string, SolveRecord> | undefined;
  if (options.outDir !== undefined) {
    Deno.mkdirSync(options.outDir, { recursive: true });
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
        throw new RangeError(
          `${path} belongs to a campaign with other cases, grids, solvers or tolerance: ` +
            `resume with the same options, or choose another --out folder`,
        );
      }
      finished = new Map(earlier.records.map((r) => [solveKey(r), r]));
      journal = JournalWriter.open(
        path,
        earlier.header ? undefined : header(print, options),
      );
    } else {
      Deno.writeTextFileSync(path, "");
      journal = JournalWriter.open(path, header(print, options));
    }
  }
  let records: SolveRecord[];
  try {
    records = await runSolves(plan, {
      jobs: options.jobs,
      tolerance: options.tolerance,
      journal,
      finished,
      onProgress: options.onProgress,
      signal: options.signal,
    });
  } finally {
    journal?.close();
  }
  const orderTolerance = options.orderTolerance ?? 0.1;
  const studies = buildStudies(cases, solvers, records, {
    orderTolerance,
    requireGridIndependence: options.requireGridIndependence ?? false,
    tolerance: options.tolerance ?? 1e-10,
  });
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
      requireGridIndependence: options.requireGridIndependence ?? false,
    },
    cases: cases.map(caseInfo),
    solvers: solvers.map((s) => structuredClone(s.info)),
    solves: records,
    studies,
    baselineVerdicts: [],
    summary: { pass: 0, fail: 0, warn: 0, notApplicable: 0, exitCode: 0 },
  };
  result.summary = summarize(result);
  return result;
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

/** Counts verdicts; exit code 1 when any failed, else 0. */
export function summarize(result: CampaignResult): CampaignResult["summary"] {
  const summary = { pass: 0, fail: 0, warn: 0, notApplicable: 0, exitCode: 0 };
  for (const v of allVerdicts(result)) {
    if (v.status === "pass") summary.pass++;
    else if (v.status === "fail") summary.fail++;
    else if (v.status === "warn") summary.warn++;
    else summary.notApplicable++;
  }
  summary.exitCode = summary.fail > 0 ? 1 : 0;
  return summary;
}
