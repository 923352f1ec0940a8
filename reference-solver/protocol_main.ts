/**
 * The bundled reference multigrid solver as a program that speaks the gridproof solver protocol
 * (docs/protocol.md), so the in-process and subprocess paths can be checked against each other.
 *
 * Modes are detected from the first message: `hello` starts a session (one request per line, one
 * reply per line until `goodbye` or end of input); anything else is a single request read to the
 * end of stdin (once mode). Vertex layout only: a cell-layout request gets a `not-applicable`
 * reply. Replies use the request's array encoding unless `--encoding numbers|base64` says otherwise.
 *
 * Run: `deno run reference-solver/protocol_main.ts [--encoding base64]`
 *
 * @module
 */
import {
  type ArrayEncoding,
  buildSolutionReply,
  PROTOCOL_VERSION,
  readSolveRequest,
  type SampledProblem,
  serializeMessage,
} from "../harness/protocol/mod.ts";
import { type Problem, solve } from "./mod.ts";

const encoder = new TextEncoder();

async function send(message: object): Promise<void> {
  const bytes = encoder.encode(serializeMessage(message));
  let at = 0;
  while (at < bytes.length) at += await Deno.stdout.write(bytes.subarray(at));
}

function toProblem(p: SampledProblem): Problem {
  const c = p.coefficients;
  return {
    domain: p.domain,
    nx: p.nx,
    ny: p.ny,
    a: c.a,
    b: c.b,
    c: c.c,
    d: c.d,
    e: c.e,
    f: p.source,
    boundary: {
      west: { ...p.boundary.west } as Problem["boundary"]["west"],
      east: { ...p.boundary.east } as Problem["boundary"]["east"],
      south: { ...p.boundary.south } as Problem["boundary"]["south"],
      north: { ...p.boundary.north } as Problem["boundary"]["north"],
    },
  };
}

function requestId(text: string): string | undefined {
  try {
    const id = (JSON.parse(text) as { id?: unknown }).id;
    return typeof id === "string" ? id : undefined;
  } catch {
    return undefined;
  }
}

/** Answers one request text with one reply message. */
function answer(text: string, forced: ArrayEncoding | undefined): Record<string, unknown> {
  let read;
  try {
    read = readSolveRequest(text);
  } catch (error) {
    const id = requestId(text);
    return {
      protocol: PROTOCOL_VERSION,
      type: "error",
      ...(id !== undefined ? { id } : {}),
      reason: (error as Error).message,
    };
  }
  const { message, problem } = read;
  if (problem.layout !== "vertex") {
    return {
      protocol: PROTOCOL_VERSION,
      type: "not-applicable",
      id: message.id,
      reason: "the reference solver is vertex-centred; it does not solve on the cell layout",
    };
  }
  try {
    const result = solve(toProblem(problem), {
      scheme: { upwind: message.scheme === "upwind" },
      stop: { tolerance: message.tolerance },
    });
    return buildSolutionReply(message.id, result.solution, {
      encoding: forced ?? message.encoding,
      residualHistory: result.residualHistory.filter(Number.isFinite),
      iterations: result.cycles,
      converged: result.converged,
      seconds: result.seconds,
      solver: { name: "gridproof-reference", version: "1" },
      notes: `stop reason: ${result.reason}; average factor ${result.averageFactor}`,
    });
  } catch (error) {
    return {
      protocol: PROTOCOL_VERSION,
      type: "error",
      id: message.id,
      reason: (error as Error).message,
    };
  }
}

/** Reads stdin as lines; `rest()` returns everything not yet consumed. */
class LineReader {
  #reader = Deno.stdin.readable.getReader();
  #pending: Uint8Array = new Uint8Array(0);
  #done = false;
  #decoder = new TextDecoder();

  async #next(): Promise<Uint8Array | undefined> {
    if (this.#done) return undefined;
    const { value, done } = await this.#reader.read();
    if (done) {
      this.#done = true;
      return undefined;
    }
    return value;
  }

  #join(chunks: Uint8Array[]): string {
    const size = chunks.reduce((s, c) => s + c.length, 0);
    const out = new Uint8Array(size);
    let at = 0;
    for (const c of chunks) {
      out.set(c, at);
      at += c.length;
    }
    return this.#decoder.decode(out);
  }

  /** The next line without its newline (chunks joined once: linear in the line length). */
  async line(): Promise<string | undefined> {
    const chunks: Uint8Array[] = [];
    let chunk: Uint8Array | undefined = this.#pending;
    this.#pending = new Uint8Array(0);
    while (true) {
      if (chunk && chunk.length > 0) {
        const nl = chunk.indexOf(10);
        if (nl >= 0) {
          chunks.push(chunk.subarray(0, nl));
          this.#pending = chunk.slice(nl + 1);
          return this.#join(chunks);
        }
        chunks.push(chunk);
      }
      chunk = await this.#next();
      if (!chunk) return chunks.length === 0 ? undefined : this.#join(chunks);
    }
  }

  async rest(): Promise<string> {
    const chunks = [this.#pending];
    this.#pending = new Uint8Array(0);
    for (let c = await this.#next(); c; c = await this.#next()) chunks.push(c);
    return this.#join(chunks);
  }
}

function messageType(text: string): string | undefined {
  try {
    const t = (JSON.parse(text) as { type?: unknown }).type;
    return typeof t === "string" ? t : undefined;
  } catch {
    return undefined;
  }
}

async function main(args: string[]): Promise<number> {
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
  const input = new LineReader();
  let first = await input.line();
  while (first !== undefined && first.trim() === "") first = await input.line();
  if (first === undefined) {
    console.error("no request on stdin");
    return 2;
  }
  if (messageType(first) !== "hello") {
    // once mode: the request may span several lines
    await send(answer(first + "\n" + (await input.rest()), forced));
    return 0;
  }
  await send({
    protocol: PROTOCOL_VERSION,
    type: "ready",
    solver: { name: "gridproof-reference", version: "1" },
    supports: {
      boundaryKinds: ["dirichlet", "neumann", "robin"],
      schemes: ["central", "upwind"],
      layouts: ["vertex"],
      encodings: ["numbers", "base64"],
    },
  });
  while (true) {
    const line = await input.line();
    if (line === undefined) return 0;
    if (line.trim() === "") continue;
    if (messageType(line) === "goodbye") return 0;
    await send(answer(line, forced));
  }
}

if (import.meta.main) {
  Deno.exit(await main(Deno.args));
}
