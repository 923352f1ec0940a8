/** The error models fitted by the least-squares procedure. */
export type LeastSquaresFitName = "power" | "linear" | "quadratic" | "linear+quadratic";

/** One fitted error model. */
export interface LeastSquaresFit {
  fit: LeastSquaresFitName;
  weighted: boolean;
  /** Exponent (the fitted p for "power", 1 or 2 for fixed fits, null for the two-term fit). */
  order: number | null;
  /** φ0, the estimate of the zero-spacing value. */
  extrapolated: number;
  /** Standard deviation of the fit U_s (same units as φ). */
  standardDeviation: number;
  /** Error estimate on the finest grid ε = |fit(h1) − φ0|. */
  error: number;
  /** |φ1 − fit(h1)|, the fit's miss at the finest grid. */
  miss: number;
}

/** Result of the least-squares uncertainty procedure. */
export interface LeastSquaresResult {
  /** The chosen fit. */
  chosen: LeastSquaresFit;
  /** Data range Δ_M = (φ_max − φ_min)/(n − 1). */
  dataRange: number;
  safetyFactor: number;
  /** Uncertainty U_φ of the finest-grid value (same units as φ). */
  uncertainty: number;
  /** U_φ/|φ1| (a fraction, like the GCI); null when φ1 = 0. */
  relativeUncertainty: number | null;
  /** Every fit tried, for the record. */
  fits: LeastSquaresFit[];
}

/**
 * Numerical uncertainty of the finest-grid value from four or more grids by least-squares fits,
 * after Eça & Hoekstra, "A procedure for the estimation of the numerical uncertainty of CFD
 * calculations based on grid refinement studies", J. Comput. Phys. 262:104–130, 2014.
 *
 * Published in outline (docs/check-values.md, "Eça and Hoekstra (2014): least-squares
 * uncertainty"): fits of φ_i = φ0 + α h_i^p (p free), φ0 + α h_i,
 * φ0 + α h_i², φ0 + α1 h_i + α2 h_i², each unweighted and weighted, the one with the smaller
 * standard deviation used; Fs = 1.25 for well-behaved data and 3 otherwise; data range
 * Δ_M = (φ_max − φ_min)/(n − 1); reduces to the GCI for clean data.
 *
 * FROM MEMORY, not re-read — confirm against the paper before citing these as published:
 * - weights w_i ∝ 1/h_i normalized to sum 1 (unweighted: w_i = 1/n); standard deviation
 *   U_s = sqrt(n·Σ w_i (φ_i − fit_i)² / (n − m)), m the number of fitted parameters;
 * - the free-p fit is used when 0.5 ≤ p < formal + 0.1 (2.1 for a second-order method) with
 *   Fs = 1.25; for p < 0.5 the smallest-U_s of the h, h² and h + h² fits is used, and for
 *   p ≥ formal + 0.1 the fixed fit with exponent `formal`, both with Fs = 3;
 * - U_φ = Fs·ε + U_s + |φ1 − fit(h1)| when U_s < Δ_M, otherwise
 *   U_φ = 3·(U_s/Δ_M)·(ε + U_s + |φ1 − fit(h1)|); and Fs = 3 whenever U_s ≥ Δ_M.
 * Spacings are scaled by the finest h (relative step sizes) before fitting; the free p is found by
 * a scan of p in [0.01, 10] and golden-section refinement of the residual sum of squares.
 *
 * @param h Spacings, any order.
 * @param values Quantity per grid, aligned with h.
 * @param options `formalOrder` of the method (default 2).
 * @returns The chosen fit, Δ_M, Fs and the uncertainty.
 * @throws {RangeError} with fewer than four grids, mismatched lengths, non-finite values or
 *   repeated spacings.
 *
 * @example
 * ```ts
 * import assert from "node:assert/strict";
 * import { leastSquaresUncertainty } from "./least_squares_uncertainty.ts";
 * const h = [0.4, 0.2, 0.1, 0.05];
 * const r = leastSquaresUncertainty(h, h.map((x) => 3 + 0.5 * x ** 1.5));
 * assert.ok(r.chosen.fit === "power" && Math.abs(r.chosen.extrapolated - 3) < 1e-6);
 * ```
 */
export function leastSquaresUncertainty(
  h: ArrayLike<number>,
  values: ArrayLike<number>,
  options: { formalOrder?: number } = {},
): LeastSquaresResult {
  const n = h.length;
  const formal = options.formalOrder ?? 2;
  if (n !== values.length) {
    throw new RangeError(
      `Cannot fit the grid study: ${n} spacings but ${values.length} values`,
    );
  }
  if (n < 4) {
    throw new RangeError(
      `Cannot apply the least-squares procedure to ${n} grids: it needs four or more`,
    );
  }
  const idx = Array.from({ length: n }, (_, i) => i).sort((a, b) => h[a] - h[b]);
  const hs = idx.map((i) => h[i]);
  const phi = idx.map((i) => values[i]);
  for (let i = 0; i < n; i++) {
    if (!(hs[i] > 0) || !Number.isFinite(hs[i]) || !Number.isFinite(phi[i])) {
      throw new RangeError(
        `Cannot fit the grid study: grid ${i + 1} has h = ${hs[i]}, value = ${phi[i]}`,
      );
    }
    if (i > 0 && hs[i] === hs[i - 1]) {
      throw new RangeError(`Cannot fit the grid study: the spacing ${hs[i]} appears twice`);
    }
  }
  const t = hs.map((x) => x / hs[0]); // relative step sizes, finest = 1
  const fits: LeastSquaresFit[] = [];
  for (const weighted of [false, true]) {
    const w = weightsFor(t, weighted);
    const power = fitPower(t, phi, w);
    if (power) fits.push(describe("power", weighted, power.p, [0, power.p], power.coef, t, phi, w));
    for (const [name, exps] of FIXED) {
      const coef = weightedLeastSquares(t, phi, w, exps);
      if (coef) {
        const order = exps.length === 1 ? exps[0] : null;
        fits.push(describe(name, weighted, order, [0, ...exps], coef, t, phi, w));
      }
    }
  }
  const best = (names: LeastSquaresFitName[], order?: number) =>
    fits
      .filter((f) => names.includes(f.fit) && (order === undefined || f.order === order))
      .reduce<LeastSquaresFit | undefined>(
        (a, f) => (a === undefined || f.standardDeviation < a.standardDeviation ? f : a),
        undefined,
      );
  const power = best(["power"]);
  const upper = formal + 0.1;
  let chosen: LeastSquaresFit | undefined;
  let wellBehaved = false;
  if (power && power.order !== null && power.order >= 0.5 && power.order < upper) {
    chosen = power;
    wellBehaved = true;
  } else if (power && power.order !== null && power.order >= upper) {
    chosen = best(["linear", "quadratic"], formal) ?? best(["quadratic"]);
  }
  chosen ??= best(["linear", "quadratic", "linear+quadratic"]);
  if (!chosen) {
    throw new RangeError("Cannot fit the grid study: every least-squares fit was singular");
  }
  const dataRange = (Math.max(...phi) - Math.min(...phi)) / (n - 1);
  const smooth = chosen.standardDeviation < dataRange;
  const safetyFactor = wellBehaved && smooth ? 1.25 : 3;
  const uncertainty = smooth
    ? safetyFactor * chosen.error + chosen.standardDeviation + chosen.miss
    : 3 * (chosen.standardDeviation / dataRange) *
      (chosen.error + chosen.standardDeviation + chosen.miss);
  return {
    chosen,
    dataRange,
    safetyFactor,
    uncertainty,
    relativeUncertainty: phi[0] !== 0 ? uncertainty / Math.abs(phi[0]) : null,
    fits,
  };
}

const FIXED: [LeastSquaresFitName, number[]][] = [
  ["linear", [1]],
  ["quadratic", [2]],
  ["linear+quadratic", [1, 2]],
];

function weightsFor(t: number[], weighted: boolean): number[] {
  if (!weighted) return t.map(() => 1 / t.length);
  const inv = t.map((x) => 1 / x);
  const sum = inv.reduce((a, b) => a + b, 0);
  return inv.map((x) => x / sum);
}

/** Model value Σ coef_k · t^exps_k (exponent 0 is the constant φ0). */
function model(exps: number[], coef: number[], x: number): number {
  let v = 0;
  for (let k = 0; k < exps.length; k++) v += coef[k] * x ** exps[k];
  return v;
}

function describe(
  fit: LeastSquaresFitName,
  weighted: boolean,
  order: number | null,
  exps: number[],
  coef: number[],
  t: number[],
  phi: number[],
  w: number[],
): LeastSquaresFit {
  const n = t.length;
  let ssr = 0;
  for (let i = 0; i < n; i++) ssr += w[i] * (phi[i] - model(exps, coef, t[i])) ** 2;
  const m = exps.length;
  const fitted1 = model(exps, coef, t[0]);
  return {
    fit,
    weighted,
    order,
    extrapolated: coef[0],
    standardDeviation: Math.sqrt((n * ssr) / (n - m)),
    error: Math.abs(fitted1 - coef[0]),
    miss: Math.abs(phi[0] - fitted1),
  };
}

/**
 * Weighted least squares for φ ≈ c0 + Σ c_k t^e_k by the normal equations (at most three
 * unknowns on relative step sizes ≥ 1, so conditioning is mild). Returns null when singular.
 */
function weightedLeastSquares(
  t: number[],
  phi: number[],
  w: number[],
  exps: number[],
): number[] | null {
  const basis = [0, ...exps];
  const m = basis.length;
  const a = Array.from({ length: m }, () => new Array<number>(m + 1).fill(0));
  for (let i = 0; i < t.length; i++) {
    const row = basis.map((e) => t[i] ** e);
    for (let r = 0; r < m; r++) {
      for (let c = 0; c < m; c++) a[r][c] += w[i] * row[r] * row[c];
      a[r][m] += w[i] * row[r] * phi[i];
    }
  }
  // Gaussian elimination with partial pivoting on the augmented matrix
  for (let col = 0; col < m; col++) {
    let piv = col;
    for (let r = col + 1; r < m; r++) if (Math.abs(a[r][col]) > Math.abs(a[piv][col])) piv = r;
    if (!(Math.abs(a[piv][col]) > 1e-300)) return null;
    [a[col], a[piv]] = [a[piv], a[col]];
    for (let r = col + 1; r < m; r++) {
      const f = a[r][col] / a[col][col];
      for (let c = col; c <= m; c++) a[r][c] -= f * a[col][c];
    }
  }
  const x = new Array<number>(m).fill(0);
  for (let r = m - 1; r >= 0; r--) {
    let s = a[r][m];
    for (let c = r + 1; c < m; c++) s -= a[r][c] * x[c];
    x[r] = s / a[r][r];
  }
  return x.every(Number.isFinite) ? x : null;
}

/** Free-exponent fit: minimizes the weighted residual sum of squares over p in [0.01, 10]. */
function fitPower(
  t: number[],
  phi: number[],
  w: number[],
): { p: number; coef: number[] } | null {
  const ssr = (p: number): number => {
    const coef = weightedLeastSquares(t, phi, w, [p]);
    if (!coef) return Infinity;
    let s = 0;
    for (let i = 0; i < t.length; i++) s += w[i] * (phi[i] - coef[0] - coef[1] * t[i] ** p) ** 2;
    return s;
  };
  const lo = Math.log(0.01);
  const hi = Math.log(10);
  const steps = 400;
  let bestK = -1;
  let bestS = Infinity;
  for (let k = 0; k <= steps; k++) {
    const s = ssr(Math.exp(lo + ((hi - lo) * k) / steps));
    if (s < bestS) {
      bestS = s;
      bestK = k;
    }
  }
  if (bestK < 0) return null;
  // golden-section search on the bracket around the best scan point (in log p)
  let a = lo + ((hi - lo) * Math.max(0, bestK - 1)) / steps;
  let b = lo + ((hi - lo) * Math.min(steps, bestK + 1)) / steps;
  const g = (Math.sqrt(5) - 1) / 2;
  let c = b - g * (b - a);
  let d = a + g * (b - a);
  let fc = ssr(Math.exp(c));
  let fd = ssr(Math.exp(d));
  for (let k = 0; k < 200 && b - a > 1e-15; k++) {
    if (fc <= fd) {
      b = d;
      d = c;
      fd = fc;
      c = b - g * (b - a);
      fc = ssr(Math.exp(c));
    } else {
      a = c;
      c = d;
      fc = fd;
      d = a + g * (b - a);
      fd = ssr(Math.exp(d));
    }
  }
  const p = Math.exp(0.5 * (a + b));
  const coef = weightedLeastSquares(t, phi, w, [p]);
  return coef ? { p, coef } : null;
}
