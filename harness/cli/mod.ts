/**
 * The commands of the gridproof command line. Each command file exports a `register…` function
 * taking the program and a callback to raise the exit code (1 when a verdict fails).
 *
 * @module
 */
import type { Command } from "commander";
import { registerReportCommand } from "./report_command.ts";
import { registerCasesCommand } from "./cases_command.ts";
import { registerSolveCommand } from "./solve_command.ts";
import { registerCheckCommand } from "./check_command.ts";
import { registerDemoCommand } from "./demo_command.ts";
import { registerRefineCommand } from "./refine_command.ts";
import { registerProbeCommand } from "./probe_command.ts";
import type { SetExitCode } from "./exit.ts";

export type { SetExitCode } from "./exit.ts";

/** Registers every command on the program. */
export function registerCommands(program: Command, setExitCode: SetExitCode): void {
  registerReportCommand(program, setExitCode);
  registerCasesCommand(program, setExitCode);
  registerSolveCommand(program, setExitCode);
  registerCheckCommand(program, setExitCode);
  registerDemoCommand(program, setExitCode);
  registerRefineCommand(program, setExitCode);
  registerProbeCommand(program, setExitCode);
  void program;
  void setExitCode;
}
