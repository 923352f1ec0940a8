/**
 * Each command keeps only the permissions it needs: checked in a real Deno process started with
 * everything the npm script grants, by asking Deno itself for the permission states afterwards.
 */
import assert from "node:assert/strict";
import { CLI_PERMISSIONS, runGridproof } from "../../testing/cli.ts";
import { COMMAND_NEEDS, type GrantedPermission, WHY_GRANTED } from "./permissions.ts";

const ALL = Object.keys(WHY_GRANTED) as GrantedPermission[];

async function statesAfter(command: string): Promise<Record<string, string>> {
  const module = new URL("./permissions.ts", import.meta.url).href;
  const script = `import { narrowPermissions } from ${JSON.stringify(module)};
narrowPermissions(${JSON.stringify(command)});
const states = {};
for (const name of ${
    JSON.stringify(ALL)
  }) states[name] = Deno.permissions.querySync({ name }).state;
console.log(JSON.stringify(states));`;
  const out = await new Deno.Command(Deno.execPath(), {
    args: ["eval", "--quiet", "--ext=ts", script],
    stdout: "piped",
    stderr: "piped",
  }).output();
  assert.equal(out.code, 0, new TextDecoder().decode(out.stderr));
  return JSON.parse(new TextDecoder().decode(out.stdout));
}

Deno.test("the npm script grants exactly the permissions the table explains", () => {
  // package.json's gridproof script, read as text: every flag it grants has a reason
  const scripts = JSON.parse(Deno.readTextFileSync(new URL("../../package.json", import.meta.url)))
    .scripts as Record<string, string>;
  const granted = [...scripts.gridproof.matchAll(/--allow-([a-z]+)/g)].map((m) => m[1]).sort();
  assert.deepEqual(granted, [...ALL].sort());
  assert.deepEqual(CLI_PERMISSIONS.map((flag) => flag.slice("--allow-".length)).sort(), granted);
});

for (const command of ["cases show", "cases export", "solve", "report", "probe", "check"]) {
  Deno.test(`\`${command}\` keeps only ${COMMAND_NEEDS[command].join(", ")}`, async () => {
    const states = await statesAfter(command);
    for (const name of ALL) {
      const expected = COMMAND_NEEDS[command].includes(name) ? "granted" : "prompt";
      assert.equal(states[name], expected, `${command}: --allow-${name}`);
    }
  });
}

Deno.test("--version prints the version package.json names", async () => {
  const pkg = JSON.parse(Deno.readTextFileSync(new URL("../../package.json", import.meta.url)));
  const run = await runGridproof(["--version"]);
  assert.equal(run.code, 0);
  assert.equal(run.stdout.trim(), `gridproof ${pkg.version}`);
});
