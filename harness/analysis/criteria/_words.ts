import type { NormName } from "./types.ts";

/** Two decimals, or "n/a". */
export function f2(x: number | null | undefined): string {
  return x === null || x === undefined || !Number.isFinite(x) ? "n/a" : x.toFixed(2);
}

/** One significant digit in exponent form, or "n/a". */
export function e1(x: number | null | undefined): string {
  return x === null || x === undefined ? "n/a" : x.toExponential(1);
}

/** The name of a norm in words. */
export const NORM_LABEL: Record<NormName, string> = {
  max: "max norm",
  l2: "L2 norm",
  l1: "L1 norm",
};

/** The norms judged, in report order. */
export const NORMS: NormName[] = ["max", "l2", "l1"];

/** "32×32". */
export function gridName(s: { nx: number; ny: number }): string {
  return `${s.nx}×${s.ny}`;
}
