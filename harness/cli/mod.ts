/**
 * The commands of the gridproof command line. Each command file exports a `register…` function
 * taking the program and a callback to raise the exit code (1 when a verdict fails).
 *
 * @module
 */
import type { Command } from "commander";

/** Raises the process exit code to at least `code`. */
export type SetExitCode = (code: number) => void;

/** Registers every command on the program. */
export function registerCommands(program: Command, setExitCode: SetExitCode): void {
  void program;
  void setExitCode;
}
