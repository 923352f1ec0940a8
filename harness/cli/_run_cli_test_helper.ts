/**
 * Runs the gridproof CLI as a subprocess for command tests.
 *
 * @module
 */

/** Exit code, standard output and standard error of one CLI run. */
export interface CliRun {
  code: number;
  stdout: string;
  stderr: string;
}

/** Runs `cli.ts` with the given arguments from the repository root. */
export async function runCli(args: string[]): Promise<CliRun> {
  const root = new URL("../../", import.meta.url);
  const out = await new Deno.Command(new URL("node_modules/.bin/deno", root).pathname, {
    args: [
      "run",
      "--allow-read",
      "--allow-write",
      "--allow-env",
      "--allow-run",
      "--allow-sys",
      "cli.ts",
      ...args,
    ],
    cwd: root.pathname,
    stdout: "piped",
    stderr: "piped",
    env: { NO_COLOR: "1" },
  }).output();
  const text = new TextDecoder();
  return { code: out.code, stdout: text.decode(out.stdout), stderr: text.decode(out.stderr) };
}
