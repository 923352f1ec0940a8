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

/**
 * A progress printer on stderr: a bar redrawn in place on a terminal, one plain line per solve
 * otherwise (logs, CI).
 */
export function progressPrinter(): (event: ProgressEvent) => void {
  const encoder = new TextEncoder();
  const terminal = Deno.stderr.isTerminal();
  const write = (s: string) => Deno.stderr.writeSync(encoder.encode(s));
  return (event) => {
    const r = event.record;
    const what = `${r.caseId} × ${r.solver} ${r.nx}×${r.ny}`;
    const status = r.status === "ok" ? (r.converged === false ? "not converged" : "ok") : r.status;
    if (terminal) {
      const width = 30;
      const filled = Math.round((event.done / event.total) * width);
      write(
        `\r[${"#".repeat(filled)}${".".repeat(width - filled)}] ${event.done}/${event.total} ` +
          `${what.slice(0, 50).padEnd(50)}`,
      );
      if (event.done === event.total) write("\n");
    } else {
      write(
        `[${event.done}/${event.total}] ${what}: ${status}` +
          `${event.resumed ? " (from the journal)" : ` (${r.seconds.toFixed(2)} s)`}\n`,
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
