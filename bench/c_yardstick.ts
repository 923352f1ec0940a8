/**
 * The plain C V-cycle of `vcycle.c` as the bench's yardstick (issue 16, item 3): compiled once per
 * bench run with `gcc -O3` into a temporary folder, run per n beside the reference solver's own
 * measurements. When gcc is missing or the build fails, {@link compileYardstick} says why and the
 * bench prints that line instead of the ratios.
 *
 * @module
 */

/** What one run of the C V-cycle reports. */
export interface YardstickRun {
  /** Best seconds of one V(2,1) cycle. */
  secondsPerCycle: number;
  /** ‖f − Au‖₂ from u = 0 and after each of the first five cycles. */
  residuals: number[];
}

/** A compiled yardstick, or the reason there is none. */
export type Yardstick =
  | { ok: true; run(n: number, reps: number): YardstickRun; dispose(): void }
  | { ok: false; reason: string };

/** Compiles `vcycle.c` with `gcc -O3` (no other flags) into a temporary folder. */
export function compileYardstick(): Yardstick {
  const source = new URL("./vcycle.c", import.meta.url).pathname;
  const dir = Deno.makeTempDirSync({ prefix: "gridproof-vcycle-" });
  const binary = `${dir}/vcycle`;
  let out: Deno.CommandOutput;
  try {
    out = new Deno.Command("gcc", { args: ["-O3", "-o", binary, source, "-lm"] }).outputSync();
  } catch {
    Deno.removeSync(dir, { recursive: true });
    return { ok: false, reason: "gcc not found: no C yardstick (install Debian's gcc)" };
  }
  if (!out.success) {
    Deno.removeSync(dir, { recursive: true });
    const err = new TextDecoder().decode(out.stderr).trim().split("\n")[0];
    return { ok: false, reason: `gcc -O3 bench/vcycle.c failed: ${err}` };
  }
  return {
    ok: true,
    run(n, reps) {
      const res = new Deno.Command(binary, { args: [String(n), String(reps)] }).outputSync();
      if (!res.success) {
        throw new Error(`vcycle ${n} failed: ${new TextDecoder().decode(res.stderr).trim()}`);
      }
      const parsed = JSON.parse(new TextDecoder().decode(res.stdout));
      return { secondsPerCycle: parsed.secondsPerCycle, residuals: parsed.residuals };
    },
    dispose: () => Deno.removeSync(dir, { recursive: true }),
  };
}
