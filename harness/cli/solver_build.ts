/**
 * The build record of an external solver: SHA-256 digests of the solver file that declared it and
 * of every file its command names (the program, then scripts or inputs among the arguments), read
 * once before the campaign starts. Reports put them beside the name, version and build id the
 * solver reports with each reply, so a reviewer can tell exactly which build was verified.
 *
 * @module
 */
import { createHash } from "node:crypto";
import { isAbsolute, relative, resolve } from "node:path";
import type { FileDigest, SolverBuildRecord } from "../result/mod.ts";
import { resolveProgram } from "../solvers/mod.ts";
import type { ExternalSolverSpec } from "../solvers/mod.ts";

/**
 * The SHA-256 of a file, read in pieces (a solver binary may be large).
 *
 * @param path The file.
 * @returns Its digest, or undefined when it is not a readable regular file.
 */
export async function fileDigest(path: string): Promise<FileDigest | undefined> {
  let info: Deno.FileInfo;
  try {
    info = await Deno.stat(path);
  } catch {
    // missing or not ours to read: the caller names it in `unread` or skips it
    return undefined;
  }
  if (!info.isFile) return undefined;
  const hash = createHash("sha256");
  const file = await Deno.open(path, { read: true });
  try {
    for await (const chunk of file.readable) hash.update(chunk);
  } catch (error) {
    throw new Error(`could not read ${path}: ${(error as Error).message}`);
  }
  return { path: shown(path), sha256: hash.digest("hex"), bytes: info.size };
}

/** A path relative to the working folder when it lies inside it, so reports name no machine. */
function shown(path: string): string {
  const abs = resolve(path);
  const rel = relative(Deno.cwd(), abs);
  return rel !== "" && !rel.startsWith("..") && !isAbsolute(rel) ? rel : abs;
}

/**
 * Reads the build record of one external solver.
 *
 * @param spec The solver as loaded from its solver file (with the file's folder).
 * @param solverFile The solver file's path, as given.
 * @returns The digests; files that could not be read are listed in `unread`.
 *
 * @example
 * ```ts ignore
 * const [spec] = await loadSolverFile("solvers.json");
 * solver.info.build = await solverBuild(spec, "solvers.json");
 * ```
 */
export async function solverBuild(
  spec: ExternalSolverSpec & { solverFileDir: string },
  solverFile: string,
): Promise<SolverBuildRecord> {
  const record: SolverBuildRecord = { files: [] };
  const unread: string[] = [];
  const declared = await fileDigest(solverFile).catch((e: Error) => {
    unread.push(e.message);
    return undefined;
  });
  if (declared) record.solverFile = declared;
  const program = await resolveProgram(spec.command[0], {
    baseDir: spec.solverFileDir,
    path: spec.env?.PATH,
  });
  const paths: string[] = program.ok ? [program.path] : [];
  if (!program.ok) unread.push(program.reason);
  // arguments are read by the solver from its working folder: those naming a file are its inputs
  const cwd = resolve(spec.solverFileDir, spec.cwd ?? ".");
  for (const arg of spec.command.slice(1)) {
    if (arg.startsWith("-") || arg.includes("\n")) continue;
    paths.push(resolve(cwd, arg));
  }
  for (const path of paths) {
    try {
      const d = await fileDigest(path);
      if (d && !record.files.some((f) => f.path === d.path)) record.files.push(d);
    } catch (error) {
      unread.push((error as Error).message);
    }
  }
  if (unread.length > 0) record.unread = unread;
  return record;
}
