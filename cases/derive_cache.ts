/**
 * The derivation cache: a folder of JSON files, one per derived case, so a case is parsed,
 * differentiated and simplified by mathjs once and later runs compile it straight from its
 * {@link Derivation} without loading mathjs.
 *
 * An entry's name is the SHA-256 of everything that determines the derivation: the validated case
 * file, the parameter values after overrides, the text of the engine's source files (`cases/*.ts`,
 * so any change of the engine misses) and the version of mathjs. An entry repeats its key and
 * carries the SHA-256 of its body; an entry whose key, digest or shape does not match is ignored
 * (and rewritten by the next build), never trusted. Writes go to a temporary file renamed into
 * place, so a reader never sees half an entry.
 *
 * @module
 */
import type { CaseFile } from "./case_file.ts";
import { type Derivation, isDerivation, type ReadableFormulas } from "./derivation.ts";

/** Format of the entries; bumped when their layout changes. */
const FORMAT = 1;

/** What the cache keeps per case. */
export interface CacheEntry {
  derivation: Derivation;
  formulas: ReadableFormulas;
}

async function sha256(text: string): Promise<string> {
  const bytes = await crypto.subtle.digest("SHA-256", new TextEncoder().encode(text));
  return [...new Uint8Array(bytes)].map((b) => b.toString(16).padStart(2, "0")).join("");
}

let engineFingerprint: Promise<string | undefined> | undefined;

/** The digest of the engine's sources and the mathjs version, or undefined when unreadable. */
function engine(): Promise<string | undefined> {
  engineFingerprint ??= (async () => {
    try {
      const folder = new URL("./", import.meta.url);
      const names: string[] = [];
      for await (const e of Deno.readDir(folder)) {
        if (e.isFile && e.name.endsWith(".ts") && !e.name.endsWith("_test.ts")) names.push(e.name);
      }
      names.sort();
      const parts = [`format ${FORMAT}`];
      for (const name of names) {
        parts.push(name, await Deno.readTextFile(new URL(name, folder)));
      }
      const mathjs = new URL("../../package.json", import.meta.resolve("mathjs"));
      parts.push(`mathjs ${JSON.parse(await Deno.readTextFile(mathjs)).version}`);
      return await sha256(parts.join("\u0000"));
    } catch {
      // sources or mathjs's package file not readable (a bundled build): no cache
      return undefined;
    }
  })();
  return engineFingerprint;
}

/**
 * The cache key of a case: undefined when the engine cannot be fingerprinted (then nothing is
 * cached).
 */
export async function derivationKey(
  caseFile: CaseFile,
  parameters: Record<string, number>,
): Promise<string | undefined> {
  const fingerprint = await engine();
  if (fingerprint === undefined) return undefined;
  const sorted = Object.fromEntries(Object.entries(parameters).sort(([p], [q]) => p < q ? -1 : 1));
  return await sha256(JSON.stringify([fingerprint, caseFile, sorted]));
}

// -0, NaN and ±Infinity do not survive JSON: they are written as tagged strings
function replacer(_key: string, value: unknown): unknown {
  if (typeof value !== "number") return value;
  if (Object.is(value, -0)) return "#-0";
  return Number.isFinite(value) ? value : `#${value}`;
}

function reviver(_key: string, value: unknown): unknown {
  if (typeof value !== "string" || !value.startsWith("#")) return value;
  const special: Record<string, number> = {
    "#-0": -0,
    "#NaN": NaN,
    "#Infinity": Infinity,
    "#-Infinity": -Infinity,
  };
  return Object.hasOwn(special, value) ? special[value] : value;
}

function entryPath(folder: string, key: string): string {
  return `${folder.replace(/[\\/]+$/, "")}/${key}.json`;
}

function isFormulas(value: unknown): value is ReadableFormulas {
  if (typeof value !== "object" || value === null) return false;
  const v = value as Record<string, Record<string, unknown> | undefined>;
  return ["text", "tex"].every((k) =>
    typeof v[k] === "object" && v[k] !== null && typeof v[k]!.source === "string" &&
    typeof v[k]!.exact === "string" && typeof v[k]!.boundary === "object"
  );
}

/**
 * Reads the entry of a key; undefined when there is none or it is corrupt or foreign.
 *
 * @param folder the cache folder
 * @param key from {@link derivationKey}
 */
export async function readCacheEntry(folder: string, key: string): Promise<CacheEntry | undefined> {
  let text: string;
  try {
    text = await Deno.readTextFile(entryPath(folder, key));
  } catch {
    return undefined;
  }
  try {
    const outer = JSON.parse(text);
    if (outer?.format !== FORMAT || outer.key !== key || typeof outer.body !== "string") {
      return undefined;
    }
    if (await sha256(outer.body) !== outer.digest) return undefined;
    const body = JSON.parse(outer.body, reviver);
    if (!isDerivation(body?.derivation) || !isFormulas(body?.formulas)) return undefined;
    return { derivation: body.derivation, formulas: body.formulas };
  } catch {
    return undefined;
  }
}

/**
 * Writes the entry of a key (creating the folder). A failure to write is ignored: the cache only
 * saves time, and the case was derived anyway.
 */
export async function writeCacheEntry(
  folder: string,
  key: string,
  entry: CacheEntry,
): Promise<void> {
  try {
    await Deno.mkdir(folder, { recursive: true });
    const body = JSON.stringify(entry, replacer);
    const text = JSON.stringify({ format: FORMAT, key, digest: await sha256(body), body });
    const path = entryPath(folder, key);
    const temporary = `${path}.${crypto.randomUUID()}.tmp`;
    await Deno.writeTextFile(temporary, text);
    await Deno.rename(temporary, path);
  } catch {
    // read-only or full disk: run without the cache
  }
}
