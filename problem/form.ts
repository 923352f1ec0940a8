/**
 * The operator form of a sampled problem, stated or implied.
 *
 * @module
 */
import type { OperatorForm, SampledProblem } from "./types.ts";

/**
 * The form of a problem: its `form` when stated, else "conservative" when it carries a
 * conductivity and "non-conservative" otherwise.
 *
 * @param p the problem
 * @returns the form
 * @throws RangeError when the stated form and the conductivity disagree (naming the fields)
 *
 * @example
 * ```ts
 * import { formOf } from "./form.ts";
 * const z = new Float64Array(0);
 * formOf({ conductivity: { alongX: { k11: z }, alongY: { k22: z } } }); // "conservative"
 * ```
 */
export function formOf(p: Pick<SampledProblem, "form" | "conductivity">): OperatorForm {
  const implied: OperatorForm = p.conductivity === undefined ? "non-conservative" : "conservative";
  if (p.form !== undefined && p.form !== implied) {
    throw new RangeError(
      p.form === "conservative"
        ? `Invalid problem.form: "conservative" needs problem.conductivity (K where each flux is ` +
          `evaluated), which is absent; give the conductivity or drop the form`
        : `Invalid problem.form: "non-conservative" with a problem.conductivity; drop the ` +
          `conductivity or say "conservative"`,
    );
  }
  return implied;
}

/**
 * Whether an optional array is zero everywhere (an absent array is zero).
 *
 * @param v the array or undefined
 * @returns true when absent or every entry is 0 (either sign)
 *
 * @example
 * ```ts
 * import { allZero } from "./form.ts";
 * allZero(new Float64Array([0, -0])); // true
 * ```
 */
export function allZero(v: Float64Array | undefined): boolean {
  if (v === undefined) return true;
  for (let k = 0; k < v.length; k++) if (v[k] !== 0) return false;
  return true;
}
