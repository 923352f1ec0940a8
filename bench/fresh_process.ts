/**
 * Runs `fresh_solve.ts` in a new Deno process at one n: the JIT warm-up (first against second
 * solve of a process) and the true peak memory of a solve (VmHWM, Linux only). Returns the reason
 * instead when the child cannot run or the peak cannot be read.
 *
 * @module
 */

/** The fresh-process measures at one n, or why there are none. */
export type FreshRun =
  | {
    ok: true;
    firstSolveSeconds: number;
    secondSolveSeconds: number;
    /** Growth of the peak resident size during the first solve, per node. */
    solveBytesPerNode: number;
    /** Growth of the peak while sampling the problem (seven arrays incl. the exact solution). */
    problemBytesPerNode: number;
  }
  | { ok: false; reason: string };

/** Solves the bench problem at n in a fresh process (see the module doc). */
export function freshProcessRun(n: number): FreshRun {
  const child = new URL("./fresh_solve.ts", import.meta.url).pathname;
  const args = [
    "run",
    "--quiet",
    "--allow-read",
    "--allow-env",
    "--allow-sys",
    "--allow-run=cat",
    child,
    String(n),
  ];
  let out: Deno.CommandOutput;
  try {
    out = new Deno.Command(Deno.execPath(), { args }).outputSync();
  } catch (e) {
    return { ok: false, reason: `cannot start a fresh Deno process: ${String(e)}` };
  }
  if (!out.success) {
    const err = new TextDecoder().decode(out.stderr).trim().split("\n")[0];
    return { ok: false, reason: `peak memory cannot be read here: ${err}` };
  }
  const r = JSON.parse(new TextDecoder().decode(out.stdout));
  const nodes = (n + 1) * (n + 1);
  return {
    ok: true,
    firstSolveSeconds: r.firstSeconds,
    secondSolveSeconds: r.secondSeconds,
    solveBytesPerNode: (r.solved - r.sampled) / nodes,
    problemBytesPerNode: (r.sampled - r.before) / nodes,
  };
}
