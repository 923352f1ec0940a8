/**
 * Protocol benchmark (a script, not a test): `deno run -A bench/protocol_bench.ts [--quick]`.
 *
 * 1. Encode + decode throughput of a request and a reply at n = 1024 (1025² ≈ 1.05 M nodes) in
 *    both array encodings, in MB/s of JSON text, along the paths the subprocess exchange takes:
 *    requests written as bytes by solveRequestBytes and read by a LineScanner (as
 *    reference-solver/protocol_main.ts reads them), replies written by solutionReplyBytes and read
 *    by readReply from their text (as the harness reads them).
 * 2. Overhead of the reference solver as a subprocess (reference-solver/protocol_main.ts, base64
 *    arrays) against the same solver in process, at n = 256, 512, 1024, measured side by side in
 *    one run (once mode: a fresh process per solve; session mode: one warm process).
 *
 * Target (issue 5): with base64, subprocess overhead < 15 % of the in-process solve at n = 1024.
 *
 * @module
 */
import { loadCase } from "../cases/mod.ts";
import {
  LineScanner,
  type MessageBytes,
  readReply,
  readSolveRequest,
  solutionReplyBytes,
  solveRequestBytes,
} from "../harness/protocol/mod.ts";
import {
  createExternalSolver,
  createReferenceSolver,
  sampleCase,
  type Solver,
  type SolveTask,
} from "../harness/solvers/mod.ts";

const quick = Deno.args.includes("--quick");
const root = new URL("../", import.meta.url).pathname;
const compiled = await loadCase("smooth-baseline");

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)];
}

function time<T>(f: () => T): [T, number] {
  const t = performance.now();
  const r = f();
  return [r, (performance.now() - t) / 1000];
}

/** All the bytes of a message line, written piece by piece into one buffer (as into a pipe). */
function collect(line: MessageBytes): Uint8Array {
  const out = new Uint8Array(line.byteLength);
  let at = 0;
  for (const piece of line.pieces()) {
    out.set(piece, at);
    at += piece.length;
  }
  return out;
}

// ---- 1. encode + decode throughput ----
{
  const scanner = new LineScanner();
  const n = 1024;
  const sampled = sampleCase(compiled, n, n, "vertex");
  const f = compiled.formulas;
  const solution = compiled.sampleExact(n, n);
  console.log(`# encode/decode at n = ${n} (${(n + 1) ** 2} nodes), median of 3`);
  console.log(
    "encoding | request bytes | encode request | decode request | reply bytes | encode reply | decode reply | harness encode+decode",
  );
  for (const encoding of ["numbers", "base64"] as const) {
    const rows: number[][] = [];
    let requestBytes = 0;
    let replyBytes = 0;
    for (let rep = 0; rep < 3; rep++) {
      const [requestLine, tEncReq] = time(() =>
        collect(solveRequestBytes(sampled, {
          id: "bench",
          caseId: compiled.id,
          expressions: {
            a: f.a,
            b: f.b,
            c: f.c,
            d: f.d,
            e: f.e,
            source: f.source,
            boundary: f.boundary,
          },
          scheme: "central",
          tolerance: 1e-10,
          timeLimitSeconds: 60,
          encoding,
        }))
      );
      const [, tDecReq] = time(() => {
        const end = scanner.scan(requestLine);
        const line = requestLine.subarray(0, end);
        return readSolveRequest(scanner.finish(line) ?? new TextDecoder().decode(line));
      });
      const [replyLine, tEncRep] = time(() =>
        collect(solutionReplyBytes("bench", solution, { encoding, iterations: 5 }))
      );
      const [check, tDecRep] = time(() =>
        readReply(new TextDecoder().decode(replyLine), {
          id: "bench",
          layout: "vertex",
          nx: n,
          ny: n,
          domain: compiled.domain,
        })
      );
      if (!check.ok) throw new Error(check.reason);
      requestBytes = requestLine.length;
      replyBytes = replyLine.length;
      rows.push([tEncReq, tDecReq, tEncRep, tDecRep]);
    }
    const [eq, dq, ep, dp] = [0, 1, 2, 3].map((k) => median(rows.map((r) => r[k])));
    const mbs = (bytes: number, s: number) =>
      `${(bytes / 1e6 / s).toFixed(0)} MB/s (${(s * 1000).toFixed(0)} ms)`;
    console.log(
      `${encoding} | ${(requestBytes / 1e6).toFixed(1)} MB | ${mbs(requestBytes, eq)} | ${
        mbs(requestBytes, dq)
      } | ` +
        `${(replyBytes / 1e6).toFixed(1)} MB | ${mbs(replyBytes, ep)} | ${mbs(replyBytes, dp)} | ` +
        `${((eq + dp) * 1000).toFixed(0)} ms`,
    );
  }
}

// ---- 2. subprocess overhead ----
async function wall(
  solver: Solver,
  task: SolveTask,
): Promise<{ seconds: number; iterations: number | null }> {
  const t = performance.now();
  const o = await solver.solve(task);
  if (o.status !== "ok") throw new Error(`${solver.info.name}: ${o.reason}`);
  return { seconds: (performance.now() - t) / 1000, iterations: o.iterations };
}

const spec = (mode: "once" | "session", constantArrays: boolean) => ({
  name: `reference-${mode}${constantArrays ? "-constants" : ""}`,
  constantArrays,
  command: [
    Deno.execPath(),
    "run",
    "--quiet",
    "--v8-flags=--max-old-space-size=4096",
    "reference-solver/protocol_main.ts",
  ],
  mode,
  encoding: "base64" as const,
  layout: "vertex" as const,
  scheme: "central" as const,
  timeLimitSeconds: 600,
  skipCases: [],
  maxReplyMiB: 1024,
});

console.log(
  "\n# reference solver: in process vs subprocess (base64), wall time around solve() incl. " +
    "sampling and request encoding; best of 2",
);
console.log(
  "n | nodes | cycles | in process | once | overhead | session (warm) | overhead | " +
    "session + constantArrays | overhead",
);
const inProcess = createReferenceSolver();
const once = createExternalSolver(spec("once", false), { solverFileDir: root });
const session = createExternalSolver(spec("session", false), { solverFileDir: root });
const compact = createExternalSolver(spec("session", true), { solverFileDir: root });
try {
  // warm everything up (JIT in this process, session start-up) on a small grid
  const warm = { case: compiled, nx: 64, ny: 64, scheme: "central" as const, tolerance: 1e-10 };
  await wall(inProcess, warm);
  await wall(session, warm);
  await wall(compact, warm);
  for (const n of quick ? [256] : [256, 512, 1024]) {
    const task = { case: compiled, nx: n, ny: n, scheme: "central" as const, tolerance: 1e-10 };
    const times: number[][] = [[], [], [], []];
    let cycles: number | null = null;
    for (let rep = 0; rep < 2; rep++) {
      const r = await wall(inProcess, task);
      cycles = r.iterations;
      times[0].push(r.seconds);
      times[1].push((await wall(once, task)).seconds);
      times[2].push((await wall(session, task)).seconds);
      times[3].push((await wall(compact, task)).seconds);
    }
    const [ta, tb, tc, td] = times.map((t) => Math.min(...t));
    const pct = (t: number) => `${(((t - ta) / ta) * 100).toFixed(1)} %`;
    console.log(
      `${n} | ${(n + 1) ** 2} | ${cycles} | ${ta.toFixed(3)} s | ${tb.toFixed(3)} s | ${
        pct(tb)
      } | ` +
        `${tc.toFixed(3)} s | ${pct(tc)} | ${td.toFixed(3)} s | ${pct(td)}`,
    );
  }
} finally {
  await session.close();
  await once.close();
  await compact.close();
}
