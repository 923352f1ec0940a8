/**
 * The README names the oldest Node.js the project runs on; every package `npm ci` installs must
 * accept it, or `npm ci` warns EBADENGINE there (and a package may use features that Node lacks).
 * The ranges come from each package's own `engines` field as npm recorded it in
 * package-lock.json; the range grammar is npm's (semver: `>=`, `^`, `x.*`, `*`, `||`).
 */
import assert from "node:assert/strict";

const ROOT = new URL("../../", import.meta.url);

type Version = [number, number, number];

function parse(text: string): Version {
  const [a, b, c] = text.replace(/\.\*$/, "").split(".").map((x) => Number(x));
  return [a, Number.isFinite(b) ? b : 0, Number.isFinite(c) ? c : 0];
}

function compare(p: Version, q: Version): number {
  return p[0] - q[0] || p[1] - q[1] || p[2] - q[2];
}

/** Whether `version` satisfies one comparator set of npm's range grammar (the forms in use). */
function satisfiesPart(version: Version, part: string): boolean {
  const text = part.trim().replace(/^(>=|<=|>|<|\^|~)\s+/, "$1");
  if (text === "*" || text === "") return true;
  const m = /^(>=|<=|>|<|\^|~)?(\d+(?:\.\d+)?(?:\.\d+)?(?:\.\*)?)$/.exec(text);
  if (!m) throw new Error(`range form not handled by this test: ${part}`);
  const [, op, ver] = m;
  const v = parse(ver);
  if (op === ">=") return compare(version, v) >= 0;
  if (op === ">") return compare(version, v) > 0;
  if (op === "<=") return compare(version, v) <= 0;
  if (op === "<") return compare(version, v) < 0;
  if (op === "^") return version[0] === v[0] && compare(version, v) >= 0;
  if (op === "~") return version[0] === v[0] && version[1] === v[1] && compare(version, v) >= 0;
  // a bare version: `8.*` is any 8.x, `20` any 20.x.y
  const parts = ver.replace(/\.\*$/, "").split(".").length;
  return version.slice(0, parts).every((x, k) => x === v[k]);
}

function satisfies(version: Version, range: string): boolean {
  return range.split("||").some((part) => satisfiesPart(version, part));
}

Deno.test("every installed package accepts the oldest Node.js the README names", () => {
  const readme = Deno.readTextFileSync(new URL("README.md", ROOT));
  const named = /Node\.js \((\d+\.\d+(?:\.\d+)?) or later\)/.exec(readme);
  assert.ok(named, "the README's quick start names the oldest Node.js it supports");
  const oldest = parse(named[1]);
  const pkg = JSON.parse(Deno.readTextFileSync(new URL("package.json", ROOT)));
  assert.equal(pkg.engines?.node, `>=${named[1]}${named[1].split(".").length === 2 ? ".0" : ""}`);
  const lock = JSON.parse(Deno.readTextFileSync(new URL("package-lock.json", ROOT)));
  const refused: string[] = [];
  for (
    const [path, entry] of Object.entries(
      lock.packages as Record<string, { engines?: { node?: unknown } }>,
    )
  ) {
    const range = entry.engines?.node;
    if (path === "" || typeof range !== "string") continue;
    if (!satisfies(oldest, range)) refused.push(`${path} (${range})`);
  }
  assert.deepEqual(refused, [], `packages that refuse Node ${named[1]}`);
});

Deno.test("the range reading of this test agrees with npm's on known answers", () => {
  // npm's semver documentation: ^20.19.0 is >=20.19.0 <21; 6.* is any 6.x
  assert.equal(satisfies([20, 19, 0], "^20.19.0 || ^22.12.0 || >=23"), true);
  assert.equal(satisfies([20, 18, 9], "^20.19.0 || ^22.12.0 || >=23"), false);
  assert.equal(satisfies([22, 11, 0], "^20.19.0 || ^22.12.0 || >=23"), false);
  assert.equal(satisfies([20, 19, 0], ">=22.12.0"), false);
  assert.equal(satisfies([20, 19, 0], "6.* || 8.* || >= 10.*"), true);
  assert.equal(satisfies([7, 0, 0], "6.* || 8.* || >= 10.*"), false);
});
