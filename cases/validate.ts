/**
 * Validation of case file text at the door: strict JSON with positions, the JSON Schema
 * (`case.schema.json`, draft 2020-12, checked by Ajv with every error collected), then the rules a
 * schema cannot say (x0 < x1, increasing grids, reserved parameter names, a layout override that
 * changes nothing). Expressions are checked later, by the engine, with mathjs.
 *
 * @module
 */
import { CYCLE_NAMES, SMOOTHERS } from "../reference-solver/mod.ts";
import { Ajv2020, type ErrorObject, type ValidateFunction } from "ajv/dist/2020";
import schema from "./case.schema.json" with { type: "json" };
import { formProblems } from "./form_rules.ts";
import { JsonSyntaxError, type LocatedJson, readJsonWithPositions } from "./_json.ts";
import { closestName } from "./_suggest.ts";
import { ALLOWED_FUNCTIONS } from "./expression.ts";
import type { CaseFile, CaseProblem } from "./case_file.ts";
import { quantityProblems } from "./validate_quantities.ts";
import { OLD_FIELD_NAMES, renameOldFields } from "./old_names.ts";

let validator: ValidateFunction | undefined;

function schemaValidator(): ValidateFunction {
  validator ??= new Ajv2020({
    allErrors: true,
    verbose: true,
    strict: true,
    allowUnionTypes: true,
    // `then: { required: [alpha, beta] }` names properties declared beside `if`, not inside `then`
    strictRequired: false,
  }).compile(schema);
  return validator;
}

/** JSON pointer → dotted field path (`/coefficients/a` → `coefficients.a`, `/grids/2` → `grids[2]`). */
export function fieldPath(pointer: string): string {
  let out = "";
  for (const raw of pointer.split("/").slice(1)) {
    const token = raw.replaceAll("~1", "/").replaceAll("~0", "~");
    out += /^\d+$/.test(token) ? `[${token}]` : out ? `.${token}` : token;
  }
  return out;
}

/** The result of validating case file text: the case when valid, and every problem found. */
export interface CaseValidation {
  value?: CaseFile;
  problems: CaseProblem[];
  /**
   * Deprecation warnings: old field names read under their new names (`old_names.ts`). Library
   * code never prints; the CLI shows them.
   */
  warnings: CaseProblem[];
  /** Positions of values and keys in the text, for later messages (absent for malformed JSON). */
  located?: LocatedJson;
}

function describeValue(v: unknown): string {
  if (typeof v === "string") return `"${v.length > 40 ? v.slice(0, 40) + "…" : v}"`;
  if (Array.isArray(v)) return "an array";
  if (v === null) return "null";
  if (typeof v === "object") return "an object";
  return String(v);
}

function schemaProblems(file: string, doc: LocatedJson, errors: ErrorObject[]): CaseProblem[] {
  const problems: CaseProblem[] = [];
  const suggestedFor = new Set<string>();
  const at = (pointer: string, key = false) => {
    const pos = (key ? doc.keyPositions.get(pointer) : undefined) ?? doc.positions.get(pointer);
    return pos ? { line: pos.line, column: pos.column } : {};
  };
  // first pass: unknown fields, remembering which missing field each one probably meant
  for (const e of errors) {
    if (e.keyword !== "additionalProperties") continue;
    const name = String((e.params as { additionalProperty: string }).additionalProperty);
    // deprecated old names (old_names.ts) are read but not offered
    const valid = Object.entries(
      (e.parentSchema as { properties?: Record<string, { deprecated?: boolean }> }).properties ??
        {},
    ).filter(([, p]) => p.deprecated !== true).map(([key]) => key);
    const pointer = `${e.instancePath}/${name}`;
    if (name === "grids" && LAYOUT_OVERRIDE.test(e.instancePath)) {
      const scheme = e.instancePath.split("/")[2];
      problems.push({
        file,
        field: fieldPath(pointer),
        ...at(pointer, true),
        message: `grids cannot be set per layout: every layout of a scheme uses the same grids; ` +
          `move them to expected.${scheme}.grids or remove them (valid fields here: ${
            valid.join(", ")
          })`,
      });
      continue;
    }
    // a misspelled old name (e.g. "tolerence") is pointed to the new name
    const nearOld = closestName(name, Object.keys(OLD_FIELD_NAMES));
    const near = closestName(name, valid) ??
      (nearOld !== undefined && valid.includes(OLD_FIELD_NAMES[nearOld])
        ? OLD_FIELD_NAMES[nearOld]
        : undefined);
    if (near) suggestedFor.add(`${e.instancePath}/${near}`);
    problems.push({
      file,
      field: fieldPath(pointer),
      ...at(pointer, true),
      message: `unknown field "${name}"${
        near ? `; did you mean "${near}"?` : ""
      } (valid fields here: ${valid.join(", ")})`,
    });
  }
  for (const e of errors) {
    const pointer = e.instancePath;
    const field = fieldPath(pointer);
    switch (e.keyword) {
      case "additionalProperties":
      case "if":
        continue;
      case "required": {
        const missing = String((e.params as { missingProperty: string }).missingProperty);
        const child = `${pointer}/${missing}`;
        if (suggestedFor.has(child)) continue; // reported as a misspelling above
        const description =
          ((e.parentSchema as { properties?: Record<string, { description?: string }> }).properties
            ?.[missing]?.description) ?? "";
        problems.push({
          file,
          field: fieldPath(child),
          ...at(pointer),
          message: `missing field "${missing}"${description ? ` (${description})` : ""}`,
        });
        continue;
      }
      case "not":
        problems.push({
          file,
          field,
          ...at(pointer),
          message: "alpha and beta belong to robin sides only; remove them or set kind to robin",
        });
        continue;
      case "enum": {
        const allowed = (e.params as { allowedValues: unknown[] }).allowedValues.map(String);
        const near = typeof e.data === "string" ? closestName(e.data, allowed) : undefined;
        problems.push({
          file,
          field,
          ...at(pointer),
          message: `${describeValue(e.data)} is not allowed${
            near ? `; did you mean "${near}"?` : ""
          } (allowed: ${allowed.join(", ")})`,
        });
        continue;
      }
      case "type":
        problems.push({
          file,
          field,
          ...at(pointer),
          message: `must be ${
            String((e.params as { type: unknown }).type).replace(",", " or ")
          }, found ${describeValue(e.data)}`,
        });
        continue;
      default: {
        const description = (e.parentSchema as { description?: string } | undefined)?.description;
        problems.push({
          file,
          field,
          ...at(pointer),
          message: `${e.message ?? "is not valid"}, found ${describeValue(e.data)}${
            description ? ` (${description})` : ""
          }`,
        });
      }
    }
  }
  return problems;
}

/** JSON pointer of one layout's override, `/expected/<scheme>/layouts/<layout>`. */
const LAYOUT_OVERRIDE = /^\/expected\/[^/]+\/layouts\/[^/]+$/;

const RESERVED = new Set(["x", "y", "pi", "e", ...Object.keys(ALLOWED_FUNCTIONS)]);

/** Largest |coordinate| of a domain corner: beyond it the grid spacing loses its digits. */
export const MAX_DOMAIN_COORDINATE = 1e6;
/** Smallest width (and height) of a domain, relative to max(1, |x0|, |x1|) along that side. */
export const MIN_DOMAIN_WIDTH = 1e-6;

/**
 * The domain's own problems, as [JSON pointer, message]: corners finite and within
 * ±{@link MAX_DOMAIN_COORDINATE}, x0 < x1 and y0 < y1, and each side at least
 * {@link MIN_DOMAIN_WIDTH} · max(1, |lower|, |upper|) long, so that a spacing of 1/n of it is
 * far above the rounding of the coordinates.
 */
function domainProblems(domain: CaseFile["domain"]): [string, string][] {
  const problems: [string, string][] = [];
  const fix = "shift and scale the case to a domain near the origin, e.g. [0, 1] × [0, 1]";
  let bounded = true;
  for (const key of ["x0", "x1", "y0", "y1"] as const) {
    const v = domain[key];
    if (!Number.isFinite(v) || Math.abs(v) > MAX_DOMAIN_COORDINATE) {
      bounded = false;
      problems.push([
        `/domain/${key}`,
        `${key} = ${v} is outside [-${MAX_DOMAIN_COORDINATE}, ${MAX_DOMAIN_COORDINATE}]: ` +
        `coordinates that large leave too few digits for the grid spacing; ${fix}`,
      ]);
    }
  }
  if (!bounded) return problems;
  for (const [lo, hi] of [["x0", "x1"], ["y0", "y1"]] as const) {
    const width = domain[hi] - domain[lo];
    const least = MIN_DOMAIN_WIDTH * Math.max(1, Math.abs(domain[lo]), Math.abs(domain[hi]));
    if (!(domain[lo] < domain[hi])) {
      problems.push([
        "/domain",
        `${lo} must be less than ${hi}, found ${lo} = ${domain[lo]}, ${hi} = ${domain[hi]}`,
      ]);
    } else if (width < least) {
      problems.push([
        "/domain",
        `${hi} − ${lo} = ${width.toPrecision(3)} is less than ${MIN_DOMAIN_WIDTH} · max(1, ` +
        `|${lo}|, |${hi}|) = ${least.toPrecision(3)}: the grid spacing would be lost in the ` +
        `rounding of the coordinates; ${fix}`,
      ]);
    }
  }
  return problems;
}

function ruleProblems(file: string, doc: LocatedJson, c: CaseFile): CaseProblem[] {
  const problems: CaseProblem[] = [];
  const push = (pointer: string, message: string, field?: string) => {
    const pos = doc.positions.get(pointer);
    problems.push({
      file,
      field: field ?? fieldPath(pointer),
      ...(pos ? { line: pos.line, column: pos.column } : {}),
      message,
    });
  };
  for (const [pointer, message] of domainProblems(c.domain)) push(pointer, message);
  for (const [pointer, message, field] of formProblems(c)) push(pointer, message, field);
  for (const [pointer, message] of quantityProblems(c)) push(pointer, message);
  // The reference solver's advice names components of its registries: refuse an unknown name at
  // the door, before any solve, with the valid ones.
  const advice = c.solver;
  if (advice?.smoother !== undefined && !Object.hasOwn(SMOOTHERS, advice.smoother)) {
    push(
      "/solver/smoother",
      `unknown smoother "${advice.smoother}": use one of ${Object.keys(SMOOTHERS).join(", ")}`,
    );
  }
  if (advice?.cycle !== undefined && !(CYCLE_NAMES as readonly string[]).includes(advice.cycle)) {
    push(
      "/solver/cycle",
      `unknown cycle "${advice.cycle}": use one of ${CYCLE_NAMES.join(", ")}`,
    );
  }
  const ratio = c.intervalRatio ?? 1;
  const sequences: [string, number[]][] = [["/grids", c.grids]];
  for (const scheme of ["central", "upwind"] as const) {
    const grids = c.expected[scheme]?.grids;
    if (grids) sequences.push([`/expected/${scheme}/grids`, grids]);
  }
  for (const [pointer, grids] of sequences) {
    for (let k = 1; k < grids.length; k++) {
      if (!(grids[k] > grids[k - 1])) {
        push(`${pointer}/${k}`, `grids must increase, found ${grids[k]} after ${grids[k - 1]}`);
      }
    }
    for (let k = 0; k < grids.length; k++) {
      if (Math.round(grids[k] * ratio) < 2) {
        push(
          `${pointer}/${k}`,
          `grid ${grids[k]} gives ny = round(${grids[k]} · intervalRatio ${ratio}) < 2; use ` +
            "larger grids",
        );
      }
    }
  }
  for (const scheme of ["central", "upwind"] as const) {
    for (const [layout, override] of Object.entries(c.expected[scheme]?.layouts ?? {})) {
      if (Object.keys(override).some((key) => key !== "reason")) continue;
      push(
        `/expected/${scheme}/layouts/${layout}`,
        `the ${layout} override changes nothing, it has only a reason; add the fields that ` +
          "differ for this layout (formal, achievable, exactToRoundOff, orderTolerance) or remove " +
          "the override",
      );
    }
  }
  for (const name of Object.keys(c.parameters ?? {})) {
    if (RESERVED.has(name)) {
      push(
        `/parameters/${name}`,
        `parameter name "${name}" is reserved (x, y, pi, e and function names); rename it`,
      );
    }
  }
  for (const side of ["west", "east", "south", "north"] as const) {
    const s = c.boundary[side];
    if (s.kind === "robin" && s.alpha === 0 && s.beta === 0) {
      push(`/boundary/${side}`, "robin needs alpha and beta not both 0");
    }
  }
  for (
    const [one, other] of [["west", "east"], ["east", "west"], ["south", "north"], [
      "north",
      "south",
    ]] as const
  ) {
    if (c.boundary[one].kind === "periodic" && c.boundary[other].kind !== "periodic") {
      push(
        `/boundary/${one}`,
        `a periodic side comes in a pair: ${one} is periodic but its partner ${other} is ` +
          `${c.boundary[other].kind}; make ${other} periodic too, or give ${one} another kind`,
      );
    }
  }
  const sides = ["west", "east", "south", "north"] as const;
  if (c.interfaces !== undefined && sides.some((s) => c.boundary[s].kind === "periodic")) {
    push(
      "/boundary",
      "periodic sides are not supported with interfaces yet; remove the interfaces or make " +
        "the sides non-periodic",
    );
  }
  return problems;
}

/**
 * Validates the text of a case file and returns every problem at once (never throws for bad
 * input): malformed JSON with line and column, schema errors with the field path and position,
 * misspelled fields with the closest valid name, and cross-field rules.
 *
 * @param text the file's content
 * @param file the file's name as it should appear in messages
 * @example
 * ```ts
 * import { validateCaseText } from "./validate.ts";
 * const { problems } = validateCaseText('{"id": "x"', "my.json");
 * problems[0].line; // 1
 * ```
 */
export function validateCaseText(text: string, file: string): CaseValidation {
  let doc: LocatedJson;
  try {
    doc = readJsonWithPositions(text);
  } catch (error) {
    if (error instanceof JsonSyntaxError) {
      return {
        warnings: [],
        problems: [{
          file,
          field: "",
          line: error.position.line,
          column: error.position.column,
          message: `malformed JSON: ${error.message}`,
        }],
      };
    }
    throw error;
  }
  // old names become new ones before the schema (which still accepts both, for editors)
  const { warnings, problems: both } = renameOldFields(doc.value, doc, file);
  const validate = schemaValidator();
  if (!validate(doc.value)) {
    return {
      problems: [...both, ...schemaProblems(file, doc, validate.errors ?? [])],
      warnings,
      located: doc,
    };
  }
  const value = doc.value as CaseFile;
  const problems = [...both, ...ruleProblems(file, doc, value)];
  return problems.length
    ? { problems, warnings, located: doc }
    : { value, problems, warnings, located: doc };
}
