/**
 * The campaign journal: one JSON line per finished solve, appended (and flushed) as each solve
 * finishes, so an interrupted campaign loses nothing finished and `--resume` can continue. The
 * first line records the configuration so a resume with a different configuration is refused.
 *
 * @module
 */
import type { SolveRecord } from "../result/mod.ts";
import type { JobNote } from "../solvers/mod.ts";

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
  /**
   * A digest of what determined this solve: the case's formulas and parameters, the solver's
   * identity and the residual tolerance ({@link solveInputs}). Journals written before it existed
   * lack it; their solves are trusted on the header's fingerprint alone.
   */
  inputs?: string;
  record: SolveRecord;
}

/**
 * A line per new scheduler job or job state of a batch solve (`key` as {@link solveKey}), so a
 * resumed campaign collects or waits for the job instead of submitting it again.
 */
export interface JobEntry {
  kind: "job";
  key: string;
  job: JobNote;
}

/** A solve read back from a journal, with the line it came from. */
export interface JournaledSolve {
  record: SolveRecord;
  /** 1-based line in the journal. */
  line: number;
  inputs: string | undefined;
}

/**
 * The digest of what determines one solve's result, compared on resume so that no record computed
 * with another case text, solver or tolerance is reused. A 53-bit string hash (cyrb53) of the
 * JSON of `parts`: collisions between two different setups are not a practical concern here.
 */
export function solveInputs(parts: unknown): string {
  const text = JSON.stringify(parts);
  let h1 = 0xdeadbeef, h2 = 0x41c6ce57;
  for (let k = 0; k < text.length; k++) {
    const c = text.charCodeAt(k);
    h1 = Math.imul(h1 ^ c, 2654435761);
    h2 = Math.imul(h2 ^ c, 1597334677);
  }
  h1 = Math.imul(h1 ^ (h1 >>> 16), 2246822507) ^ Math.imul(h2 ^ (h2 >>> 13), 3266489909);
  h2 = Math.imul(h2 ^ (h2 >>> 16), 2246822507) ^ Math.imul(h1 ^ (h1 >>> 13), 3266489909);
  return (4294967296 * (2097151 & h2) + (h1 >>> 0)).toString(36);
}

/** The key of a solve within a campaign (a solve of the rank-count check adds its rank count). */
export function solveKey(
  r: { caseId: string; solver: string; nx: number; ny: number; ranks?: number },
): string {
  const ranks = r.ranks === undefined ? "" : `\u0000ranks ${r.ranks}`;
  return `${r.caseId}\u0000${r.solver}\u0000${r.nx}\u0000${r.ny}${ranks}`;
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

  /** Appends a batch solve's job or its new state, by the solve's key ({@link solveKey}). */
  appendJob(key: string, job: JobNote): void {
    this.#write({ kind: "job", key, job } satisfies JobEntry);
  }

  /** Appends one finished solve with the digest of its inputs ({@link solveInputs}). */
  append(record: SolveRecord, inputs: string): void {
    this.#write({ kind: "solve", inputs, record } satisfies JournalEntry);
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
  /** The same solves with their line and input digest. */
  solves: JournaledSolve[];
  /** Bytes of complete lines: a torn last line (an interrupted write) starts here. */
  completeBytes: number;
  /** The torn last line that was dropped, if any. */
  torn: string | null;
  /** The last job note of every batch solve, by solve key. */
  jobs: Map<string, JobNote>;
} {
  const lines = text.split("\n");
  let header: JournalHeader | undefined;
  const records: SolveRecord[] = [];
  const solves: JournaledSolve[] = [];
  const jobs = new Map<string, JobNote>();
  // a last line without its newline was cut in the middle of a write
  const tornText = text.endsWith("\n") || text === "" ? null : lines[lines.length - 1];
  const torn = tornText !== null && tornText.trim() !== "" ? tornText : null;
  const complete = tornText === null ? lines : lines.slice(0, -1);
  for (let k = 0; k < complete.length; k++) {
    const line = complete[k].trim();
    if (line === "") continue;
    let value: unknown;
    try {
      value = JSON.parse(line);
    } catch {
      throw new RangeError(
        `${path}: line ${
          k + 1
        } is not valid JSON: the journal is damaged; remove the line or start without --resume`,
      );
    }
    const problem = entryProblem(value);
    if (problem) {
      throw new RangeError(
        `${path}: line ${k + 1} ${problem}: the journal is damaged; remove the line or start ` +
          `without --resume`,
      );
    }
    const entry = value as JournalHeader | JournalEntry | JobEntry;
    if (entry.kind === "campaign") header ??= entry;
    else if (entry.kind === "job") jobs.set(entry.key, entry.job);
    else {
      records.push(entry.record);
      solves.push({ record: entry.record, line: k + 1, inputs: entry.inputs });
    }
  }
  const completeBytes = new TextEncoder().encode(
    tornText === null ? text : text.slice(0, text.length - tornText.length),
  ).length;
  return { header, records, solves, completeBytes, torn, jobs };
}

/** What is wrong with a parsed journal line, or null when it is a header or a valid solve entry. */
function entryProblem(value: unknown): string | null {
  if (value === null || typeof value !== "object" || Array.isArray(value)) {
    return 'is not a journal entry (an object with kind "campaign", "solve" or "job")';
  }
  const v = value as Record<string, unknown>;
  if (v.kind === "campaign") {
    return typeof v.fingerprint === "string" ? null : "is a header without its fingerprint";
  }
  if (v.kind === "job") {
    const j = v.job as Record<string, unknown> | null;
    const texts = ["id", "state", "requestId", "folder"];
    return typeof v.key === "string" && j !== null && typeof j === "object" &&
        texts.every((k) => typeof j[k] === "string")
      ? null
      : "is a job entry without its key, id, state, request id or folder";
  }
  if (v.kind !== "solve") {
    return `has kind ${JSON.stringify(v.kind)}, not "campaign", "solve" or "job"`;
  }
  const r = v.record as Record<string, unknown> | null;
  if (r === null || typeof r !== "object") return "is a solve entry without its record";
  if (v.inputs !== undefined && typeof v.inputs !== "string") {
    return "has a solve entry whose inputs digest is not a string";
  }
  const need: [string, (x: unknown) => boolean, string][] = [
    ["caseId", (x) => typeof x === "string", "a string"],
    ["solver", (x) => typeof x === "string", "a string"],
    ["nx", (x) => Number.isInteger(x) && (x as number) > 0, "a positive whole number"],
    ["ny", (x) => Number.isInteger(x) && (x as number) > 0, "a positive whole number"],
    ["h", (x) => typeof x === "number" && x > 0, "a positive number"],
    [
      "status",
      (x) => x === "ok" || x === "failed" || x === "not-applicable",
      "ok, failed or not-applicable",
    ],
    ["residualHistory", (x) => Array.isArray(x), "an array"],
    ["seconds", (x) => typeof x === "number", "a number"],
  ];
  for (const [field, ok, what] of need) {
    if (!ok(r[field])) {
      return `has a solve record whose field ${field} is ${
        r[field] === undefined ? "missing" : `${JSON.stringify(r[field])}`
      } (expected ${what})`;
    }
  }
  return null;
}

/**
 * Drops a torn last line (an interrupted write) from the journal file, so the next record starts
 * on a line of its own.
 *
 * @param path The journal file.
 * @param read What {@link readJournal} found in it.
 * @returns The dropped text, or null when the journal ended with a complete line.
 */
export function repairJournal(
  path: string,
  read: Pick<ReturnType<typeof readJournal>, "torn" | "completeBytes">,
): string | null {
  if (read.torn === null) return null;
  Deno.truncateSync(path, read.completeBytes);
  return read.torn;
}
