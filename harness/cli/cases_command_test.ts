import assert from "node:assert/strict";
import { runGridproof as runCli } from "../../testing/mod.ts";

const fixture = (name: string) => `testdata/cases/${name}`;

/** Asserts a bad-input run: exit code 2, every pattern in stderr, and no stack trace. */
function assertBadInput(run: { code: number; stderr: string }, patterns: RegExp[]) {
  assert.equal(run.code, 2, run.stderr);
  for (const p of patterns) assert.match(run.stderr, p);
  assert.doesNotMatch(run.stderr, /\n\s+at .*\.ts:\d+/, "no stack trace");
}

Deno.test("gridproof cases lists the library as a table and as JSON", async () => {
  const table = await runCli(["cases"]);
  assert.equal(table.code, 0, table.stderr);
  assert.match(table.stdout, /^id\s+title\s+W E S N\s+order\s+tags/);
  assert.match(table.stdout, /weak-singularity .* N D D D {2}2 \(max 1\.5, l2 1\.5, l1 1\.5\)/);
  const json = await runCli(["cases", "--json"]);
  const rows = JSON.parse(json.stdout);
  assert.ok(rows.length >= 14);
  for (const key of ["id", "title", "expectedOrder", "boundary", "tags"]) {
    assert.ok(key in rows[0], key);
  }
  const exact = rows.find((r: { id: string }) => r.id === "quadratic-exact");
  assert.equal(exact.exact, true);
});

Deno.test("gridproof cases show prints the operator, exact solution, source and boundary data", async () => {
  const run = await runCli(["cases", "show", "neumann-all"]);
  assert.equal(run.code, 0, run.stderr);
  for (
    const p of [
      /Operator: a·u_xx/,
      /u = cos\(pi \* x\) \* exp\(y\) \+ sin\(x \* y\)/,
      /f = /,
      /west \(x = 0\), neumann: ∂u\/∂n = /,
    ]
  ) {
    assert.match(run.stdout, p);
  }
  const tex = await runCli(["cases", "show", "smooth-baseline", "--tex"]);
  assert.match(tex.stdout, /\\sin\\left\(/);
});

Deno.test("gridproof cases show refuses an unknown case with the list of valid ones", async () => {
  const run = await runCli(["cases", "show", "smooth-basline"]);
  assertBadInput(run, [
    /unknown case "smooth-basline" \(did you mean "smooth-baseline"\?\)/,
    /quadratic-exact/,
  ]);
});

Deno.test("gridproof cases check passes a good file with exit code 0", async () => {
  const run = await runCli(["cases", "check", fixture("good.json")]);
  assert.equal(run.code, 0, run.stderr);
  assert.match(run.stdout, /ok: testdata\/cases\/good\.json/);
});

Deno.test("gridproof cases check passes an old-name file with located deprecation warnings", async () => {
  // docs/cases.md, "Renamed fields": old names are read, with one warning per old field
  const run = await runCli(["cases", "check", fixture("old-names.json")]);
  assert.equal(run.code, 0, run.stderr);
  assert.match(run.stdout, /ok: testdata\/cases\/old-names\.json/);
  assert.match(
    run.stderr,
    /^gridproof: warning: testdata\/cases\/old-names\.json:13:3: aspect: deprecated field name "aspect": rename it to "intervalRatio"/m,
  );
  assert.match(
    run.stderr,
    /old-names\.json:\d+:\d+: expected\.central\.layouts\.cell\.observed: deprecated field name "observed": rename it to "achievable"/,
  );
  assert.equal(run.stderr.match(/gridproof: warning: /g)?.length, 8, run.stderr);
  const renamed = await runCli(["cases", "check", fixture("new-names.json")]);
  assert.equal(renamed.code, 0, renamed.stderr);
  assert.equal(renamed.stderr, "");
});

Deno.test("gridproof cases check refuses a file giving both the old and the new name", async () => {
  const dir = await Deno.makeTempDir();
  const doc = JSON.parse(await Deno.readTextFile(fixture("new-names.json")));
  await Deno.writeTextFile(`${dir}/both.json`, JSON.stringify({ aspect: 2, ...doc }, null, 2));
  assertBadInput(await runCli(["cases", "check", `${dir}/both.json`]), [
    /both\.json:2:3: aspect: both "aspect" \(the old name\) and "intervalRatio" are given; they name the same field: keep "intervalRatio" and remove "aspect"/,
  ]);
  await Deno.remove(dir, { recursive: true });
});

Deno.test("gridproof cases check: malformed JSON names the line and column", async () => {
  assertBadInput(await runCli(["cases", "check", fixture("malformed-json.txt")]), [
    /malformed-json\.txt:46:3: malformed JSON: expected ',' or '}' after a field value/,
  ]);
});

Deno.test("gridproof cases check: a misspelled field gets the closest valid name", async () => {
  assertBadInput(await runCli(["cases", "check", fixture("misspelled.json")]), [
    /misspelled\.json:\d+:\d+: coeficients: unknown field "coeficients"; did you mean "coefficients"\?/,
  ]);
});

Deno.test("gridproof cases check: a missing field is named with what it means", async () => {
  assertBadInput(await runCli(["cases", "check", fixture("missing-field.json")]), [
    /missing-field\.json:1:1: exact: missing field "exact" \(The manufactured exact solution/,
  ]);
});

Deno.test("gridproof cases check: a syntax error shows the column and the expression", async () => {
  assertBadInput(await runCli(["cases", "check", fixture("syntax-error.json")]), [
    /syntax-error\.json:20:30: exact: column 18 of the expression: syntax error: Parenthesis \) expected/,
    /sin\(pi\*x \* exp\(y\)\n\s+\^/,
  ]);
});

Deno.test("gridproof cases check: an unknown symbol lists the allowed names", async () => {
  assertBadInput(await runCli(["cases", "check", fixture("unknown-symbol.json")]), [
    /exact: column 8 of the expression: unknown name "z"/,
    /allowed names: x, y, pi, e; no parameters; functions: sin, cos/,
  ]);
});

Deno.test("gridproof cases check: import, evaluate, parse, createUnit and config are refused together", async () => {
  const run = await runCli(["cases", "check", fixture("forbidden-functions.json")]);
  assertBadInput(run, [
    /coefficients\.a: column 5 of the expression: function "import" is not allowed \(refused, never run\)/,
    /coefficients\.b: .*function "evaluate" is not allowed/,
    /coefficients\.c: .*function "parse" is not allowed/,
    /coefficients\.d: .*function "createUnit" is not allowed/,
    /coefficients\.e: .*function "config" is not allowed/,
  ]);
});

Deno.test("gridproof cases check: a non-elliptic coefficient names the point and the values", async () => {
  // a = x − 0.5 is smallest at x = 0, a point of the check grid (cases/operator_check.ts)
  assertBadInput(await runCli(["cases", "check", fixture("not-elliptic.json")]), [
    /not-elliptic\.json:\d+:\d+: coefficients\.a: a = -0\.5 at \(x, y\) = \(0, 0\), a point of the 129×129 check grid; the operator must be elliptic \(a·c > 0\)/,
    /make a positive on the whole domain, including between grid nodes/,
  ]);
});

Deno.test("gridproof cases check: infinity on the grid names the point and field", async () => {
  assertBadInput(await runCli(["cases", "check", fixture("not-finite.json")]), [
    /not-finite\.json:\d+:\d+: coefficients\.e: e = -Infinity at \(x, y\) = \(0, 0\), a point of the 129×129 check grid; make e finite/,
  ]);
});

Deno.test("gridproof cases check: a pure-Neumann case without reaction is accepted when its data balance, refused with the imbalance when they do not (issue 14)", async () => {
  const ok = await runCli(["cases", "check", fixture("singular-neumann.json")]);
  assert.equal(ok.code, 0, ok.stderr);
  // a kink at x = 0.3: the derived source misses the delta of u_xx there, so ∫f ≠ ∮∂u/∂n
  // (divergence theorem; the balance is worked by hand in cases/compatibility_test.ts)
  const doc = JSON.parse(await Deno.readTextFile(fixture("singular-neumann.json")));
  doc.exact = "abs(x - 0.3) + y^2";
  const path = await Deno.makeTempFile({ suffix: ".json" });
  await Deno.writeTextFile(path, JSON.stringify(doc, null, 2));
  assertBadInput(await runCli(["cases", "check", path]), [
    /exact: the problem is singular .* do not balance/,
  ]);
  await Deno.remove(path);
});

Deno.test("gridproof cases check: an id used twice names both files", async () => {
  assertBadInput(
    await runCli(["cases", "check", fixture("duplicate-a.json"), fixture("duplicate-b.json")]),
    [/duplicate-b\.json: id: "user-twice" is already used by testdata\/cases\/duplicate-a\.json/],
  );
});

Deno.test("gridproof cases show prints a case title's control characters as '?' (issue 12, item 14)", async () => {
  // before, an escape sequence in a title reached the terminal raw
  const doc = JSON.parse(await Deno.readTextFile(fixture("good.json")));
  doc.title = "plate\u001b[2J\u0007 with a bell";
  const path = await Deno.makeTempFile({ suffix: ".json" });
  await Deno.writeTextFile(path, JSON.stringify(doc));
  const run = await runCli(["cases", "show", path]);
  assert.equal(run.code, 0, run.stderr);
  // deno-lint-ignore no-control-regex
  assert.doesNotMatch(run.stdout, /[\u0000-\u0009\u000b-\u001f\u007f]/);
  assert.match(run.stdout, /plate\?\[2J\? with a bell/);
  await Deno.remove(path);
});

Deno.test("gridproof cases show and check refuse /dev/stdin: case files must be regular files (issue 12, item 15)", async () => {
  // before: "Requires all access to "/dev/stdin", run again with the --allow-all flag"
  for (const args of [["cases", "show", "/dev/stdin"], ["cases", "check", "/dev/stdin"]]) {
    const run = await runCli(args);
    assertBadInput(run, [
      /\/dev\/stdin: is not a regular file .*to read a case from a pipe, save it to a file first/,
    ]);
    assert.doesNotMatch(run.stderr, /allow-all/);
  }
});

Deno.test("gridproof cases check accepts a byte-order mark and refuses deep nesting and undocumented syntax (issue 12, items 15 and 16)", async () => {
  const dir = await Deno.makeTempDir();
  try {
    const good = await Deno.readTextFile(fixture("good.json"));
    const doc = JSON.parse(good);
    await Deno.writeTextFile(`${dir}/bom.json`, "\uFEFF" + good);
    const bom = await runCli(["cases", "check", `${dir}/bom.json`]);
    assert.equal(bom.code, 0, bom.stderr);
    assert.match(bom.stdout, /ok: .*bom\.json/);
    const variants: [string, string, RegExp][] = [
      [
        "deep.json",
        "(".repeat(500) + "x" + ")".repeat(500),
        /deep\.json:\d+:\d+: exact: column 65 of the expression: parentheses are nested deeper than 64 levels/,
      ],
      [
        "implicit.json",
        "sin(x)(y) + 2x",
        /implicit\.json:\d+:\d+: exact: column 7 of the expression: implicit multiplication "sin\(x\)\(y\)" is not allowed: write sin\(x\)\*\(y\)/,
      ],
      ["percent.json", "x%", /percent\.json:\d+:\d+: exact: column 2 .*"%" is not allowed/],
      ["comment.json", "x # y", /comment\.json:\d+:\d+: exact: column 3 .*"#" is not allowed/],
    ];
    for (const [name, exact, pattern] of variants) {
      await Deno.writeTextFile(`${dir}/${name}`, JSON.stringify({ ...doc, exact }, null, 2));
      const run = await runCli(["cases", "check", `${dir}/${name}`]);
      assertBadInput(run, [pattern]);
      assert.doesNotMatch(run.stderr, /call stack/);
    }
  } finally {
    await Deno.remove(dir, { recursive: true });
  }
});
