/**
 * The files of a batch solve: one folder per solve with the request, a `run.sh` that starts the
 * solver (through its launcher) with the request on stdin, and what the job leaves: the reply,
 * stderr, the solver's exit status and its start and end times. A job array's script runs the
 * `run.sh` of its task's folder.
 *
 * @module
 */
import type { MessageBytes } from "../../protocol/mod.ts";

/** Last bytes of stderr kept for the outcome (as the local backend keeps). */
const STDERR_TAIL = 64 * 1024;

/** Quotes one word for POSIX sh. */
export function shellQuote(word: string): string {
  return `'${word.replaceAll("'", `'"'"'`)}'`;
}

/**
 * Writes a solve's folder: `request.json` and `run.sh`.
 *
 * @param folder the solve's folder (created)
 * @param request the request bytes
 * @param run the program's full argv (launcher first), its working folder and extra environment
 */
export async function writeSolveFolder(
  folder: string,
  request: MessageBytes,
  run: { argv: string[]; cwd: string; env?: Record<string, string> },
): Promise<void> {
  await Deno.mkdir(folder, { recursive: true });
  const file = await Deno.open(`${folder}/request.json`, {
    create: true,
    write: true,
    truncate: true,
  });
  try {
    for (const piece of request.pieces()) {
      let offset = 0;
      while (offset < piece.length) offset += await file.write(piece.subarray(offset));
    }
  } finally {
    file.close();
  }
  const here = shellQuote(folder);
  const exports = Object.entries(run.env ?? {}).map(([k, v]) => `export ${k}=${shellQuote(v)}`);
  const script = [
    "#!/bin/sh",
    "# written by gridproof: one solve, the request on stdin, the reply on stdout",
    `here=${here}`,
    `date +%s.%N > "$here/start"`,
    ...exports,
    `cd ${shellQuote(run.cwd)} || { echo 126 > "$here/exit"; exit 126; }`,
    `${
      run.argv.map(shellQuote).join(" ")
    } < "$here/request.json" > "$here/reply.part" 2> "$here/stderr.txt"`,
    "status=$?",
    `date +%s.%N > "$here/end"`,
    `mv "$here/reply.part" "$here/reply.json"`,
    `echo "$status" > "$here/exit.part" && mv "$here/exit.part" "$here/exit"`,
    'exit "$status"',
    "",
  ].join("\n");
  await Deno.writeTextFile(`${folder}/run.sh`, script, { mode: 0o755 });
}

/**
 * The job script of one solve or a job array: it runs the `run.sh` of `folders[i]` for array
 * task i.
 */
export function jobScript(folders: string[]): string {
  const lines = ["#!/bin/sh", "# written by gridproof"];
  if (folders.length === 1) lines.push(`exec sh ${shellQuote(`${folders[0]}/run.sh`)}`);
  else {
    lines.push('case "$SLURM_ARRAY_TASK_ID" in');
    folders.forEach((f, k) => lines.push(`  ${k}) exec sh ${shellQuote(`${f}/run.sh`)} ;;`));
    lines.push('  *) echo "no task $SLURM_ARRAY_TASK_ID" >&2; exit 125 ;;', "esac");
  }
  return lines.join("\n") + "\n";
}

/** What a solve's folder holds after (or while) its job ran. */
export interface SolveFiles {
  /** The solver's exit status, null until it exited. */
  exit: number | null;
  /** The reply text, null until the solver exited. */
  reply: string | null;
  /** The last 64 KiB of stderr. */
  stderrTail: string;
  /** Seconds the solver ran (null until it ended). */
  runSeconds: number | null;
  /** Unix time (seconds) the job started the solver, or null. */
  startedAt: number | null;
}

async function text(path: string): Promise<string | null> {
  try {
    return await Deno.readTextFile(path);
  } catch {
    return null;
  }
}

/** Reads what a solve's job left in its folder. */
export async function readSolveFiles(folder: string): Promise<SolveFiles> {
  const exitText = await text(`${folder}/exit`);
  const exit = exitText === null ? null : Number(exitText.trim());
  const start = await text(`${folder}/start`);
  const end = await text(`${folder}/end`);
  const startedAt = start === null ? null : Number(start.trim());
  const runSeconds = startedAt !== null && end !== null ? Number(end.trim()) - startedAt : null;
  let stderrTail = "";
  try {
    const bytes = await Deno.readFile(`${folder}/stderr.txt`);
    stderrTail = new TextDecoder().decode(bytes.subarray(Math.max(0, bytes.length - STDERR_TAIL)));
  } catch {
    // no stderr yet
  }
  return {
    exit: Number.isInteger(exit) ? exit : null,
    reply: exit === null ? null : await text(`${folder}/reply.json`),
    stderrTail,
    runSeconds: runSeconds !== null && Number.isFinite(runSeconds) ? runSeconds : null,
    startedAt: startedAt !== null && Number.isFinite(startedAt) ? startedAt : null,
  };
}
