/**
 * Small numeric kernels shared by the analysis functions: straight-line least squares, the log
 * gamma function and the regularized incomplete beta function. Private to `harness/analysis/`.
 *
 * @module
 */

/** Result of an ordinary least-squares straight-line fit y ≈ intercept + slope·x. */
export interface LineFit {
  slope: number;
  intercept: number;
  /** Number of points used. */
  n: number;
  /** Sum of squared residuals. */
  residualSumOfSquares: number;
  /** Standard error of the slope, sqrt(SSR/(n − 2) / Sxx); NaN when n ≤ 2. */
  slopeStandardError: number;
}

/**
 * Ordinary least-squares line through (x_i, y_i). Centred sums avoid cancellation.
 * Returns NaN slope when all x coincide.
 */
export function fitLine(x: ArrayLike<number>, y: ArrayLike<number>): LineFit {
  const n = x.length;
  let mx = 0;
  let my = 0;
  for (let i = 0; i < n; i++) {
    mx += x[i];
    my += y[i];
  }
  mx /= n;
  my /= n;
  let sxx = 0;
  let sxy = 0;
  for (let i = 0; i < n; i++) {
    sxx += (x[i] - mx) * (x[i] - mx);
    sxy += (x[i] - mx) * (y[i] - my);
  }
  const slope = sxx > 0 ? sxy / sxx : NaN;
  const intercept = my - slope * mx;
  let ssr = 0;
  for (let i = 0; i < n; i++) {
    const r = y[i] - intercept - slope * x[i];
    ssr += r * r;
  }
  const slopeStandardError = n > 2 && sxx > 0 ? Math.sqrt(ssr / (n - 2) / sxx) : NaN;
  return { slope, intercept, n, residualSumOfSquares: ssr, slopeStandardError };
}

// Lanczos coefficients g = 7, n = 9 (the widely published set, e.g. Numerical Recipes 3rd ed.
// §6.1 and Wikipedia "Lanczos approximation"); relative accuracy about 1e-15 for x > 0.
const LANCZOS = [
  0.99999999999980993,
  676.5203681218851,
  -1259.1392167224028,
  771.32342877765313,
  -176.61502916214059,
  12.507343278686905,
  -0.13857109526572012,
  9.9843695780195716e-6,
  1.5056327351493116e-7,
];

/** ln Γ(x) for x > 0 (Lanczos approximation, g = 7). */
export function logGamma(x: number): number {
  if (x < 0.5) {
    // reflection formula Γ(x)Γ(1 − x) = π / sin(πx)
    return Math.log(Math.PI / Math.abs(Math.sin(Math.PI * x))) - logGamma(1 - x);
  }
  const z = x - 1;
  let a = LANCZOS[0];
  const t = z + 7.5;
  for (let i = 1; i < 9; i++) a += LANCZOS[i] / (z + i);
  return 0.5 * Math.log(2 * Math.PI) + (z + 0.5) * Math.log(t) - t + Math.log(a);
}

/**
 * Continued fraction for the incomplete beta function (modified Lentz method), DLMF 8.17.22;
 * Numerical Recipes 3rd ed. §6.4 `betacf`. Converges fast for x < (a + 1)/(a + b + 2).
 */
function betaContinuedFraction(a: number, b: number, x: number): number {
  const tiny = 1e-300;
  const qab = a + b;
  const qap = a + 1;
  const qam = a - 1;
  let c = 1;
  let d = 1 - (qab * x) / qap;
  if (Math.abs(d) < tiny) d = tiny;
  d = 1 / d;
  let h = d;
  for (let m = 1; m <= 1000; m++) {
    const m2 = 2 * m;
    let aa = (m * (b - m) * x) / ((qam + m2) * (a + m2));
    d = 1 + aa * d;
    if (Math.abs(d) < tiny) d = tiny;
    c = 1 + aa / c;
    if (Math.abs(c) < tiny) c = tiny;
    d = 1 / d;
    h *= d * c;
    aa = (-(a + m) * (qab + m) * x) / ((a + m2) * (qap + m2));
    d = 1 + aa * d;
    if (Math.abs(d) < tiny) d = tiny;
    c = 1 + aa / c;
    if (Math.abs(c) < tiny) c = tiny;
    d = 1 / d;
    const del = d * c;
    h *= del;
    if (Math.abs(del - 1) < 1e-16) break;
  }
  return h;
}

/** Regularized incomplete beta function I_x(a, b) for a, b > 0 and 0 ≤ x ≤ 1. */
export function regularizedIncompleteBeta(x: number, a: number, b: number): number {
  if (x <= 0) return 0;
  if (x >= 1) return 1;
  const lnFront = logGamma(a + b) - logGamma(a) - logGamma(b) + a * Math.log(x) +
    b * Math.log1p(-x);
  const front = Math.exp(lnFront);
  // use the symmetry I_x(a, b) = 1 − I_{1−x}(b, a) where the continued fraction converges faster
  if (x < (a + 1) / (a + b + 2)) return (front * betaContinuedFraction(a, b, x)) / a;
  return 1 - (front * betaContinuedFraction(b, a, 1 - x)) / b;
}
