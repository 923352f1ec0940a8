/**
 * Old field names of case files, still read: each is renamed to its new name in the parsed
 * document, with a deprecation warning naming the file, the old field and the new one. A file that
 * gives both the old and the new name of one field is refused (the two could disagree).
 *
 * Why the new names (docs/cases.md, "Renamed fields"):
 * - `aspect` → `intervalRatio`: the value is ny/nx, the ratio of interval counts, not the
 *   domain's aspect ratio (cells are square only when the two agree).
 * - `exact` (in `expected.*`) → `exactToRoundOff`: `exact` is also the exact solution at the top
 *   level; the flag says the scheme reproduces that solution to round-off.
 * - `observed` (in `expected.*`) → `achievable`: it holds the order theory says the scheme
 *   achieves in a norm, not a measured (observed) order.
 * - `tolerance` (in `expected.*`) → `orderTolerance`: the allowed order deviation, the case's own
 *   value of `check --order-tolerance`; not the residual tolerance asked of solvers.
 *
 * @module
 */
import type { CaseProblem } from "./case_file.ts";
import type { LocatedJson } from "./_json.ts";

/** One renamed field: where it may sit (JSON pointers of the objects holding it), old and new name. */
interface Rename {
  old: string;
  new: string;
}

/** Renames at the top level of a case file. */
const TOP: readonly Rename[] = [{ old: "aspect", new: "intervalRatio" }];

/** Renames in `expected.<scheme>` and `expected.<scheme>.layouts.<layout>`. */
const EXPECTATION: readonly Rename[] = [
  { old: "exact", new: "exactToRoundOff" },
  { old: "observed", new: "achievable" },
  { old: "tolerance", new: "orderTolerance" },
];

/** Every old name with its new one (for documentation and tests). */
export const OLD_FIELD_NAMES: Readonly<Record<string, string>> = Object.fromEntries(
  [...TOP, ...EXPECTATION].map((r) => [r.old, r.new]),
);

/** What {@link renameOldFields} found: deprecation warnings, and problems (both names given). */
export interface OldNameReading {
  warnings: CaseProblem[];
  problems: CaseProblem[];
}

function isObject(v: unknown): v is Record<string, unknown> {
  return typeof v === "object" && v !== null && !Array.isArray(v);
}

/** JSON pointer → dotted field path (the same rule as validate.ts's fieldPath, without arrays). */
function dotted(pointer: string): string {
  return pointer.split("/").slice(1).join(".");
}

/**
 * Renames the old field names of a parsed case file to the new ones, in place, and reports each
 * as a warning; a field given under both names is a problem and is left as it is (the caller
 * refuses the file). Keys keep their order. Never throws.
 *
 * @param value the parsed file (anything: a value that is not an object is left alone)
 * @param doc positions of keys and values, for the line and column of each message
 * @param file the file's name as it should appear in messages
 * @example
 * ```ts
 * import { readJsonWithPositions } from "./_json.ts";
 * import { renameOldFields } from "./old_names.ts";
 * const doc = readJsonWithPositions('{"aspect": 2}');
 * const { warnings } = renameOldFields(doc.value, doc, "my.json");
 * (doc.value as { intervalRatio: number }).intervalRatio; // 2
 * warnings[0].field; // "aspect"
 * ```
 */
export function renameOldFields(value: unknown, doc: LocatedJson, file: string): OldNameReading {
  const reading: OldNameReading = { warnings: [], problems: [] };
  if (!isObject(value)) return reading;
  const places: [string, Record<string, unknown>, readonly Rename[]][] = [["", value, TOP]];
  const expected = value.expected;
  if (isObject(expected)) {
    for (const [scheme, e] of Object.entries(expected)) {
      if (!isObject(e)) continue;
      places.push([`/expected/${scheme}`, e, EXPECTATION]);
      if (!isObject(e.layouts)) continue;
      for (const [layout, o] of Object.entries(e.layouts)) {
        if (isObject(o)) places.push([`/expected/${scheme}/layouts/${layout}`, o, EXPECTATION]);
      }
    }
  }
  for (const [pointer, holder, renames] of places) {
    for (const r of renames) {
      if (!Object.hasOwn(holder, r.old)) continue;
      const oldPointer = `${pointer}/${r.old}`;
      const pos = doc.keyPositions.get(oldPointer) ?? doc.positions.get(oldPointer);
      const at = pos ? { line: pos.line, column: pos.column } : {};
      if (Object.hasOwn(holder, r.new)) {
        reading.problems.push({
          file,
          field: dotted(oldPointer),
          ...at,
          message: `both "${r.old}" (the old name) and "${r.new}" are given; they name the ` +
            `same field: keep "${r.new}" and remove "${r.old}"`,
        });
        continue;
      }
      reading.warnings.push({
        file,
        field: dotted(oldPointer),
        ...at,
        message: `deprecated field name "${r.old}": rename it to "${r.new}" (same meaning; the ` +
          "old name is still read for now)",
      });
      renameKey(holder, r.old, r.new);
      copyPositions(doc, oldPointer, `${pointer}/${r.new}`);
    }
  }
  return reading;
}

/** Renames one key of an object in place, keeping the order of the keys. */
function renameKey(holder: Record<string, unknown>, old: string, name: string): void {
  const entries = Object.entries(holder).map(([k, v]) => [k === old ? name : k, v] as const);
  for (const k of Object.keys(holder)) delete holder[k];
  for (const [k, v] of entries) holder[k] = v;
}

/** Positions under the old pointer, copied under the new one (later messages use the new name). */
function copyPositions(doc: LocatedJson, from: string, to: string): void {
  for (const map of [doc.positions, doc.keyPositions]) {
    for (const [pointer, pos] of [...map]) {
      if (pointer === from || pointer.startsWith(`${from}/`)) {
        map.set(to + pointer.slice(from.length), pos);
      }
    }
  }
}
