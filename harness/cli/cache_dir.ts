/**
 * The folder of the derivation cache (`cases/derive_cache.ts`) the commands use: the environment
 * variable `GRIDPROOF_CACHE_DIR` when set (`off` turns the cache off), else
 * `$XDG_CACHE_HOME/gridproof/derivations`, else `$HOME/.cache/gridproof/derivations`, else none.
 *
 * @module
 */

/**
 * The derivation cache folder, or undefined for no cache.
 *
 * @param env reads an environment variable. Default: `Deno.env.get` (undefined when not permitted)
 * @example
 * ```ts
 * import { derivationCacheDir } from "./cache_dir.ts";
 * derivationCacheDir((name) => ({ HOME: "/home/ada" } as Record<string, string>)[name]);
 * // "/home/ada/.cache/gridproof/derivations"
 * ```
 */
export function derivationCacheDir(
  env: (name: string) => string | undefined = readEnv,
): string | undefined {
  const chosen = env("GRIDPROOF_CACHE_DIR");
  if (chosen !== undefined && chosen !== "") return chosen === "off" ? undefined : chosen;
  const xdg = env("XDG_CACHE_HOME");
  if (xdg) return `${xdg}/gridproof/derivations`;
  const home = env("HOME");
  return home ? `${home}/.cache/gridproof/derivations` : undefined;
}

function readEnv(name: string): string | undefined {
  try {
    return Deno.env.get(name);
  } catch {
    return undefined;
  }
}
