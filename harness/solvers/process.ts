/**
 * A child process in its own session and process group (started through util-linux `setsid`,
 * since Deno.Command cannot detach), so the whole group — children and grandchildren — can be
 * killed at once. Reads stdout with a size limit, keeps the tail of stderr.
 *
 * @module
 */

/** How much of stderr is kept per solve. */
export const STDERR_TAIL_BYTES = 64 * 1024;

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
  /** Resolves when stderr is closed (all holders exited). */
  readonly stderrDone: Promise<void>;

  #child: Deno.ChildProcess;
  #writer: WritableStreamDefaultWriter<Uint8Array>;
  #reader: ReadableStreamDefaultReader<Uint8Array>;
  #pending: Uint8Array = new Uint8Array(0);
  #eof = false;

  private constructor(child: Deno.ChildProcess) {
    this.#child = child;
    this.pid = child.pid;
    this.#writer = child.stdin.getWriter();
    this.#reader = child.stdout.getReader();
    this.status = child.status.then((s) => {
      this.exitStatus = s;
      return s;
    });
    this.stderrDone = (async () => {
      try {
        for await (const chunk of child.stderr) this.stderr.push(chunk);
      } catch {
        // stderr broke because the process was killed: what was read is kept
      }
    })();
  }

  /**
   * Starts a process in a new session (its pid is the process group id).
   *
   * @throws Deno errors when `setsid` or `prlimit` cannot be started
   */
  static start(options: StartOptions): GroupProcess {
    const wrapper = options.memoryLimitMiB !== undefined
      ? ["prlimit", `--as=${Math.round(options.memoryLimitMiB * 1024 * 1024)}`, "--"]
      : [];
    const child = new Deno.Command("setsid", {
      args: [...wrapper, ...options.argv],
      cwd: options.cwd,
      env: options.env,
      stdin: "piped",
      stdout: "piped",
      stderr: "piped",
    }).spawn();
    return new GroupProcess(child);
  }

  /**
   * Writes bytes to stdin in pieces of at most 1 MiB, counting what got through. Each piece is
   * written before the next is taken, so an iterable may reuse one buffer for its pieces.
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
    try {
      for (const piece of pieces) {
        for (let at = 0; at < piece.length; at += most) {
          const part = piece.subarray(at, Math.min(piece.length, at + most));
          await this.#writer.write(part);
          written += part.length;
        }
      }
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

  /** Next chunk of stdout, or undefined at the end. */
  async #next(): Promise<Uint8Array | undefined> {
    if (this.#eof) return undefined;
    try {
      const result = await this.#reader.read();
      if (!result.done) return result.value;
    } catch {
      // the pipe broke because the process was killed: treat as the end
    }
    this.#eof = true;
    return undefined;
  }

  /** Reads stdout to its end, or stops once more than `limit` bytes arrived. */
  async readAll(limit: number): Promise<ReadResult> {
    const chunks: Uint8Array[] = [];
    let size = this.#pending.length;
    if (size > 0) chunks.push(this.#pending);
    this.#pending = new Uint8Array(0);
    while (true) {
      const chunk = await this.#next();
      if (!chunk) break;
      chunks.push(chunk);
      size += chunk.length;
      if (size > limit) return { kind: "overflow", limit };
    }
    return { kind: "data", bytes: concat(chunks, size) };
  }

  /** Reads one line of stdout (without its newline), or EOF, or stops beyond `limit` bytes. */
  async readLine(limit: number): Promise<ReadResult> {
    // chunks are kept in a list and joined once, so a long line costs linear time
    const chunks: Uint8Array[] = [];
    let size = 0;
    let chunk: Uint8Array | undefined = this.#pending;
    this.#pending = new Uint8Array(0);
    while (true) {
      if (chunk && chunk.length > 0) {
        const nl = chunk.indexOf(10);
        if (nl >= 0) {
          chunks.push(chunk.subarray(0, nl));
          size += nl;
          this.#pending = chunk.slice(nl + 1);
          return { kind: "line", text: new TextDecoder().decode(concat(chunks, size)) };
        }
        chunks.push(chunk);
        size += chunk.length;
        if (size > limit) return { kind: "overflow", limit };
      }
      chunk = await this.#next();
      if (!chunk) return { kind: "eof", partial: concat(chunks, size) };
    }
  }

  /** Sends SIGKILL to the whole process group; a group that is already gone is fine. */
  killGroup(): void {
    try {
      Deno.kill(-this.pid, "SIGKILL");
    } catch {
      // ESRCH: every member has already exited
    }
  }

  /** Releases the pipes after the process ended (or was killed). */
  async release(): Promise<void> {
    await this.closeStdin();
    try {
      await this.#reader.cancel();
    } catch {
      // already closed
    }
  }
}

function concat(chunks: Uint8Array[], size: number): Uint8Array {
  if (chunks.length === 1) return chunks[0];
  const out = new Uint8Array(size);
  let at = 0;
  for (const c of chunks) {
    out.set(c, at);
    at += c.length;
  }
  return out;
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
