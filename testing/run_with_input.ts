/**
 * Runs a program (argument array, no shell) with text on its stdin and collects what it printed:
 * the one way tests feed requests to example solvers, SciPy scripts and protocol programs.
 *
 * @module
 */

/** Exit status and decoded output of one run. */
export interface InputRun {
  code: number;
  success: boolean;
  stdout: string;
  stderr: string;
}

/**
 * Starts `command[0]` with the rest as arguments, writes `input` to its stdin, closes it and waits.
 *
 * @param command program and arguments
 * @param input text for stdin
 * @param options `cwd`: working folder (default: the current one)
 * @returns exit code, success and decoded stdout and stderr
 */
export async function runWithInput(
  command: string[],
  input: string,
  options: { cwd?: string | URL } = {},
): Promise<InputRun> {
  const child = new Deno.Command(command[0], {
    args: command.slice(1),
    cwd: options.cwd,
    stdin: "piped",
    stdout: "piped",
    stderr: "piped",
  }).spawn();
  const writer = child.stdin.getWriter();
  await writer.write(new TextEncoder().encode(input));
  await writer.close();
  const out = await child.output();
  const text = new TextDecoder();
  return {
    code: out.code,
    success: out.success,
    stdout: text.decode(out.stdout),
    stderr: text.decode(out.stderr),
  };
}
