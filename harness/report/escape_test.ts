import assert from "node:assert/strict";
import { escapeCsvCell, escapeHtml, escapeMarkdown } from "./escape.ts";

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

Deno.test("escapeMarkdown() and escapeCsvCell() turn terminal control characters into U+FFFD", () => {
  // ESC starts a terminal escape sequence (ECMA-48); BEL rings; NUL ends C strings
  const hostile = "ok\u001b[2J\u0007\u0000done";
  assert.equal(escapeMarkdown(hostile), "ok\ufffd\\[2J\ufffd\ufffddone");
  assert.equal(escapeCsvCell(hostile), "ok\ufffd[2J\ufffd\ufffddone");
  assert.equal(escapeCsvCell("\u001b=1+1"), "\ufffd=1+1");
  assert.equal(escapeCsvCell("=1+1"), "'=1+1");
  assert.equal(escapeCsvCell("line\nbreak\tkept"), "line\nbreak\tkept");
  assert.equal(escapeCsvCell(-2), -2);
});
