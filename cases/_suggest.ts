/**
 * Closest-name suggestions for misspelled fields, options and names.
 *
 * @module
 */

/** Levenshtein edit distance (insertions, deletions, substitutions each cost 1). */
export function editDistance(a: string, b: string): number {
  const row = new Array<number>(b.length + 1);
  for (let j = 0; j <= b.length; j++) row[j] = j;
  for (let i = 1; i <= a.length; i++) {
    let diagonal = row[0];
    row[0] = i;
    for (let j = 1; j <= b.length; j++) {
      const above = row[j];
      const cost = a[i - 1] === b[j - 1] ? 0 : 1;
      row[j] = Math.min(row[j] + 1, row[j - 1] + 1, diagonal + cost);
      diagonal = above;
    }
  }
  return row[b.length];
}

/**
 * The candidate closest to `name` (case-insensitive edit distance), or undefined when none is
 * close enough: within 1 edit for names of up to 3 letters, else max(2, a third of the length).
 *
 * @example
 * ```ts
 * import { closestName } from "./_suggest.ts";
 * closestName("coeficients", ["coefficients", "exact"]); // "coefficients"
 * ```
 */
export function closestName(name: string, candidates: readonly string[]): string | undefined {
  let best: string | undefined;
  let bestDistance = Infinity;
  for (const candidate of candidates) {
    const d = editDistance(name.toLowerCase(), candidate.toLowerCase());
    if (d < bestDistance) {
      best = candidate;
      bestDistance = d;
    }
  }
  const limit = name.length <= 3 ? 1 : Math.max(2, Math.floor(name.length / 3));
  return bestDistance <= limit ? best : undefined;
}
