/**
 * Plain-text layout for the text report: aligned tables with spaces, word wrapping, optional ANSI
 * styling, and neutralising control characters in strings that come from the input file.
 */

import type { RenderOptions } from "./types.js";

/** Text width the report aims to stay within. */
export const lineWidth = 96;
/** Indentation of a section's body under its heading. */
export const indent = "  ";

/** Styling hooks; every function is the identity when colour is off. */
export interface Style {
  readonly heading: (text: string) => string;
  readonly warning: (text: string) => string;
  readonly error: (text: string) => string;
}

const ansi = (code: string) => (text: string) => `\u001b[${code}m${text}\u001b[0m`;
const plain = (text: string): string => text;

/** ANSI bold headings, yellow warnings and red errors when `options.colour`; plain text otherwise. */
export function styleFor(options: RenderOptions): Style {
  return options.colour ? { heading: ansi("1"), warning: ansi("33"), error: ansi("31") } : { heading: plain, warning: plain, error: plain };
}

/**
 * Replaces control characters (C0, DEL, C1) by a visible `\u{..}` escape, so a column name or file
 * name cannot move the cursor or change the terminal's colours.
 */
export function printable(text: string): string {
  // biome-ignore lint/suspicious/noControlCharactersInRegex: matching control characters is the point
  return text.replace(/[\u0000-\u001f\u007f-\u009f]/g, (c) => `\\u{${c.charCodeAt(0).toString(16)}}`);
}

export interface TableSpec {
  /** Column headings; a "\n" splits a heading over lines (bottom-aligned). */
  readonly header: readonly string[];
  readonly rows: readonly (readonly string[])[];
}

/**
 * Lays out a table: the first column left-aligned, the others right-aligned, two spaces between
 * columns, every line indented by `indent`. Short rows are padded with blanks.
 */
export function table(spec: TableSpec): string[] {
  const columns = spec.header.length;
  const headerLines = spec.header.map((h) => h.split("\n"));
  const height = Math.max(...headerLines.map((lines) => lines.length));
  const cell = (row: readonly string[], i: number): string => row[i] ?? "";
  // A loop, not Math.max(...rows): a table of a million rows would overflow the call stack.
  const widths = spec.header.map((_, i) => {
    let width = Math.max(...headerLines[i]!.map((line) => line.length));
    for (const row of spec.rows) width = Math.max(width, cell(row, i).length);
    return width;
  });
  const line = (row: readonly string[]): string =>
    (indent + row.map((text, i) => (i === 0 ? text.padEnd(widths[i]!) : text.padStart(widths[i]!))).join("  ")).trimEnd();
  const out: string[] = [];
  for (let k = 0; k < height; k++) {
    out.push(line(headerLines.map((lines) => lines[k - (height - lines.length)] ?? "")));
  }
  for (const row of spec.rows) out.push(line(Array.from({ length: columns }, (_, i) => cell(row, i))));
  return out;
}

/**
 * Word-wraps `text` to `width` columns. The first line starts with `first`, later lines with `rest`
 * (both count towards the width). A word longer than the width gets a line of its own.
 */
export function wrap(text: string, first: string, rest: string, width: number = lineWidth): string[] {
  const lines: string[] = [];
  let current = first;
  let empty = true;
  for (const word of text.split(/\s+/).filter((w) => w !== "")) {
    if (!empty && current.length + 1 + word.length > width) {
      lines.push(current);
      current = rest;
      empty = true;
    }
    current += (empty ? "" : " ") + word;
    empty = false;
  }
  lines.push(current);
  return lines;
}

/** Two-column "label  value" lines with the labels padded to a common width. */
export function fields(pairs: readonly (readonly [string, string])[]): string[] {
  const width = Math.max(...pairs.map(([label]) => label.length));
  return pairs.map(([label, value]) => `${indent}${label.padEnd(width)}  ${value}`.trimEnd());
}
