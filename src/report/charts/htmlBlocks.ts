/** A report section (report/blocks.ts) as HTML: tables, label/value tables, paragraphs and lists, all text escaped. */
import type { Block, Section } from "../blocks.js";
import { escapeHtml, fields, paragraph, section, table } from "./htmlElements.js";

function blockHtml(block: Block): string {
  switch (block.kind) {
    case "table":
      return table(
        block.header.map((h) => h.replace(/\n/g, " ")),
        block.rows.map((row) => row.map((cell) => cell.trim())),
      );
    case "fields":
      return fields(block.pairs);
    case "paragraph":
      return paragraph(block.text, block.tone);
    case "list":
      return `<ul>\n${block.items.map((item) => `<li>${escapeHtml(item)}</li>`).join("\n")}\n</ul>`;
    case "gap":
      return "";
  }
}

/** The section element: its heading and blocks. */
export function sectionHtml(s: Section): string {
  return section(s.id, s.heading, ...s.blocks.map(blockHtml).filter((html) => html !== ""));
}
