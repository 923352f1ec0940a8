/**
 * `gridproof probe --solvers FILE [--name N]` or `gridproof probe [flags] -- CMD ARGS…`: checks
 * an external solver's adapter with a few tiny requests (each boundary kind, both encodings, each
 * declared mode), validates every reply, reports what works and what does not, and measures
 * start-up and per-solve overhead. Exit 0 when every check passes, 1 when the adapter
 * misbehaves, 2 for bad usage.
 *
 * @module
 */
import type { Command } from "commander";
import {
  type ExternalSolverSpec,
  loadSolverFile,
  type ProbeCheck,
  type ProbeReport,
  probeSolver,
} from "../solvers/mod.ts";
import { InputError } from "./errors.ts";
import type { SetExitCode } from "./exit.ts";

/** The flags of `gridproof probe` as commander parses them (all text). */
export interface ProbeFlags {
  solvers?: string;
  name?: string;
  mode?: string;
  encoding?: string;
  layout?: string;
  scheme?: string;
  timeLimit?: string;
  json?: boolean;
}

function oneOf<T extends string>(
  flag: string,
  value: string | undefined,
  allowed: readonly T[],
  fallback: T,
): T {
  if (value === undefined) return fallback;
  if ((allowed as readonly string[]).includes(value)) return value as T;
  throw new InputError(`must be one of ${allowed.join(", ")}, found "${value}"`, { where: flag });
}

/** Resolves the flags to the solvers to probe and the modes of each. */
export async function probeTargets(
  flags: ProbeFlags,
  command: string[],
): Promise<{ spec: ExternalSolverSpec; dir: string; modes: ("once" | "session")[] }[]> {
  if (flags.solvers !== undefined && command.length > 0) {
    throw new InputError("give either --solvers FILE or a command after --, not both", {
      where: "probe",
    });
  }
  const modeFlag = flags.mode === undefined
    ? undefined
    : oneOf("--mode", flags.mode, ["once", "session", "both"] as const, "once");
  const modesFor = (declared: "once" | "session"): ("once" | "session")[] =>
    modeFlag === "both" ? ["once", "session"] : [modeFlag ?? declared];
  let limit: number | undefined;
  if (flags.timeLimit !== undefined) {
    limit = Number(flags.timeLimit);
    if (!(limit > 0)) {
      throw new InputError(`must be a positive number of seconds, found "${flags.timeLimit}"`, {
        where: "--time-limit",
      });
    }
  }
  if (flags.solvers !== undefined) {
    let specs = await loadSolverFile(flags.solvers);
    if (flags.name !== undefined) {
      specs = specs.filter((s) => s.name === flags.name);
      if (specs.length === 0) {
        const names = (await loadSolverFile(flags.solvers)).map((s) => s.name).join(", ");
        throw new InputError(
          `no solver named "${flags.name}" in ${flags.solvers}; the file has: ${names}`,
          {
            where: "--name",
          },
        );
      }
    }
    return specs.map((spec) => ({
      spec: limit !== undefined ? { ...spec, timeLimitSeconds: limit } : spec,
      dir: spec.solverFileDir,
      modes: modesFor(spec.mode),
    }));
  }
  if (command.length === 0) {
    throw new InputError(
      "nothing to probe: give --solvers FILE, or the solver's command after --, e.g. " +
        "gridproof probe -- python3 my_adapter.py",
      { where: "probe" },
    );
  }
  const spec: ExternalSolverSpec = {
    name: flags.name ?? "probed",
    command,
    mode: "once",
    encoding: oneOf("--encoding", flags.encoding, ["numbers", "base64"] as const, "numbers"),
    layout: oneOf("--layout", flags.layout, ["vertex", "cell", "points"] as const, "vertex"),
    scheme: oneOf("--scheme", flags.scheme, ["central", "upwind"] as const, "central"),
    timeLimitSeconds: limit ?? 15,
    skipCases: [],
    maxReplyMiB: 1024,
  };
  return [{ spec, dir: Deno.cwd(), modes: modesFor("once") }];
}

function seconds(s: number | null): string {
  return s === null ? "—" : s < 1 ? `${(s * 1000).toFixed(1)} ms` : `${s.toFixed(2)} s`;
}

function checkLine(c: ProbeCheck): string {
  const mark = c.status === "pass"
    ? "ok  "
    : c.status === "not-applicable"
    ? "n/a "
    : c.required
    ? "FAIL"
    : "note";
  const what = `${c.mode.padEnd(7)} ${c.encoding.padEnd(7)} ${c.boundary.padEnd(9)}`;
  const detail = c.status === "pass"
    ? `${seconds(c.seconds)}, relative error ${c.relativeError?.toExponential(2)}`
    : `${c.reason ?? ""}${!c.required && c.status === "fail" ? " (optional encoding)" : ""}`;
  return `  ${mark}  ${what} ${detail}`;
}

/** The text report of one probed solver. */
export function probeText(report: ProbeReport): string {
  const lines = [`probe: ${report.solver}`, ...report.checks.map(checkLine)];
  const count = (s: ProbeCheck["status"]) => report.checks.filter((c) => c.status === s).length;
  if (report.overheadSeconds.once !== null) {
    lines.push(
      `  once mode: ${
        seconds(report.overheadSeconds.once)
      } per solve beyond the solver's own time (process start-up included)`,
    );
  }
  if (report.sessionStartupSeconds !== null) {
    lines.push(`  session start-up (hello to ready): ${seconds(report.sessionStartupSeconds)}`);
  }
  if (report.overheadSeconds.session !== null) {
    lines.push(
      `  session mode: ${
        seconds(report.overheadSeconds.session)
      } per solve beyond the solver's own time`,
    );
  }
  lines.push(
    `  ${report.passed ? "PASS" : "FAIL"}: ${count("pass")} passed, ${count("fail")} failed, ` +
      `${count("not-applicable")} not applicable`,
  );
  return lines.join("\n");
}

/** Registers `gridproof probe` on the program. */
export function registerProbeCommand(program: Command, setExitCode: SetExitCode): void {
  program
    .command("probe")
    .description(
      "check a solver adapter in under a minute: tiny requests for each boundary kind, both " +
        "encodings and each declared mode; exit 0 all pass, 1 misbehaves, 2 bad usage",
    )
    .argument("[command...]", "the solver's command after --, e.g. -- python3 adapter.py")
    .option("--solvers <file>", "a solver file (JSON, see docs/protocol.md)")
    .option("--name <name>", "probe only this solver of the file (or name the command's solver)")
    .option(
      "--mode <mode>",
      "once, session or both (default: the declared mode; once for a command)",
    )
    .option(
      "--encoding <enc>",
      "declared request encoding for a command: numbers or base64 (default numbers)",
    )
    .option("--layout <layout>", "for a command: vertex, cell or points (default vertex)")
    .option("--scheme <scheme>", "for a command: central or upwind (default central)")
    .option(
      "--time-limit <seconds>",
      "time limit per probe request (default: the solver's, at most 15 s)",
    )
    .option("--json", "print the reports as JSON")
    .action(async (command: string[], flags: ProbeFlags) => {
      const targets = await probeTargets(flags, command ?? []);
      const reports: ProbeReport[] = [];
      for (const t of targets) {
        reports.push(await probeSolver(t.spec, { solverFileDir: t.dir, modes: t.modes }));
      }
      console.log(
        flags.json ? JSON.stringify(reports, null, 2) : reports.map(probeText).join("\n\n"),
      );
      if (reports.some((r) => !r.passed)) setExitCode(1);
    });
}
