/**
 * The check of a Robin side's weights α and β (α·u + β·∂u/∂n = g) along the side, before any
 * grid sees them. A Robin side either fixes u (β = 0 along the whole side: u = g/α) or states a
 * flux (β of one strict sign along the side): a β that reaches 0 somewhere inside the side
 * switches between the two at an unresolved point and is refused, as are weights that are not
 * finite or both 0 at a point. The side is sampled at {@link CHECK_INTERVALS} + 1 evenly spaced
 * points, ends included (the same density as the operator check).
 *
 * @module
 */
import type { Domain, Side } from "../reference-solver/mod.ts";
import { CHECK_INTERVALS } from "./domain_check.ts";
import type { OperatorFault } from "./operator_check.ts";
import type { PointFn } from "./types.ts";

/** The points of a side, ends included, ordered by increasing coordinate. */
function sidePoints(domain: Domain, side: Side, n: number): [number, number][] {
  const out: [number, number][] = [];
  for (let k = 0; k <= n; k++) {
    const t = k / n;
    const x = side === "west"
      ? domain.x0
      : side === "east"
      ? domain.x1
      : domain.x0 + t * (domain.x1 - domain.x0);
    const y = side === "south"
      ? domain.y0
      : side === "north"
      ? domain.y1
      : domain.y0 + t * (domain.y1 - domain.y0);
    out.push([x, y]);
  }
  return out;
}

/**
 * Faults of one Robin side's weights, each naming the side, the point and the fix.
 *
 * @param domain the rectangle
 * @param side the side
 * @param alpha α(x, y)
 * @param beta β(x, y)
 * @param intervals points along the side minus one. Default: {@link CHECK_INTERVALS}
 * @returns the faults (empty when the weights are fine)
 *
 * @example
 * ```ts
 * import { checkRobinWeights } from "./robin_check.ts";
 * const domain = { x0: 0, x1: 1, y0: 0, y1: 1 };
 * checkRobinWeights(domain, "east", () => 1, (_x, y) => y - 0.5).length; // 1: β changes sign
 * ```
 */
export function checkRobinWeights(
  domain: Domain,
  side: Side,
  alpha: PointFn,
  beta: PointFn,
  intervals = CHECK_INTERVALS,
): OperatorFault[] {
  const at = (field: "alpha" | "beta", message: string): OperatorFault => ({
    pointer: `/boundary/${side}/${field}`,
    field: `boundary.${side}.${field}`,
    message,
  });
  const point = (x: number, y: number) => `(x, y) = (${x}, ${y})`;
  let positive = 0, negative = 0, zero = 0;
  let firstZero: [number, number] | undefined, firstSigned: [number, number] | undefined;
  for (const [x, y] of sidePoints(domain, side, intervals)) {
    const a = alpha(x, y), b = beta(x, y);
    if (!Number.isFinite(a)) {
      return [
        at(
          "alpha",
          `α = ${a} at ${point(x, y)} on the ${side} side; make alpha finite along the whole side`,
        ),
      ];
    }
    if (!Number.isFinite(b)) {
      return [
        at(
          "beta",
          `β = ${b} at ${point(x, y)} on the ${side} side; make beta finite along the whole side`,
        ),
      ];
    }
    if (a === 0 && b === 0) {
      return [
        at(
          "alpha",
          `α = β = 0 at ${point(x, y)} on the ${side} side: the condition says nothing about u ` +
            "there; keep alpha or beta away from 0",
        ),
      ];
    }
    if (b === 0) zero++, firstZero ??= [x, y];
    else (b > 0 ? positive++ : negative++), firstSigned ??= [x, y];
  }
  if (zero > 0 && zero <= intervals) {
    const [x, y] = firstZero!;
    return [
      at(
        "beta",
        `β = 0 at ${point(x, y)} but not along the whole ${side} side: a side either fixes u ` +
          "(beta = 0 everywhere on it) or states a flux (beta of one strict sign); keep beta " +
          "away from 0 or set it to 0",
      ),
    ];
  }
  if (positive > 0 && negative > 0) {
    const [x, y] = firstSigned!;
    return [
      at(
        "beta",
        `β changes sign along the ${side} side (first value at ${point(x, y)}): it must keep ` +
          "one strict sign along a side; keep beta away from 0",
      ),
    ];
  }
  if (zero > 0) {
    // β ≡ 0: u = g/α, so α must not reach 0
    for (const [x, y] of sidePoints(domain, side, intervals)) {
      if (alpha(x, y) === 0) {
        return [
          at(
            "alpha",
            `α = 0 at ${point(x, y)} with β = 0 along the ${side} side; u = g/α needs alpha ≠ 0`,
          ),
        ];
      }
    }
  }
  return [];
}
