/**
 * Opens the HTML report in headless Chromium (Debian's `chromium`) over the DevTools protocol,
 * checks that it loads with no console message, exception or dialog, that every expected plot is
 * present, that markup in the result stays text, that no table overflows at 1400 px and that the
 * printed PDF holds every column header of the GCI audit; saves screenshots to tests/artifacts/.
 */
import assert from "node:assert/strict";
import { renderHtml, reportPlots } from "../../harness/report/mod.ts";
import { HOSTILE_TEXT, makeFixtureResult } from "../../testdata/report/fixture.ts";
import { GCI_HEADERS } from "../../harness/report/html.ts";
import { pdfPageTexts } from "./_pdf_text.ts";

const CHROMIUM = "/usr/bin/chromium";
const ARTIFACTS = new URL("../artifacts/", import.meta.url);

async function exists(path: string): Promise<boolean> {
  try {
    await Deno.stat(path);
    return true;
  } catch {
    // absent: the tests below are skipped and say so
    return false;
  }
}

const available = await exists(CHROMIUM);
if (!available) {
  console.warn(
    `SKIPPED: ${CHROMIUM} is not installed, so the HTML report is not opened in a browser`,
  );
}

interface Event {
  method: string;
  params: Record<string, unknown>;
}

/**
 * A minimal DevTools-protocol client over `--remote-debugging-pipe` (NUL-separated JSON on file
 * descriptors 3 and 4, which a shell maps to the child's stdin and stdout), so the test needs no
 * network permission. Commands go to one page through a flattened target session.
 */
class Devtools {
  #writer: WritableStreamDefaultWriter<Uint8Array>;
  #next = 1;
  #pending = new Map<number, { resolve(v: unknown): void; reject(e: Error): void }>();
  #waiters: { method: string; resolve(e: Event): void }[] = [];
  #encoder = new TextEncoder();
  session: string | undefined;
  readonly events: Event[] = [];
  readonly done: Promise<void>;

  constructor(input: WritableStream<Uint8Array>, output: ReadableStream<Uint8Array<ArrayBuffer>>) {
    this.#writer = input.getWriter();
    this.done = (async () => {
      let buffer = "";
      for await (const chunk of output.pipeThrough(new TextDecoderStream())) {
        buffer += chunk;
        let end;
        while ((end = buffer.indexOf("\0")) >= 0) {
          this.#receive(JSON.parse(buffer.slice(0, end)));
          buffer = buffer.slice(end + 1);
        }
      }
    })();
  }

  #receive(msg: {
    id?: number;
    error?: { message: string; code: number };
    result?: unknown;
    method?: string;
    params?: Record<string, unknown>;
  }) {
    if (msg.id !== undefined) {
      const p = this.#pending.get(msg.id);
      this.#pending.delete(msg.id);
      if (msg.error) p?.reject(new Error(`${msg.error.message} (${msg.error.code})`));
      else p?.resolve(msg.result);
      return;
    }
    const event = { method: msg.method ?? "", params: msg.params ?? {} };
    this.events.push(event);
    if (event.method === "Page.javascriptDialogOpening") {
      // a dialog would block the page; dismiss it (it stays recorded as a problem)
      void this.send("Page.handleJavaScriptDialog", { accept: true }).catch(() => undefined);
    }
    this.#waiters = this.#waiters.filter((w) => {
      if (w.method !== event.method) return true;
      w.resolve(event);
      return false;
    });
  }

  /** Sends a command to the page session (or the browser when no session is attached yet). */
  send(method: string, params: Record<string, unknown> = {}): Promise<Record<string, unknown>> {
    const id = this.#next++;
    const message = this.session === undefined
      ? { id, method, params }
      : { id, method, params, sessionId: this.session };
    const reply = new Promise<Record<string, unknown>>((resolve, reject) =>
      this.#pending.set(id, { resolve: (v) => resolve(v as Record<string, unknown>), reject })
    );
    void this.#writer.write(this.#encoder.encode(JSON.stringify(message) + "\0"));
    return reply;
  }

  waitFor(method: string): Promise<Event> {
    return new Promise((resolve) => this.#waiters.push({ method, resolve }));
  }

  async close(): Promise<void> {
    await this.#writer.close().catch(() => undefined);
  }
}

function timeout<T>(promise: Promise<T>, seconds: number, what: string): Promise<T> {
  let timer: ReturnType<typeof setTimeout> | undefined;
  const limit = new Promise<never>((_, reject) => {
    timer = setTimeout(
      () => reject(new Error(`timed out after ${seconds} s: ${what}`)),
      seconds * 1000,
    );
  });
  return Promise.race([promise, limit]).finally(() => clearTimeout(timer));
}

interface PageReport {
  events: Event[];
  page: Record<string, unknown>;
  /** The page printed to PDF (A4, the report's print style sheet), when asked for. */
  pdf?: Uint8Array;
}

/** How to open a page: the window width, and whether to print it to PDF too. */
interface OpenOptions {
  /** Window width in CSS pixels. Default 1280. */
  width?: number;
  /** Also print the page to PDF. Default false. */
  print?: boolean;
}

/** Loads a file in a fresh headless Chromium, evaluates `probe` and saves screenshots. */
async function openInChromium(
  file: string,
  probe: string,
  shot?: string,
  options: OpenOptions = {},
): Promise<PageReport> {
  const width = options.width ?? 1280;
  const profile = await Deno.makeTempDir({ prefix: "gridproof-chromium-" });
  const flags = [
    "--headless",
    "--no-sandbox",
    "--disable-gpu",
    "--disable-quic",
    "--no-first-run",
    "--disable-background-networking",
    "--disable-component-update",
    "--disable-sync",
    `--user-data-dir=${profile}`,
    "--remote-debugging-pipe",
    "about:blank",
  ];
  // the shell hands our stdin/stdout to Chromium as its pipe descriptors 3 and 4
  const child = new Deno.Command("/bin/sh", {
    args: ["-c", `exec "$0" "$@" 3<&0 4>&1 </dev/null >/dev/null 2>/dev/null`, CHROMIUM, ...flags],
    stdin: "piped",
    stdout: "piped",
    stderr: "null",
  }).spawn();
  const devtools = new Devtools(child.stdin, child.stdout);
  try {
    const { targetInfos } = await timeout(
      devtools.send("Target.getTargets"),
      30,
      "Chromium to start",
    ) as { targetInfos: { type: string; targetId: string }[] };
    const page = targetInfos.find((t) => t.type === "page");
    assert.ok(page, "Chromium opened a page");
    const attached = await devtools.send("Target.attachToTarget", {
      targetId: page.targetId,
      flatten: true,
    });
    devtools.session = attached.sessionId as string;
    await devtools.send("Runtime.enable");
    await devtools.send("Log.enable");
    await devtools.send("Page.enable");
    await devtools.send("Emulation.setDeviceMetricsOverride", {
      width,
      height: 1800,
      deviceScaleFactor: 1,
      mobile: false,
    });
    const loaded = devtools.waitFor("Page.loadEventFired");
    await devtools.send("Page.navigate", { url: `file://${file}` });
    await timeout(loaded, 30, "the report to load");
    const evaluated = await devtools.send("Runtime.evaluate", {
      expression: probe,
      returnByValue: true,
    });
    const value = (evaluated.result as { value: Record<string, unknown> }).value;
    if (shot) {
      await Deno.mkdir(ARTIFACTS, { recursive: true });
      const top = await devtools.send("Page.captureScreenshot", { format: "png" });
      await Deno.writeFile(new URL(`${shot}.png`, ARTIFACTS), decode(top.data as string));
      const metrics = await devtools.send("Page.getLayoutMetrics");
      const size = metrics.cssContentSize as { width: number; height: number };
      const full = await devtools.send("Page.captureScreenshot", {
        format: "png",
        captureBeyondViewport: true,
        clip: { x: 0, y: 0, width, height: Math.ceil(size.height), scale: 1 },
      });
      await Deno.writeFile(new URL(`${shot}-full.png`, ARTIFACTS), decode(full.data as string));
    }
    let pdf: Uint8Array | undefined;
    if (options.print) {
      // the page's own @page rule sets A4; headers and footers off as `--format pdf` has them
      const printed = await timeout(
        devtools.send("Page.printToPDF", { preferCSSPageSize: true, displayHeaderFooter: false }),
        60,
        "the report to print",
      );
      pdf = decode(printed.data as string);
      if (shot) await Deno.writeFile(new URL(`${shot}.pdf`, ARTIFACTS), pdf);
    }
    devtools.session = undefined;
    await devtools.send("Browser.close").catch(() => undefined);
    return { events: devtools.events, page: value, ...(pdf ? { pdf } : {}) };
  } finally {
    await devtools.close();
    try {
      child.kill("SIGKILL");
    } catch {
      // already exited after Browser.close
    }
    await child.status;
    await devtools.done.catch(() => undefined);
    await Deno.remove(profile, { recursive: true }).catch(() => undefined);
  }
}

function decode(base64: string): Uint8Array {
  return Uint8Array.from(atob(base64), (c) => c.charCodeAt(0));
}

/** Console calls, exceptions, error log entries and dialogs: a clean page has none. */
function problems(events: Event[]): string[] {
  return events
    .filter((e) =>
      e.method === "Runtime.consoleAPICalled" || e.method === "Runtime.exceptionThrown" ||
      e.method === "Page.javascriptDialogOpening" ||
      (e.method === "Log.entryAdded" &&
        ["error", "warning"].includes((e.params.entry as { level: string }).level))
    )
    .map((e) => `${e.method}: ${JSON.stringify(e.params).slice(0, 300)}`);
}

const PROBE = `(() => ({
  plots: [...document.querySelectorAll("figure.plot")].map((f) => ({
    kind: f.dataset.plot,
    svgs: f.querySelectorAll(":scope > svg").length,
    width: f.querySelector("svg")?.getBoundingClientRect().width ?? 0,
    texts: [...f.querySelectorAll("svg text")].map((t) => t.textContent),
  })),
  scripts: document.scripts.length,
  images: document.images.length,
  heading: document.querySelector("section.case h2")?.textContent ?? "",
  caution: document.querySelector(".caution")?.textContent ?? "",
  maths: document.querySelectorAll("math").length,
  mathWidth: document.querySelector("math")?.getBoundingClientRect().width ?? 0,
  firstSections: [...document.querySelectorAll("main > section, main > h2")].slice(0, 3)
    .map((e) => e.id || e.textContent),
}))()`;

Deno.test({
  name: `the HTML report loads in headless Chromium with no console errors and every plot drawn${
    available ? "" : " (skipped: Debian chromium not installed)"
  }`,
  ignore: !available,
  sanitizeResources: false,
  sanitizeOps: false,
  async fn() {
    const result = makeFixtureResult();
    const dir = await Deno.makeTempDir();
    try {
      const file = `${dir}/report.html`;
      await Deno.writeTextFile(file, await renderHtml(result));
      const { events, page } = await openInChromium(file, PROBE, "report");
      assert.deepEqual(problems(events), []);
      const plots = page.plots as { kind: string; svgs: number; width: number; texts: string[] }[];
      const expected = reportPlots(result).map((p) => p.kind);
      assert.deepEqual(plots.map((p) => p.kind), expected);
      assert.equal(expected.length, 8);
      for (const p of plots) {
        assert.equal(p.svgs, 1, `${p.kind} has its SVG`);
        assert.ok(p.width > 200, `${p.kind} is drawn at a readable size (${p.width}px)`);
      }
      // labelled axes and legends
      const errors = plots.find((p) => p.kind === "errors")!;
      for (
        const label of [
          "grid spacing h",
          "error",
          "solver (colour)",
          "norm (line and mark)",
          "slope 2 (expected)",
          "slope 1",
        ]
      ) {
        assert.ok(errors.texts.includes(label), `error plot shows "${label}"`);
      }
      const cost = plots.find((p) => p.kind === "cost")!;
      for (const label of ["unknowns", "iterations", "solve time (s)"]) {
        assert.ok(cost.texts.includes(label), `cost plot shows "${label}"`);
      }
      assert.ok(plots.find((p) => p.kind === "residuals")!.texts.includes("residual norm ‖r‖"));
      assert.equal(page.scripts, 0);
      assert.match(page.caution as string, /does not validate the physical model/);
      // the formulas are MathML, drawn by the browser itself (no script, no web font)
      assert.ok((page.maths as number) > 10, `${page.maths} formulas typeset`);
      assert.ok((page.mathWidth as number) > 10, `a formula is drawn ${page.mathWidth} px wide`);
      // the first screen: the builds, then what was found, then the overview
      assert.deepEqual(page.firstSections, ["builds", "found", "Overview"]);
    } finally {
      await Deno.remove(dir, { recursive: true });
    }
  },
});

Deno.test({
  name: `markup in case titles and solver notes stays text in the browser and never runs${
    available ? "" : " (skipped: Debian chromium not installed)"
  }`,
  ignore: !available,
  sanitizeResources: false,
  sanitizeOps: false,
  async fn() {
    const result = makeFixtureResult({ hostile: true });
    const dir = await Deno.makeTempDir();
    try {
      const file = `${dir}/hostile.html`;
      await Deno.writeTextFile(file, await renderHtml(result));
      const { events, page } = await openInChromium(file, PROBE);
      assert.deepEqual(problems(events), [], "no dialog, no exception, no blocked script");
      assert.equal(page.scripts, 0);
      assert.equal(page.images, 0);
      assert.equal(page.heading, `poisson-sine — Poisson with a sine solution ${HOSTILE_TEXT}`);
      assert.equal((page.plots as unknown[]).length, 8, "a stray </svg> closed no plot early");
    } finally {
      await Deno.remove(dir, { recursive: true });
    }
  },
});

/** Every table wider than its box or than the window, and the page's own horizontal overflow. */
const LAYOUT_PROBE = `(() => {
  // the window less its vertical scroll bar
  const view = document.documentElement.clientWidth;
  const tables = [...document.querySelectorAll("table")];
  return {
    view,
    window: window.innerWidth,
    pageWidth: document.documentElement.scrollWidth,
    tables: tables.length,
    overflowing: tables
      .filter((t) => t.scrollWidth > t.clientWidth + 1 || t.getBoundingClientRect().right > view + 1)
      .map((t) => (t.querySelector("th")?.textContent ?? "?") + " (" + Math.round(t.scrollWidth) + " px)"),
    scrolled: [...document.querySelectorAll("*")]
      .filter((e) => e.scrollWidth > e.clientWidth + 1 && getComputedStyle(e).overflowX !== "visible")
      .map((e) => e.tagName.toLowerCase() + "." + e.className),
  };
})()`;

Deno.test({
  name:
    "at 1400 px no table overflows, and the printed PDF holds every GCI column header (skipped without chromium)",
  ignore: !available,
  sanitizeResources: false,
  sanitizeOps: false,
  async fn() {
    const result = makeFixtureResult();
    const dir = await Deno.makeTempDir();
    try {
      const file = `${dir}/report.html`;
      await Deno.writeTextFile(file, await renderHtml(result));
      const { events, page, pdf } = await openInChromium(file, LAYOUT_PROBE, "report-1400", {
        width: 1400,
        print: true,
      });
      assert.deepEqual(problems(events), []);
      assert.equal(page.window, 1400);
      assert.ok((page.tables as number) >= 8, `the report has its tables (${page.tables})`);
      assert.deepEqual(page.overflowing, [], "every table fits its box at 1400 px");
      assert.deepEqual(page.scrolled, [], "nothing hides content behind a scroll bar");
      assert.ok(
        (page.pageWidth as number) <= (page.view as number),
        `the page is ${page.pageWidth} px wide in a ${page.view} px view`,
      );
      const pages = await pdfPageTexts(pdf!);
      assert.ok(pages.length >= 2, `${pages.length} pages`);
      // Chromium's fonts set "fi" as a ligature; NFKC turns it back into two letters
      const text = pages.join("").normalize("NFKC").replace(/\s/g, "");
      for (const header of GCI_HEADERS) {
        assert.ok(
          text.includes(header.replace(/\s/g, "")),
          `the printed GCI audit shows "${header}"`,
        );
      }
    } finally {
      await Deno.remove(dir, { recursive: true });
    }
  },
});
