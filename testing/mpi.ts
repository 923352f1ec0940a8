/**
 * Detects Debian's Open MPI and mpi4py, which the MPI example (examples/mpi-python) needs. Tests
 * that run it skip, naming the reason, when they are missing.
 *
 * @module
 */

let found: Promise<string | undefined> | undefined;

/**
 * Checks that `mpirun` runs and that `/usr/bin/python3` imports mpi4py and NumPy (Debian's
 * `openmpi-bin`, `python3-mpi4py`, `python3-numpy`).
 *
 * @returns undefined when MPI is usable, else why not (for a test's name).
 *
 * @example
 * ```ts ignore
 * const why = await mpiMissing();
 * Deno.test({ name: `… ${why ? `(skipped: ${why})` : ""}`, ignore: why !== undefined, fn });
 * ```
 */
export function mpiMissing(): Promise<string | undefined> {
  found ??= (async () => {
    const need = "needs Debian's openmpi-bin, python3-mpi4py and python3-numpy";
    try {
      const out = await new Deno.Command("/usr/bin/python3", {
        args: ["-c", "import mpi4py, numpy"],
        stdout: "null",
        stderr: "null",
      }).output();
      if (!out.success) return `mpi4py or NumPy is missing for /usr/bin/python3 (${need})`;
      const mpirun = await new Deno.Command("mpirun", {
        args: ["--version"],
        stdout: "null",
        stderr: "null",
      }).output();
      if (!mpirun.success) return `mpirun does not run here (${need})`;
      return undefined;
    } catch {
      return `mpirun or /usr/bin/python3 is not installed (${need})`;
    }
  })();
  return found;
}
