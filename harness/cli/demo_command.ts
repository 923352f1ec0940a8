/**
 * `gridproof demo [--out DIR]`: the first thing a newcomer runs. An invented scenario — the
 * groundwater group of a made-up water authority verifying release 2.4 of its in-house head
 * solver — runs the whole built-in library with the reference solver, the released version 2.3 and
 * the release candidate 2.4-rc1 (two copies of the `examples/deno-sor` solver, the candidate with a
 * deliberately seeded first-order defect on Neumann and Robin sides), writes every report, and
 * checks that the report caught the defect. Exit 0 when the demonstration ran as intended.
 *
 * @module
 */
import { fileURLToPath } from "node:url";
import type { Command } from "commander";
import { loadLibrary } from "../../cases/mod.ts";
import { derivationCacheDir } from "./cache_dir.ts";
import { createPooledReferenceSolver, runCampaign } from "../campaign/mod.ts";
import type { CampaignResult } from "../result/mod.ts";
import { createExternalSolver, loadSolverFile, type Solver } from "../solvers/mod.ts";
import type { SetExitCode } from "./exit.ts";
import { writeReport } from "./report_command.ts";
import { foundLines, loadHtmlRenderer, wrapWords } from "../report/mod.ts";
import { solverBuild } from "./solver_build.ts";
import {
  environmentRecord,
  outputWidth,
  parsePositive,
  progressPrinter,
  writeFileWhole,
} from "./shared.ts";

/** Default output folder of the demo. */
export const DEMO_OUT = "gridproof-demo";

/** The demo's solver file, relative to this module. */
const SOLVER_FILE = new URL("../../examples/demo/solvers.json", import.meta.url);

/** Names of the scenario's two solvers (in examples/demo/solvers.json). */
export const RELEASED = "head-2.3";
/** The release candidate with the seeded defect. */
export const CANDIDATE = "head-2.4-rc1";

/** Registers `demo`. */
export function registerDemoCommand(program: Command, setExitCode: SetExitCode): void {
  program
    .command("demo")
    .description(
      "demonstration: verify an invented team's release candidate against the built-in library " +
        "(writes result.json, report.html, report.md and report.xml)",
    )
    .option("--out <dir>", "output folder", DEMO_OUT)
    .option("--jobs <n>", "solves at once (default: the number of cores)")
    .action(async (flags: { out: string; jobs?: string }) => {
      const jobs = flags.jobs === undefined
        ? navigator.hardwareConcurrency
        : parsePositive(flags.jobs, "--jobs", { integer: true });
      const ok = await runDemo(flags.out, jobs);
      setExitCode(ok ? 0 : 1);
    });
}

/** What the demonstration expects the report to show; each unmet expectation in words. */
export function unmetExpectations(result: CampaignResult): string[] {
  const failing = (solver: string) =>
    result.studies.filter((s) =>
      s.solver === solver && s.verdicts.some((v) => v.status === "fail")
    );
  const unmet: string[] = [];
  for (const solver of ["reference", RELEASED]) {
    const bad = failing(solver).map((s) => s.caseId);
    if (bad.length > 0) unmet.push(`${solver} should pass every case but failed ${bad.join(", ")}`);
  }
  // the seeded defect sits in the Neumann and Robin closures: a failing order verdict must say so
  const caught = failing(CANDIDATE).filter((s) =>
    s.verdicts.some((v) =>
      v.status === "fail" && v.criterion === "order" && /Neumann|Robin/.test(v.reason)
    )
  );
  if (caught.length === 0) {
    unmet.push(
      `${CANDIDATE}'s seeded boundary defect was not caught by an order verdict naming its sides`,
    );
  }
  const kindsOf = (id: string) =>
    Object.values(result.cases.find((c) => c.id === id)?.boundaryKinds ?? {});
  const wrongly = failing(CANDIDATE).filter((s) =>
    kindsOf(s.caseId).every((k) => k === "dirichlet")
  );
  if (wrongly.length > 0) {
    unmet.push(
      `${CANDIDATE} failed all-Dirichlet cases (${wrongly.map((s) => s.caseId).join(", ")}), ` +
        `where its defect cannot act`,
    );
  }
  return unmet;
}

/**
 * The demo's summary: the builds under test and what was found first (failures by defect with the
 * isolation finding, then warnings by criterion with their reasons), then studies per solver.
 */
export function demoSummary(result: CampaignResult, width = 100): string {
  const lines = ["", ...foundLines(result, { width, reasonsPerWarning: 3, reasonLines: 3 })];
  lines.push("", "Studies per solver:");
  lines.push("  solver          passed  passed with warnings  failed  not applicable");
  for (const solver of result.solvers.map((s) => s.name)) {
    const studies = result.studies.filter((s) => s.solver === solver);
    const count = (test: (v: string[]) => boolean) =>
      studies.filter((s) => test(s.verdicts.map((v) => v.status))).length;
    const failed = count((v) => v.includes("fail"));
    const na = count((v) => v.every((x) => x === "not-applicable"));
    const warned = count((v) => !v.includes("fail") && v.includes("warn"));
    const passed = studies.length - failed - na - warned;
    lines.push(
      `  ${solver.padEnd(16)}${String(passed).padStart(6)}  ${String(warned).padStart(20)}  ` +
        `${String(failed).padStart(6)}  ${String(na).padStart(14)}`,
    );
  }
  lines.push(
    "",
    ...wrapWords(
      "Warnings are expected here: the SOR solvers' iteration counts grow with the grid (the " +
        "scaling analysis shows it), and some quantities of interest are not yet in their " +
        "asymptotic range.",
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
  return lines.join("\n");
}

async function runDemo(out: string, jobs: number): Promise<boolean> {
  const log = (s = "") => console.log(s);
  log("gridproof demo — an invented scenario");
  log(
    "The groundwater group of the (made-up) Fernhollow Water Authority is about to release version " +
      "2.4 of its head solver.",
  );
  log(
    `Before release, it verifies the candidate (${CANDIDATE}) beside the released ${RELEASED} and ` +
      "gridproof's reference multigrid solver on every built-in manufactured-solution case.\n",
  );
  const cases = await loadLibrary({ cacheDir: derivationCacheDir() });
  // fileURLToPath, not .pathname: a folder name with spaces or non-ASCII letters stays intact
  const specs = await loadSolverFile(fileURLToPath(SOLVER_FILE));
  const solvers: Solver[] = [
    createPooledReferenceSolver({ workers: jobs }),
    ...specs.map((spec) =>
      createExternalSolver(spec, { solverFileDir: spec.solverFileDir, sessions: jobs })
    ),
  ];
  for (const [k, spec] of specs.entries()) {
    solvers[k + 1].info.build = await solverBuild(spec, fileURLToPath(SOLVER_FILE));
  }
  // the HTML renderer loads while the solves run, not after them (a failure shows when it renders)
  loadHtmlRenderer().catch(() => {});
  let result: CampaignResult;
  try {
    result = await runCampaign(cases, solvers, {
      jobs,
      outDir: out,
      environment: environmentRecord(),
      onProgress: progressPrinter(),
    });
  } finally {
    await Promise.all(solvers.map((s) => s.close()));
  }
  await writeFileWhole(
    `${out}/result.json`,
    JSON.stringify(result, (_k, v) => typeof v === "number" && !Number.isFinite(v) ? null : v, 1) +
      "\n",
    "the result",
  );
  for (
    const [format, file] of [["html", "report.html"], ["md", "report.md"], ["junit", "report.xml"]]
  ) {
    await writeReport(result, { format, out: `${out}/${file}` });
  }
  log(demoSummary(result, outputWidth()));
  const unmet = unmetExpectations(result);
  log("");
  if (unmet.length === 0) {
    log(
      `As intended: the reference and ${RELEASED} pass; ${CANDIDATE} fails on the cases with ` +
        "Neumann or Robin sides, and the cross-case diagnosis points at those closures.",
    );
  } else {
    log("The demonstration did not run as intended:");
    for (const u of unmet) log(wrapWords(u, outputWidth(), "  - ", "    ").join("\n"));
  }
  log(`\nHTML report: ${out}/report.html`);
  log(`Also written: ${out}/result.json, ${out}/report.md, ${out}/report.xml`);
  return unmet.length === 0;
}
