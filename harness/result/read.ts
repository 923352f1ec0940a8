/**
 * Reading a saved `result.json`: the format and version are checked first (so a file from another
 * tool or another gridproof version gets a message about that, not a list of schema errors), then
 * the whole object is validated against `result.schema.json`.
 *
 * @module
 */
// The named export: the default export of this CommonJS module does not type-check under Deno
import { Ajv2020, type ErrorObject, type ValidateFunction } from "ajv/dist/2020";
import schema from "./result.schema.json" with { type: "json" };
import { InputError } from "../../errors/mod.ts";
import { type CampaignResult, RESULT_FORMAT, RESULT_VERSION } from "./types.ts";

/**
 * Upgrades of older result versions, by the version they upgrade from (each returns the next
 * version). Version 1 is the first, so there is none yet; a result older than the oldest key here
 * is refused with a message that says so.
 */
const UPGRADES: Record<number, (old: Record<string, unknown>) => Record<string, unknown>> = {};

/** Options of {@link parseResult}. */
export interface ParseResultOptions {
  /** Name of the file for messages. Default `"result"`. */
  source?: string;
}

let compiled: ValidateFunction | undefined;

function validator(): ValidateFunction {
  if (!compiled) {
    const ajv = new Ajv2020({ allErrors: true, strict: true, allowUnionTypes: true });
    compiled = ajv.compile(schema);
  }
  return compiled;
}

/** Turns a JSON pointer such as `/studies/0/orders/1/fitted` into `studies[0].orders[1].fitted`. */
function dotted(pointer: string): string {
  const parts = pointer.split("/").slice(1).map((p) => p.replace(/~1/g, "/").replace(/~0/g, "~"));
  let out = "";
  for (const part of parts) out += /^\d+$/.test(part) ? `[${part}]` : out ? `.${part}` : part;
  return out || "(top level)";
}

/** The field at fault (dotted path) and what is wrong with it, for one schema error. */
function describeError(error: ErrorObject): { field: string; problem: string } {
  const at = dotted(error.instancePath);
  if (error.keyword === "required") {
    const missing = (error.params as { missingProperty: string }).missingProperty;
    return { field: at === "(top level)" ? missing : `${at}.${missing}`, problem: "is missing" };
  }
  if (error.keyword === "enum") {
    const allowed = (error.params as { allowedValues: unknown[] }).allowedValues;
    return {
      field: at,
      problem: `must be one of ${allowed.map((v) => JSON.stringify(v)).join(", ")}`,
    };
  }
  return { field: at, problem: error.message ?? "is not valid" };
}

/**
 * Checks a parsed JSON value and returns it as a {@link CampaignResult}.
 *
 * @param data The parsed JSON.
 * @param options Where it came from, for messages.
 * @returns The result, upgraded to the current version when an upgrade exists.
 * @throws {InputError} When it is not a gridproof result, its version cannot be read, or it
 * does not match the schema; `where` names the file and the first field at fault and `problems`
 * lists every schema problem.
 *
 * @example
 * ```ts ignore
 * const result = checkResult(JSON.parse(text), { source: "result.json" });
 * ```
 */
export function checkResult(data: unknown, options: ParseResultOptions = {}): CampaignResult {
  const source = options.source ?? "result";
  if (typeof data !== "object" || data === null || Array.isArray(data)) {
    throw new InputError(
      "is not a gridproof result: expected a JSON object at the top level; give the " +
        "result.json that a gridproof run wrote",
      { where: source },
    );
  }
  let record = data as Record<string, unknown>;
  if (record.format !== RESULT_FORMAT) {
    throw new InputError(
      `is not a gridproof result: field format is ${JSON.stringify(record.format)}, expected ` +
        `"${RESULT_FORMAT}"; give the result.json that a gridproof run wrote`,
      { where: `${source}: format` },
    );
  }
  const version = record.version;
  if (typeof version !== "number" || !Number.isInteger(version) || version < 1) {
    throw new InputError(
      `cannot tell which result version this is: field version is ${JSON.stringify(version)}, ` +
        `expected a whole number from 1; the file may be damaged, re-run the campaign`,
      { where: `${source}: version` },
    );
  }
  if (version > RESULT_VERSION) {
    throw new InputError(
      `was written by a newer gridproof (result version ${version}); this gridproof reads ` +
        `versions up to ${RESULT_VERSION}: upgrade gridproof to read it`,
      { where: `${source}: version` },
    );
  }
  for (let v = version; v < RESULT_VERSION; v++) {
    const upgrade = UPGRADES[v];
    if (!upgrade) {
      throw new InputError(
        `result version ${version} is older than this gridproof can read (it reads version ` +
          `${RESULT_VERSION}, and has no upgrade from version ${v}): re-run the campaign with ` +
          `this gridproof to make a current result`,
        { where: `${source}: version` },
      );
    }
    record = upgrade(record);
  }
  const validate = validator();
  if (!validate(record)) {
    const found = (validate.errors ?? []).map(describeError);
    const problems = found.map((p) => `${p.field}: ${p.problem}`);
    const first = found[0] ?? { field: "(top level)", problem: "is not valid" };
    throw new InputError(
      `does not match the result format version ${RESULT_VERSION}: field ${first.field} ` +
        `${first.problem}` +
        (problems.length > 1 ? ` (and ${problems.length - 1} more problems)` : "") +
        "; the file may be damaged or hand-edited, re-run the campaign to make a new one",
      { where: `${source}: ${first.field}`, problems },
    );
  }
  return record as unknown as CampaignResult;
}

/**
 * Parses the text of a saved result and checks it with {@link checkResult}.
 *
 * @param text The file's text.
 * @param options Where it came from, for messages.
 * @returns The checked result.
 * @throws {InputError} When the text is not JSON or not a valid result.
 *
 * @example
 * ```ts
 * import { parseResult } from "./read.ts";
 * try {
 *   parseResult("{}", { source: "old.json" });
 * } catch (error) {
 *   console.assert(String(error).includes("not a gridproof result"));
 * }
 * ```
 */
export function parseResult(text: string, options: ParseResultOptions = {}): CampaignResult {
  let data: unknown;
  try {
    data = JSON.parse(text);
  } catch (error) {
    throw new InputError(
      `is not valid JSON (${(error as Error).message}); give the result.json that a gridproof ` +
        "run wrote",
      { where: options.source ?? "result" },
    );
  }
  return checkResult(data, options);
}

/**
 * Reads and checks a saved `result.json`.
 *
 * @param path The file to read.
 * @returns The checked result.
 * @throws {InputError} When the file cannot be read, is not JSON, or is not a valid result.
 *
 * @example
 * ```ts ignore
 * const result = await readResult("gridproof-demo/result.json");
 * ```
 */
export async function readResult(path: string): Promise<CampaignResult> {
  let text: string;
  try {
    text = await Deno.readTextFile(path);
  } catch (error) {
    const why = error instanceof Deno.errors.NotFound ? "no such file" : (error as Error).message;
    throw new InputError(`cannot read the result file (${why}); check the path`, {
      where: path,
    });
  }
  return parseResult(text, { source: path });
}
