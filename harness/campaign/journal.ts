/**
 * The campaign journal: one JSON line per finished solve, appended (and flushed) as each solve
 * finishes, so an interrupted campaign loses nothing finished and `--resume` can continue. The
 * first line records the configuration so a resume with a different configuration is refused.
 *
 * @module
 */
import type { SolveRecord } from "../result/types.ts";

/** File name of the journal inside the output folder. */
export const JOURNAL_FILE = "journal.jsonl";

/** The first line of a journal. */
export interface JournalHeader {
  kind: "campaign";
  /** A fingerprint of what determines the solves: cases, grids, solvers, tolerances. */
  fingerprint: string;
  startedAt: string;
}

/** A line per finished solve. */
export interface JournalEntry {
  kind: "solve";
  record: SolveRecord;
}

/** The key of a solve within a campaign. */
export function solveKey(r: { caseId: string; solver: string; nx: number; ny: number }): string {
  return `${r.caseId}\u0000${r.solver}\u0000${r.nx}\u0000${r.ny}`;
}

/** Appends journal lines; each write is a whole line written synchronously (no partial records). */
export class JournalWriter {
  #file: Deno.FsFile;
  #encoder = new TextEncoder();

  private constructor(file: Deno.FsFile) {
    this.#file = file;
  }

  /** Opens (creating or appending) the journal at `path`; writes the header when `header` is given. */
  static open(path: string, header?: JournalHeader): JournalWriter {
    const file = Deno.openSync(path, { create: true, append: true, write: true });
    const writer = new JournalWriter(file);
    if (header) writer.#write(header);
    return writer;
  }

  /** Appends one finished solve. */
  append(record: SolveRecord): void {
    this.#write({ kind: "solve", record } satisfies JournalEntry);
  }

  #write(value: unknown): void {
    const bytes = this.#encoder.encode(JSON.stringify(value, finiteOrNull) + "\n");
    let offset = 0;
    while (offset < bytes.length) offset += this.#file.writeSync(bytes.subarray(offset));
    this.#file.syncDataSync();
  }

  /** Closes the file. */
  close(): void {
    this.#file.close();
  }
}

/** JSON replacer: NaN and ±Infinity become null (JSON has neither). */
export function finiteOrNull(_key: string, value: unknown): unknown {
  return typeof value === "number" && !Number.isFinite(value) ? null : value;
}

/**
 * Reads a journal. A torn last line (the process died mid-write) is ignored; anything else that
 * does not parse is an error naming the line.
 *
 * @returns the header (if any) and the finished solves in order
 */
export function readJournal(text: string, path: string): {
  header: JournalHeader | undefined;
  records: SolveRecord[];
} {
  const lines = text.split("\n");
  let header: JournalHeader | undefined;
  const records: SolveRecord[] = [];
  for (let k = 0; k < lines.length; k++) {
    const line = lines[k].trim();
    if (line === "") continue;
    let value: JournalHeader | JournalEntry;
    try {
      value = JSON.parse(line);
    } catch {
      if (k >= lines.length - 2) break; // torn final line from an interrupted write
      throw new RangeError(
        `${path}: line ${
          k + 1
        } is not valid JSON: the journal is damaged; remove the line or start without --resume`,
      );
    }
    if (value.kind === "campaign") header ??= value;
    else if (value.kind === "solve") records.push(value.record);
  }
  return { header, records };
}
