/**
 * Composite Gauss–Legendre quadrature of the manufactured expressions: the exact values of the
 * quantities of interest and the compatibility balance of singular cases integrate with it.
 *
 * @module
 */

// 8-point Gauss–Legendre nodes and weights on [−1, 1] (Abramowitz & Stegun, Table 25.4, published).
const GL_X = [
  -0.9602898564975363,
  -0.7966664774136267,
  -0.5255324099163290,
  -0.1834346424956498,
  0.1834346424956498,
  0.5255324099163290,
  0.7966664774136267,
  0.9602898564975363,
];
const GL_W = [
  0.1012285362903763,
  0.2223810344533745,
  0.3137066458778873,
  0.3626837833783620,
  0.3626837833783620,
  0.3137066458778873,
  0.2223810344533745,
  0.1012285362903763,
];

/** Composite 8-point Gauss–Legendre rule on [lo, hi] with `panels` panels: nodes and weights. */
export function gaussLegendre(
  lo: number,
  hi: number,
  panels: number,
): { x: number[]; w: number[] } {
  const x: number[] = [];
  const w: number[] = [];
  const width = (hi - lo) / panels;
  for (let p = 0; p < panels; p++) {
    const mid = lo + (p + 0.5) * width;
    for (let k = 0; k < 8; k++) {
      x.push(mid + 0.5 * width * GL_X[k]);
      w.push(0.5 * width * GL_W[k]);
    }
  }
  return { x, w };
}
