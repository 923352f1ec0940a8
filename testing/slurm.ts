/**
 * Detects a running Slurm cluster (`npm run slurm:start` starts a one-node one). Tests that
 * submit jobs skip, naming the reason, when none is running.
 *
 * @module
 */

let found: Promise<string | undefined> | undefined;

/**
 * Checks that `sinfo` answers and shows a node that takes jobs (idle, mixed or allocated).
 *
 * @returns undefined when jobs can run, else why not (for a test's name).
 *
 * @example
 * ```ts ignore
 * const why = await slurmMissing();
 * Deno.test({ name: `… ${why ? `(skipped: ${why})` : ""}`, ignore: why !== undefined, fn });
 * ```
 */
export function slurmMissing(): Promise<string | undefined> {
  found ??= (async () => {
    try {
      const out = await new Deno.Command("sinfo", {
        args: ["-h", "-o", "%T"],
        stdout: "piped",
        stderr: "null",
      }).output();
      const states = new TextDecoder().decode(out.stdout);
      if (out.success && /^(idle|mixed|allocated)/m.test(states)) return undefined;
      return "no Slurm node takes jobs here (start one with npm run slurm:start)";
    } catch {
      return "Slurm is not installed (needs Debian's slurmctld, slurmd, slurm-client and munge; " +
        "then npm run slurm:start)";
    }
  })();
  return found;
}
