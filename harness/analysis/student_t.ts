import { regularizedIncompleteBeta } from "./_stats.ts";

/**
 * Cumulative distribution function of Student's t distribution with `dof` degrees of freedom.
 *
 * Formula: for t ≥ 0, P(T ≤ t) = 1 − ½·I_{ν/(ν+t²)}(ν/2, ½), with I the regularized incomplete
 * beta function (Abramowitz & Stegun 26.7.1 / DLMF 8.17); symmetric for t < 0.
 *
 * @param t The point.
 * @param dof Degrees of freedom ν > 0 (need not be an integer).
 * @returns P(T ≤ t).
 * @throws {RangeError} when dof is not a positive finite number.
 *
 * @example
 * ```ts
 * import assert from "node:assert/strict";
 * import { studentTCdf } from "./student_t.ts";
 * // one degree of freedom is the Cauchy distribution: P(T ≤ 1) = 3/4
 * assert.ok(Math.abs(studentTCdf(1, 1) - 0.75) < 1e-12);
 * ```
 */
export function studentTCdf(t: number, dof: number): number {
  checkDof(dof);
  if (Number.isNaN(t)) return NaN;
  if (t === Infinity) return 1;
  if (t === -Infinity) return 0;
  const tail = 0.5 * regularizedIncompleteBeta(dof / (dof + t * t), dof / 2, 0.5);
  return t >= 0 ? 1 - tail : tail;
}

/**
 * Quantile (inverse CDF) of Student's t distribution: the t with P(T ≤ t) = p.
 *
 * Computed, not tabled: the CDF above (via the regularized incomplete beta function) is inverted
 * by bracketing and bisection to full double precision, so any ν and p work. For a two-sided 95 %
 * confidence interval use p = 0.975 (t_{0.975,1} = 12.706, t_{0.975,10} = 2.228 in the usual
 * tables).
 *
 * @param p Probability, 0 < p < 1.
 * @param dof Degrees of freedom ν > 0.
 * @returns t_{p,ν}.
 * @throws {RangeError} when p is outside (0, 1) or dof is not positive.
 *
 * @example
 * ```ts
 * import assert from "node:assert/strict";
 * import { studentTQuantile } from "./student_t.ts";
 * assert.ok(Math.abs(studentTQuantile(0.975, 3) - 3.182) < 5e-4);
 * ```
 */
export function studentTQuantile(p: number, dof: number): number {
  checkDof(dof);
  if (!(p > 0 && p < 1)) {
    throw new RangeError(`Cannot compute a t quantile: probability must lie in (0, 1), got ${p}`);
  }
  if (p === 0.5) return 0;
  if (p < 0.5) return -studentTQuantile(1 - p, dof);
  // bracket: the CDF is increasing, so double the upper end until it passes p
  let lo = 0;
  let hi = 1;
  while (studentTCdf(hi, dof) < p) {
    lo = hi;
    hi *= 2;
    if (hi > 1e300) return Infinity;
  }
  for (let k = 0; k < 2000 && hi - lo > 4e-16 * hi; k++) {
    const mid = 0.5 * (lo + hi);
    if (studentTCdf(mid, dof) < p) lo = mid;
    else hi = mid;
  }
  return 0.5 * (lo + hi);
}

function checkDof(dof: number): void {
  if (!(dof > 0 && Number.isFinite(dof))) {
    throw new RangeError(
      `Cannot use Student's t distribution: degrees of freedom must be a positive number, got ${dof}`,
    );
  }
}
