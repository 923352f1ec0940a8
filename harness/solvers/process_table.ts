/**
 * The processes of a Linux machine as /proc lists them, and the descendants of one process among
 * them. /proc is read by `/bin/sh` and `cat`: Deno reads /proc itself only with --allow-all,
 * while the harness has --allow-run anyway to start solvers.
 *
 * @module
 */

/** One process, from its /proc/<pid>/stat line. */
export interface ProcessEntry {
  pid: number;
  /** Parent's pid (1 or a subreaper once the parent has exited). */
  ppid: number;
  /** Process group id. */
  pgrp: number;
  /** One letter: R running, S sleeping, Z zombie (exited, not yet reaped), X dead, … */
  state: string;
  /** Start in clock ticks after boot (field 22): with the pid, names one process for good. */
  startTime: number;
}

/** The processes at one moment. */
export interface ProcessTable {
  /** Every process, by pid. */
  entries: Map<number, ProcessEntry>;
  /** Pids of the processes whose environment holds the line asked for (`mark`). */
  marked: Set<number>;
}

/** Separates the stat lines from the marked files in the script's output. */
const SEPARATOR = "--marked--";
/**
 * Prints every /proc/<pid>/stat line, the separator, then /proc/<pid>/environ for each process
 * whose environment holds the line $1 (none when $1 is empty). A process that ends between the
 * listing and the reading is skipped; a process of another user hides its environment.
 */
const SCRIPT = `cat /proc/[0-9]*/stat 2>/dev/null
echo ${SEPARATOR}
[ -n "$1" ] && grep -lsxzF -e "$1" /proc/[0-9]*/environ
exit 0`;

/**
 * Reads one /proc/<pid>/stat line.
 *
 * @param line the line, e.g. `"4242 (python3) S 4241 4241 4241 0 -1 …"`
 * @returns the process, or undefined when the line is not a stat line
 *
 * @example
 * ```ts
 * import { parseProcStat } from "./process_table.ts";
 * const line = "7 (my (odd) name) S 1 7 7 0 -1 4194560 0 0 0 0 0 0 0 0 20 0 1 0 9001 0";
 * parseProcStat(line); // { pid: 7, ppid: 1, pgrp: 7, state: "S", startTime: 9001 }
 * ```
 */
export function parseProcStat(line: string): ProcessEntry | undefined {
  // the name (field 2) sits in parentheses and may hold spaces and ")": fields resume after
  // the last ")"
  const open = line.indexOf(" (");
  const close = line.lastIndexOf(")");
  if (open < 0 || close < open) return undefined;
  const pid = Number(line.slice(0, open));
  // after[0] is field 3, so field k is after[k - 3]
  const after = line.slice(close + 2).split(" ");
  const entry = {
    pid,
    ppid: Number(after[1]),
    pgrp: Number(after[2]),
    state: after[0] ?? "",
    startTime: Number(after[19]),
  };
  const numbers = [entry.pid, entry.ppid, entry.pgrp, entry.startTime];
  if (entry.state.length !== 1 || !numbers.every(Number.isInteger)) return undefined;
  return entry;
}

/**
 * Reads the output of the listing script: stat lines, the separator, marked environ paths.
 *
 * @param text the script's output
 * @returns the table (empty when the text holds no stat line)
 */
export function parseProcessTable(text: string): ProcessTable {
  const entries = new Map<number, ProcessEntry>();
  const marked = new Set<number>();
  let inMarked = false;
  for (const line of text.split("\n")) {
    if (line === SEPARATOR) {
      inMarked = true;
    } else if (inMarked) {
      const pid = /^\/proc\/(\d+)\/environ$/.exec(line)?.[1];
      if (pid !== undefined) marked.add(Number(pid));
    } else {
      const entry = parseProcStat(line);
      if (entry) entries.set(entry.pid, entry);
    }
  }
  return { entries, marked };
}

/**
 * The descendants of `root` in a table: its children, their children and so on, by parent pid.
 * A process whose parent exited was handed to init (or a subreaper) and is no longer found here.
 *
 * @param root the pid whose descendants are wanted (not itself among them)
 * @param entries the processes
 * @returns the descendants, nearest first
 *
 * @example
 * ```ts
 * import { descendantsOf, type ProcessEntry } from "./process_table.ts";
 * const p = (pid: number, ppid: number): ProcessEntry =>
 *   ({ pid, ppid, pgrp: pid, state: "S", startTime: 0 });
 * const table = new Map([[10, p(10, 1)], [11, p(11, 10)], [12, p(12, 11)], [13, p(13, 1)]]);
 * descendantsOf(10, table).map((e) => e.pid); // [11, 12]
 * ```
 */
export function descendantsOf(
  root: number,
  entries: ReadonlyMap<number, ProcessEntry>,
): ProcessEntry[] {
  const children = new Map<number, ProcessEntry[]>();
  for (const entry of entries.values()) {
    const siblings = children.get(entry.ppid);
    if (siblings) siblings.push(entry);
    else children.set(entry.ppid, [entry]);
  }
  const found: ProcessEntry[] = [];
  const seen = new Set([root]);
  const queue = [root];
  for (let k = 0; k < queue.length; k++) {
    for (const child of children.get(queue[k]) ?? []) {
      // a pid can be its own ancestor only in a table read while pids were reused: stop there
      if (seen.has(child.pid)) continue;
      seen.add(child.pid);
      found.push(child);
      queue.push(child.pid);
    }
  }
  return found;
}

/**
 * Lists the processes of the machine from /proc.
 *
 * @param options `mark`: a line `NAME=value`; processes whose environment holds it are listed
 *   in `marked` (default: none, which is cheaper)
 * @returns the table, or undefined when /proc cannot be read (not Linux, no `/bin/sh`, or no
 *   permission to run it)
 */
export async function readProcessTable(
  options: { mark?: string } = {},
): Promise<ProcessTable | undefined> {
  let output: Deno.CommandOutput;
  try {
    output = await new Deno.Command("/bin/sh", {
      args: ["-c", SCRIPT, "sh", options.mark ?? ""],
      stdin: "null",
      stdout: "piped",
      stderr: "null",
    }).output();
  } catch {
    // no /bin/sh, or no --allow-run: the caller falls back to what it can do without
    return undefined;
  }
  const table = parseProcessTable(new TextDecoder().decode(output.stdout));
  // the script's own shell is always listed where /proc exists
  return table.entries.size > 0 ? table : undefined;
}
