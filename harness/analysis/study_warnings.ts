import type { QuantityRecord } from "../result/types.ts";

/**
 * Plain-word warnings about a grid study of one quantity: refinement ratios below `minRatio`,
 * data outside the asymptotic range, oscillatory or divergent behaviour, an order that could not
 * be observed.
 *
 * Thresholds: Celik et al. (2008) recommend r > 1.3 (from memory; the NASA NPARC tutorial
 * advises at least 1.1, published); the asymptotic ratio GCI_23/(r^p·GCI_12) should be near 1
 * (Roache 1994) — "near" is |ratio − 1| ≤ `asymptoticTolerance`, default 0.1, our choice.
 *
 * @param h Spacing per grid, coarsest first.
 * @param record The quantity's record from {@link quantityRecord}.
 * @param options `minRatio` (default 1.3), `asymptoticTolerance` (default 0.1).
 * @returns Warnings, empty when none.
 *
 * @example
 * ```ts
 * import assert from "node:assert/strict";
 * import { studyWarnings } from "./study_warnings.ts";
 * import { quantityRecord } from "./quantity_record.ts";
 * const h = [1.2, 1.1, 1];
 * const w = studyWarnings(h, quantityRecord(h, [1.44, 1.21, 1]));
 * assert.ok(w.some((s) => s.includes("below 1.3")));
 * ```
 */
export function studyWarnings(
  h: ArrayLike<number>,
  record: QuantityRecord,
  options: { minRatio?: number; asymptoticTolerance?: number } = {},
): string[] {
  const minRatio = options.minRatio ?? 1.3;
  const tol = options.asymptoticTolerance ?? 0.1;
  const out: string[] = [];
  const low: string[] = [];
  for (let i = 0; i + 1 < h.length; i++) {
    const r = h[i] / h[i + 1];
    if (r < minRatio) low.push(`${fmt(r)} between grids ${i + 1} and ${i + 2}`);
  }
  if (low.length > 0) {
    out.push(
      `refinement ratio below ${minRatio} (${low.join("; ")}): differences between grids may be ` +
        `swamped by other errors; refine by a larger factor`,
    );
  }
  const c = record.celik;
  if (c?.convergence === "oscillatory") {
    out.push(
      "oscillatory convergence (the differences between grids change sign): the observed order " +
        "and the GCI are unreliable",
    );
  } else if (c?.convergence === "divergent") {
    out.push(
      "the differences between grids grow with refinement (divergent): no order or GCI can be " +
        "trusted; check the solutions or refine further",
    );
  }
  if (record.order === null && c !== null && c.convergence !== "divergent") {
    out.push("no observed order could be computed from the finest three grids");
  }
  if (record.asymptoticRatio !== null && Math.abs(record.asymptoticRatio - 1) > tol) {
    out.push(
      `outside the asymptotic range: GCI_23/(r^p·GCI_12) = ${fmt(record.asymptoticRatio)}, ` +
        `expected 1 ± ${tol}; refine further before trusting the GCI`,
    );
  }
  return out;
}

function fmt(x: number): string {
  return x.toPrecision(4);
}
