/**
 * Reads a solver file (JSON, schema `solvers.schema.json` beside this file) into validated
 * {@link ExternalSolverSpec}s with every default filled in.
 *
 * @module
 */
import { dirname, resolve } from "node:path";
import { Ajv2020, type ErrorObject } from "ajv/dist/2020";
import { JsonSyntaxError, readJsonWithPositions } from "../../cases/mod.ts";
import { InputError } from "../../errors/mod.ts";
import solverFileSchema from "./solvers.schema.json" with { type: "json" };
import type { ExternalSolverSpec } from "./types.ts";
import { readScaleOut } from "./scale_out_fields.ts";

let validator: ReturnType<Ajv2020["compile"]> | undefined;

/** The bundled reference solver's name in results and `--solver` (see `reference.ts`). */
const REFERENCE_NAME = "reference";

function fieldPath(error: ErrorObject): string {
  // "/solvers/0/command" → "solvers[0].command"
  const parts = error.instancePath.split("/").slice(1);
  let out = "";
  for (const part of parts) out += /^\d+$/.test(part) ? `[${part}]` : (out ? "." : "") + part;
  if (error.keyword === "additionalProperties") {
    const key = (error.params as { additionalProperty: string }).additionalProperty;
    return `${out ? out + "." : ""}${key}`;
  }
  if (error.keyword === "required") {
    const key = (error.params as { missingProperty: string }).missingProperty;
    return `${out ? out + "." : ""}${key}`;
  }
  return out || "(top level)";
}

function problemText(error: ErrorObject): string {
  const where = fieldPath(error);
  switch (error.keyword) {
    case "additionalProperties":
      return `${where}: unknown field; see harness/solvers/solvers.schema.json for the fields`;
    case "required":
      return `${where}: missing (required)`;
    case "enum":
      return `${where}: must be one of ${
        (error.params as { allowedValues: unknown[] }).allowedValues.map((v) => JSON.stringify(v))
          .join(", ")
      }`;
    default:
      return `${where}: ${error.message ?? "is invalid"}`;
  }
}

/** Largest solver file read (1 MiB): a solver file is a few kilobytes of JSON. */
export const MAX_SOLVER_FILE_BYTES = 1 << 20;

const NOT_REGULAR = "is not a regular file (a device, pipe, socket or process file): solver " +
  "files must be regular files; to pass one through a pipe, save it to a file first and give " +
  "that file's path to --solvers";

/**
 * Loads and validates a solver file.
 *
 * @param path the JSON file; relative paths inside it are taken from its folder
 * @returns one spec per solver, defaults filled in and `solverFileDir` set to the file's folder
 * @throws InputError naming the file and every field at fault (missing file, bad JSON, schema
 *   violations, duplicate names, the reserved name "reference")
 *
 * @example
 * ```ts ignore
 * import { loadSolverFile } from "./solver_file.ts";
 * const specs = await loadSolverFile("examples/solvers.json");
 * specs[0].mode; // "once" unless the file says otherwise
 * ```
 */
export async function loadSolverFile(
  path: string,
): Promise<(ExternalSolverSpec & { solverFileDir: string })[]> {
  let text: string;
  try {
    // a pipe would hang and a device never end: a solver file is a regular file of some kilobytes
    const info = await Deno.stat(path);
    if (!info.isFile) {
      throw new InputError(
        info.isDirectory
          ? "is a directory, expected a solver file (.json); check the path given to --solvers"
          : NOT_REGULAR,
        { where: path },
      );
    }
    if (info.size > MAX_SOLVER_FILE_BYTES) {
      throw new InputError(
        `is ${info.size} bytes, more than the ${MAX_SOLVER_FILE_BYTES} a solver file may have; ` +
          "check that this is a solver file",
        { where: path },
      );
    }
    text = await Deno.readTextFile(path);
  } catch (error) {
    if (error instanceof InputError) throw error;
    // Deno refuses /dev/stdin, /dev/fd/N and /proc files to anything short of --allow-all
    if (error instanceof Deno.errors.NotCapable) throw new InputError(NOT_REGULAR, { where: path });
    throw new InputError(
      `cannot read the solver file (${
        (error as Error).message
      }); check the path given to --solvers`,
      { where: path },
    );
  }
  let data: unknown;
  try {
    // strict JSON with positions: a field given twice is refused, as in case files
    // a leading byte-order mark, as some Windows editors write, is not part of the JSON
    data = readJsonWithPositions(text.replace(/^\uFEFF/, "")).value;
  } catch (error) {
    if (!(error instanceof JsonSyntaxError)) throw error;
    const { line, column } = error.position;
    throw new InputError(
      `the solver file is not valid JSON at line ${line}, column ${column}: ${error.message}`,
      { where: path },
    );
  }
  validator ??= new Ajv2020({ allErrors: true, strict: false }).compile(solverFileSchema);
  if (!validator(data)) {
    const problems = [...new Set((validator.errors ?? []).map(problemText))];
    throw new InputError(
      `the solver file has ${problems.length} problem(s); fix the fields listed (format: docs/protocol.md, "Solver files")`,
      { where: path, problems },
    );
  }
  const dir = dirname(resolve(path));
  const seen = new Set<string>();
  const specs: (ExternalSolverSpec & { solverFileDir: string })[] = [];
  const raw = (data as { solvers: Record<string, unknown>[] }).solvers;
  raw.forEach((entry, index) => {
    const name = entry.name as string;
    if (name === REFERENCE_NAME) {
      throw new InputError(
        `solvers[${index}].name: "${name}" is reserved for gridproof's bundled reference solver, ` +
          `the one --solver ${name} names; give this solver another name, e.g. "my-${name}"`,
        { where: path },
      );
    }
    if (seen.has(name)) {
      throw new InputError(
        `solvers[${index}].name: "${name}" is used twice; names must be unique`,
        {
          where: path,
        },
      );
    }
    seen.add(name);
    const spec: ExternalSolverSpec & { solverFileDir: string } = {
      name,
      command: [...(entry.command as string[])],
      mode: (entry.mode as ExternalSolverSpec["mode"]) ?? "once",
      encoding: (entry.encoding as ExternalSolverSpec["encoding"]) ?? "numbers",
      layout: (entry.layout as ExternalSolverSpec["layout"]) ?? "vertex",
      scheme: (entry.scheme as ExternalSolverSpec["scheme"]) ?? "central",
      timeLimitSeconds: (entry.timeLimitSeconds as number) ?? 300,
      skipCases: [...((entry.skipCases as string[]) ?? [])],
      maxReplyMiB: (entry.maxReplyMiB as number) ?? 1024,
      solverFileDir: dir,
    };
    if (entry.description !== undefined) spec.description = entry.description as string;
    if (entry.cwd !== undefined) spec.cwd = entry.cwd as string;
    if (entry.env !== undefined) spec.env = { ...(entry.env as Record<string, string>) };
    if (entry.memoryLimitMiB !== undefined) spec.memoryLimitMiB = entry.memoryLimitMiB as number;
    if (entry.constantArrays !== undefined) spec.constantArrays = entry.constantArrays as boolean;
    if (entry.iterationGrowth !== undefined) spec.iterationGrowth = entry.iterationGrowth as number;
    if (entry.protocol !== undefined) spec.protocol = entry.protocol as 1 | 2;
    readScaleOut(spec, entry, `solvers[${index}]`, path);
    specs.push(spec);
  });
  return specs;
}
