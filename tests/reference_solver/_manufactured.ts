/**
 * Hand-derived manufactured solutions for the reference-solver verification tests.
 *
 * Every field carries its value and the first and second derivatives the operator
 * a·u_xx + b·u_x + c·u_yy + d·u_y + e·u needs, written out by hand (the symbolic case engine is
 * another part and is not used here, so these derivations are an independent route). Each
 * derivation is checked against central finite differences of the value at random points in
 * `_manufactured_test.ts` (common practice).
 *
 * @module
 */

/** A function of position. */
export type PointFunction = (x: number, y: number) => number;

/** A manufactured solution with its hand-derived derivatives. */
export interface Field {
  /** Short description of the formula, for test names and messages. */
  name: string;
  u: PointFunction;
  ux: PointFunction;
  uy: PointFunction;
  uxx: PointFunction;
  uyy: PointFunction;
}

/** The five coefficient functions of a·u_xx + b·u_x + c·u_yy + d·u_y + e·u. */
export interface Coefficients {
  name: string;
  a: PointFunction;
  b: PointFunction;
  c: PointFunction;
  d: PointFunction;
  e: PointFunction;
}

/**
 * u = 1 + x − 2y + 3x² − xy + 2y², a non-trivial quadratic (all six monomials of degree ≤ 2,
 * mixed term included). Central differences and the ghost-node boundary formulas are exact for it.
 */
export const QUADRATIC: Field = {
  name: "u = 1 + x − 2y + 3x² − xy + 2y²",
  u: (x, y) => 1 + x - 2 * y + 3 * x * x - x * y + 2 * y * y,
  ux: (x, y) => 1 + 6 * x - y,
  uy: (x, y) => -2 - x + 4 * y,
  uxx: () => 6,
  uyy: () => 4,
};

/**
 * u = 0.5 + x − y + x² + 2xy − y² + x³ − 2x²y + 0.5xy² + 1.5y³, a full cubic. The second central
 * difference is exact for cubics along each grid line (derived: its truncation error is
 * (h²/12)·u'''' + …), so a·u_xx + c·u_yy + e·u with Dirichlet sides reproduces it to round-off.
 */
export const CUBIC: Field = {
  name: "u = 0.5 + x − y + x² + 2xy − y² + x³ − 2x²y + 0.5xy² + 1.5y³",
  u: (x, y) =>
    0.5 + x - y + x * x + 2 * x * y - y * y + x ** 3 - 2 * x * x * y + 0.5 * x * y * y +
    1.5 * y ** 3,
  ux: (x, y) => 1 + 2 * x + 2 * y + 3 * x * x - 4 * x * y + 0.5 * y * y,
  uy: (x, y) => -1 + 2 * x - 2 * y - 2 * x * x + x * y + 4.5 * y * y,
  uxx: (x, y) => 2 + 6 * x - 4 * y,
  uyy: (x, y) => -2 + x + 9 * y,
};

/**
 * u = exp(p·x·y)·sin(k1·x + φ1)·cos(k2·y + φ2): smooth, not polynomial, with every derivative
 * non-trivial and no symmetry that would hide an error on any side.
 *
 * Hand derivation, with E = exp(pxy), S = sin(k1x + φ1), S' = k1·cos(k1x + φ1), S'' = −k1²·S,
 * C = cos(k2y + φ2), C' = −k2·sin(k2y + φ2), C'' = −k2²·C, E_x = py·E, E_y = px·E:
 * - u_x = E·(py·S + S')·C
 * - u_xx = E·(p²y²·S + 2py·S' + S'')·C
 * - u_y = E·S·(px·C + C')
 * - u_yy = E·S·(p²x²·C + 2px·C' + C'')
 */
export function expSinCos(p: number, k1: number, phi1: number, k2: number, phi2: number): Field {
  const parts = (x: number, y: number) => {
    const E = Math.exp(p * x * y);
    const S = Math.sin(k1 * x + phi1);
    const S1 = k1 * Math.cos(k1 * x + phi1);
    const S2 = -k1 * k1 * S;
    const C = Math.cos(k2 * y + phi2);
    const C1 = -k2 * Math.sin(k2 * y + phi2);
    const C2 = -k2 * k2 * C;
    return { E, S, S1, S2, C, C1, C2 };
  };
  return {
    name: `u = exp(${p}xy)·sin(${k1}x + ${phi1})·cos(${k2}y + ${phi2})`,
    u: (x, y) => {
      const q = parts(x, y);
      return q.E * q.S * q.C;
    },
    ux: (x, y) => {
      const q = parts(x, y);
      return q.E * (p * y * q.S + q.S1) * q.C;
    },
    uxx: (x, y) => {
      const q = parts(x, y);
      return q.E * (p * p * y * y * q.S + 2 * p * y * q.S1 + q.S2) * q.C;
    },
    uy: (x, y) => {
      const q = parts(x, y);
      return q.E * q.S * (p * x * q.C + q.C1);
    },
    uyy: (x, y) => {
      const q = parts(x, y);
      return q.E * q.S * (p * p * x * x * q.C + 2 * p * x * q.C1 + q.C2);
    },
  };
}

/** The smooth manufactured solution of the order-of-accuracy tests. */
export const SMOOTH: Field = expSinCos(0.5, 2.5, 0.4, 1.7, -0.3);

/**
 * Smooth variable coefficients: a, c > 0 (a ∈ [0.7, 1.3], c ∈ [0.8, 1.6]), moderate b and d (cell
 * Péclet number well below 1 on every grid used, so central differences stay monotone) and e ≤ −1,
 * which keeps problems with only Neumann or Robin sides non-singular.
 */
export const VARIABLE: Coefficients = {
  name: "variable a, b, c, d, e (moderate b, d; e ≤ −1)",
  a: (x, y) => 1 + 0.3 * Math.sin(2 * x + y),
  b: (x, y) => 0.8 * Math.cos(x - 2 * y),
  c: (x, y) => 1.2 + 0.4 * Math.cos(x * y),
  d: (x, y) => 0.5 + 0.5 * x - 0.3 * y * y,
  e: (x, y) => -1 - 0.5 * Math.exp(-x * x - y * y),
};

/**
 * Variable coefficients with strong first-order terms (b ≈ 8 > 0, d ≈ −6 < 0): upwinding's
 * first-order error (h/2)(|b|·u_xx + |d|·u_yy) dominates the central second-order error on the
 * grids of the tests, so the observed order with upwinding is 1.
 */
export const CONVECTIVE: Coefficients = {
  name: "variable a, c, e with strong b ≈ 8, d ≈ −6",
  a: (x, y) => 1 + 0.3 * Math.sin(2 * x + y),
  b: (x, y) => 8 + 1.5 * Math.sin(x + y),
  c: (x, y) => 1.2 + 0.4 * Math.cos(x * y),
  d: (x, y) => -6 + Math.cos(2 * x - y),
  e: (x, y) => -1 - 0.5 * Math.exp(-x * x - y * y),
};

/** Coefficients of a·u_xx + c·u_yy + e·u (b = d = 0), for the cubic exactness test. */
export const NO_FIRST_ORDER: Coefficients = {
  name: "variable a, c, e; b = d = 0",
  a: (x, y) => 1 + 0.3 * Math.sin(2 * x + y),
  b: () => 0,
  c: (x, y) => 1.2 + 0.4 * Math.cos(x * y),
  d: () => 0,
  e: (x, y) => -1 - 0.5 * Math.exp(-x * x - y * y),
};

/** The source f = a·u_xx + b·u_x + c·u_yy + d·u_y + e·u of a field under given coefficients. */
export function sourceOf(field: Field, k: Coefficients): PointFunction {
  return (x, y) =>
    k.a(x, y) * field.uxx(x, y) + k.b(x, y) * field.ux(x, y) + k.c(x, y) * field.uyy(x, y) +
    k.d(x, y) * field.uy(x, y) + k.e(x, y) * field.u(x, y);
}
