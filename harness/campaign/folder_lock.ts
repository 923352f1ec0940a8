/**
 * One campaign per output folder: a lock file with the owner's process id, taken before the
 * journal is touched and released when the campaign ends. A lock whose process no longer runs
 * (the campaign was killed) is stale and taken over.
 *
 * @module
 */

/** The lock file's name inside the output folder. */
export const LOCK_FILE = ".gridproof.lock";

/** Whether a process id runs on this machine (`kill -0`: a signal test that sends nothing). */
function running(pid: number): boolean {
  if (pid === Deno.pid) return true;
  try {
    return new Deno.Command("sh", {
      args: ["-c", `kill -0 ${pid}`],
      stdout: "null",
      stderr: "null",
    }).outputSync().success;
  } catch {
    // no shell to ask: treat the lock as held rather than risk two writers
    return true;
  }
}

/**
 * Takes the lock of an output folder.
 *
 * @param dir The output folder (it exists).
 * @returns A function that releases the lock, and the pid of a stale lock taken over (or null).
 * @throws {RangeError} when another running campaign holds the folder (exit code 2 on the CLI).
 */
export function lockFolder(dir: string): { release: () => void; staleFrom: number | null } {
  const path = `${dir}/${LOCK_FILE}`;
  let staleFrom: number | null = null;
  for (let attempt = 0; attempt < 2; attempt++) {
    try {
      const file = Deno.openSync(path, { write: true, createNew: true });
      file.writeSync(new TextEncoder().encode(`${Deno.pid}\n`));
      file.close();
      return {
        staleFrom,
        release: () => {
          try {
            if (Number.parseInt(Deno.readTextFileSync(path), 10) === Deno.pid) {
              Deno.removeSync(path);
            }
          } catch {
            // already gone: nothing to release
          }
        },
      };
    } catch (error) {
      if (!(error instanceof Deno.errors.AlreadyExists)) throw error;
      const owner = Number.parseInt(Deno.readTextFileSync(path), 10);
      if (Number.isInteger(owner) && running(owner)) {
        throw new RangeError(
          `${dir} is in use by another gridproof campaign (process ${owner}): wait for it to ` +
            `finish, or choose another --out folder; remove ${path} only if no such process runs`,
        );
      }
      // stale: its process is gone (killed or crashed); take it over
      staleFrom = Number.isInteger(owner) ? owner : -1;
      Deno.removeSync(path);
    }
  }
  throw new RangeError(`could not take the lock ${path}: another campaign took it just now`);
}
