/**
 * Finds the program of a solver command before starting it, so "not found" and "not executable"
 * are reported with the path and the reason instead of a bare spawn error.
 *
 * @module
 */
import { delimiter, isAbsolute, join, resolve } from "node:path";

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
 * name on PATH.
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
