/**
 * Runs the gridproof command line as a subprocess from the repository root, the way users and CI
 * run it, for end-to-end tests of exit codes and messages.
 *
 * @module
 */
import { fileURLToPath } from "node:url";

/** Exit code, standard output and standard error of one run. */
export interface CliRun {
  code: number;
  stdout: string;
  stderr: string;
}

/** The permissions the npm scripts grant (package.json). */
export const CLI_PERMISSIONS = [
  "--allow-read",
  "--allow-write",
  "--allow-env",
  "--allow-run",
  "--allow-sys",
];

const ROOT = fileURLToPath(new URL("../", import.meta.url));

/**
 * Runs `cli.ts` with `args` (NO_COLOR set) and waits for it.
 *
 * @param args command-line arguments after `cli.ts`
 * @param options `env`: extra environment (default none); `permissions`: Deno permission flags
 *   (default {@link CLI_PERMISSIONS})
 * @returns exit code and decoded output
 */
export async function runGridproof(
  args: string[],
  options: { env?: Record<string, string>; permissions?: string[] } = {},
): Promise<CliRun> {
  const out = await new Deno.Command(Deno.execPath(), {
    args: ["run", "--quiet", ...(options.permissions ?? CLI_PERMISSIONS), "cli.ts", ...args],
    cwd: ROOT,
    env: { NO_COLOR: "1", ...options.env },
    stdout: "piped",
    stderr: "piped",
  }).output();
  const text = new TextDecoder();
  return { code: out.code, stdout: text.decode(out.stdout), stderr: text.decode(out.stderr) };
}
