import assert from "node:assert/strict";
import { makeFixtureResult } from "../../testdata/report/fixture.ts";
import { summaryText } from "./check_command.ts";

Deno.test("summaryText() prints no terminal control characters from a solver's words (issue 12, item 14)", () => {
  const result = makeFixtureResult();
  const v = result.studies[0].verdicts[0];
  v.status = "fail";
  // a reason carrying a clear-screen sequence, a bell and a NUL, as a hostile solver could send
  v.reason = "bad\u001b[2J\u0007\u0000 news";
  const text = summaryText(result);
  // deno-lint-ignore no-control-regex
  assert.doesNotMatch(text, /[\u0000-\u0009\u000b-\u001f\u007f]/);
  assert.match(text, /bad\?\[2J\?\? news/);
});
