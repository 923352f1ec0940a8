/**
 * The compatibility check of a singular case (every side Neumann, periodic or Robin with α ≡ 0,
 * and no reaction term): such a problem has a solution only when its data balance. Integrating
 * L u = f over the domain and applying the divergence theorem gives the balance checked here.
 *
 * Conservative form ∇·(K∇u) + β·∇u = f:
 *
 *   ∫Ω f dA = ∮ (K∇u)·n ds + ∫Ω β·∇u dA,
 *
 * where (K∇u)·n is the side's data: g on a Neumann side, g/β on a Robin side with α ≡ 0.
 *
 * Non-conservative form a·u_xx + m·u_xy + c·u_yy + b·u_x + d·u_y = f: its principal part is
 * written in divergence form, a·u_xx + m·u_xy + c·u_yy = ∂x(a·u_x + ½m·u_y) + ∂y(½m·u_x + c·u_y)
 * − (a_x + ½m_y)·u_x − (c_y + ½m_x)·u_y, so
 *
 *   ∫Ω f dA = ∮ F·n ds + ∫Ω ((b − a_x − ½m_y)·u_x + (d − c_y − ½m_x)·u_y) dA,
 *
 * with F·n = a·g ∓ ½m·u_y on the west/east sides (g = ∂u/∂n the side's data, the sign − on west)
 * and c·g ∓ ½m·u_x on south/north. The coefficient derivatives are taken by fourth-order central
 * differences of the compiled coefficients (step 1e-3 of the domain's size: truncation near 1e-12,
 * round-off near 1e-13 relative); the exact solution's u_x and u_y come from the derived
 * expressions.
 *
 * Periodic pairs contribute nothing: the seam check (`periodic_check.ts`) has made u, its normal
 * derivative and the coefficients equal on both sides, so their fluxes cancel.
 *
 * Both sides of the balance are integrated with composite Gauss–Legendre quadrature
 * ({@link PANELS} panels of 8 nodes per direction), exact to round-off for smooth data. Derived
 * data balances by construction when the exact solution and the coefficients are smooth; a kink
 * in u or in a coefficient (|x − ½|, a step written as an expression) makes the symbolic source
 * miss its singular part, and the check finds it as an imbalance.
 *
 * @module
 */
import type { Domain, Side } from "../reference-solver/mod.ts";
import type { CompiledCase, PointFn } from "./types.ts";
import { gaussLegendre } from "./gauss_legendre.ts";

/** Panels of 8 Gauss–Legendre nodes per direction. */
export const PANELS = 16;

/** Imbalance, relative to the sum of the integrals' absolute values, above which data is refused. */
export const COMPATIBILITY_TOLERANCE = 1e-8;

/** Quadrature points and weights on [a, b]. */
function rule(a: number, b: number): { t: number[]; w: number[] } {
  const { x, w } = gaussLegendre(a, b, PANELS);
  return { t: x, w };
}

/** The two sides of the balance and what is left. */
export interface Balance {
  /** ∫Ω f dA. */
  source: number;
  /** The boundary flux integral ∮ flux·n ds (periodic pairs excluded: they cancel). */
  flux: number;
  /** ∫Ω of the first-order remainder (β·∇u, or the non-conservative remainder). */
  volume: number;
  /** source − flux − volume. */
  imbalance: number;
  /** |imbalance| / (∫|f| + ∮|flux·n| + ∫|remainder|). */
  relative: number;
}

/** Integrates fn over the rectangle; also returns the integral of |fn|. */
function area(domain: Domain, fn: PointFn): [number, number] {
  const X = rule(domain.x0, domain.x1), Y = rule(domain.y0, domain.y1);
  let s = 0, abs = 0;
  for (let j = 0; j < Y.t.length; j++) {
    for (let i = 0; i < X.t.length; i++) {
      const v = fn(X.t[i], Y.t[j]) * X.w[i] * Y.w[j];
      s += v, abs += Math.abs(v);
    }
  }
  return [s, abs];
}

/** Integrates fn along one side (by increasing coordinate); also the integral of |fn|. */
function line(domain: Domain, side: Side, fn: PointFn): [number, number] {
  const vertical = side === "west" || side === "east";
  const R = vertical ? rule(domain.y0, domain.y1) : rule(domain.x0, domain.x1);
  let s = 0, abs = 0;
  for (let k = 0; k < R.t.length; k++) {
    const v = vertical
      ? fn(side === "west" ? domain.x0 : domain.x1, R.t[k])
      : fn(R.t[k], side === "south" ? domain.y0 : domain.y1);
    s += v * R.w[k], abs += Math.abs(v) * R.w[k];
  }
  return [s, abs];
}

/** Fourth-order central difference of fn along x or y with step h. */
function derivative(fn: PointFn, axis: "x" | "y", h: number): PointFn {
  return axis === "x"
    ? (x, y) =>
      (fn(x - 2 * h, y) - 8 * fn(x - h, y) + 8 * fn(x + h, y) - fn(x + 2 * h, y)) / (12 * h)
    : (x, y) =>
      (fn(x, y - 2 * h) - 8 * fn(x, y - h) + 8 * fn(x, y + h) - fn(x, y + 2 * h)) / (12 * h);
}

/**
 * The balance of a singular case's derived data (see the module doc for the identity).
 *
 * @param kase the compiled case (every side neumann, periodic, or robin with α ≡ 0)
 * @returns the integrals and the imbalance
 *
 * @example
 * ```ts ignore
 * import { compatibilityBalance } from "./compatibility.ts";
 * const b = compatibilityBalance(kase);
 * b.relative < 1e-8; // true for smooth derived data
 * ```
 */
export function compatibilityBalance(
  kase: Pick<
    CompiledCase,
    "domain" | "source" | "boundary" | "coefficients" | "conservative" | "exactDx" | "exactDy"
  >,
): Balance {
  const { domain, boundary, exactDx: ux, exactDy: uy } = kase;
  const [source, sourceAbs] = area(domain, kase.source);
  let flux = 0, fluxAbs = 0;
  const K = kase.conservative;
  const { a, b, c, d, m } = kase.coefficients;
  for (const side of ["west", "east", "south", "north"] as const) {
    const bc = boundary[side];
    if (bc.kind === "periodic" || bc.kind === "dirichlet") continue;
    // the normal flux the side's data states: g, or g/β on a Robin side with α ≡ 0
    const g: PointFn = bc.kind === "robin" ? (x, y) => bc.data(x, y) / bc.beta!(x, y) : bc.data;
    const sign = side === "west" || side === "south" ? -1 : 1;
    const fn: PointFn = K !== undefined
      ? g
      : side === "west" || side === "east"
      ? (x, y) => a(x, y) * g(x, y) + sign * 0.5 * m(x, y) * uy(x, y)
      : (x, y) => c(x, y) * g(x, y) + sign * 0.5 * m(x, y) * ux(x, y);
    const [s, abs] = line(domain, side, fn);
    flux += s, fluxAbs += abs;
  }
  let remainder: PointFn;
  if (K !== undefined) {
    remainder = (x, y) => K.bx(x, y) * ux(x, y) + K.by(x, y) * uy(x, y);
  } else {
    const h = 1e-3 * Math.max(domain.x1 - domain.x0, domain.y1 - domain.y0);
    const ax = derivative(a, "x", h), cy = derivative(c, "y", h);
    const mx = derivative(m, "x", h), my = derivative(m, "y", h);
    remainder = (x, y) =>
      (b(x, y) - ax(x, y) - 0.5 * my(x, y)) * ux(x, y) +
      (d(x, y) - cy(x, y) - 0.5 * mx(x, y)) * uy(x, y);
  }
  const [volume, volumeAbs] = area(domain, remainder);
  const imbalance = source - flux - volume;
  const scale = sourceAbs + fluxAbs + volumeAbs;
  return {
    source,
    flux,
    volume,
    imbalance,
    relative: scale > 0 ? Math.abs(imbalance) / scale : Math.abs(imbalance),
  };
}
