/**
 * Exit codes of the command line: the callback type through which a command raises the code, and
 * the mapping of errors to messages and codes: bad input (InputError, RangeError) → 2 with the
 * message only; anything else is a bug in gridproof → 3 with the stack, so it can be reported.
 *
 * The command files and `mod.ts` both take {@link SetExitCode} from here, so no command imports
 * the `mod.ts` that imports it.
 *
 * @module
 */
import { InputError } from "./errors.ts";

/** Raises the process exit code to at least `code`. */
export type SetExitCode = (code: number) => void;

/** The exit code for an error that escaped a command. */
export function exitCodeFor(error: unknown): number {
  // Validated entry points throw RangeError (a value out of its allowed set) or InputError; a
  // TypeError here would be a programming error inside gridproof, so it keeps its stack.
  if (error instanceof InputError || error instanceof RangeError) return 2;
  return 3;
}

/** The text printed for an error: `gridproof: <where>: <message>` and every collected problem. */
export function formatError(error: unknown): string {
  if (error instanceof InputError) {
    const head = `gridproof: ${error.where ? error.where + ": " : ""}${error.message}`;
    return [head, ...error.problems.map((p) => `  - ${p}`)].join("\n");
  }
  if (error instanceof Error) {
    if (exitCodeFor(error) === 2) return `gridproof: ${error.message}`;
    return `gridproof: internal error (please report it): ${error.stack ?? error.message}`;
  }
  return `gridproof: ${String(error)}`;
}
