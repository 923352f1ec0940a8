/**
 * Which planned solve starts next, so that `jobs` solves at once finish the campaign early: the
 * first `jobs` picks are the smallest grids (each worker's JIT warm-up lands on a cheap solve), then
 * the smallest grid of each study not yet started (a cheap measurement of that study's cost), then
 * the solve predicted to take longest (longest-processing-time-first list scheduling), so that the most expensive solve of the campaign does not start last and run alone
 * while the other jobs idle. The order changes when solves start, never what a result holds.
 *
 * @module
 */

/** What the scheduler knows of a planned solve. */
export interface ScheduledSolve {
  /** The study it belongs to (case and solver). */
  study: string;
  /** Unknowns of its grid (nx·ny is enough: only ratios matter). */
  unknowns: number;
}

/** A finished solve: its study, size and wall time. */
export interface FinishedSolve extends ScheduledSolve {
  seconds: number;
}

/**
 * A queue of planned solves that hands out the next one to start.
 *
 * @example
 * ```ts
 * import assert from "node:assert/strict";
 * import { SolveQueue } from "./schedule.ts";
 * const q = new SolveQueue([
 *   { study: "a", unknowns: 100 },
 *   { study: "a", unknowns: 400 },
 *   { study: "b", unknowns: 100 },
 *   { study: "b", unknowns: 400 },
 * ], { jobs: 1 });
 * assert.equal(q.next(), 0); // warm-up: the smallest first
 * q.finished({ study: "a", unknowns: 100, seconds: 1 });
 * assert.equal(q.next(), 2); // b's smallest: its cost is not known yet
 * q.finished({ study: "b", unknowns: 100, seconds: 3 });
 * assert.equal(q.next(), 3); // b at 400 is predicted to take 12 s, a at 400 only 4 s
 * ```
 */
export class SolveQueue {
  readonly #pending: number[];
  readonly #warmUp: number;
  #started = 0;
  /** Per study, the largest finished solve. */
  readonly #largest = new Map<string, FinishedSolve>();
  /** Seconds per unknown of every finished solve. */
  readonly #rates: number[] = [];
  /** Studies with a solve handed out (or finished earlier). */
  readonly #seen = new Set<string>();

  /**
   * @param solves the planned solves, by plan index
   * @param options `jobs`: solves running at once (default 1); `pending`: the indices to run
   *   (default all)
   */
  constructor(
    readonly solves: ScheduledSolve[],
    options: { jobs?: number; pending?: number[] } = {},
  ) {
    this.#pending = [...(options.pending ?? solves.map((_, k) => k))];
    this.#warmUp = Math.max(1, options.jobs ?? 1);
  }

  /** Solves not handed out yet. */
  get size(): number {
    return this.#pending.length;
  }

  /** Records a finished solve (of this run or an earlier one) for the predictions. */
  finished(solve: FinishedSolve): void {
    if (!(solve.seconds > 0) || !(solve.unknowns > 0)) return;
    const before = this.#largest.get(solve.study);
    if (!before || solve.unknowns >= before.unknowns) this.#largest.set(solve.study, solve);
    this.#rates.push(solve.seconds / solve.unknowns);
    this.#seen.add(solve.study);
  }

  /** Predicted seconds of a solve; relative values are what count. */
  predict(solve: ScheduledSolve): number {
    const own = this.#largest.get(solve.study);
    // multigrid and most solvers do at least linear work in the unknowns: scale the study's own
    // largest finished solve linearly (an underestimate for solvers that grow faster)
    if (own) return own.seconds * solve.unknowns / own.unknowns;
    if (this.#rates.length === 0) return solve.unknowns;
    const sorted = [...this.#rates].sort((p, q) => p - q);
    return sorted[sorted.length >> 1] * solve.unknowns;
  }

  /** The plan index of the solve to start now, or undefined when none is left. */
  next(): number | undefined {
    if (this.#pending.length === 0) return undefined;
    const pick = (key: (s: ScheduledSolve) => number, among: number[]) => {
      // the smallest key wins; ties keep plan order
      let best = among[0];
      for (const k of among) {
        const d = key(this.solves[k]) - key(this.solves[best]);
        if (d < 0 || (d === 0 && k < best)) best = k;
      }
      return best;
    };
    const unexplored = this.#pending.filter((k) => !this.#seen.has(this.solves[k].study));
    const chosen = this.#started < this.#warmUp
      ? pick((s) => s.unknowns, this.#pending)
      : unexplored.length > 0
      // one cheap solve of every study first: its time is what predicts the study's larger ones
      ? pick((s) => s.unknowns, unexplored)
      : pick((s) => -this.predict(s), this.#pending);
    this.#started++;
    this.#seen.add(this.solves[chosen].study);
    this.#pending.splice(this.#pending.indexOf(chosen), 1);
    return chosen;
  }
}
