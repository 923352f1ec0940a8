/**
 * gridproof example solver: plain SOR on the vertex-centred 5-point system, speaking
 * gridproof-protocol/1 on stdin/stdout (docs/protocol.md). Logs go to stderr.
 *
 * Usage: `deno run main.ts [--omega W] [--max-sweeps N] [--seeded-defect one-sided] [--reply-points]`
 *
 * `--seeded-defect one-sided` is a DELIBERATE DEFECT for gridproof's demo: Neumann and Robin
 * sides get a first-order one-sided boundary row instead of the second-order ghost node, so the
 * boundary band converges at order 1.
 *
 * `--reply-points` answers like a solver on its own mesh (docs/protocol.md, "Replying on your own
 * points"): it still solves on the requested vertex grid, then replies with the cell centres as
 * its own points, each valued by the average of its four nodes, with weights hx·hy
 * (`cell_points.ts` derives why that stays second-order accurate). Its solver-file entry declares
 * `"layout": "points"`.
 *
 * The mode is chosen by the first line on stdin: a hello message starts a session (one message
 * per line until goodbye or end of input); anything else is one request (once mode).
 *
 * @module
 */
import { encodeArray, PROTOCOL, readProblem, RequestError } from "./problem.ts";
import { sorSolve } from "./sor.ts";
import { assembleStencil } from "./stencil.ts";
import { cellPoints } from "./cell_points.ts";

const VERSION = "1.0.0";
/** Largest grid accepted: SOR needs about 10^10 operations at 1024 × 1024. */
const LARGEST = 512;
const NAME = "deno-sor";

// deno-lint-ignore no-explicit-any
type Json = any;

/** Command-line options of this example. */
interface Flags {
  omega?: number;
  maxSweeps?: number;
  defect?: "one-sided";
  /** Reply on the cell centres (own points) instead of the requested nodes. */
  points?: boolean;
}

function parseFlags(args: string[]): Flags {
  const flags: Flags = {};
  for (let k = 0; k < args.length; k++) {
    const [key, inline] = args[k].split("=", 2);
    if (key === "--reply-points" && inline === undefined) {
      flags.points = true;
      continue;
    }
    const value = inline ?? args[++k];
    const num = Number(value);
    if (key === "--omega" && num > 0 && num < 2) flags.omega = num;
    else if (key === "--max-sweeps" && Number.isInteger(num) && num > 0) flags.maxSweeps = num;
    else if (key === "--seeded-defect" && value === "one-sided") flags.defect = "one-sided";
    else {
      console.error(
        `deno-sor: unknown or bad option '${
          args[k]
        }'; use --omega W (0 < W < 2), --max-sweeps N, --seeded-defect one-sided or --reply-points`,
      );
      Deno.exit(2);
    }
  }
  return flags;
}

/** Name, version and build id, sent with `ready` and every reply (the build names the seeded defect). */
function identity(flags: Flags): Json {
  return {
    name: NAME,
    version: VERSION,
    build: flags.defect ? "seeded-defect-one-sided" : "plain",
  };
}

function ready(flags: Flags): Json {
  return {
    protocol: PROTOCOL,
    type: "ready",
    solver: identity(flags),
    supports: {
      boundaryKinds: ["dirichlet", "neumann", "robin"],
      schemes: ["central", "upwind"],
      // requests come on the vertex layout either way; the reply's layout is what is declared
      layouts: [flags.points ? "points" : "vertex"],
      encodings: ["numbers", "base64"],
      largestGrid: { nx: LARGEST, ny: LARGEST },
    },
  };
}

function msg(type: string, fields: Record<string, unknown>): Json {
  return { protocol: PROTOCOL, type, ...fields };
}

function solve(req: Json, flags: Flags): Json {
  const id = String(req.id ?? "");
  if (req.grid?.layout !== "vertex") {
    return msg("not-applicable", { id, reason: `only the vertex layout, not ${req.grid?.layout}` });
  }
  const scheme = req.scheme ?? "central";
  if (scheme !== "central" && scheme !== "upwind") {
    return msg("not-applicable", { id, reason: `unknown scheme '${scheme}'` });
  }
  if (Math.max(Number(req.grid?.nx), Number(req.grid?.ny)) > LARGEST) {
    return msg("not-applicable", {
      id,
      reason: `grid ${req.grid.nx}x${req.grid.ny} is above this example's largest grid ` +
        `${LARGEST}x${LARGEST} (SOR work grows like N^1.5)`,
    });
  }
  const p = readProblem(req);
  const sides = Object.values(p.boundary);
  if (
    sides.every((s) => s.kind === "neumann" || (s.kind === "robin" && s.alpha === 0)) &&
    p.e.every((v) => v === 0)
  ) {
    return msg("not-applicable", {
      id,
      reason: "only Neumann sides and e = 0: the solution is fixed only up to a constant",
    });
  }
  const start = performance.now();
  const limit = Number(req.timeLimitSeconds);
  let stencil;
  try {
    stencil = assembleStencil(p, { upwind: scheme === "upwind", defect: flags.defect });
  } catch (err) {
    if (err instanceof RangeError) throw new RequestError(err.message);
    throw err;
  }
  const dirichletLike = (side: "west" | "east" | "south" | "north") => {
    const bc = p.boundary[side];
    return bc.kind === "dirichlet" || (bc.kind === "robin" && bc.beta === 0);
  };
  const result = sorSolve(stencil, {
    omega: flags.omega,
    dirichletSides: {
      west: dirichletLike("west"),
      east: dirichletLike("east"),
      south: dirichletLike("south"),
      north: dirichletLike("north"),
    },
    maxSweeps: flags.maxSweeps,
    tolerance: Number(req.tolerance) > 0 ? Number(req.tolerance) : 1e-10,
    // stop a little before the harness would kill us, so the reply says why
    deadline: limit > 0 ? start + 900 * limit : undefined,
  });
  const seconds = (performance.now() - start) / 1000;
  console.error(
    `${NAME}: ${id} ${p.nx}x${p.ny} ${result.reason} after ${result.sweeps} sweeps ` +
      `(omega ${result.omega.toFixed(4)}) in ${seconds.toFixed(3)} s`,
  );
  if (!result.solution.every(Number.isFinite)) {
    return msg("error", { id, reason: `SOR ${result.reason} and produced non-finite values` });
  }
  const encoding = req.encoding ?? "numbers";
  const own = flags.points
    ? cellPoints(result.solution, { ...p.domain, nx: p.nx, ny: p.ny })
    : null;
  return msg("solution", {
    id,
    values: encodeArray(own ? own.values : result.solution, encoding),
    ...(own
      ? {
        points: {
          x: encodeArray(own.x, encoding),
          y: encodeArray(own.y, encoding),
          weights: encodeArray(own.weights, encoding),
        },
      }
      : {}),
    residualHistory: result.residualHistory,
    iterations: result.sweeps,
    converged: result.converged,
    seconds,
    solver: identity(flags),
    notes: `lexicographic SOR, omega ${result.omega.toFixed(6)}, ${scheme} scheme, ` +
      `stopped: ${result.reason}` +
      (own ? `; replied at the ${own.values.length} cell centres (averages of four nodes)` : "") +
      (result.restarts.length > 0
        ? `; restarted after divergence with omega ${
          result.restarts.map((o) => o.toFixed(4)).join(", ")
        }`
        : ""),
  });
}

function answer(req: Json, flags: Flags): Json {
  if (typeof req !== "object" || req === null || Array.isArray(req)) {
    return msg("error", { reason: "the message is not a JSON object" });
  }
  const idField = typeof req.id === "string" ? { id: req.id } : {};
  if (req.protocol !== PROTOCOL) {
    return msg("error", {
      ...idField,
      reason: `this solver speaks '${PROTOCOL}' only; the message says '${req.protocol}'`,
    });
  }
  if (req.type === "hello") return ready(flags);
  if (req.type !== "solve") {
    return msg("error", { ...idField, reason: `unknown message type '${req.type}'` });
  }
  try {
    return solve(req, flags);
  } catch (err) {
    if (err instanceof RequestError) return msg("error", { ...idField, reason: err.message });
    throw err;
  }
}

const encoder = new TextEncoder();

async function send(reply: Json): Promise<void> {
  const bytes = encoder.encode(JSON.stringify(reply) + "\n");
  let done = 0;
  while (done < bytes.length) done += await Deno.stdout.write(bytes.subarray(done));
}

function parse(text: string): Json | SyntaxError {
  try {
    return JSON.parse(text);
  } catch (err) {
    return err as SyntaxError;
  }
}

/** Yields stdin line by line (without the newline); the last line may lack one. */
async function* lines(): AsyncGenerator<string> {
  const decoder = new TextDecoder();
  let buffer = "";
  for await (const chunk of Deno.stdin.readable) {
    buffer += decoder.decode(chunk, { stream: true });
    let nl;
    while ((nl = buffer.indexOf("\n")) >= 0) {
      yield buffer.slice(0, nl);
      buffer = buffer.slice(nl + 1);
    }
  }
  buffer += decoder.decode();
  if (buffer.length > 0) yield buffer;
}

async function main(): Promise<void> {
  const flags = parseFlags(Deno.args);
  const input = lines();
  const first = await input.next();
  const head = first.done ? undefined : parse(first.value);
  if (head?.type !== "hello") {
    // once mode: the whole of stdin is the request
    let text = first.done ? "" : first.value;
    for await (const line of input) text += "\n" + line;
    const req = parse(text);
    await send(
      req instanceof SyntaxError
        ? msg("error", { reason: `the request is not valid JSON: ${req.message}` })
        : answer(req, flags),
    );
    return;
  }
  await send(answer(head, flags));
  for await (const line of input) {
    if (line.trim() === "") continue;
    const req = parse(line);
    if (req instanceof SyntaxError) {
      await send(msg("error", { reason: `the line is not valid JSON: ${req.message}` }));
      continue;
    }
    if (req?.type === "goodbye") return;
    await send(answer(req, flags));
  }
}

if (import.meta.main) await main();
