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
  #buffer = new Uint8Array(0);
  #done = false;
  #decoder = new TextDecoder();

  async #pull(): Promise<boolean> {
    if (this.#done) return false;
    const { value, done } = await this.#reader.read();
    if (done) {
      this.#done = true;
      return false;
    }
    const joined = new Uint8Array(this.#buffer.length + value.length);
    joined.set(this.#buffer);
    joined.set(value, this.#buffer.length);
    this.#buffer = joined;
    return true;
  }

  async line(): Promise<string | undefined> {
    let searched = 0;
    while (true) {
      const nl = this.#buffer.indexOf(10, searched);
      if (nl >= 0) {
        const text = this.#decoder.decode(this.#buffer.subarray(0, nl));
        this.#buffer = this.#buffer.slice(nl + 1);
        return text;
      }
      searched = this.#buffer.length;
      if (!(await this.#pull())) {
        if (this.#buffer.length === 0) return undefined;
        const text = this.#decoder.decode(this.#buffer);
        this.#buffer = new Uint8Array(0);
        return text;
      }
    }
  }

  async rest(): Promise<string> {
    while (await this.#pull()) {
      // keep reading to the end of input
    }
    const text = this.#decoder.decode(this.#buffer);
    this.#buffer = new Uint8Array(0);
    return text;
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
