/**
 * A report section as data: its heading and blocks (tables, label/value fields, paragraphs, lists),
 * said once and laid out twice, as text (here) and as HTML (charts/htmlBlocks.ts), so the two
 * reports hold the same figures in the same words.
 */

import { fields, indent, table, wrap, type Style } from "./layout.js";

export type Block =
  /** A table: the first column holds row labels; a "\n" in a heading splits it over lines in text. */
  | { readonly kind: "table"; readonly header: readonly string[]; readonly rows: readonly (readonly string[])[] }
  /** Label / value lines; `wrapped`: long values wrap under themselves (text). */
  | { readonly kind: "fields"; readonly pairs: readonly (readonly [string, string])[]; readonly wrapped?: boolean }
  /** A paragraph, wrapped and indented in text; `tone` marks a note or a warning. */
  | { readonly kind: "paragraph"; readonly text: string; readonly tone?: "note" | "warning" }
  /** A bulleted list. */
  | { readonly kind: "list"; readonly items: readonly string[] }
  /** A blank line in text; nothing in HTML. */
  | { readonly kind: "gap" };

export interface Section {
  /** The HTML id of the section. */
  readonly id: string;
  readonly heading: string;
  readonly blocks: readonly Block[];
}

function wrappedFields(pairs: readonly (readonly [string, string])[]): string[] {
  const width = Math.max(...pairs.map(([label]) => label.length));
  return pairs.flatMap(([label, value]) => wrap(value, `${indent}${label.padEnd(width)}  `, " ".repeat(indent.length + width + 2)));
}

/** The lines of one block. */
export function blockLines(block: Block, style: Style): string[] {
  switch (block.kind) {
    case "table":
      return table({ header: block.header, rows: block.rows });
    case "fields":
      return block.wrapped === true ? wrappedFields(block.pairs) : fields(block.pairs);
    case "paragraph": {
      const lines = wrap(block.text, indent, indent);
      return block.tone === "warning" ? lines.map(style.warning) : lines;
    }
    case "list":
      return block.items.flatMap((item) => wrap(item, `${indent}- `, `${indent}  `));
    case "gap":
      return [""];
  }
}

/** A section as text lines: the heading, then its blocks. */
export function sectionLines(section: Section, style: Style): string[] {
  return [style.heading(section.heading), ...section.blocks.flatMap((b) => blockLines(b, style))];
}
