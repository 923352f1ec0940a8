/**
 * Test helper of this folder: puts decoded arrays back as their base64 text, so a message parsed
 * on the fast path can be compared with what JSON.parse gives for the same text.
 *
 * @module
 */
import { encodeArray } from "./encoding.ts";

/** Replaces decoded arrays by their base64 text again, to compare with JSON.parse. */
export function restoreBase64(v: unknown, decoded: Map<string, Float64Array>): unknown {
  if (v === null || typeof v !== "object") return v;
  if (Array.isArray(v)) return v.map((x) => restoreBase64(x, decoded));
  const out: Record<string, unknown> = {};
  for (const [k, x] of Object.entries(v)) {
    out[k] = k === "base64" && typeof x === "string" && decoded.has(x)
      ? (encodeArray(decoded.get(x)!, "base64") as { base64: string }).base64
      : restoreBase64(x, decoded);
  }
  return out;
}
