/**
 * Slurm's own commands, as the batch backend uses them: `sbatch --parsable` to submit, `squeue -t
 * all` to read states (the accounting daemon behind `sacct` is often absent), `scontrol show job`
 * for an exit code, `scancel` to cancel. Nothing here prints or throws on a scheduler refusal: a
 * failed command comes back as its error text.
 *
 * @module
 */

/** A job's state as `squeue` shows it. */
export interface JobState {
  /** PENDING, RUNNING, COMPLETED, FAILED, TIMEOUT, CANCELLED, NODE_FAIL, … */
  state: string;
  /** Slurm's reason field (e.g. Priority, Resources, TimeLimit, NonZeroExitCode). */
  reason: string;
}

async function run(program: string, args: string[]): Promise<
  { ok: true; text: string } | { ok: false; error: string }
> {
  try {
    const out = await new Deno.Command(program, { args, stdout: "piped", stderr: "piped" })
      .output();
    const text = new TextDecoder().decode(out.stdout);
    if (out.success) return { ok: true, text };
    const err = new TextDecoder().decode(out.stderr).trim() || text.trim();
    return { ok: false, error: `${program} exited with code ${out.code}: ${err}` };
  } catch (error) {
    return { ok: false, error: `${program} could not be started: ${(error as Error).message}` };
  }
}

/**
 * Submits a job script.
 *
 * @returns the job id, or the scheduler's refusal in words
 */
export async function submitJob(
  script: string,
  args: string[],
): Promise<{ id: string } | { error: string }> {
  const out = await run("sbatch", ["--parsable", ...args, script]);
  if (!out.ok) return { error: out.error };
  // --parsable prints "id" or "id;cluster"
  const id = out.text.trim().split(";")[0];
  return /^\d+$/.test(id) ? { id } : { error: `sbatch printed no job id: ${out.text.trim()}` };
}

/**
 * The states of the jobs `ids` (array tasks as `123_4`), one `squeue` call; a job Slurm no longer
 * knows is absent from the map. A finished job is shown only until `MinJobAge` (300 s by default).
 *
 * @returns the states by id, or the command's failure in words
 */
export async function jobStates(ids: string[]): Promise<Map<string, JobState> | string> {
  const states = new Map<string, JobState>();
  if (ids.length === 0) return states;
  const out = await run("squeue", ["-h", "-t", "all", "-r", "-j", ids.join(","), "-o", "%i|%T|%r"]);
  if (!out.ok) {
    // every id unknown: squeue refuses the whole list
    return /Invalid job id/i.test(out.error) ? states : out.error;
  }
  for (const line of out.text.split("\n")) {
    const [id, state, reason] = line.trim().split("|");
    if (id && state) states.set(id, { state, reason: reason ?? "" });
  }
  return states;
}

/** A finished job's exit code and signal from `scontrol show job` ("ExitCode=3:0"), or null. */
export async function jobExit(id: string): Promise<{ code: number; signal: number } | null> {
  const out = await run("scontrol", ["show", "job", id]);
  if (!out.ok) return null;
  const m = /\bExitCode=(\d+):(\d+)/.exec(out.text);
  return m ? { code: Number(m[1]), signal: Number(m[2]) } : null;
}

/** Cancels a job; returns the failure in words, or undefined. */
export async function cancelJob(id: string): Promise<string | undefined> {
  const out = await run("scancel", [id]);
  return out.ok ? undefined : out.error;
}
