/**
 * Escaping of text taken from a result before it goes into HTML/XML or Markdown.
 *
 * @module
 */

const HTML: Record<string, string> = {
  "&": "&amp;",
  "<": "&lt;",
  ">": "&gt;",
  '"': "&quot;",
  "'": "&#39;",
};

/**
 * Escapes text for HTML or XML element content and quoted attribute values. Characters that XML
 * 1.0 forbids (control characters other than tab, newline and carriage return) are replaced by
 * U+FFFD so the output always parses.
 *
 * @param text Any text from the result.
 * @returns The text with `& < > " '` replaced by entities.
 *
 * @example
 * ```ts
 * import { escapeHtml } from "./escape.ts";
 * console.assert(escapeHtml("<b>") === "&lt;b&gt;");
 * ```
 */
export function escapeHtml(text: string): string {
  return String(text)
    // deno-lint-ignore no-control-regex
    .replace(/[\u0000-\u0008\u000b\u000c\u000e-\u001f\ufffe\uffff]/g, "\ufffd")
    .replace(/[&<>"']/g, (c) => HTML[c]);
}

/**
 * Escapes text for Markdown inline content (and table cells): Markdown punctuation gets a
 * backslash, `< > &` become entities so no raw HTML reaches the page, newlines and tabs become
 * spaces, and other control characters (ESC, BEL, NUL …, which a terminal showing the file would
 * obey) become U+FFFD.
 *
 * @param text Any text from the result.
 * @returns Text that renders literally.
 *
 * @example
 * ```ts
 * import { escapeMarkdown } from "./escape.ts";
 * console.assert(escapeMarkdown("a|b") === "a\\|b");
 * ```
 */
export function escapeMarkdown(text: string): string {
  return String(text)
    .replace(/[\r\n\t]+/g, " ")
    // deno-lint-ignore no-control-regex
    .replace(/[\u0000-\u001f\u007f-\u009f]/g, "\ufffd")
    .replace(/[\\`*_{}[\]|~]/g, (c) => "\\" + c)
    .replace(/[&<>]/g, (c) => HTML[c]);
}

/**
 * Makes text safe for a terminal line: control characters (ESC, BEL, NUL … — the start of
 * terminal escape sequences a solver's reason or a case title could carry) become "?", and line
 * breaks and tabs become spaces.
 *
 * @param text Any text from the result or a solver.
 * @returns Printable text on one line.
 *
 * @example
 * ```ts
 * import { escapeTerminal } from "./escape.ts";
 * console.assert(escapeTerminal("ok\u001b[2J\nnext") === "ok?[2J next");
 * ```
 */
export function escapeTerminal(text: string): string {
  return String(text).replace(/[\r\n\t]+/g, " ")
    // deno-lint-ignore no-control-regex
    .replace(/[\u0000-\u001f\u007f-\u009f]/g, "?");
}

/** Control characters a CSV cell may not carry (tab and line breaks are data there). */
// deno-lint-ignore no-control-regex
const CSV_CONTROL = /[\u0000-\u0008\u000b\u000c\u000e-\u001f\u007f-\u009f]/g;

/**
 * Makes a CSV cell safe to open in a spreadsheet or a terminal: text starting with `=`, `+`, `-`,
 * `@`, tab or carriage return would be read as a formula, so it gets a leading apostrophe (the
 * usual guard against formula injection); control characters other than tab and line breaks
 * (ESC, BEL, NUL …) become U+FFFD; numbers stay as they are.
 *
 * @example
 * ```ts
 * import { escapeCsvCell } from "./escape.ts";
 * console.assert(escapeCsvCell("=1+1") === "'=1+1" && escapeCsvCell(-2) === -2);
 * ```
 */
export function escapeCsvCell<T>(value: T): T | string {
  if (typeof value !== "string") return value;
  const printable = value.replace(CSV_CONTROL, "\ufffd");
  return /^[=+\-@\t\r]/.test(printable) ? `'${printable}` : printable;
}
