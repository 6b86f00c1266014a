/** The HTML report's building blocks: escaped text, sections, paragraphs, tables and inline SVG. */
import { printable } from "../layout.js";

/** Escapes text for HTML element content and attribute values, after neutralising control characters. */
export function escapeHtml(text: string): string {
  return printable(text).replace(/&/g, "&amp;").replace(/</g, "&lt;").replace(/>/g, "&gt;").replace(/"/g, "&quot;").replace(/'/g, "&#39;");
}

export function section(id: string, heading: string, ...body: string[]): string {
  return [`<section id="${id}">`, `<h2>${escapeHtml(heading)}</h2>`, ...body, "</section>"].join("\n");
}

export function paragraph(text: string, className?: string): string {
  return `<p${className === undefined ? "" : ` class="${className}"`}>${escapeHtml(text)}</p>`;
}

/** A table: a header row, then rows whose first cell is a row heading. Cells are plain text, escaped. */
export function table(
  header: readonly string[],
  rows: readonly (readonly string[])[],
  options: { caption?: string; textColumns?: readonly number[] } = {},
): string {
  const textColumns = new Set(options.textColumns ?? []);
  const head = `<thead><tr>${header.map((h) => `<th scope="col">${escapeHtml(h)}</th>`).join("")}</tr></thead>`;
  const body = rows
    .map(
      (row) =>
        `<tr>${row
          .map((cell, i) =>
            i === 0
              ? `<th scope="row">${escapeHtml(cell)}</th>`
              : `<td class="${textColumns.has(i) ? "text" : "num"}">${escapeHtml(cell)}</td>`,
          )
          .join("")}</tr>`,
    )
    .join("\n");
  const caption = options.caption === undefined ? "" : `<caption class="note">${escapeHtml(options.caption)}</caption>`;
  return `<table>${caption}\n${head}\n<tbody>\n${body}\n</tbody></table>`;
}

/** A two-column label / value table. */
export function fields(pairs: readonly (readonly [string, string])[]): string {
  const rows = pairs.map(
    ([label, value]) => `<tr><th scope="row">${escapeHtml(label)}</th><td class="text">${escapeHtml(value)}</td></tr>`,
  );
  return `<table class="fields">\n<tbody>\n${rows.join("\n")}\n</tbody></table>`;
}

/** Inlines an SVG document from this package's chart renderers. */
export function inlineSvg(svg: string): string {
  const trimmed = svg.trim().replace(/^<\?xml[^>]*\?>\s*/, "");
  if (!trimmed.startsWith("<svg")) throw new RangeError("renderHtmlReport: a chart must be an SVG document starting with <svg");
  return trimmed.replace(/^<svg([^>]*)>/, (_, attributes: string) => `<svg${attributes.replace(/\s+xmlns(:\w+)?="[^"]*"/g, "")}>`);
}
