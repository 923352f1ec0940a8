/**
 * Errors the command line turns into exit code 2 with a clear message and no stack trace.
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
