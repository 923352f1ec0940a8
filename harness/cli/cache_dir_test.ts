import assert from "node:assert/strict";
import { derivationCacheDir } from "./cache_dir.ts";

// Expected folders follow the XDG Base Directory specification ($XDG_CACHE_HOME, falling back to
// $HOME/.cache), recalled from memory; GRIDPROOF_CACHE_DIR is our own override.
Deno.test("derivationCacheDir() takes GRIDPROOF_CACHE_DIR, then XDG_CACHE_HOME, then HOME/.cache", () => {
  const env = (vars: Record<string, string>) => (name: string) => vars[name];
  const rows: [Record<string, string>, string | undefined][] = [
    [{ GRIDPROOF_CACHE_DIR: "c", XDG_CACHE_HOME: "/x", HOME: "/h" }, "c"],
    [{ GRIDPROOF_CACHE_DIR: "off", HOME: "/h" }, undefined],
    [{ GRIDPROOF_CACHE_DIR: "", XDG_CACHE_HOME: "/x", HOME: "/h" }, "/x/gridproof/derivations"],
    [{ HOME: "/h" }, "/h/.cache/gridproof/derivations"],
    [{}, undefined],
  ];
  for (const [vars, expected] of rows) assert.equal(derivationCacheDir(env(vars)), expected);
});
