/**
 * A linear combination of unknowns plus a constant, Σ coef·u[col] + constant: the form in which the
 * zoo's assemblies build face values, ghost values and fluxes before adding them to a row.
 *
 * @module
 */

/** Σ terms[k][1]·u[terms[k][0]] + constant. */
export interface Combination {
  terms: [col: number, coef: number][];
  constant: number;
}

/** The unknown u[col]. */
export function unknown(col: number): Combination {
  return { terms: [[col, 1]], constant: 0 };
}

/** A known value. */
export function known(value: number): Combination {
  return { terms: [], constant: value };
}

/**
 * Σ weights[k]·parts[k].
 *
 * @example
 * ```ts
 * import { combine, known, unknown } from "./combination.ts";
 * const c = combine([unknown(3), known(2)], [0.5, 2]);
 * c.terms; // [[3, 0.5]]
 * c.constant; // 4
 * ```
 */
export function combine(parts: Combination[], weights: number[]): Combination {
  const terms: [number, number][] = [];
  let constant = 0;
  parts.forEach((p, k) => {
    const w = weights[k];
    if (w === 0) return;
    for (const [col, coef] of p.terms) terms.push([col, w * coef]);
    constant += w * p.constant;
  });
  return { terms, constant };
}
