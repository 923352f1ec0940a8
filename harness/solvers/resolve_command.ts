/**
 * Finds the program of a solver command before starting it, so "not found" and "not executable"
 * are reported with the path and the reason instead of a bare spawn error.
 *
 * @module
 */
import { basename, delimiter, isAbsolute, join, resolve } from "node:path";

/** A program found, or why not. */
export type Resolved = { ok: true; path: string } | { ok: false; reason: string };

async function check(path: string): Promise<"ok" | "missing" | "folder" | "not-executable"> {
  let info: Deno.FileInfo;
  try {
    info = await Deno.stat(path);
  } catch {
    return "missing";
  }
  if (info.isDirectory) return "folder";
  if (info.mode !== null && (info.mode & 0o111) === 0) return "not-executable";
  return "ok";
}

/**
 * Resolves the first element of a command: a name containing "/" relative to `baseDir`, a bare
 * name on PATH. A script whose first line is `#!INTERPRETER` is resolved only when that
 * interpreter exists (for `#!/usr/bin/env NAME`: when NAME is on PATH), since starting it would
 * otherwise fail with a bare "not found" that names neither.
 *
 * @param program the command's first element as written
 * @param options `baseDir` for relative paths, `path` the PATH to search (default: the
 *   environment's)
 * @returns the absolute path, or a reason naming the path and what is wrong
 *
 * @example
 * ```ts ignore
 * import { resolveProgram } from "./resolve_command.ts";
 * await resolveProgram("python3", { baseDir: "." }); // { ok: true, path: "/usr/bin/python3" }
 * ```
 */
export async function resolveProgram(
  program: string,
  options: { baseDir: string; path?: string },
): Promise<Resolved> {
  const found = await resolveFile(program, options);
  if (!found.ok) return found;
  const reason = await interpreterProblem(program, found.path, options.path);
  return reason === undefined ? found : { ok: false, reason };
}

async function resolveFile(
  program: string,
  options: { baseDir: string; path?: string },
): Promise<Resolved> {
  if (program.includes("/")) {
    const path = isAbsolute(program) ? program : resolve(options.baseDir, program);
    const state = await check(path);
    if (state === "ok") return { ok: true, path };
    if (state === "missing") {
      return {
        ok: false,
        reason: `command ${JSON.stringify(program)} not found: ${path} does not exist ` +
          `(relative paths are taken from the solver file's folder)`,
      };
    }
    if (state === "folder") {
      return {
        ok: false,
        reason: `command ${JSON.stringify(program)} is a folder (${path}), not a program`,
      };
    }
    return {
      ok: false,
      reason:
        `command ${JSON.stringify(program)} is not executable (${path}: permission denied, no ` +
        `execute bit); make it executable with chmod +x, or run it through its interpreter, e.g. ` +
        `["python3", ${JSON.stringify(program)}]`,
    };
  }
  const searchPath = options.path ?? Deno.env.get("PATH") ?? "";
  const folders = searchPath.split(delimiter).filter((d) => d !== "");
  let notExecutable: string | undefined;
  for (const folder of folders) {
    const path = join(folder, program);
    const state = await check(path);
    if (state === "ok") return { ok: true, path };
    if (state === "not-executable" && notExecutable === undefined) notExecutable = path;
  }
  if (notExecutable !== undefined) {
    return {
      ok: false,
      reason:
        `command ${JSON.stringify(program)} found on PATH at ${notExecutable} but it is not ` +
        `executable (permission denied)`,
    };
  }
  return {
    ok: false,
    reason: `command ${JSON.stringify(program)} not found on PATH (searched ${folders.length} ` +
      `folders); install it or give its path in the solver file`,
  };
}

/** Longest first line read for a `#!` line (Linux reads at most 256 bytes of it). */
const SHEBANG_BYTES = 256;

/**
 * Why the interpreter a script names on its `#!` line cannot run it, or undefined when it can
 * (or the file is no script, or its line cannot be read: starting it will then say why).
 */
async function interpreterProblem(
  program: string,
  path: string,
  searchPath: string | undefined,
): Promise<string | undefined> {
  let head: string;
  try {
    using file = await Deno.open(path);
    const bytes = new Uint8Array(SHEBANG_BYTES);
    const count = await file.read(bytes) ?? 0;
    head = new TextDecoder().decode(bytes.subarray(0, count));
  } catch {
    // unreadable here: starting it will say why
    return undefined;
  }
  if (!head.startsWith("#!")) return undefined;
  const line = head.slice(2).split("\n")[0].trim();
  const words = line.split(/\s+/).filter((w) => w !== "");
  const shown = `${JSON.stringify(program)} (${path})`;
  const fix = `fix the script's first line (e.g. "#!/usr/bin/env python3"), or name an ` +
    `interpreter that exists in the solver file's command, e.g. ["python3", ${
      JSON.stringify(program)
    }]`;
  if (words.length === 0) {
    return `command ${shown} starts with "#!" but names no interpreter; ${fix}`;
  }
  const interpreter = words[0];
  // a relative interpreter is taken from the working folder at start: left to the start itself
  if (!isAbsolute(interpreter)) return undefined;
  const state = await check(interpreter);
  if (state !== "ok") {
    const what = state === "missing"
      ? "does not exist"
      : state === "folder"
      ? "is a folder"
      : "is not executable";
    return `command ${shown} names the interpreter ${interpreter} on its first line ` +
      `("#!${line}"), which ${what}; ${fix}`;
  }
  if (basename(interpreter) !== "env") return undefined;
  // #!/usr/bin/env NAME: NAME is looked up on PATH (options and VAR=value settings skipped;
  // with -S and the like the rest of the line is env's business)
  const name = words.slice(1).find((w) => !w.includes("="));
  if (name === undefined || name.startsWith("-") || name.includes("/")) return undefined;
  const found = await resolveFile(name, { baseDir: "/", path: searchPath });
  if (found.ok) return undefined;
  return `command ${shown} runs ${JSON.stringify(name)} through ${interpreter} on its first ` +
    `line ("#!${line}"), but ${JSON.stringify(name)} is not on PATH; install it, or ${fix}`;
}
