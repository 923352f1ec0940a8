/**
 * Local Fourier (two-grid) analysis of red–black Gauss–Seidel for the 2-D 5-point Poisson operator
 * with full-weighting restriction, bilinear interpolation and an exact coarse solve by
 * rediscretization on the grid of width 2h: the standard analysis of Trottenberg, Oosterlee and
 * Schüller, Multigrid (2001), re-derived here so the tests can recompute the values they recall from
 * memory.
 *
 * Derivation (symbols scaled by h², operator −Δ_h):
 * - L_h(θ) = 4 − 2cos θ1 − 2cos θ2; coarse L_H(2θ) = (4 − 2cos 2θ1 − 2cos 2θ2)/4.
 * - Harmonics of a low frequency θ ∈ [−π/2, π/2)²: θ⁰ = θ, θ¹ = θ + (π, π), θ² = θ + (π, 0),
 *   θ³ = θ + (0, π).
 * - Full weighting and bilinear interpolation both have symbol ¼(1 + cos θ1^α)(1 + cos θ2^α) on
 *   harmonic α, so the coarse-grid correction is K_αβ = δ_αβ − p_α·r_β·L_h(θ^β)/L_H(2θ).
 * - Jacobi (ω = 1) has symbol s(θ) = (cos θ1 + cos θ2)/2, and s(θ + (π, π)) = −s(θ). Relaxing only
 *   the red points (even i + j) maps amplitudes (A, B) on the pair (θ, θ + (π, π)) to
 *   ½[(1 + s)(A − B), (1 − s)(B − A)]; the black half-step to ½[(1 + s)(A + B), (1 − s)(A + B)]
 *   (mixing by the checkerboard (−1)^(i+j), which shifts a frequency by (π, π)). The pairs
 *   (θ⁰, θ¹) and (θ², θ³) are each invariant.
 * - Two-grid operator M = S^ν2·K·S^ν1; its spectral radius equals that of K·S^(ν1+ν2) (cyclic
 *   similarity), so ρ depends on ν = ν1 + ν2 only. ρ = sup over θ ≠ 0 of the spectral radius.
 *
 * @module
 */

type Mat4 = Float64Array; // row-major 4×4

function mul(a: Mat4, b: Mat4): Mat4 {
  const c = new Float64Array(16);
  for (let i = 0; i < 4; i++) {
    for (let k = 0; k < 4; k++) {
      const aik = a[i * 4 + k];
      for (let j = 0; j < 4; j++) c[i * 4 + j] += aik * b[k * 4 + j];
    }
  }
  return c;
}

/** Spectral radius by repeated squaring: ρ(M) = lim ‖M^(2^m)‖^(1/2^m), with rescaling each step. */
function spectralRadius(m: Mat4): number {
  let a = m;
  let logScale = 0;
  const steps = 18;
  for (let s = 0; s < steps; s++) {
    a = mul(a, a);
    let norm = 0;
    for (let k = 0; k < 16; k++) norm += a[k] * a[k];
    norm = Math.sqrt(norm);
    if (norm === 0) return 0;
    for (let k = 0; k < 16; k++) a[k] /= norm;
    logScale = 2 * logScale + Math.log(norm);
  }
  // ‖M^(2^steps)‖ = exp(logScale); the 2^steps-th root is the radius up to (polynomial)^(1/2^steps)
  return Math.exp(logScale / 2 ** steps);
}

function redBlackSymbol(theta1: number, theta2: number): Mat4 {
  const s = new Float64Array(16);
  // block (0, 1) uses s(θ), block (2, 3) uses s(θ + (π, 0))
  const blocks: [number, number, number][] = [
    [0, 1, (Math.cos(theta1) + Math.cos(theta2)) / 2],
    [2, 3, (-Math.cos(theta1) + Math.cos(theta2)) / 2],
  ];
  for (const [p, q, j] of blocks) {
    // red then black: S = S_B·S_R with S_R = ½[[1+s, −(1+s)], [−(1−s), 1−s]],
    // S_B = ½[[1+s, 1+s], [1−s, 1−s]]
    const r = [[(1 + j) / 2, -(1 + j) / 2], [-(1 - j) / 2, (1 - j) / 2]];
    const b = [[(1 + j) / 2, (1 + j) / 2], [(1 - j) / 2, (1 - j) / 2]];
    const idx = [p, q];
    for (let x = 0; x < 2; x++) {
      for (let y = 0; y < 2; y++) {
        s[idx[x] * 4 + idx[y]] = b[x][0] * r[0][y] + b[x][1] * r[1][y];
      }
    }
  }
  return s;
}

function coarseCorrectionSymbol(theta1: number, theta2: number): Mat4 {
  const harmonics: [number, number][] = [
    [theta1, theta2],
    [theta1 + Math.PI, theta2 + Math.PI],
    [theta1 + Math.PI, theta2],
    [theta1, theta2 + Math.PI],
  ];
  const lh = harmonics.map(([t1, t2]) => 4 - 2 * Math.cos(t1) - 2 * Math.cos(t2));
  const transfer = harmonics.map(([t1, t2]) => (1 + Math.cos(t1)) * (1 + Math.cos(t2)) / 4);
  const lH = (4 - 2 * Math.cos(2 * theta1) - 2 * Math.cos(2 * theta2)) / 4;
  const k = new Float64Array(16);
  for (let a = 0; a < 4; a++) {
    for (let b = 0; b < 4; b++) {
      k[a * 4 + b] = (a === b ? 1 : 0) - transfer[a] * transfer[b] * lh[b] / lH;
    }
  }
  return k;
}

/**
 * LFA two-grid convergence factor ρ of red–black Gauss–Seidel with ν = ν1 + ν2 sweeps, full
 * weighting, bilinear interpolation, for the 5-point Poisson operator, sampled on a
 * `samples × samples` grid of low frequencies (θ = 0 excluded).
 */
export function redBlackTwoGridFactor(nu: number, samples = 64): number {
  let rho = 0;
  for (let p = 0; p < samples; p++) {
    for (let q = 0; q < samples; q++) {
      const t1 = -Math.PI / 2 + p * Math.PI / samples;
      const t2 = -Math.PI / 2 + q * Math.PI / samples;
      if (Math.abs(t1) < 1e-12 && Math.abs(t2) < 1e-12) continue;
      let m = coarseCorrectionSymbol(t1, t2);
      const s = redBlackSymbol(t1, t2);
      for (let k = 0; k < nu; k++) m = mul(m, s);
      rho = Math.max(rho, spectralRadius(m));
    }
  }
  return rho;
}

/**
 * LFA smoothing factor of red–black Gauss–Seidel (one sweep) for the 5-point Poisson operator: the
 * two-grid analysis with an ideal coarse-grid correction that removes the low harmonic θ⁰ exactly
 * and leaves the three high ones (the usual definition of μ for a pattern smoother).
 */
export function redBlackSmoothingFactor(samples = 64): number {
  let mu = 0;
  for (let p = 0; p < samples; p++) {
    for (let q = 0; q < samples; q++) {
      const t1 = -Math.PI / 2 + p * Math.PI / samples;
      const t2 = -Math.PI / 2 + q * Math.PI / samples;
      if (Math.abs(t1) < 1e-12 && Math.abs(t2) < 1e-12) continue;
      const q4 = new Float64Array(16);
      for (let k = 1; k < 4; k++) q4[k * 4 + k] = 1;
      mu = Math.max(mu, spectralRadius(mul(q4, redBlackSymbol(t1, t2))));
    }
  }
  return mu;
}

/** Point and line smoothers whose LFA symbol is a single complex number (no pattern). */
export type SimpleSmoother = "jacobi" | "gauss-seidel" | "line-x" | "line-y";

/**
 * LFA smoothing factor μ = sup over high frequencies θ ∈ [−π, π)² \ [−π/2, π/2)² of |S(θ)| for
 * the anisotropic operator −(ε·u_xx + u_yy) (5-point, equal mesh widths), for smoothers whose
 * amplification is one complex number per frequency. Derivation (scaled by h², D = 2ε + 2):
 * - weighted Jacobi: S = 1 − ω·(2ε(1 − cos θ1) + 2(1 − cos θ2))/D;
 * - lexicographic Gauss–Seidel (x fastest): S = (ε·e^{iθ1} + e^{iθ2})/(D − ε·e^{−iθ1} − e^{−iθ2});
 * - line-y (columns solved exactly, left to right): S = ε·e^{iθ1}/(D − 2cos θ2 − ε·e^{−iθ1});
 * - line-x (rows solved exactly, bottom to top): S = e^{iθ2}/(D − 2ε·cos θ1 − e^{−iθ2}).
 */
export function smoothingFactor(
  smoother: SimpleSmoother,
  epsilon: number,
  options: { omega?: number; samples?: number } = {},
): number {
  const omega = options.omega ?? 0.8;
  const samples = options.samples ?? 256;
  const diag = 2 * epsilon + 2;
  // |num| / |den| with num, den complex given as [re, im]
  const ratio = (nr: number, ni: number, dr: number, di: number) =>
    Math.hypot(nr, ni) / Math.hypot(dr, di);
  let mu = 0;
  for (let p = 0; p < samples; p++) {
    for (let q = 0; q < samples; q++) {
      const t1 = -Math.PI + 2 * Math.PI * p / samples;
      const t2 = -Math.PI + 2 * Math.PI * q / samples;
      const low = t1 >= -Math.PI / 2 && t1 < Math.PI / 2 && t2 >= -Math.PI / 2 && t2 < Math.PI / 2;
      if (low) continue;
      const c1 = Math.cos(t1), s1 = Math.sin(t1), c2 = Math.cos(t2), s2 = Math.sin(t2);
      let amp: number;
      if (smoother === "jacobi") {
        amp = Math.abs(1 - omega * (2 * epsilon * (1 - c1) + 2 * (1 - c2)) / diag);
      } else if (smoother === "gauss-seidel") {
        amp = ratio(
          epsilon * c1 + c2,
          epsilon * s1 + s2,
          diag - epsilon * c1 - c2,
          epsilon * s1 + s2,
        );
      } else if (smoother === "line-y") {
        amp = ratio(epsilon * c1, epsilon * s1, diag - 2 * c2 - epsilon * c1, epsilon * s1);
      } else {
        amp = ratio(c2, s2, diag - 2 * epsilon * c1 - c2, s2);
      }
      mu = Math.max(mu, amp);
    }
  }
  return mu;
}
