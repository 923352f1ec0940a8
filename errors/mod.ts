/**
 * The error class shared by every part that reads user input (case files, solver files, result
 * files, command-line flags). It lives in its own part so that `cases/` and `harness/` can both
 * use it without importing each other; the command line maps it to exit code 2.
 *
 * @example
 * ```ts
 * import { InputError } from "./mod.ts";
 * const error = new InputError("grid 1 is below 2", { where: "--grids" });
 * console.assert(error.where === "--grids");
 * ```
 *
 * @module
 */

/**
 * Bad input from the user: a file, field or flag that is wrong. `where` names the file (and
 * field or position) so the message can say what to fix.
 */
export class InputError extends Error {
  /** The file, flag or field at fault, e.g. `cases/my.json: coefficients.a`. */
  readonly where: string | undefined;
  /** Every problem found, when more than one was collected. */
  readonly problems: string[];

  constructor(message: string, options: { where?: string; problems?: string[] } = {}) {
    super(message);
    this.name = "InputError";
    this.where = options.where;
    this.problems = options.problems ?? [];
  }
}
