/**
 * The bundled reference multigrid solver as a program that speaks the gridproof solver protocol
 * (docs/protocol.md), so the in-process and subprocess paths can be checked against each other.
 *
 * Modes are detected from the first message: `hello` starts a session (one request per line, one
 * reply per line until `goodbye` or end of input); anything else is a single request read to the
 * end of stdin (once mode). It speaks versions 1 and 2 (the conservative form with K at the edge
 * midpoints, the mixed term) and answers in the version it was spoken to. Vertex layout only: a
 * cell-layout request gets a `not-applicable` reply. Replies use the request's array encoding
 * unless `--encoding numbers|base64` says otherwise.
 *
 * Run: `deno run reference-solver/protocol_main.ts [--encoding base64]`; with `--allow-ffi` on
 * Linux it also enlarges its stdin and stdout pipes (see {@link enlargePipes}).
 *
 * @module
 */
import {
  type ArrayEncoding,
  isConstantForm,
  LineScanner,
  type MessageBytes,
  messageBytes,
  type ParsedMessage,
  PROTOCOL_VERSION,
  PROTOCOL_VERSION_2,
  PROTOCOL_VERSIONS,
  type ProtocolVersion,
  readSolveRequest,
  solutionReplyBytes,
} from "../harness/protocol/mod.ts";
import { type Problem, solve } from "./mod.ts";

/** Linux `fcntl` command that sets the capacity of a pipe. */
const F_SETPIPE_SZ = 1031;
/** Capacity asked for: Linux's default limit for unprivileged processes (fs.pipe-max-size). */
const PIPE_BYTES = 1 << 20;

/**
 * Enlarges the stdin and stdout pipes from Linux's 64 KiB to 1 MiB, when this runs on Linux with
 * `--allow-ffi` (otherwise, or when the call fails, the pipes stay as they are). A request of
 * tens of megabytes then crosses in 1 MiB steps instead of 64 KiB ones; every step is a hand-over
 * between the two processes, and at a million nodes the thousand small ones cost tens of
 * milliseconds (bench/protocol_bench.ts shows both).
 */
function enlargePipes(): void {
  if (Deno.build.os !== "linux") return;
  if (Deno.permissions.querySync({ name: "ffi" }).state !== "granted") return;
  try {
    const libc = Deno.dlopen("libc.so.6", {
      fcntl: { parameters: ["i32", "i32", "i32"], result: "i32" },
    });
    // a result of -1 (not a pipe, a lower limit) leaves that pipe as it was
    for (const fd of [0, 1]) libc.symbols.fcntl(fd, F_SETPIPE_SZ, PIPE_BYTES);
    libc.close();
  } catch {
    // no glibc (e.g. musl): the default pipes work, only more slowly
  }
}

async function writeAll(piece: Uint8Array): Promise<void> {
  let at = 0;
  while (at < piece.length) at += await Deno.stdout.write(piece.subarray(at));
}

/**
 * Writes one message line to stdout, piece by piece: arrays are encoded as they are written, the
 * next piece while the last one is being written (pieces take turns in two buffers).
 */
async function send(line: MessageBytes): Promise<void> {
  let previous = Promise.resolve();
  for (const piece of line.pieces()) {
    const current = previous.then(() => writeAll(piece));
    current.catch(() => {}); // a broken pipe is reported by the await below
    await previous;
    previous = current;
  }
  await previous;
}

/** The version of a line's message when it is one this program speaks, else version 1. */
function versionOf(line: Line): ProtocolVersion {
  const v = field(line, "protocol");
  return PROTOCOL_VERSIONS.includes(v as ProtocolVersion) ? v as ProtocolVersion : PROTOCOL_VERSION;
}

/**
 * Anisotropy above which the program relaxes by alternating zebra lines instead of red–black
 * Gauss–Seidel. Point smoothers lose their smoothing as the coupling ratio grows (LFA, Trottenberg
 * et al. 2001: μ → 1 as ε → 0 for ε·u_xx + u_yy), while alternating line relaxation stays robust
 * for any ratio; at 10 a point smoother still converges but noticeably slower (common practice).
 */
export const ANISOTROPY_FOR_LINES = 10;

/**
 * The smoother for a problem: "alternating-line" when the stencil's couplings are anisotropic
 * somewhere — max over nodes of a·hy²/(c·hx²) or its inverse above {@link ANISOTROPY_FOR_LINES},
 * with the local spacings on a stretched grid (hx² → hw·he, hy² → hs·hn at the node) —
 * else "red-black". A request carries no advice, so the program decides from the coefficients (the
 * in-process path uses the case's own advice).
 *
 * @param problem the problem
 * @param options `uniform`: a and c are known to hold one value each (they came in the constant
 *   form), so the first node decides (default false: every node is looked at)
 */
export function smootherFor(
  problem: Problem,
  options: { uniform?: boolean } = {},
): "alternating-line" | "red-black" {
  const hx = (problem.domain.x1 - problem.domain.x0) / problem.nx;
  const hy = (problem.domain.y1 - problem.domain.y0) / problem.ny;
  const scale = (hy * hy) / (hx * hx);
  // On a stretched grid the spacings are local: hx² becomes hw·he at node i (the product in the
  // denominator of the non-uniform 3-point u_xx), hy² alike; every node is looked at.
  const co = problem.coordinates;
  const local = (k: number): number => {
    if (co === undefined) return scale;
    const i = k % (problem.nx + 1), j = (k - i) / (problem.nx + 1);
    const h2 = (v: Float64Array, t: number) =>
      (v[t] - v[t > 0 ? t - 1 : t + 1]) * (v[t < v.length - 1 ? t + 1 : t - 1] - v[t]);
    return Math.abs(h2(co.y, j) / h2(co.x, i));
  };
  const count = options.uniform && co === undefined
    ? Math.min(1, problem.a.length)
    : problem.a.length;
  for (let k = 0; k < count; k++) {
    const ratio = (problem.a[k] * local(k)) / problem.c[k];
    if (ratio > ANISOTROPY_FOR_LINES || ratio < 1 / ANISOTROPY_FOR_LINES) return "alternating-line";
  }
  return "red-black";
}

/** One line of input: its message when it was parsed on the way, else its text. */
type Line = ParsedMessage | string;

/** A field of a line's message (a text of more than 4 KiB is not parsed again just for this). */
function field(line: Line, name: "id" | "type" | "protocol"): string | undefined {
  let value: unknown = typeof line === "string" ? undefined : line.value;
  if (typeof line === "string" && line.length <= 4096) {
    try {
      value = JSON.parse(line);
    } catch {
      return undefined;
    }
  }
  const v = (value as Record<string, unknown> | null | undefined)?.[name];
  return typeof v === "string" ? v : undefined;
}

/**
 * Buffers of arrays sent in the constant form, kept from request to request (one request is
 * answered before the next is read, so the last request's arrays are free to overwrite).
 */
const keptConstants = new Map<string, Float64Array>();

/** Answers one request with one reply line. */
function answer(text: Line, forced: ArrayEncoding | undefined): MessageBytes {
  let read;
  try {
    read = readSolveRequest(text, { keptConstants });
  } catch (error) {
    const id = field(text, "id");
    return messageBytes({
      protocol: versionOf(text),
      type: "error",
      ...(id !== undefined ? { id } : {}),
      reason: (error as Error).message,
    });
  }
  const { message, problem } = read;
  // answer in the request's own version, however it was read
  const protocol = message.protocol;
  if (problem.layout !== "vertex") {
    return messageBytes({
      protocol,
      type: "not-applicable",
      id: message.id,
      reason: "the reference solver is vertex-centred; it does not solve on the cell layout",
    });
  }
  try {
    // the read request is the solver's problem as it stands (one type, problem/)
    const c = message.coefficients;
    const uniform = c !== undefined && isConstantForm(c.a) && isConstantForm(c.c);
    const result = solve(problem, {
      smoother: { name: smootherFor(problem, { uniform }) },
      scheme: { upwind: message.scheme === "upwind" },
      stop: { tolerance: message.tolerance },
      // the request says the solution is fixed up to a constant: fix it by a zero mean
      ...(problem.singular ? { singular: "mean-zero" as const } : {}),
    });
    return solutionReplyBytes(message.id, result.solution, {
      protocol,
      encoding: forced ?? message.encoding,
      residualHistory: result.residualHistory.filter(Number.isFinite),
      iterations: result.cycles,
      converged: result.converged,
      seconds: result.seconds,
      solver: { name: "gridproof-reference", version: "1" },
      notes: `stop reason: ${result.reason}; average factor ${result.averageFactor}`,
    });
  } catch (error) {
    return messageBytes({
      protocol,
      type: "error",
      id: message.id,
      reason: (error as Error).message,
    });
  }
}

/**
 * Reads stdin as lines into one buffer, kept and grown as needed from line to line, and scans each
 * line while it arrives (base64 arrays are decoded on the way, see LineScanner): a request of
 * tens of megabytes is ready soon after its last byte, and the next one lands in memory already
 * touched. Its arrays, too, are decoded into the buffers of the last request's (`reuseArrays`):
 * each request is answered before the next line is read. Reads block: this program has nothing
 * else to do while it waits for input.
 */
class LineReader {
  #buffer = new Uint8Array(1 << 16);
  /** Start of the bytes not yet consumed. */
  #start = 0;
  /** End of the bytes read. */
  #end = 0;
  #done = false;
  #decoder = new TextDecoder();
  #scanner = new LineScanner({ reuseArrays: true });

  /** Reads more input after what is kept; false at the end of input. */
  #fill(): boolean {
    if (this.#done) return false;
    if (this.#end === this.#buffer.length) {
      const kept = this.#buffer.subarray(this.#start, this.#end);
      const target = 2 * kept.length > this.#buffer.length
        ? new Uint8Array(2 * this.#buffer.length)
        : this.#buffer;
      target.set(kept);
      this.#buffer = target;
      this.#start = 0;
      this.#end = kept.length;
    }
    const n = Deno.stdin.readSync(this.#buffer.subarray(this.#end));
    if (n === null) {
      this.#done = true;
      return false;
    }
    this.#end += n;
    return true;
  }

  #take(length: number, skip: number): Line {
    const bytes = this.#buffer.subarray(this.#start, this.#start + length);
    this.#start += length + skip;
    return this.#scanner.finish(bytes) ?? this.#decoder.decode(bytes);
  }

  /** The next line without its newline, or undefined at the end of input. */
  line(): Line | undefined {
    // all consumed: start again at the front, in memory already touched
    if (this.#start === this.#end) this.#start = this.#end = 0;
    while (true) {
      const nl = this.#scanner.scan(this.#buffer.subarray(this.#start, this.#end));
      if (nl >= 0) return this.#take(nl, 1);
      if (!this.#fill()) {
        return this.#start === this.#end ? undefined : this.#take(this.#end - this.#start, 0);
      }
    }
  }

  /** Everything not yet consumed, as text. */
  rest(): string {
    while (this.#fill());
    const text = this.#decoder.decode(this.#buffer.subarray(this.#start, this.#end));
    this.#start = this.#end;
    return text;
  }
}

const isBlank = (line: Line) => typeof line === "string" && line.trim() === "";

function main(args: string[]): Promise<number> | number {
  let forced: ArrayEncoding | undefined;
  const at = args.indexOf("--encoding");
  if (at >= 0) {
    const value = args[at + 1];
    if (value !== "numbers" && value !== "base64") {
      console.error(`--encoding must be numbers or base64, got ${value}`);
      return 2;
    }
    forced = value;
  }
  enlargePipes();
  return serve(new LineReader(), forced);
}

async function serve(input: LineReader, forced: ArrayEncoding | undefined): Promise<number> {
  let first = input.line();
  while (first !== undefined && isBlank(first)) first = input.line();
  if (first === undefined) {
    console.error("no request on stdin");
    return 2;
  }
  if (field(first, "type") !== "hello") {
    // once mode: the request may span several lines
    const rest = input.rest();
    if (typeof first !== "string" && rest.trim() !== "") {
      const id = field(first, "id");
      await send(messageBytes({
        protocol: versionOf(first),
        type: "error",
        ...(id !== undefined ? { id } : {}),
        reason: `a request without hello must be the only message on stdin; more text follows ` +
          `it: ${JSON.stringify(rest.trim().slice(0, 60))}`,
      }));
      return 0;
    }
    await send(answer(typeof first === "string" ? first + "\n" + rest : first, forced));
    return 0;
  }
  // a session speaks the version of its hello
  const protocol = versionOf(first);
  await send(messageBytes({
    protocol,
    type: "ready",
    solver: { name: "gridproof-reference", version: "1" },
    supports: {
      // periodic sides exist in version 2 only
      boundaryKinds: protocol === PROTOCOL_VERSION_2
        ? ["dirichlet", "neumann", "robin", "periodic"]
        : ["dirichlet", "neumann", "robin"],
      schemes: ["central", "upwind"],
      layouts: ["vertex"],
      encodings: ["numbers", "base64"],
      constantArrays: true,
    },
  }));
  while (true) {
    const line = input.line();
    if (line === undefined) return 0;
    if (isBlank(line)) continue;
    if (field(line, "type") === "goodbye") return 0;
    await send(answer(line, forced));
  }
}

if (import.meta.main) {
  Deno.exit(await main(Deno.args));
}
