/**
 * A child process in its own session and process group (started through util-linux `setsid`,
 * since Deno.Command cannot detach), so the whole group — children and grandchildren — can be
 * killed at once; descendants that leave the group are tracked and ended with it (see
 * `descendants.ts`). Reads stdout with a size limit, keeps the tail of stderr.
 *
 * @module
 */
import { LineScanner, type ParsedMessage } from "../protocol/mod.ts";
import { DescendantWatch, type EndedProcesses, MARK_VARIABLE } from "./descendants.ts";

/** How much of stderr is kept per solve. */
export const STDERR_TAIL_BYTES = 64 * 1024;
/** Least room offered to one read of stdout (a pipe holds 64 KiB on Linux unless enlarged). */
const READ_ROOM = 1 << 16;

/** The last bytes written to a stream, with absolute offsets so a caller can take "since mark". */
export class TailBuffer {
  #chunks: { start: number; bytes: Uint8Array }[] = [];
  #total = 0;
  readonly #keep: number;

  /** @param keep bytes to keep (default 64 KiB) */
  constructor(keep = STDERR_TAIL_BYTES) {
    this.#keep = keep;
  }

  /** Bytes seen so far. */
  get total(): number {
    return this.#total;
  }

  /** Appends a chunk, dropping what falls out of the kept window. */
  push(bytes: Uint8Array): void {
    this.#chunks.push({ start: this.#total, bytes: bytes.slice() });
    this.#total += bytes.length;
    while (this.#chunks.length > 1) {
      const first = this.#chunks[0];
      if (first.start + first.bytes.length > this.#total - this.#keep) break;
      this.#chunks.shift();
    }
  }

  /** The kept text written at or after offset `mark` (at most the last `keep` bytes). */
  text(mark = 0): string {
    const from = Math.max(mark, this.#total - this.#keep);
    const parts: Uint8Array[] = [];
    for (const { start, bytes } of this.#chunks) {
      const end = start + bytes.length;
      if (end <= from) continue;
      parts.push(start >= from ? bytes : bytes.subarray(from - start));
    }
    const joined = new Uint8Array(parts.reduce((s, p) => s + p.length, 0));
    let at = 0;
    for (const p of parts) {
      joined.set(p, at);
      at += p.length;
    }
    return new TextDecoder().decode(joined);
  }
}

/** What reading stdout produced. */
export type ReadResult =
  | { kind: "data"; bytes: Uint8Array }
  | { kind: "line"; text: string }
  /** A line read with `parse`, parsed as it arrived (it held base64 arrays). */
  | { kind: "message"; message: ParsedMessage }
  | { kind: "eof"; partial: Uint8Array }
  | { kind: "overflow"; limit: number };

/** Options for starting a process. */
export interface StartOptions {
  /** Absolute program path followed by its arguments. */
  argv: string[];
  cwd: string;
  env?: Record<string, string>;
  /** Address-space limit in MiB, applied with `prlimit --as`. */
  memoryLimitMiB?: number;
}

/** A running solver process leading its own process group. */
export class GroupProcess {
  /** Process id, also the process group id. */
  readonly pid: number;
  /** Resolves when the group leader exits. */
  readonly status: Promise<Deno.CommandStatus>;
  /** Tail of everything written on stderr. */
  readonly stderr: TailBuffer = new TailBuffer();
  /** Set once the group leader has exited. */
  exitStatus: Deno.CommandStatus | undefined;
  /** When the group leader exited (`performance.now()`), once it has. */
  exitTime: number | undefined;
  /** Resolves when stderr is closed (all holders exited). */
  readonly stderrDone: Promise<void>;

  #child: Deno.ChildProcess;
  #writer: WritableStreamDefaultWriter<Uint8Array>;
  #reader: ReadableStreamBYOBReader;
  /**
   * Stdout received and not yet returned: `#buffer[0, #held)`. Stdout is read straight into
   * this buffer, kept (and grown when needed) from line to line.
   */
  #buffer = new Uint8Array(1 << 16);
  #held = 0;
  #scanner = new LineScanner();
  #eof = false;
  #watch: DescendantWatch;
  #ending: Promise<EndedProcesses> | undefined;

  private constructor(child: Deno.ChildProcess, mark: string) {
    this.#child = child;
    this.pid = child.pid;
    this.#writer = child.stdin.getWriter();
    this.#reader = child.stdout.getReader({ mode: "byob" });
    this.status = child.status.then((s) => {
      this.exitStatus = s;
      this.exitTime = performance.now();
      return s;
    });
    this.#watch = new DescendantWatch(child.pid, mark);
    this.stderrDone = (async () => {
      try {
        for await (const chunk of child.stderr) this.stderr.push(chunk);
      } catch {
        // stderr broke because the process was killed: what was read is kept
      }
    })();
  }

  /**
   * Starts a process in a new session (its pid is the process group id), with a mark of its own
   * in the environment variable `GRIDPROOF_PROCESS_MARK`, and begins recording its descendants.
   * Call {@link end} when it is done, or at least {@link release}.
   *
   * @throws Deno errors when `setsid` or `prlimit` cannot be started
   */
  static start(options: StartOptions): GroupProcess {
    const wrapper = options.memoryLimitMiB !== undefined
      ? ["prlimit", `--as=${Math.round(options.memoryLimitMiB * 1024 * 1024)}`, "--"]
      : [];
    const mark = crypto.randomUUID();
    const child = new Deno.Command("setsid", {
      args: [...wrapper, ...options.argv],
      cwd: options.cwd,
      env: { ...options.env, [MARK_VARIABLE]: mark },
      stdin: "piped",
      stdout: "piped",
      stderr: "piped",
    }).spawn();
    return new GroupProcess(child, mark);
  }

  /**
   * Writes bytes to stdin in pieces of at most 1 MiB, counting what got through. One piece is
   * being written while the next is taken, so an iterable may reuse a buffer every other piece
   * (as `MessageBytes.pieces()` does) and make its next piece while the pipe drains.
   *
   * @param data the bytes, or the bytes in pieces
   * @returns bytes written and, when the pipe broke, the error text
   */
  async write(
    data: Uint8Array | Iterable<Uint8Array>,
  ): Promise<{ written: number; error?: string }> {
    const most = 1 << 20;
    const pieces = data instanceof Uint8Array ? [data] : data;
    let written = 0;
    let previous: Promise<void> = Promise.resolve();
    let previousLength = 0;
    try {
      for (const piece of pieces) {
        for (let at = 0; at < piece.length; at += most) {
          const part = piece.subarray(at, Math.min(piece.length, at + most));
          // the writer queues the part behind the one in flight
          const current = this.#writer.write(part);
          current.catch(() => {}); // a broken pipe is reported by the await below
          await previous;
          written += previousLength;
          previous = current;
          previousLength = part.length;
        }
      }
      await previous;
      written += previousLength;
      return { written };
    } catch (error) {
      return { written, error: (error as Error).message };
    }
  }

  /** Closes stdin (ignores a pipe that is already broken). */
  async closeStdin(): Promise<void> {
    try {
      await this.#writer.close();
    } catch {
      // the solver already closed its end: nothing left to flush
    }
  }

  /** Reads more stdout after the bytes held; false at the end. */
  async #fill(): Promise<boolean> {
    if (this.#eof) return false;
    if (this.#buffer.length - this.#held < READ_ROOM) {
      const grown = new Uint8Array(Math.max(2 * this.#buffer.length, this.#held + READ_ROOM));
      grown.set(this.#buffer.subarray(0, this.#held));
      this.#buffer = grown;
    }
    const room = new Uint8Array(this.#buffer.buffer, this.#held);
    try {
      const { value, done } = await this.#reader.read(room);
      // the read hands the buffer back in a new ArrayBuffer (the old one is detached)
      if (value) this.#buffer = new Uint8Array(value.buffer);
      if (!done && value) {
        this.#held += value.length;
        return true;
      }
    } catch {
      // the pipe broke because the process was killed: treat as the end
    }
    if (this.#buffer.buffer.detached) {
      // the stream was cancelled or broke with the buffer in it: what it held is gone
      this.#buffer = new Uint8Array(0);
      this.#held = 0;
    }
    this.#eof = true;
    return false;
  }

  /** Takes the bytes received and not yet returned (the buffer goes with them). */
  #takeHeld(): Uint8Array {
    const held = this.#buffer.subarray(0, this.#held);
    this.#buffer = new Uint8Array(0);
    this.#held = 0;
    return held;
  }

  /** Reads stdout to its end, or stops once more than `limit` bytes arrived. */
  async readAll(limit: number): Promise<ReadResult> {
    while (this.#held <= limit && await this.#fill());
    if (this.#held > limit) return { kind: "overflow", limit };
    return { kind: "data", bytes: this.#takeHeld() };
  }

  /**
   * Reads one line of stdout (without its newline), or EOF, or stops beyond `limit` bytes. The
   * line is scanned while it arrives (a `LineScanner` decodes its base64 arrays on the way), into
   * a buffer kept from line to line.
   *
   * @param limit most bytes of one line
   * @param options `parse`: return a line that held base64 arrays as the message parsed on the
   *   way (kind "message") instead of its text (default false)
   */
  async readLine(limit: number, options: { parse?: boolean } = {}): Promise<ReadResult> {
    let end = this.#scanner.scan(this.#buffer.subarray(0, this.#held));
    while (end < 0) {
      if (this.#held > limit || !await this.#fill()) {
        // start the next line afresh: drop what the scanner saw of this one
        this.#scanner = new LineScanner();
        if (this.#held > limit) {
          this.#held = 0;
          return { kind: "overflow", limit };
        }
        return { kind: "eof", partial: this.#takeHeld() };
      }
      end = this.#scanner.scan(this.#buffer.subarray(0, this.#held));
    }
    const line = this.#buffer.subarray(0, end);
    const message = this.#scanner.finish(line);
    const result: ReadResult = message && options.parse
      ? { kind: "message", message }
      : { kind: "line", text: new TextDecoder().decode(line) };
    this.#buffer.copyWithin(0, end + 1, this.#held);
    this.#held -= end + 1;
    return result;
  }

  /**
   * Waits at most `ms` for a read of stdout. When the group leader exits first, whatever it left
   * behind may hold stdout open for ever, so that is ended ({@link end}): the read then ends
   * after the last bytes written, and what the leader wrote is read in full.
   *
   * @param reading a read started on this process (`readAll`, `readLine`)
   * @param ms most time to wait
   * @returns the read, or undefined at the time limit
   */
  async settle<T>(reading: Promise<T>, ms: number): Promise<T | undefined> {
    const deadline = performance.now() + ms;
    const exited = Symbol("exited");
    const first = await within(Promise.race([reading, this.status.then(() => exited)]), ms);
    if (first !== exited) return first as T | undefined;
    await this.end();
    return await within(reading, deadline - performance.now());
  }

  /** Sends SIGKILL to the whole process group; a group that is already gone is fine. */
  killGroup(): void {
    try {
      Deno.kill(-this.pid, "SIGKILL");
    } catch {
      // ESRCH: every member has already exited
    }
  }

  /**
   * Ends the process and everything it started: the process group is killed, and descendants
   * recorded outside it get SIGTERM, then SIGKILL after half a second. Safe to call again (the
   * first call's result is returned).
   *
   * @returns the processes that were still running and were ended
   */
  end(): Promise<EndedProcesses> {
    return this.#ending ??= this.#watch.end(() => this.killGroup());
  }

  /** Releases the pipes after the process ended (or was killed); stops recording descendants. */
  async release(): Promise<void> {
    await this.#watch.stop();
    await this.closeStdin();
    try {
      await this.#reader.cancel();
    } catch {
      // already closed
    }
  }
}

/** Waits for a promise at most `ms` milliseconds; returns `undefined` on timeout. */
export async function within<T>(promise: Promise<T>, ms: number): Promise<T | undefined> {
  let timer: ReturnType<typeof setTimeout> | undefined;
  const timeout = new Promise<undefined>((resolve) => {
    timer = setTimeout(() => resolve(undefined), Math.max(0, ms));
  });
  try {
    return await Promise.race([promise, timeout]);
  } finally {
    clearTimeout(timer);
  }
}

/**
 * Describes how a process ended: "exited with code N" or "was killed by signal SIGX". With an
 * address-space limit in force, adds that the limit may be the cause and how to raise it (an
 * allocation beyond it fails: Python's MemoryError, a failed malloc, V8's "out of memory").
 */
export function describeExit(status: Deno.CommandStatus, memoryLimitMiB?: number): string {
  const how = status.signal
    ? `was killed by signal ${status.signal}`
    : `exited with code ${status.code}`;
  if (memoryLimitMiB === undefined) return how;
  return `${how}; it ran under an address-space limit of ${memoryLimitMiB} MiB ` +
    `(memoryLimitMiB in the solver file), and an allocation beyond it fails — raise ` +
    `memoryLimitMiB if the solver needs more`;
}
