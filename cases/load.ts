/**
 * Loading cases: the built-in library (`cases/library/*.json`, one case per file, file name = id)
 * and user files, with duplicate ids refused, plus the all-problems check behind
 * `gridproof cases check`.
 *
 * @module
 */
import { InputError } from "../errors/mod.ts";
import { type CaseFile, type CaseProblem, formatProblem } from "./case_file.ts";
import { buildCase } from "./engine.ts";
import { closestName } from "./_suggest.ts";
import type { CompiledCase } from "./types.ts";
import { validateCaseText } from "./validate.ts";

const LIBRARY = new URL("./library/", import.meta.url);

/** Options of {@link loadCase}. */
export interface LoadOptions {
  /** Parameter values overriding the case's defaults, e.g. `{ width: 0.1 }`. Default: none. */
  parameters?: Record<string, number>;
  /**
   * The derivation cache folder (`derive_cache.ts`); the CLI passes its default from
   * `harness/cli/cache_dir.ts`. Default: no cache.
   */
  cacheDir?: string;
}

/**
 * Ids of the built-in cases, sorted.
 *
 * @example
 * ```ts
 * import { libraryIds } from "./load.ts";
 * libraryIds().includes("smooth-baseline"); // true
 * ```
 */
export function libraryIds(): string[] {
  const ids: string[] = [];
  for (const entry of Deno.readDirSync(LIBRARY)) {
    if (entry.isFile && entry.name.endsWith(".json")) ids.push(entry.name.slice(0, -5));
  }
  return ids.sort();
}

function looksLikePath(s: string): boolean {
  return s.endsWith(".json") || s.includes("/") || s.includes("\\");
}

/** Largest case file read (1 MiB): a case is a few kilobytes of JSON. */
export const MAX_CASE_FILE_BYTES = 1 << 20;

const NOT_REGULAR = "is not a regular file (a device, pipe, socket or process file): case files " +
  "must be regular files; to read a case from a pipe, save it to a file first and give that " +
  "file's path (.json)";

async function readText(path: string | URL): Promise<string> {
  try {
    // refuse what is not a regular file (a FIFO would hang, /dev/zero would never end) and
    // anything far larger than a case file, before reading a byte
    const info = await Deno.stat(path);
    if (info.isFile === false && !info.isDirectory) {
      throw new InputError(NOT_REGULAR, { where: String(path) });
    }
    if (info.isFile && info.size > MAX_CASE_FILE_BYTES) {
      throw new InputError(
        `is ${info.size} bytes, more than the ${MAX_CASE_FILE_BYTES} a case file may have; ` +
          `check that this is a case file`,
        { where: String(path) },
      );
    }
    // a byte-order mark, as some Windows editors write, is not part of the JSON: drop it
    return (await Deno.readTextFile(path)).replace(/^\uFEFF/, "");
  } catch (error) {
    if (error instanceof InputError) throw error;
    // Deno refuses /dev/stdin, /dev/fd/N and /proc files to anything short of --allow-all
    if (error instanceof Deno.errors.NotCapable) {
      throw new InputError(NOT_REGULAR, { where: String(path) });
    }
    if (error instanceof Deno.errors.NotFound) {
      throw new InputError("file not found; check the path", { where: String(path) });
    }
    if (error instanceof Deno.errors.IsADirectory) {
      throw new InputError("is a directory, expected a case file (.json)", {
        where: String(path),
      });
    }
    throw new InputError(
      `cannot read the file: ${error instanceof Error ? error.message : String(error)}`,
      { where: String(path) },
    );
  }
}

async function loadFile(
  path: string | URL,
  origin: string,
  label: string,
  options: LoadOptions,
): Promise<CompiledCase> {
  const text = await readText(path);
  const { value, problems, warnings, located } = validateCaseText(text, label);
  if (!value) {
    throw new InputError(
      `${problems.length} problem${problems.length === 1 ? "" : "s"} in the case file`,
      { where: label, problems: problems.map(formatProblem) },
    );
  }
  const built = await buildCase(value, {
    origin,
    file: label,
    ...(located ? { located } : {}),
    ...(options.parameters ? { parameters: options.parameters } : {}),
    ...(options.cacheDir !== undefined ? { cacheDir: options.cacheDir } : {}),
  });
  if (warnings.length) built.warnings = warnings.map(formatProblem);
  return built;
}

/**
 * Loads one case: a built-in id (e.g. `"boundary-layer"`) or the path of a case file.
 *
 * @throws {InputError} for an unknown id (listing the valid ones), a missing file or any problem
 *   in the file (all of them at once)
 * @throws {RangeError} for an unknown parameter override
 * @example
 * ```ts
 * import { loadCase } from "./load.ts";
 * const c = await loadCase("boundary-layer", { parameters: { width: 0.1 } });
 * c.sample(16, 16).f.length; // 289
 * ```
 */
export async function loadCase(pathOrId: string, options: LoadOptions = {}): Promise<CompiledCase> {
  if (looksLikePath(pathOrId)) return await loadFile(pathOrId, pathOrId, pathOrId, options);
  const ids = libraryIds();
  if (!ids.includes(pathOrId)) {
    const near = closestName(pathOrId, ids);
    throw new InputError(
      `unknown case "${pathOrId}"${near ? ` (did you mean "${near}"?)` : ""}; give a case file ` +
        `path (.json) or one of: ${ids.join(", ")}`,
      { where: "--case" },
    );
  }
  const path = new URL(`${pathOrId}.json`, LIBRARY);
  return await loadFile(path, "library", `cases/library/${pathOrId}.json`, options);
}

/**
 * Reads and validates the built-in case files without compiling them (no mathjs): fast, for
 * listings.
 *
 * @throws {InputError} if a library file is broken
 */
export async function libraryFiles(): Promise<CaseFile[]> {
  const files: CaseFile[] = [];
  for (const id of libraryIds()) {
    const label = `cases/library/${id}.json`;
    const { value, problems } = validateCaseText(
      await readText(new URL(`${id}.json`, LIBRARY)),
      label,
    );
    if (!value) {
      throw new InputError("the built-in case file is broken", {
        where: label,
        problems: problems.map(formatProblem),
      });
    }
    files.push(value);
  }
  return files;
}

/**
 * Loads every built-in case, sorted by id.
 *
 * @throws {InputError} if a library file is broken or its id does not match its file name
 */
export async function loadLibrary(
  options: Pick<LoadOptions, "cacheDir"> = {},
): Promise<CompiledCase[]> {
  const cases: CompiledCase[] = [];
  for (const id of libraryIds()) {
    const c = await loadCase(id, options);
    if (c.id !== id) {
      throw new InputError(`the id "${c.id}" differs from the file name; rename one`, {
        where: `cases/library/${id}.json`,
      });
    }
    cases.push(c);
  }
  return cases;
}

/**
 * Loads user case files; an id used twice (between files, or by a file and the library) is an
 * error naming both files.
 *
 * @throws {InputError} for the first broken file, or a duplicate id
 */
export async function loadCaseFiles(
  paths: readonly string[],
  options: Pick<LoadOptions, "cacheDir"> = {},
): Promise<CompiledCase[]> {
  const cases: CompiledCase[] = [];
  const seen = new Map<string, string>();
  for (const id of libraryIds()) seen.set(id, `cases/library/${id}.json`);
  for (const path of paths) {
    const c = await loadFile(path, path, path, options);
    const other = seen.get(c.id);
    if (other !== undefined) {
      throw new InputError(
        `id "${c.id}" is used twice: in ${other} and in ${path}; give one of them another id`,
        { where: `${path}: id` },
      );
    }
    seen.set(c.id, path);
    cases.push(c);
  }
  return cases;
}

/** Every problem found in one file by {@link checkCaseFiles}. */
export interface FileCheck {
  file: string;
  /** Formatted problems (`file:line:column: field: message`); empty when the file is fine. */
  problems: string[];
  /** Formatted deprecation warnings (old field names); they do not make the file bad. */
  warnings: string[];
}

/**
 * Checks case files and collects every problem: JSON syntax, schema, expressions, derivation,
 * duplicate ids, and sampling of each suggested grid (ellipticity, finite values). Never throws
 * for bad input.
 */
export async function checkCaseFiles(paths: readonly string[]): Promise<FileCheck[]> {
  const results: FileCheck[] = [];
  const seen = new Map<string, string>();
  for (const id of libraryIds()) seen.set(id, `cases/library/${id}.json`);
  for (const path of paths) {
    const problems: string[] = [];
    let warnings: string[] = [];
    try {
      const c = await loadFile(path, path, path, {});
      warnings = c.warnings ?? [];
      const other = seen.get(c.id);
      if (other !== undefined) {
        problems.push(
          `${path}: id: "${c.id}" is already used by ${other}; give this case another id`,
        );
      } else seen.set(c.id, path);
      for (const n of c.grids) {
        const { nx, ny } = c.gridFor(n);
        try {
          c.sample(nx, ny);
        } catch (error) {
          if (!(error instanceof RangeError)) throw error;
          problems.push(`${path}: grids: ${error.message}`);
          break;
        }
      }
    } catch (error) {
      if (error instanceof InputError) {
        if (error.problems.length) problems.push(...error.problems);
        else problems.push(`${error.where ? error.where + ": " : ""}${error.message}`);
      } else if (error instanceof RangeError) problems.push(`${path}: ${error.message}`);
      else throw error;
    }
    results.push({ file: path, problems, warnings });
  }
  return results;
}

/** Re-exported for callers that format problems themselves. */
export type { CaseProblem };
