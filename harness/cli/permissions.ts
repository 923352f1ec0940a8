/**
 * What each command may do. The npm script grants the union of what the commands need (read,
 * write, environment, subprocesses, host name); before a command runs, the command line gives up
 * every permission that command does not need, so a `cases show` or a `report` cannot start a
 * process or write a file whatever its input says.
 *
 * @module
 */

/** A Deno permission the npm script grants. */
export type GrantedPermission = "read" | "write" | "env" | "run" | "sys";

/** Every permission the npm script grants, and why (the README's table says the same). */
export const WHY_GRANTED: Readonly<Record<GrantedPermission, string>> = {
  read: "case files, solver files, saved results and journals, and the program's own modules",
  write: "the output folder (journal, result.json, reports), `--out` files, the derivation cache",
  env: "PATH, to find a solver's command, NO_COLOR, the derivation cache folder",
  run: "your solvers, util-linux `setsid` to give each its own process group, `kill`, and " +
    "`/bin/sh` with `cat` to list in /proc the processes a solver started; Chromium to print " +
    "`--format pdf`",
  sys: "the host name recorded in result.json",
};

/**
 * The permissions each command keeps. A command missing here keeps all of them (a new command
 * should be added with the least it needs).
 */
export const COMMAND_NEEDS: Readonly<Record<string, readonly GrantedPermission[]>> = {
  "cases": ["read"],
  "cases show": ["read"],
  "cases check": ["read"],
  "cases export": ["read", "write"],
  "check": ["read", "write", "env", "run", "sys"],
  "solve": ["read"],
  "report": ["read", "write", "env", "run"],
  "refine": ["read"],
  "probe": ["read", "env", "run"],
  "demo": ["read", "write", "env", "run", "sys"],
};

/**
 * Gives up, for the rest of the process, every granted permission the command does not need.
 *
 * @param command the command about to run, with its parents' names (`cases show`)
 * @returns the permissions given up
 */
export function narrowPermissions(command: string): GrantedPermission[] {
  const needs = COMMAND_NEEDS[command];
  if (needs === undefined) return [];
  const dropped: GrantedPermission[] = [];
  for (const name of Object.keys(WHY_GRANTED) as GrantedPermission[]) {
    if (needs.includes(name)) continue;
    // revoked whether granted in full or only for some names (`--allow-sys=hostname`)
    Deno.permissions.revokeSync({ name });
    dropped.push(name);
  }
  return dropped;
}
