/**
 * TEST HELPER — the text of a PDF as Chromium (Skia) writes it, page by page, so a test can check
 * what a printed report contains without a PDF library. It reads exactly what Skia emits and no
 * more: objects `N 0 obj … endobj`, Flate-compressed streams, Type0 fonts named `/F<n>` with a
 * `/ToUnicode` CMap (`bfchar` and `bfrange`), and text shown with hex strings in `Tj`/`TJ`. The
 * layout of these is in the PDF 1.7 reference (ISO 32000-1), sections 7.3, 7.4.4, 9.4 and 9.10.3.
 *
 * @module
 */

const decoder = new TextDecoder("latin1");

async function inflate(bytes: Uint8Array): Promise<Uint8Array> {
  const stream = new Blob([bytes as Uint8Array<ArrayBuffer>]).stream()
    .pipeThrough(new DecompressionStream("deflate"));
  return new Uint8Array(await new Response(stream).arrayBuffer());
}

interface PdfObject {
  dict: string;
  stream?: Uint8Array;
}

/** Every numbered object with its dictionary text and its (inflated) stream. */
async function objects(pdf: Uint8Array): Promise<Map<number, PdfObject>> {
  const text = decoder.decode(pdf);
  const out = new Map<number, PdfObject>();
  const head = /(\d+) 0 obj\s*/g;
  let m: RegExpExecArray | null;
  while ((m = head.exec(text)) !== null) {
    const start = m.index + m[0].length;
    const end = text.indexOf("endobj", start);
    if (end < 0) break;
    const body = text.slice(start, end);
    const s = body.indexOf("stream");
    const object: PdfObject = { dict: s >= 0 ? body.slice(0, s) : body };
    if (s >= 0) {
      let from = start + s + "stream".length;
      if (text[from] === "\r") from++;
      if (text[from] === "\n") from++;
      const length = Number(/\/Length (\d+)/.exec(object.dict)?.[1] ?? "0");
      const raw = pdf.subarray(from, from + length);
      object.stream = /\/FlateDecode/.test(object.dict) ? await inflate(raw) : raw;
    }
    out.set(Number(m[1]), object);
    head.lastIndex = end;
  }
  return out;
}

/** Code (as hex) to text, from a ToUnicode CMap. */
function readCmap(text: string): Map<string, string> {
  const map = new Map<string, string>();
  const utf16 = (hex: string) => {
    let s = "";
    for (let k = 0; k + 4 <= hex.length; k += 4) {
      s += String.fromCharCode(parseInt(hex.slice(k, k + 4), 16));
    }
    return s;
  };
  for (const block of text.matchAll(/beginbfchar([\s\S]*?)endbfchar/g)) {
    for (const pair of block[1].matchAll(/<([0-9A-Fa-f]+)>\s*<([0-9A-Fa-f]+)>/g)) {
      map.set(pair[1].toUpperCase(), utf16(pair[2]));
    }
  }
  for (const block of text.matchAll(/beginbfrange([\s\S]*?)endbfrange/g)) {
    for (
      const r of block[1].matchAll(
        /<([0-9A-Fa-f]+)>\s*<([0-9A-Fa-f]+)>\s*(<[0-9A-Fa-f]+>|\[[^\]]*\])/g,
      )
    ) {
      const width = r[1].length;
      const lo = parseInt(r[1], 16);
      const hi = parseInt(r[2], 16);
      const targets = r[3].startsWith("[")
        ? [...r[3].matchAll(/<([0-9A-Fa-f]+)>/g)].map((t) => t[1])
        : undefined;
      for (let code = lo; code <= hi; code++) {
        const key = code.toString(16).toUpperCase().padStart(width, "0");
        if (targets) {
          map.set(key, utf16(targets[code - lo] ?? ""));
        } else {
          const base = r[3].slice(1, -1);
          const last = parseInt(base.slice(-4), 16) + (code - lo);
          map.set(key, utf16(base.slice(0, -4) + last.toString(16).padStart(4, "0")));
        }
      }
    }
  }
  return map;
}

/**
 * The text of every page, in content-stream order (glyphs of one line follow each other; no
 * spaces are inferred from positions, so compare with whitespace removed).
 *
 * @param pdf The PDF bytes.
 * @returns One string per page.
 */
export async function pdfPageTexts(pdf: Uint8Array): Promise<string[]> {
  const all = await objects(pdf);
  const cmaps = new Map<string, Map<string, string>>();
  for (const [font, o] of all) {
    if (!/\/Type \/Font/.test(o.dict)) continue;
    const toUnicode = /\/ToUnicode (\d+) 0 R/.exec(o.dict);
    const cmap = toUnicode ? all.get(Number(toUnicode[1]))?.stream : undefined;
    if (cmap) cmaps.set(`F${font}`, readCmap(decoder.decode(cmap)));
  }
  const pages: string[] = [];
  for (const [, o] of all) {
    if (!/\/Type \/Page\b(?!s)/.test(o.dict)) continue;
    const contents = /\/Contents (?:(\d+) 0 R|\[([^\]]*)\])/.exec(o.dict);
    const ids = contents?.[1]
      ? [contents[1]]
      : [...(contents?.[2] ?? "").matchAll(/(\d+) 0 R/g)].map((x) => x[1]);
    let text = "";
    for (const id of ids) {
      const stream = all.get(Number(id))?.stream;
      if (!stream) continue;
      const ops = decoder.decode(stream);
      let cmap: Map<string, string> | undefined;
      // a font choice, or a hex string shown with it
      for (const t of ops.matchAll(/\/(F\d+)\s+[-\d.]+\s+Tf|<([0-9A-Fa-f\s]*)>/g)) {
        if (t[1]) {
          cmap = cmaps.get(t[1]);
          continue;
        }
        if (!cmap) continue;
        const hex = t[2].replace(/\s/g, "").toUpperCase();
        for (let k = 0; k + 4 <= hex.length; k += 4) text += cmap.get(hex.slice(k, k + 4)) ?? "";
      }
    }
    pages.push(text);
  }
  return pages;
}
