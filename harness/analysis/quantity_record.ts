import type { QuantityRecord } from "../result/types.ts";
import { celikThreeGrid } from "./celik.ts";
import { leastSquaresUncertainty } from "./least_squares_uncertainty.ts";
import { richardsonExtrapolate, roacheGci } from "./richardson.ts";

/** Options of {@link quantityRecord}. */
export interface QuantityOptions {
  /** Short name of the quantity (default "quantity"). */
  name?: string;
  /** What it is, in words (default: the name). */
  label?: string;
  /** The exact value, when known (manufactured cases); enables the coverage check. */
  exact?: number | null;
  /**
   * Formal order of the method: used with Fs = 3 when no order can be observed (two grids, or
   * oscillatory/divergent data), and by the least-squares procedure (default: none, then no GCI
   * without an observed order; the least-squares procedure assumes 2).
   */
  formalOrder?: number;
  /**
   * Safety factor override for every GCI (default: 1.25 with an observed order from three or
   * more grids, 3 with the formal order — Roache 1994/1998).
   */
  safetyFactor?: number;
}

/**
 * Grid-convergence study of one quantity of interest: observed order and Celik et al. (2008)
 * figures from the finest three grids, Richardson extrapolation from the finest pair, Roache GCI of
 * the finest pair and of the next pair, the asymptotic ratio, the Eça & Hoekstra (2014)
 * least-squares estimate with four or more grids, and — when the exact value is known — whether
 * the finest GCI band contains the true error.
 *
 * Formulas: p and φext21 from {@link celikThreeGrid} (which equals the NPARC formula
 * p = ln((f3 − f2)/(f2 − f1))/ln r for a constant ratio); GCI_12 = Fs·|ε12|/(r21^p − 1) and
 * GCI_23 = Fs·|ε23|/(r32^p − 1) ({@link roacheGci}); asymptotic ratio GCI_23/(r21^p·GCI_12),
 * ≈ 1 in the asymptotic range (Roache 1994; NASA NPARC tutorial — which prints the reciprocal);
 * covered ⇔ |φ1 − φexact| ≤ GCI_fine·|φ1|. Note (derived): with p observed from the same three
 * grids and a constant ratio the asymptotic ratio equals |f1/f2| exactly (NPARC's 1.0020 is
 * 0.9705/0.96854), so it only flags large changes between grids.
 *
 * @param h Spacing per grid, coarsest first (strictly decreasing).
 * @param values Value per grid, aligned; null or non-finite entries are skipped.
 * @param options See {@link QuantityOptions}.
 * @returns A {@link QuantityRecord}; figures that cannot be computed are null.
 * @throws {RangeError} when lengths differ or h is not strictly decreasing.
 *
 * @example
 * ```ts
 * import assert from "node:assert/strict";
 * import { quantityRecord } from "./quantity_record.ts";
 * // NASA NPARC tutorial: p = 1.786170, f_ext = 0.971300, GCI_12 = 0.103083 %
 * const q = quantityRecord([4, 2, 1], [0.96178, 0.96854, 0.9705]);
 * assert.ok(Math.abs(q.order! - 1.786170) < 1e-6 && Math.abs(q.gciFine! - 0.00103083) < 1e-8);
 * ```
 */
export function quantityRecord(
  h: ArrayLike<number>,
  values: ArrayLike<number | null>,
  options: QuantityOptions = {},
): QuantityRecord {
  if (h.length !== values.length) {
    throw new RangeError(
      `Cannot study the quantity: ${h.length} spacings but ${values.length} values`,
    );
  }
  for (let i = 1; i < h.length; i++) {
    if (!(h[i] < h[i - 1])) {
      throw new RangeError(
        `Cannot study the quantity: spacings must decrease from coarsest to finest, got ` +
          `h = ${h[i - 1]} then ${h[i]} at grids ${i} and ${i + 1}`,
      );
    }
  }
  const name = options.name ?? "quantity";
  const exact = options.exact ?? null;
  const usable: number[] = [];
  for (let i = 0; i < h.length; i++) {
    const v = values[i];
    if (v !== null && Number.isFinite(v)) usable.push(i);
  }
  const record: QuantityRecord = {
    name,
    label: options.label ?? name,
    exact,
    values: Array.from(values, (v) => (v !== null && Number.isFinite(v) ? v : null)),
    order: null,
    extrapolated: null,
    gciFine: null,
    gciCoarse: null,
    safetyFactor: null,
    asymptoticRatio: null,
    celik: null,
    leastSquares: null,
    covered: null,
  };
  const k = usable.length;
  if (k < 2) return record;
  const i1 = usable[k - 1];
  const i2 = usable[k - 2];
  const f1 = values[i1] as number;
  const f2 = values[i2] as number;
  const r21 = h[i2] / h[i1];
  let p: number | null = null;
  let fs: number | null = null;
  let f3: number | null = null;
  let r32: number | null = null;
  if (k >= 3) {
    const i3 = usable[k - 3];
    f3 = values[i3] as number;
    r32 = h[i3] / h[i2];
    const c = celikThreeGrid(
      {
        fine: { h: h[i1], value: f1 },
        medium: { h: h[i2], value: f2 },
        coarse: { h: h[i3], value: f3 },
      },
      { safetyFactor: options.safetyFactor },
    );
    record.celik = {
      order: c.order,
      extrapolated: c.extrapolated,
      relativeError: c.relativeError,
      extrapolatedRelativeError: c.extrapolatedRelativeError,
      gciFine: c.gciFine,
      convergence: c.convergence,
    };
    record.order = c.order;
    if (c.order !== null) {
      p = c.order;
      fs = options.safetyFactor ?? 1.25;
    }
  }
  if (p === null && options.formalOrder !== undefined) {
    p = options.formalOrder;
    fs = options.safetyFactor ?? 3;
  }
  if (p !== null && fs !== null && p > 0) {
    record.safetyFactor = fs;
    record.extrapolated = richardsonExtrapolate(f1, f2, r21, p);
    if (f1 !== 0) {
      record.gciFine = roacheGci(f1, f2, { ratio: r21, order: p, safetyFactor: fs }).fine;
    }
    if (f3 !== null && r32 !== null && f2 !== 0) {
      record.gciCoarse = roacheGci(f2, f3, { ratio: r32, order: p, safetyFactor: fs }).fine;
      if (record.gciFine !== null && record.gciFine > 0 && record.order !== null) {
        record.asymptoticRatio = record.gciCoarse / (r21 ** p * record.gciFine);
      }
    }
  }
  if (k >= 4) {
    const ls = leastSquaresUncertainty(
      usable.map((i) => h[i]),
      usable.map((i) => values[i] as number),
      { formalOrder: options.formalOrder },
    );
    record.leastSquares = {
      fit: ls.chosen.fit + (ls.chosen.weighted ? " (weighted)" : ""),
      order: ls.chosen.order,
      extrapolated: ls.chosen.extrapolated,
      uncertainty: ls.relativeUncertainty,
      safetyFactor: ls.safetyFactor,
    };
  }
  if (exact !== null && record.gciFine !== null) {
    record.covered = Math.abs(f1 - exact) <= record.gciFine * Math.abs(f1);
  }
  return record;
}
