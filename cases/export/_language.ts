/**
 * What a language's emitter receives and offers: the case's quantities as function bodies (one per
 * region), the interface lines, and the header text; the emitter writes the whole file.
 *
 * @module
 */
import type { Body, Spelling } from "./_dag.ts";

/** The interface lines of a case with several regions, as the region selector needs them. */
export interface ExportInterfaces {
  x: readonly number[];
  y: readonly number[];
  /** Distance under which a coordinate lies on an x-line (1e-9 of the domain's width). */
  xTolerance: number;
  /** The same along y. */
  yTolerance: number;
}

/** One exported function: its name, a one-line summary, and its body in each region. */
export interface ExportQuantity {
  name: string;
  summary: string;
  /** One body per region (regions numbered from 1, west to east, then south to north). */
  bodies: Body[];
}

/** Everything an emitter writes into the file. */
export interface FileParts {
  /** An identifier made from the case id (letters, digits, underscores; starts with a letter). */
  ident: string;
  /** Header lines, without comment markers. */
  header: string[];
  /** The interfaces, or undefined for a case with one region. */
  interfaces?: ExportInterfaces;
  quantities: ExportQuantity[];
}

/** A target language. */
export interface Language {
  /** The name `--lang` takes. */
  name: string;
  /** The usual file name extension, with its dot. */
  extension: string;
  spelling: Spelling;
  /** Lines of the header that explain this language's calling convention. */
  usage(parts: FileParts): string[];
  /** The complete source file. */
  file(parts: FileParts): string;
}

/**
 * The shortest round-trip decimal of a non-negative finite number, always with a point or an
 * exponent so that no language reads it as an integer.
 */
export function decimal(value: number): string {
  const text = String(value);
  return /[.e]/.test(text) ? text : `${text}.0`;
}
