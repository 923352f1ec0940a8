/**
 * True peak memory of a solve through the harness (issue 16, item 5): runs
 * `gridproof solve --case smooth-baseline --n N --json` (the CLI, sampling with the case engine,
 * the solve, the error norms) in a child Deno process under GNU time (`/usr/bin/time -f %M`),
 * which reports the child's maximum resident set size from the kernel when it is waited for: the
 * true peak, with no sampling of /proc. The fixed cost of a process (Deno, mathjs, the case
 * derivation) is measured by the same command at a small n, so the bench can report bytes per
 * node both in total and above that fixed cost.
 *
 * @module
 */

/** One run's peak, or why there is none. */
export type HarnessPeak =
  | { ok: true; n: number; peakBytes: number }
  | { ok: false; reason: string };

/** The CLI solve of `smooth-baseline` at n under GNU time (module doc). */
export function harnessPeak(n: number, caseId = "smooth-baseline"): HarnessPeak {
  const cli = new URL("../cli.ts", import.meta.url).pathname;
  const args = [
    "-f",
    "%M",
    Deno.execPath(),
    "run",
    "--quiet",
    "--allow-read",
    "--allow-write",
    "--allow-env",
    "--allow-run",
    "--allow-sys",
    cli,
    "solve",
    "--case",
    caseId,
    "--n",
    String(n),
    "--json",
  ];
  let out: Deno.CommandOutput;
  try {
    out = new Deno.Command("/usr/bin/time", { args }).outputSync();
  } catch {
    return { ok: false, reason: "no /usr/bin/time (install Debian's time): peak not measured" };
  }
  const err = new TextDecoder().decode(out.stderr).trim().split("\n");
  const kb = Number(err[err.length - 1]);
  if (!out.success || !Number.isFinite(kb)) {
    return { ok: false, reason: `solve --n ${n} failed: ${err.slice(-3).join(" ")}` };
  }
  return { ok: true, n, peakBytes: kb * 1024 };
}
