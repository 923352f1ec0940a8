/**
 * The load-time check of a case with periodic sides: the exact solution, its normal derivative,
 * the coefficients (for the conservative form K, β and σ) and the derived source must repeat with
 * the domain's period. Each function is sampled at {@link CHECK_INTERVALS} + 1 points along both
 * sides of a seam (west against east at the same y, south against north at the same x); values
 * agree when |v₀ − v₁| ≤ {@link SEAM_TOLERANCE}·max(max |v| on the two sides, 1e-3) (the floor
 * keeps a function that vanishes on the seam, like sin 2πx, from being held to round-off of 0).
 *
 * @module
 */
import type { Domain } from "../reference-solver/mod.ts";
import { CHECK_INTERVALS } from "./domain_check.ts";
import type { OperatorFault } from "./operator_check.ts";
import type { PointFn } from "./types.ts";

/** Relative mismatch allowed between a function's values on the two sides of a seam. */
export const SEAM_TOLERANCE = 1e-9;

/** One function checked on a seam: its name in messages, the case file field, the function. */
export interface SeamFunction {
  /** How the message names it, e.g. "the exact solution u" or "coefficients.a". */
  name: string;
  /** The case file's field the fault points at (JSON pointer and dotted field). */
  pointer: string;
  field: string;
  fn: PointFn;
}

/**
 * Faults of one periodic pair: every function that differs across the seam, with the first point
 * where it does, both values and the mismatch.
 *
 * @param domain the rectangle (its width or height is the period)
 * @param axis "x" for the west–east pair, "y" for south–north
 * @param functions what must repeat (the normal derivative is one of them: u_x for x, u_y for y)
 * @param intervals points along the seam minus one. Default: {@link CHECK_INTERVALS}
 * @returns the faults, one per function at most
 *
 * @example
 * ```ts
 * import { checkSeam } from "./periodic_check.ts";
 * const domain = { x0: 0, x1: 1, y0: 0, y1: 1 };
 * const u = { name: "u", pointer: "/exact", field: "exact", fn: (x: number) => x * x };
 * checkSeam(domain, "x", [u]).length; // 1: u(0, y) = 0 but u(1, y) = 1
 * ```
 */
export function checkSeam(
  domain: Domain,
  axis: "x" | "y",
  functions: SeamFunction[],
  intervals = CHECK_INTERVALS,
): OperatorFault[] {
  const [lo, hi] = axis === "x" ? ["west", "east"] : ["south", "north"];
  const faults: OperatorFault[] = [];
  for (const { name, pointer, field, fn } of functions) {
    const first: number[] = [], second: number[] = [], along: number[] = [];
    for (let k = 0; k <= intervals; k++) {
      const t = k / intervals;
      if (axis === "x") {
        const y = domain.y0 + t * (domain.y1 - domain.y0);
        first.push(fn(domain.x0, y)), second.push(fn(domain.x1, y)), along.push(y);
      } else {
        const x = domain.x0 + t * (domain.x1 - domain.x0);
        first.push(fn(x, domain.y0)), second.push(fn(x, domain.y1)), along.push(x);
      }
    }
    let scale = 1e-3;
    for (let k = 0; k <= intervals; k++) {
      scale = Math.max(scale, Math.abs(first[k]), Math.abs(second[k]));
    }
    for (let k = 0; k <= intervals; k++) {
      const miss = Math.abs(first[k] - second[k]);
      if (miss <= SEAM_TOLERANCE * scale) continue;
      const other = axis === "x" ? "y" : "x";
      const p0 = axis === "x" ? `(${domain.x0}, ${along[k]})` : `(${along[k]}, ${domain.y0})`;
      const p1 = axis === "x" ? `(${domain.x1}, ${along[k]})` : `(${along[k]}, ${domain.y1})`;
      faults.push({
        pointer,
        field,
        message: `the ${lo}–${hi} sides are periodic but ${name} does not repeat across the seam ` +
          `at ${other} = ${along[k]}: ${first[k]} at ${p0} on the ${lo} side, ${
            second[k]
          } at ${p1} on the ${hi} side (mismatch ${miss.toPrecision(3)}, ${
            (miss / scale).toPrecision(3)
          } of its size); choose functions with period ${
            axis === "x" ? domain.x1 - domain.x0 : domain.y1 - domain.y0
          } in ${axis}, or make the ${lo} and ${hi} sides non-periodic`,
      });
      break;
    }
  }
  return faults;
}
