/**
 * The JSON Schemas of the protocol messages (files in `schemas/`) compiled once with Ajv's 2020-12
 * validator, and a validator that reports every violation with its JSON path.
 *
 * @module
 */
import { Ajv2020, type ErrorObject } from "ajv/dist/2020";
import arraySchema from "./schemas/array.schema.json" with { type: "json" };
import helloSchema from "./schemas/hello.schema.json" with { type: "json" };
import goodbyeSchema from "./schemas/goodbye.schema.json" with { type: "json" };
import readySchema from "./schemas/ready.schema.json" with { type: "json" };
import solveSchema from "./schemas/solve.schema.json" with { type: "json" };
import solutionSchema from "./schemas/solution.schema.json" with { type: "json" };

/** Names of the protocol messages that have a schema. */
export type MessageName = "solve" | "solution" | "hello" | "ready" | "goodbye";

const ARRAY_ID = "urn:gridproof:protocol:1:array";

/** The raw schema documents by message name (plain JSON). */
export const MESSAGE_SCHEMAS: Readonly<Record<MessageName | "array", Record<string, unknown>>> = {
  array: arraySchema,
  solve: solveSchema,
  solution: solutionSchema,
  hello: helloSchema,
  ready: readySchema,
  goodbye: goodbyeSchema,
};

let ajv: Ajv2020 | undefined;

function compiled(name: MessageName) {
  if (!ajv) {
    ajv = new Ajv2020({ allErrors: true, strict: false });
    for (const schema of Object.values(MESSAGE_SCHEMAS)) ajv.addSchema(schema);
  }
  const validate = ajv.getSchema(`urn:gridproof:protocol:1:${name}`);
  if (!validate) throw new TypeError(`no schema compiled for message ${name}`);
  return validate;
}

function valueAt(data: unknown, pointer: string): unknown {
  let node = data;
  for (const raw of pointer.split("/").slice(1)) {
    const key = raw.replaceAll("~1", "/").replaceAll("~0", "~");
    if (node === null || typeof node !== "object") return undefined;
    node = (node as Record<string, unknown>)[key];
  }
  return node;
}

function describe(error: ErrorObject): string {
  const path = error.instancePath === "" ? "(top level)" : error.instancePath;
  let message = error.message ?? "is invalid";
  if (error.keyword === "const" || error.keyword === "enum") {
    const allowed = error.keyword === "const"
      ? [(error.params as { allowedValue: unknown }).allowedValue]
      : (error.params as { allowedValues: unknown[] }).allowedValues;
    message = `must be ${allowed.map((v) => JSON.stringify(v)).join(" or ")}`;
  } else if (error.keyword === "additionalProperties") {
    message = `has unknown field "${
      (error.params as { additionalProperty: string }).additionalProperty
    }"`;
  } else if (error.keyword === "required") {
    return `${path}: missing field "${
      (error.params as { missingProperty: string }).missingProperty
    }"`;
  }
  return `${path}: ${message}`;
}

/**
 * Validates a parsed message against its schema and lists every violation as
 * `"<JSON path>: <what is wrong>"`. An array field that is neither form gets one plain message
 * instead of Ajv's per-branch noise.
 *
 * @param name which message schema to use
 * @param data the parsed JSON
 * @returns the violations; empty when the message is valid
 *
 * @example
 * ```ts
 * import { validateMessage } from "./schemas.ts";
 * validateMessage("hello", { protocol: "gridproof-protocol/1", type: "hello" }); // []
 * ```
 */
export function validateMessage(name: MessageName, data: unknown): string[] {
  const validate = compiled(name);
  if (validate(data)) return [];
  const errors = validate.errors ?? [];
  const problems: string[] = [];
  // Paths whose array field failed both forms: keep only the branch matching the value's type.
  const arrayPaths = new Set(
    errors.filter((e: ErrorObject) => e.keyword === "oneOf" && e.schemaPath.startsWith(ARRAY_ID))
      .map((e: ErrorObject) => e.instancePath),
  );
  for (const error of errors) {
    if (error.keyword === "if") continue;
    if (error.schemaPath.startsWith(ARRAY_ID)) {
      const root = [...arrayPaths].find((p) =>
        error.instancePath === p || error.instancePath.startsWith(p + "/")
      );
      if (root !== undefined) {
        const value = valueAt(data, root);
        const isList = Array.isArray(value);
        const isObject = value !== null && typeof value === "object" && !isList;
        if (error.keyword === "oneOf") {
          if (!isList && !isObject) {
            problems.push(`${root}: must be an array of numbers or an object {"base64": text}`);
          }
          continue;
        }
        const branch = error.schemaPath.includes("/oneOf/0/") ? "list" : "object";
        if ((branch === "list" && !isList) || (branch === "object" && !isObject)) continue;
        // an object is checked against both object forms: report the form it tried to be
        if (branch === "object" && isObject) {
          const looksConstant = "constant" in (value as object);
          const isConstantBranch = error.schemaPath.includes("/oneOf/2/");
          if (looksConstant !== isConstantBranch) continue;
        }
      }
    }
    problems.push(describe(error));
  }
  return [...new Set(problems)];
}
