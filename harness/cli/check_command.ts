/**
 * `gridproof check`: the verification campaign. Every selected case on every grid by every
 * selected solver, in parallel, journaled and resumable; the result is saved as `result.json` in
 * the output folder and summarised; exit 0 when every verdict passes, 1 when any fails, 2 for bad
 * input.
 *
 * @module
 */
import { type Command, Option } from "commander";
import {
  checkGridSize,
  libraryIds,
  loadCase,
  loadCaseFiles,
  loadLibrary,
} from "../../cases/mod.ts";
import type { CompiledCase } from "../../cases/types.ts";
import { compareWithBaseline } from "../baseline/mod.ts";
import {
  createPooledReferenceSolver,
  gridSequence,
  type ProgressEvent,
  runCampaign,
  summarize,
} from "../campaign/mod.ts";
import { type CampaignResult, readResult, worstStatus } from "../result/mod.ts";
import {
  createReferenceSolver,
  createSolver,
  loadSolverFile,
  programsToCheck,
  resolveProgram,
} from "../solvers/mod.ts";
import type { Solver } from "../solvers/mod.ts";
import { InputError } from "./errors.ts";
import { derivationCacheDir } from "./cache_dir.ts";
import type { SetExitCode } from "./exit.ts";
import { writeReport } from "./report_command.ts";
import { solverBuild } from "./solver_build.ts";
import { findChromium } from "./pdf.ts";
import {
  escapeTerminal,
  foundLines,
  loadHtmlRenderer,
  rendererFor,
  wrapWords,
} from "../report/mod.ts";
import {
  environmentRecord,
  outputWidth,
  parseNumberList,
  parsePositive,
  progressPrinter,
  writeFileWhole,
} from "./shared.ts";

/** Default output folder of `check`. */
export const DEFAULT_OUT = "gridproof-results";

/** Parsed options of `check`. */
export interface CheckFlags {
  cases?: string;
  caseFile?: string[];
  grids?: string;
  ratio?: string;
  levels?: string;
  coarsest?: string;
  solvers?: string;
  solver?: string;
  upwind?: boolean;
  jobs?: string;
  out: string;
  resume?: boolean;
  json?: boolean;
  format?: string;
  orderTolerance?: string;
  residualTolerance?: string;
  /** Deprecated alias of `residualTolerance`. */
  tolerance?: string;
  requireGridIndependence?: boolean;
  iterationAdvice?: boolean;
  refine?: boolean;
  refineGrids?: string;
  refineUnknowns?: string;
  refineSeconds?: string;
  isolation?: boolean;
  isolationSeconds?: string;
  baseline?: string;
  progress?: boolean;
}

/** Registers `check` on the program. */
export function registerCheckCommand(program: Command, setExitCode: SetExitCode): void {
  program
    .command("check")
    .description(
      "run the verification campaign: cases × grids × solvers, observed orders, GCI, residual " +
        "behaviour and verdicts (exit 0 all pass, 1 a verdict failed, 2 bad input, 4 a verdict " +
        "undecided and none failed)",
    )
    .option("--cases <ids>", "comma-separated ids of built-in cases (default: every built-in case)")
    .option("--case-file <files...>", "case files of your own (JSON); may be repeated")
    .option("--grids <list>", "interval counts, e.g. 16,32,64,128 (default: each case's own grids)")
    .option("--ratio <r>", "refinement ratio of a geometric grid sequence, ≥ 1.1 (e.g. 1.5)")
    .option(
      "--levels <k>",
      "number of grids of the geometric sequence (default 5; the finest must fit 2^27 nodes)",
    )
    .option("--coarsest <n>", "coarsest grid of the geometric sequence (default 16)")
    .option("--solvers <file>", "solver file naming external solvers to run beside the reference")
    .option(
      "--solver <names>",
      'comma-separated solvers to run: "reference" and/or names from --solvers (default: all)',
    )
    .option("--upwind", "the reference solver uses first-order upwinding (expected order 1)")
    .option("--jobs <n>", "solves at once (default: the number of cores; at most 4 per core)")
    .option("--out <dir>", "output folder for the journal and result.json", DEFAULT_OUT)
    .option("--resume", "continue the campaign recorded in the output folder's journal")
    .option("--json", "print the result object as JSON instead of the summary")
    .addOption(
      new Option(
        "--format <list>",
        "also write reports: comma-separated text,html,pdf,md,csv,junit (pdf needs chromium)",
      ),
    )
    .option(
      "--order-tolerance <t>",
      "allowed |measured − expected| order, unless a case sets its orderTolerance (default 0.1)",
    )
    .option(
      "--residual-tolerance <t>",
      "relative residual tolerance asked of every solver (default 1e-10)",
    )
    .addOption(
      new Option("--tolerance <t>", "deprecated: use --residual-tolerance").hideHelp(),
    )
    .option(
      "--iteration-advice",
      "iterations that grow faster than the solver declares only warn (default: they fail)",
    )
    .addOption(
      new Option("--require-grid-independence", "deprecated: iteration growth fails by default")
        .hideHelp(),
    )
    .option(
      "--no-refine",
      "do not add finer grids to studies whose order is undecided (default: add them)",
    )
    .option("--refine-grids <k>", "at most k grids added per undecided study (default 2)")
    .option(
      "--refine-unknowns <n>",
      "no added grid above n unknowns (default 1100000, about 1024×1024)",
    )
    .option(
      "--refine-seconds <s>",
      "solve time the added grids of one study may take (default 120)",
    )
    .option(
      "--no-isolation",
      "do not rerun failing studies on case variants that change one ingredient (default: rerun)",
    )
    .option(
      "--isolation-seconds <s>",
      "predicted solve time the isolation variants of one failing study may take (default 60)",
    )
    .option("--baseline <file>", "compare with the result.json of the previous release")
    .option("--no-progress", "no progress output")
    .action(async (flags: CheckFlags) => {
      const result = await runCheck(flags);
      setExitCode(result.summary.exitCode);
    });
}

/** Resolves the cases a campaign runs. */
export async function selectCases(
  flags: Pick<CheckFlags, "cases" | "caseFile">,
): Promise<CompiledCase[]> {
  const cases: CompiledCase[] = [];
  if (flags.cases !== undefined) {
    const known = libraryIds();
    const ids = flags.cases.split(",").map((s) => s.trim()).filter((s) => s !== "");
    // the whole list is checked before any case is compiled
    ids.forEach((id, k) => {
      if (ids.indexOf(id) < k) {
        throw new InputError(`case ${id} is named twice in --cases; name each case once`, {
          where: "--cases",
        });
      }
      if (!known.includes(id)) {
        throw new InputError(`unknown case "${id}": valid ids are ${known.join(", ")}`, {
          where: "--cases",
        });
      }
    });
    for (const id of ids) cases.push(await loadCase(id, { cacheDir: derivationCacheDir() }));
  }
  const cache = { cacheDir: derivationCacheDir() };
  if (flags.caseFile !== undefined) cases.push(...await loadCaseFiles(flags.caseFile, cache));
  if (flags.cases === undefined && flags.caseFile === undefined) {
    cases.push(...await loadLibrary(cache));
  }
  const seen = new Map<string, string>();
  for (const c of cases) {
    const other = seen.get(c.id);
    if (other !== undefined) {
      throw new InputError(
        `case id "${c.id}" is used twice (${other} and ${c.origin}): give each case its own id`,
        { where: "--cases/--case-file" },
      );
    }
    seen.set(c.id, c.origin);
  }
  if (cases.length === 0) {
    throw new InputError("no case selected: name at least one", { where: "--cases" });
  }
  return cases;
}

/** Builds the solvers a campaign runs. */
export async function selectSolvers(
  flags: Pick<CheckFlags, "solvers" | "solver" | "upwind">,
  jobs: number,
): Promise<Solver[]> {
  const scheme = flags.upwind ? "upwind" as const : "central" as const;
  const reference = jobs > 1
    ? createPooledReferenceSolver({
      workers: jobs,
      solveOptions: { scheme: { upwind: !!flags.upwind } },
    })
    : createReferenceSolver({ scheme, solveOptions: { scheme: { upwind: !!flags.upwind } } });
  reference.info.scheme = scheme;
  const all: Solver[] = [reference];
  const specs = flags.solvers === undefined ? [] : await loadSolverFile(flags.solvers);
  for (const spec of specs) {
    // one session process per job, so overlapping solves of one solver do not wait in turn
    all.push(createSolver(spec, { solverFileDir: spec.solverFileDir, sessions: jobs }));
  }
  let chosen = all;
  if (flags.solver !== undefined) {
    const wanted = flags.solver.split(",").map((s) => s.trim()).filter((s) => s !== "");
    const names = all.map((s) => s.info.name);
    for (const name of wanted) {
      if (!names.includes(name)) {
        await Promise.all(all.map((s) => s.close()));
        throw new InputError(`unknown solver "${name}": valid names are ${names.join(", ")}`, {
          where: "--solver",
        });
      }
    }
    chosen = all.filter((s) => wanted.includes(s.info.name));
  }
  // a chosen solver whose program cannot start (missing, not executable, a script whose #! line
  // names a missing interpreter) is bad input: refused before any work, not one failure per solve
  for (const [index, spec] of specs.entries()) {
    if (!chosen.some((s) => s.info.name === spec.name)) continue;
    for (const { field, program } of programsToCheck(spec)) {
      const found = await resolveProgram(program, {
        baseDir: spec.solverFileDir,
        path: spec.env?.PATH,
      });
      if (found.ok) continue;
      await Promise.all(all.map((s) => s.close()));
      const need = field === "batch"
        ? "; a batch solver needs Slurm's client commands (Debian package slurm-client)"
        : "";
      const at = field === "command" ? "" : ` ${field}`;
      throw new InputError(`solvers[${index}] ("${spec.name}")${at}: ${found.reason}${need}`, {
        where: flags.solvers,
      });
    }
  }
  await Promise.all(all.filter((s) => !chosen.includes(s)).map((s) => s.close()));
  // the digests of what each chosen solver runs, for the reports' first screen
  for (const spec of specs) {
    const solver = chosen.find((s) => s.info.name === spec.name);
    if (solver && flags.solvers !== undefined) {
      solver.info.build = await solverBuild(spec, flags.solvers);
    }
  }
  return chosen;
}

/** Runs `check` with parsed flags: the campaign, the result file, the reports and the summary. */
export async function runCheck(flags: CheckFlags): Promise<CampaignResult> {
  const cores = Math.max(1, navigator.hardwareConcurrency);
  const asked = flags.jobs === undefined
    ? cores
    : parsePositive(flags.jobs, "--jobs", { integer: true });
  // Each job may hold a solver process or a reference worker with its grid in memory: more than
  // four per core only adds memory and contention.
  const jobs = Math.min(asked, MAX_JOBS_PER_CORE * cores);
  if (jobs < asked) {
    console.error(
      `gridproof: --jobs ${asked} capped at ${jobs} (${MAX_JOBS_PER_CORE} per core on ${cores} ` +
        `cores)`,
    );
  }
  const grids = flags.grids !== undefined
    ? gridsOrThrow(
      () => gridSequence({ grids: parseNumberList(flags.grids!, "--grids") }),
      "--grids",
    )
    : flags.ratio !== undefined || flags.levels !== undefined || flags.coarsest !== undefined
    ? gridsOrThrow(() =>
      gridSequence({
        ratio: flags.ratio === undefined ? undefined : parsePositive(flags.ratio, "--ratio"),
        levels: flags.levels === undefined
          ? undefined
          : parsePositive(flags.levels, "--levels", { integer: true }),
        coarsest: flags.coarsest === undefined
          ? undefined
          : parsePositive(flags.coarsest, "--coarsest", { integer: true }),
      }), "--ratio/--levels/--coarsest")
    : undefined;
  const orderTolerance = flags.orderTolerance === undefined
    ? undefined
    : parsePositive(flags.orderTolerance, "--order-tolerance");
  // --tolerance is the old name of --residual-tolerance: read, with a warning
  if (flags.tolerance !== undefined && flags.residualTolerance !== undefined) {
    throw new InputError(
      "both --residual-tolerance and its deprecated alias --tolerance are given; keep " +
        "--residual-tolerance only",
      { where: "--tolerance" },
    );
  }
  const residualFlag = flags.tolerance !== undefined ? "--tolerance" : "--residual-tolerance";
  const residualText = flags.residualTolerance ?? flags.tolerance;
  const tolerance = residualText === undefined
    ? undefined
    : parsePositive(residualText, residualFlag);
  if (tolerance !== undefined && !(tolerance < 1)) {
    throw new InputError(
      `${tolerance} is not a relative residual reduction: give a number between 0 and 1, ` +
        `e.g. 1e-10`,
      { where: residualFlag },
    );
  }
  if (flags.tolerance !== undefined) {
    console.error(
      "gridproof: warning: --tolerance is deprecated: use --residual-tolerance (the relative " +
        "residual tolerance asked of every solver; the allowed order deviation is " +
        "--order-tolerance)",
    );
  }
  checkOutFolder(flags.out);
  const formats = (flags.format ?? "").split(",").map((s) => s.trim()).filter((s) => s !== "");
  for (const format of formats) {
    // refuse an unknown report format before any solve runs
    try {
      if (rendererFor(format).printed) findChromium();
    } catch (error) {
      if (error instanceof RangeError) throw new InputError(error.message, { where: "--format" });
      throw error;
    }
  }
  const isolation = flags.isolation === false
    ? false as const
    : flags.isolationSeconds === undefined
    ? {}
    : { seconds: parsePositive(flags.isolationSeconds, "--isolation-seconds") };
  const refine = {
    maxAdded: flags.refine === false
      ? 0
      : flags.refineGrids === undefined
      ? undefined
      : parseCount(flags.refineGrids),
    maxUnknowns: flags.refineUnknowns === undefined
      ? undefined
      : parsePositive(flags.refineUnknowns, "--refine-unknowns"),
    seconds: flags.refineSeconds === undefined
      ? undefined
      : parsePositive(flags.refineSeconds, "--refine-seconds"),
  };
  const baseline = flags.baseline === undefined ? undefined : await readResult(flags.baseline);

  const cases = await selectCases(flags);
  for (const kase of cases) {
    for (const w of kase.warnings ?? []) console.error(escapeTerminal(`gridproof: warning: ${w}`));
  }
  // every grid of every case must fit before any solve starts
  for (const kase of cases) {
    for (const n of grids ?? kase.grids) {
      const g = kase.gridFor(n);
      try {
        checkGridSize(g.nx, g.ny);
        // a case with material interfaces needs each interface on a grid line
        const misses = kase.gridMisses(g.nx, g.ny);
        if (misses) throw new RangeError(`grid ${g.nx}×${g.ny}: ${misses}`);
      } catch (error) {
        if (error instanceof RangeError) {
          throw new InputError(`${error.message} (case ${kase.id})`, {
            where: grids ? "--grids" : kase.origin,
          });
        }
        throw error;
      }
    }
  }
  const solvers = await selectSolvers(flags, jobs);
  const stopSolvers = () => Promise.all(solvers.map((s) => s.close()));
  // Ctrl-C (SIGINT) or SIGTERM: no new solve starts, every running solver process group is
  // killed at once, and the command ends with 130 (SIGINT) or 143 (SIGTERM) — whichever comes
  // first, the handler or the campaign returning, never with a result of 0.
  const interrupt = new AbortController();
  let exitCode = 130;
  const endInterrupted = (): never => {
    console.error(
      `\ngridproof: interrupted; every finished solve is in ${flags.out}/journal.jsonl — ` +
        `run the same command with --resume to continue`,
    );
    Deno.exit(exitCode);
  };
  const onSignal = (code: number) => () => {
    if (interrupt.signal.aborted) return;
    exitCode = code;
    interrupt.abort();
    Promise.all(solvers.map((s) => s.stop?.())).then(stopSolvers).finally(endInterrupted);
  };
  const onInterrupt = onSignal(130);
  const onTerminate = onSignal(143);
  Deno.addSignalListener("SIGINT", onInterrupt);
  Deno.addSignalListener("SIGTERM", onTerminate);
  // the HTML renderer loads while the solves run, not after them (a failure shows when it renders)
  if (formats.some((f) => f === "html" || f === "pdf")) loadHtmlRenderer().catch(() => {});
  let result: CampaignResult;
  try {
    result = await runCampaign(cases, solvers, {
      grids,
      jobs,
      tolerance,
      orderTolerance,
      requireFlatIterations: !flags.iterationAdvice,
      refine,
      isolation,
      outDir: flags.out,
      resume: flags.resume ?? false,
      environment: environmentRecord(),
      signal: interrupt.signal,
      onProgress: flags.progress === false || flags.json ? undefined : progressPrinter(),
    });
  } finally {
    if (!interrupt.signal.aborted) {
      Deno.removeSignalListener("SIGINT", onInterrupt);
      Deno.removeSignalListener("SIGTERM", onTerminate);
    }
    await stopSolvers();
  }
  if (interrupt.signal.aborted) endInterrupted();
  if (baseline) {
    result.configuration.baseline = flags.baseline;
    result.baselineVerdicts = compareWithBaseline(result, baseline, { orderTolerance });
    result.summary = summarize(result);
  }
  const resultPath = `${flags.out}/result.json`;
  await writeFileWhole(resultPath, JSON.stringify(result, finite, 1) + "\n", "the result");
  const written: string[] = [resultPath];
  for (const format of formats) {
    const extension =
      { text: "txt", html: "html", md: "md", csv: "csv", junit: "xml", json: "json" }[
        format
      ] ?? format;
    const path = `${flags.out}/report.${extension}`;
    await writeReport(result, { format, out: path });
    written.push(path);
  }
  if (flags.json) {
    console.log(JSON.stringify(result, finite, 1));
  } else {
    console.log(summaryText(result, outputWidth()));
    console.log(`\nwritten: ${written.join(", ")}`);
  }
  return result;
}

/** At most this many solves at once per core (see runCheck). */
const MAX_JOBS_PER_CORE = 4;

/** The output folder must be a folder we can write: refuse anything else before any work. */
function checkOutFolder(out: string): void {
  if (out.trim() === "") {
    throw new InputError("the output folder is empty: name a folder, e.g. --out results", {
      where: "--out",
    });
  }
  try {
    const info = Deno.statSync(out);
    if (!info.isDirectory) {
      throw new InputError(
        `${out} exists and is not a folder: name a folder (it is created when missing)`,
        { where: "--out" },
      );
    }
  } catch (error) {
    if (error instanceof InputError) throw error;
    if (error instanceof Deno.errors.NotCapable) {
      throw new InputError(`gridproof may not write in ${out}: choose a folder of your own`, {
        where: "--out",
      });
    }
    if (!(error instanceof Deno.errors.NotFound)) {
      throw new InputError(`cannot use ${out}: ${(error as Error).message}`, { where: "--out" });
    }
  }
  try {
    Deno.mkdirSync(out, { recursive: true });
    const probe = `${out}/.gridproof-write-test`;
    Deno.writeTextFileSync(probe, "");
    Deno.removeSync(probe);
  } catch (error) {
    const why = error instanceof Deno.errors.NotCapable
      ? "gridproof may not write there"
      : (error as Error).message;
    throw new InputError(`cannot write in ${out}: ${why}; choose a folder you can write to`, {
      where: "--out",
    });
  }
}

function parseCount(text: string): number {
  const value = Number(text);
  if (text.trim() === "" || !Number.isInteger(value) || value < 0) {
    throw new InputError(`"${text}" is not a whole number ≥ 0 (0 adds no grid)`, {
      where: "--refine-grids",
    });
  }
  return value;
}

function finite(_key: string, value: unknown): unknown {
  return typeof value === "number" && !Number.isFinite(value) ? null : value;
}

function gridsOrThrow(make: () => number[], where: string): number[] {
  try {
    return make();
  } catch (error) {
    if (error instanceof RangeError) throw new InputError(error.message, { where });
    throw error;
  }
}

/**
 * The readable summary printed at the end of a campaign: the builds under test and what was found
 * (failures by defect, undecided, warnings by criterion with reasons), then one line per case ×
 * solver, wrapped at word boundaries to `width` columns.
 */
export function summaryText(result: CampaignResult, width = 100): string {
  const lines: string[] = [];
  const rows = result.studies.map((s) => {
    const verdicts = s.verdicts;
    const status = worstStatus(verdicts);
    const criteria = [
      ...new Set(verdicts.filter((v) => v.status === status).map((v) => v.criterion)),
    ];
    const word = status === "not-applicable"
      ? "n/a"
      : status === "pass"
      ? "pass"
      : `${status === "warn" ? "pass, warned" : status === "fail" ? "FAIL" : "UNDECIDED"}: ` +
        criteria.join(", ");
    const order = s.orders.find((o) => o.region === "all" && o.norm === "max");
    const finest = order?.pairwise[order.pairwise.length - 1];
    return [
      s.caseId,
      s.solver,
      String(s.expectedOrder),
      finest === null || finest === undefined ? "—" : finest.toFixed(2),
      s.grids.join(","),
      word,
    ];
  });
  const head = ["case", "solver", "expected", "observed (max, finest pair)", "grids", "verdict"];
  const widths = head.map((h, k) => Math.max(h.length, ...rows.map((r) => r[k].length)));
  const fmt = (r: string[]) => r.map((c, k) => c.padEnd(widths[k])).join("  ").trimEnd();
  lines.push(fmt(head), widths.map((w) => "─".repeat(w)).join("  "), ...rows.map(fmt));
  lines.push("", ...foundLines(result, { width, reasonLines: 4 }));
  const isolated = result.studies.filter((s) => s.isolation);
  if (isolated.length > 0) {
    lines.push("", "Isolation (variants of each failing case, one ingredient changed):");
    for (const s of isolated) {
      lines.push(
        ...wrapWords(`${s.caseId} × ${s.solver}: ${s.isolation!.finding}`, width, "  ", "    "),
      );
    }
  }
  const added = result.studies.filter((s) => s.added);
  if (added.length > 0) {
    lines.push("", "Grids added to decide:");
    for (const s of added) {
      lines.push(
        ...wrapWords(`${s.caseId} × ${s.solver}: ${s.added!.reason}`, width, "  ", "    "),
      );
    }
  }
  for (const note of result.notes ?? []) lines.push("", ...wrapWords(note, width, "note: ", "  "));
  const s = result.summary;
  lines.push(
    "",
    ...wrapWords(
      `${s.pass} passed, ${s.fail} failed, ${s.inconclusive ?? 0} undecided, ${s.warn} warnings, ` +
        `${s.notApplicable} not applicable (verdicts; see the report for each one)`,
      width,
      "",
    ),
    ...wrapWords(
      "Code verification shows the discrete equations are solved correctly; it does not validate " +
        "the physical model.",
      width,
      "",
    ),
  );
  return lines.map((line) => line.split("\n").map(escapeTerminal).join("\n")).join("\n");
}

/** Progress for the campaign (re-exported for `demo`). */
export type { ProgressEvent };
