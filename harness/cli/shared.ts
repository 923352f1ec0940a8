/**
 * Small helpers shared by the commands: flag parsing with clear errors, the environment record,
 * and progress output (a bar on a terminal, plain lines otherwise).
 *
 * @module
 */
import type { CampaignResult } from "../result/mod.ts";
import type { ProgressEvent } from "../campaign/mod.ts";
import { InputError } from "./errors.ts";

/** Parses a positive number flag. */
export function parsePositive(
  text: string,
  flag: string,
  options: { integer?: boolean } = {},
): number {
  const value = Number(text);
  if (text.trim() === "" || !Number.isFinite(value) || value <= 0) {
    throw new InputError(`"${text}" is not a positive number`, { where: flag });
  }
  if (options.integer && !Number.isInteger(value)) {
    throw new InputError(`"${text}" is not a whole number`, { where: flag });
  }
  return value;
}

/** Parses a comma-separated list of whole numbers, e.g. `16,32,64`. */
export function parseNumberList(text: string, flag: string): number[] {
  const parts = text.split(",").map((s) => s.trim()).filter((s) => s !== "");
  if (parts.length === 0) {
    throw new InputError(`no numbers in "${text}": use e.g. 16,32,64`, { where: flag });
  }
  return parts.map((p) => {
    const n = Number(p);
    if (!Number.isInteger(n) || n < 2) {
      throw new InputError(`"${p}" is not a whole number ≥ 2: use e.g. 16,32,64`, { where: flag });
    }
    return n;
  });
}

/** The machine and runtime a result was made on. */
export function environmentRecord(): CampaignResult["environment"] {
  let hostname = "";
  try {
    hostname = Deno.hostname();
  } catch {
    hostname = "unknown (no --allow-sys)";
  }
  return {
    deno: Deno.version.deno,
    os: Deno.build.os,
    arch: Deno.build.arch,
    cpus: navigator.hardwareConcurrency,
    hostname,
  };
}

/** Columns of standard output: the terminal's width, else 100 (logs and pipes). */
export function outputWidth(): number {
  try {
    if (Deno.stdout.isTerminal()) return Math.max(60, Deno.consoleSize().columns);
  } catch {
    // no terminal size (not a terminal after all): the default below
  }
  return 100;
}

/** Seconds as "42 s", "3 min 05 s" or "1 h 02 min". */
export function clock(seconds: number): string {
  const t = Math.max(0, Math.round(seconds));
  if (t < 60) return `${t} s`;
  if (t < 3600) return `${Math.floor(t / 60)} min ${String(t % 60).padStart(2, "0")} s`;
  return `${Math.floor(t / 3600)} h ${String(Math.floor((t % 3600) / 60)).padStart(2, "0")} min`;
}

/** What the progress line says about a batch of solves so far. */
export interface ProgressState {
  /** The batch: the planned grids, grids added to decide, or isolation variants. */
  phase: string;
  done: number;
  total: number;
  /** Seconds since the batch started. */
  elapsed: number;
  /** Solves of the batch that failed or did not converge so far. */
  failed: number;
}

/**
 * The progress line of a batch: count, elapsed time, the estimate of the time left (from the
 * batch's own pace; none before two solves) and the failures so far.
 *
 * @example
 * ```ts
 * import assert from "node:assert/strict";
 * import { progressLine } from "./shared.ts";
 * assert.equal(
 *   progressLine({ phase: "solves", done: 30, total: 120, elapsed: 10, failed: 1 }),
 *   "solves 30/120 · 10 s elapsed · about 30 s left · 1 failed",
 * );
 * ```
 */
export function progressLine(state: ProgressState): string {
  const { phase, done, total, elapsed, failed } = state;
  const left = done >= 2 && done < total
    ? ` · about ${clock((elapsed / done) * (total - done))} left`
    : "";
  return `${phase} ${done}/${total} · ${clock(elapsed)} elapsed${left} · ` +
    `${failed === 0 ? "none failed" : `${failed} failed`}`;
}

/**
 * A progress printer on stderr: a line redrawn in place on a terminal (a bar, the count, elapsed
 * time, an estimate of the time left and the failures so far), one plain line per solve
 * otherwise (logs, CI). A batch that follows the planned solves (grids added to decide, isolation
 * variants) starts its own count. When a batch ends, a line says what happens next, so the pause
 * while the studies are judged and the reports written is never silent.
 *
 * @param now The clock in milliseconds (tests pass their own). Default `performance.now`.
 */
export function progressPrinter(
  now: () => number = () => performance.now(),
): (event: ProgressEvent) => void {
  const encoder = new TextEncoder();
  const terminal = Deno.stderr.isTerminal();
  const write = (s: string) => Deno.stderr.writeSync(encoder.encode(s));
  let started = now();
  let failed = 0;
  let batches = 0;
  let phase = "solves";
  let last = 0;
  return (event) => {
    const r = event.record;
    if (event.done === 1 || event.done <= last) {
      // a new batch: the planned solves, then grids added to decide, then isolation variants
      batches++;
      started = now();
      failed = 0;
      phase = batches === 1
        ? "solves"
        : r.caseId.includes("~")
        ? "isolation variants"
        : "added grids";
    }
    last = event.done;
    if (r.status === "failed" || r.converged === false) failed++;
    const what = `${r.caseId} × ${r.solver} ${r.nx}×${r.ny}`;
    const status = r.status === "ok" ? (r.converged === false ? "not converged" : "ok") : r.status;
    const elapsed = (now() - started) / 1000;
    const line = progressLine({ phase, done: event.done, total: event.total, elapsed, failed });
    if (terminal) {
      let columns = 100;
      try {
        columns = Deno.consoleSize().columns;
      } catch {
        // stderr is a terminal without a size: keep 100 columns
      }
      const width = 20;
      const filled = Math.round((event.done / event.total) * width);
      const text = `[${"#".repeat(filled)}${".".repeat(width - filled)}] ${line} · ${what}`;
      write(`\r${[...text].slice(0, columns - 1).join("")}\x1b[K`);
      if (event.done === event.total) write("\n");
    } else {
      write(
        `[${event.done}/${event.total}] ${what}: ${status}` +
          `${event.resumed ? " (from the journal)" : ` (${r.seconds.toFixed(2)} s)`}\n`,
      );
    }
    if (event.done === event.total) {
      write(
        `${phase}: ${event.total} done in ${clock(elapsed)}, ` +
          `${failed === 0 ? "none failed" : `${failed} failed`}; judging the studies ` +
          `(finer grids or isolation variants may follow), then writing the reports…\n`,
      );
    }
  };
}

/**
 * Writes a file whole or not at all: the bytes go to a temporary file beside it, which is then
 * renamed over the target, so a full disk or a crash never leaves a truncated result or report.
 * A failure becomes an {@link InputError} that says what could not be written, where, and that
 * the journal keeps every finished solve.
 *
 * @param path The file to write.
 * @param data The content.
 * @param what What the file is, for the message (e.g. "the result").
 * @throws {InputError} when the file cannot be written.
 */
export async function writeFileWhole(
  path: string,
  data: string | Uint8Array,
  what: string,
): Promise<void> {
  const temporary = `${path}.partial-${Deno.pid}`;
  try {
    if (typeof data === "string") await Deno.writeTextFile(temporary, data);
    else await Deno.writeFile(temporary, data);
    await Deno.rename(temporary, path);
  } catch (error) {
    await Deno.remove(temporary).catch(() => {});
    throw new InputError(
      `could not write ${what}: ${(error as Error).message}. Nothing was half-written; every ` +
        `finished solve is in the journal of the output folder — free some space or fix the ` +
        `folder, then run the same command with --resume`,
      { where: path },
    );
  }
}
