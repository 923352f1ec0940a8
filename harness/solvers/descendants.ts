/**
 * Keeps track of the processes a solver starts, so that those which leave its process group
 * (`setsid`, `setpgid`) can be ended with it. Killing the group reaches only its members.
 *
 * Two traces lead to a descendant: its parent chain back to the solver, which breaks once a
 * process in between exits (the orphan goes to init), and the mark in its environment, which it
 * inherits unless it empties its environment. So the chain is recorded while the solver runs —
 * 200 ms after its start, then less often, up to every 2 s (one look costs a `sh` and a `cat`,
 * about 15 ms of CPU) — and both are looked up once more at the end. A process found neither way (it left
 * the group, dropped the mark, and lost its parent between two looks) is not found. Without a
 * readable /proc (not Linux) nothing is tracked and only the group is killed.
 *
 * @module
 */
import { descendantsOf, type ProcessTable, readProcessTable } from "./process_table.ts";

/** The environment variable that carries a solver's mark to every process it starts. */
export const MARK_VARIABLE = "GRIDPROOF_PROCESS_MARK";

/** What ending a solver's processes met. */
export interface EndedProcesses {
  /** false when /proc could not be read: only the process group was killed. */
  tracked: boolean;
  /** Members of the process group, other than its leader, alive when the group was killed. */
  inGroup: number[];
  /** Descendants outside the group that were alive and were ended (SIGTERM, then SIGKILL). */
  outside: number[];
}

/** Options of {@link DescendantWatch}. */
export interface DescendantWatchOptions {
  /** Time to the first look, in ms (default 200); each next wait is 1.5 times longer. */
  intervalMs?: number;
  /** Longest time between two looks, in ms (default 2000). */
  maxIntervalMs?: number;
  /** Time a process outside the group gets between SIGTERM and SIGKILL, in ms (default 500). */
  graceMs?: number;
}

/**
 * Records the descendants of a process (pid and start time, so a reused pid is never taken for
 * one) from its start to its end, and ends them.
 *
 * @example
 * ```ts ignore
 * import { DescendantWatch } from "./descendants.ts";
 * const watch = new DescendantWatch(child.pid, mark);
 * // … later, when the solve is over:
 * const ended = await watch.end(() => Deno.kill(-child.pid, "SIGKILL"));
 * ```
 */
export class DescendantWatch {
  /** Descendants seen, pid → start time. */
  readonly #recorded = new Map<number, number>();
  readonly #root: number;
  readonly #markLine: string;
  #intervalMs: number;
  readonly #maxIntervalMs: number;
  readonly #graceMs: number;
  #timer: ReturnType<typeof setTimeout> | undefined;
  #looking: Promise<void> = Promise.resolve();
  #stopped = false;

  /**
   * Starts looking (first after `intervalMs`).
   *
   * @param root pid of the process whose descendants are tracked (the group leader)
   * @param mark the value of {@link MARK_VARIABLE} in its environment
   */
  constructor(root: number, mark: string, options: DescendantWatchOptions = {}) {
    this.#root = root;
    this.#markLine = `${MARK_VARIABLE}=${mark}`;
    this.#intervalMs = options.intervalMs ?? 200;
    this.#maxIntervalMs = options.maxIntervalMs ?? 2000;
    this.#graceMs = options.graceMs ?? 500;
    this.#schedule();
  }

  /** Pids of the descendants recorded so far. */
  get recorded(): number[] {
    return [...this.#recorded.keys()];
  }

  #schedule(): void {
    if (this.#stopped) return;
    const timer = setTimeout(() => {
      this.#looking = this.#look().then(() => this.#schedule());
    }, this.#intervalMs);
    this.#timer = timer;
    this.#intervalMs = Math.min(this.#maxIntervalMs, this.#intervalMs * 1.5);
    // a watch must never keep the program alive
    Deno.unrefTimer(timer);
  }

  /** Records the descendants found by parent chain (and by mark when asked); returns the table. */
  async #look(byMark = false): Promise<ProcessTable | undefined> {
    const table = await readProcessTable(byMark ? { mark: this.#markLine } : {});
    if (!table) return undefined;
    // forget what has ended, so a long session does not pile up pids
    for (const [pid, start] of this.#recorded) {
      if (table.entries.get(pid)?.startTime !== start) this.#recorded.delete(pid);
    }
    for (const entry of descendantsOf(this.#root, table.entries)) {
      this.#recorded.set(entry.pid, entry.startTime);
    }
    for (const pid of table.marked) {
      const entry = table.entries.get(pid);
      if (entry && pid !== this.#root) this.#recorded.set(pid, entry.startTime);
    }
    return table;
  }

  /** Stops looking (waits for a look under way). Safe to call twice. */
  async stop(): Promise<void> {
    this.#stopped = true;
    clearTimeout(this.#timer);
    await this.#looking;
  }

  /**
   * Ends everything: looks once more (parent chain and mark), kills the group with `killGroup`,
   * then sends SIGTERM to every recorded descendant still running outside the group, and SIGKILL
   * to those still running after the grace.
   *
   * @param killGroup kills the process group (called exactly once, even when /proc is unreadable)
   * @returns what was found running and ended
   */
  async end(killGroup: () => void): Promise<EndedProcesses> {
    await this.stop();
    // looked at before the group dies, while members still link their children to the root
    const table = await this.#look(true);
    killGroup();
    if (!table) return { tracked: false, inGroup: [], outside: [] };
    const inGroup = [...table.entries.values()]
      .filter((e) => e.pgrp === this.#root && e.pid !== this.#root && running(e.state))
      .map((e) => e.pid);
    let left = this.#runningOutside(table);
    const outside = [...left];
    signal(left, "SIGTERM");
    const until = performance.now() + this.#graceMs;
    while (left.length > 0 && performance.now() < until) {
      await new Promise((r) => setTimeout(r, Math.min(100, this.#graceMs)));
      const now = await readProcessTable();
      if (!now) break;
      left = this.#runningOutside(now).filter((pid) => left.includes(pid));
    }
    signal(left, "SIGKILL");
    return { tracked: true, inGroup, outside };
  }

  /** Recorded descendants running in `table` (same start time) outside the root's group. */
  #runningOutside(table: ProcessTable): number[] {
    return [...this.#recorded]
      .filter(([pid, start]) => {
        const entry = table.entries.get(pid);
        return entry !== undefined && entry.startTime === start && entry.pgrp !== this.#root &&
          running(entry.state);
      })
      .map(([pid]) => pid);
  }
}

/** Whether a process in this state still runs (a zombie has exited and awaits its reaper). */
function running(state: string): boolean {
  return state !== "Z" && state !== "X";
}

function signal(pids: number[], name: Deno.Signal): void {
  for (const pid of pids) {
    try {
      Deno.kill(pid, name);
    } catch {
      // ESRCH: it ended since the look; EPERM: it became another user's (a setuid program)
    }
  }
}
