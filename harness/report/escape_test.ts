import assert from "node:assert/strict";
import { escapeHtml, escapeMarkdown } from "./escape.ts";

Deno.test("escapeHtml() replaces the five markup characters and forbidden control characters", () => {
  assert.equal(
    escapeHtml(`<a href="x">'&'</a>`),
    "&lt;a href=&quot;x&quot;&gt;&#39;&amp;&#39;&lt;/a&gt;",
  );
  assert.equal(escapeHtml("a\u0001b\tc\nd"), "a\ufffdb\tc\nd");
});

Deno.test("escapeMarkdown() makes punctuation literal and keeps text on one line", () => {
  assert.equal(escapeMarkdown("*x* | [y](z) <b>\nnext"), "\\*x\\* \\| \\[y\\](z) &lt;b&gt; next");
});
