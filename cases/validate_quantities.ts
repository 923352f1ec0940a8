/**
 * The rules of a case file's `quantities` that its schema cannot say: unique names, none of the
 * built-in names, segments inside their side, rectangles of positive area inside the domain,
 * points inside the domain, and no field of another kind.
 *
 * @module
 */
import type { CaseFile, QuantitySpec } from "./case_file.ts";

/** Names of the quantities every study measures (`harness/campaign/quantities.ts`). */
export const BUILT_IN_QUANTITIES = ["integral", "point", "maximum", "east-flux"] as const;

/** The fields each kind may use besides `name`, `kind` and `label`. */
const FIELDS: Record<QuantitySpec["kind"], string[]> = {
  flux: ["side", "segment"],
  integral: ["x", "y"],
  point: ["x", "y"],
};

/**
 * Problems of the quantities of a schema-valid case file, as [JSON pointer, message] pairs.
 *
 * @example
 * ```ts
 * import assert from "node:assert/strict";
 * import { quantityProblems } from "./validate_quantities.ts";
 * const domain = { x0: 0, x1: 1, y0: 0, y1: 1 };
 * const [[pointer, message]] = quantityProblems({
 *   domain,
 *   quantities: [{ name: "p", kind: "point", x: 2, y: 0.5 }],
 * });
 * assert.equal(pointer, "/quantities/0/x");
 * assert.match(message, /outside the domain/);
 * ```
 */
export function quantityProblems(
  c: Pick<CaseFile, "domain" | "quantities">,
): [string, string][] {
  const problems: [string, string][] = [];
  const { x0, x1, y0, y1 } = c.domain;
  const seen = new Map<string, number>();
  (c.quantities ?? []).forEach((q, k) => {
    const at = `/quantities/${k}`;
    if ((BUILT_IN_QUANTITIES as readonly string[]).includes(q.name)) {
      problems.push([
        `${at}/name`,
        `"${q.name}" is the name of a built-in quantity (${BUILT_IN_QUANTITIES.join(", ")}); ` +
        `choose another name`,
      ]);
    } else if (seen.has(q.name)) {
      problems.push([
        `${at}/name`,
        `the name "${q.name}" is already used by quantities[${seen.get(q.name)}]; ` +
        `give each quantity its own name`,
      ]);
    } else seen.set(q.name, k);
    for (const field of ["side", "segment", "x", "y"]) {
      if (field in q && !FIELDS[q.kind].includes(field)) {
        problems.push([
          `${at}/${field}`,
          `a ${q.kind} quantity has no "${field}" (its fields: ${
            FIELDS[q.kind].join(", ")
          }); remove it or change the kind`,
        ]);
      }
    }
    if (q.kind === "flux" && q.segment) {
      const vertical = q.side === "west" || q.side === "east";
      const [lo, hi] = vertical ? [y0, y1] : [x0, x1];
      const axis = vertical ? "y" : "x";
      const [a, b] = q.segment;
      if (!(a < b)) {
        problems.push([
          `${at}/segment`,
          `the segment [${a}, ${b}] is empty: write [from, to] with from < to`,
        ]);
      } else if (a < lo || b > hi) {
        problems.push([
          `${at}/segment`,
          `the segment [${a}, ${b}] lies outside the ${q.side} side, which runs over ` +
          `${axis} in [${lo}, ${hi}]: choose from and to within it`,
        ]);
      }
    }
    if (q.kind === "integral") {
      for (const [axis, lo, hi] of [["x", x0, x1], ["y", y0, y1]] as const) {
        const range = q[axis] as unknown;
        if (range === undefined) continue;
        if (!Array.isArray(range)) {
          problems.push([
            `${at}/${axis}`,
            `an integral takes a range [from, to] in ${axis}, not a single number`,
          ]);
          continue;
        }
        const [a, b] = range as [number, number];
        if (!(a < b)) {
          problems.push([
            `${at}/${axis}`,
            `the rectangle has zero area: ${axis} runs over [${a}, ${b}]; write [from, to] ` +
            `with from < to`,
          ]);
        } else if (a < lo || b > hi) {
          problems.push([
            `${at}/${axis}`,
            `[${a}, ${b}] lies outside the domain, whose ${axis} runs over [${lo}, ${hi}]: ` +
            `choose a range within it`,
          ]);
        }
      }
    }
    if (q.kind === "point") {
      for (const [axis, lo, hi] of [["x", x0, x1], ["y", y0, y1]] as const) {
        const v = q[axis] as unknown;
        if (typeof v !== "number") {
          problems.push([
            `${at}/${axis}`,
            `a point takes one coordinate in ${axis}, not a range`,
          ]);
        } else if (v < lo || v > hi) {
          problems.push([
            `${at}/${axis}`,
            `the point lies outside the domain: ${axis} = ${v}, but the domain's ${axis} runs ` +
            `over [${lo}, ${hi}]; move the point inside`,
          ]);
        }
      }
    }
  });
  return problems;
}
