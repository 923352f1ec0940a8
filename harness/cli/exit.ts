/**
 * Maps errors to messages and exit codes: bad input (InputError, RangeError) → 2 with the message only; anything else is a
 * bug in gridproof → 3 with the stack, so it can be reported.
 *
 * @module
 */
import { InputError } from "./errors.ts";

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
