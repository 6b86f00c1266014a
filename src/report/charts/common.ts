/**
 * Shared pieces of the charts: rendering a Vega spec to an SVG string (Vega is loaded on first use,
 * never at start-up), the palette, text clean-up for strings from the input file, a text-width
 * estimate for placing labels, the caption lines every chart carries, and a builder for the simple
 * marks the charts are made of.
 *
 * Everything here is pure apart from the lazy module load: the same spec gives the same SVG.
 */

import type { Mark, Spec } from "vega";
import { importVega, type VegaLoader } from "./loadVega.js";
import { printable } from "../layout.js";

/**
 * Okabe & Ito (2008) colours, distinguishable with the common colour-vision deficiencies. Every
 * mark that uses one also differs in dash pattern or shape, so nothing depends on colour alone.
 */
export const palette = {
  blue: "#0072B2",
  orange: "#E69F00",
  vermillion: "#D55E00",
  ink: "#222222",
  text: "#333333",
  grey: "#666666",
  rule: "#9A9A9A",
  lightRule: "#D0D0D0",
  setFill: "#DCE9F5",
  skyBlueLight: "#D7ECF8",
  skyBlueEdge: "#56B4E9",
} as const;

/** Fonts every system has (no web fonts: the SVG and the HTML report work offline). */
export const fontFamily = "Helvetica, Arial, 'Liberation Sans', 'DejaVu Sans', sans-serif";

/** Dash patterns (SVG stroke-dasharray). */
export const dash = {
  solid: [] as number[],
  dashed: [7, 4],
  dotted: [1.5, 3],
  guide: [2, 3],
};

/**
 * Text from the input (file and column names) made safe to place in SVG: control characters become
 * visible `\u{..}` escapes (XML 1.0 forbids most of them) and unpaired surrogates become U+FFFD.
 * Markup characters need nothing here: Vega's SVG writer escapes them.
 */
export function chartText(text: string): string {
  return printable(text).replace(/[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/g, "\uFFFD");
}

/**
 * Estimated width in pixels of `text` in the chart font: 0.6 em per character (0.66 bold), at or
 * above the average advance of the fonts in `fontFamily`, so labels placed with it do not collide.
 */
export function textWidth(text: string, fontSize: number, bold = false): number {
  return text.length * fontSize * (bold ? 0.66 : 0.6);
}

/** A no-break space: `wrapToWidth` never breaks a line there (used inside formulas). */
export const nbsp = "\u00a0";

/** Word-wraps a caption paragraph to lines of at most `pixels` at `fontSize`, breaking at spaces only. */
export function wrapToWidth(text: string, pixels: number, fontSize: number): string[] {
  const width = Math.max(20, Math.floor(pixels / (fontSize * 0.6)));
  const lines: string[] = [];
  let current = "";
  for (const word of text.split(/ +/).filter((w) => w !== "")) {
    if (current !== "" && current.length + 1 + word.length > width) {
      lines.push(current);
      current = word;
    } else current = current === "" ? word : `${current} ${word}`;
  }
  lines.push(current);
  return lines;
}

/** A number for a chart label: four significant digits, exponent only for extreme magnitudes. */
export function labelNumber(x: number): string {
  if (x === 0) return "0";
  const magnitude = Math.abs(x);
  if (magnitude < 1e-3 || magnitude >= 1e5) return x.toExponential(3);
  return x.toPrecision(4);
}

function round(x: number): number {
  return Number(x.toPrecision(12));
}

/**
 * The model's maintained assumptions (src/report/conventions.ts) in one short line, for a caption;
 * the full sentences are in the text and HTML reports.
 */
export function assumptionsLine(weight: number | null): string {
  const formula = (text: string): string => text.replace(/ /g, nbsp);
  const proxy =
    weight === null
      ? `market proxy ${formula("M = w low + (1 - w) high")}, betas scaled so that ${formula("w b_low + (1 - w) b_high = 1")}`
      : `market proxy ${formula(`M = ${weight} low + ${round(1 - weight)} high`)}, betas scaled so that ` +
        formula(`${weight} b_low + ${round(1 - weight)} b_high = 1`);
  return (
    "Assumptions: one common factor; each book's noise uncorrelated with the factor and with the other " +
    `book's noise; constant betas and variances; ${proxy}.`
  );
}

/** The last caption line of every chart. */
export const cautionCaption = "These are statistical estimates, not investment advice.";

/** The chart's fixed look: fonts, sizes and colours of titles, axes and text. */
export function chartConfig(): NonNullable<Spec["config"]> {
  return {
    background: "#FFFFFF",
    title: {
      font: fontFamily,
      fontSize: 17,
      fontWeight: "bold",
      color: palette.ink,
      subtitleFont: fontFamily,
      subtitleFontSize: 12,
      subtitleColor: palette.text,
      subtitlePadding: 8,
      subtitleLineHeight: 16,
      anchor: "start",
      frame: "bounds",
      offset: 16,
    },
    axis: {
      labelFont: fontFamily,
      titleFont: fontFamily,
      labelFontSize: 11,
      titleFontSize: 12,
      titleFontWeight: "bold",
      labelColor: palette.text,
      titleColor: palette.ink,
      domainColor: "#555555",
      tickColor: "#555555",
      gridColor: "#EBEBEB",
    },
    text: { font: fontFamily, fill: palette.text },
  };
}

/** A mark's `enter` encoding, by mark type. */
export type EnterEncoding<T extends Mark["type"]> = NonNullable<NonNullable<Extract<Mark, { type: T }>["encode"]>["enter"]>;

/** Where a mark takes its items from, and whether screen readers see it (`aria: false` hides it). */
export interface MarkOptions {
  readonly aria?: false;
  readonly from?: { readonly data: string };
}

/** Marks that hide from screen readers: decoration, or text that another mark already describes. */
export const decorative = { aria: false } as const;

/**
 * A mark with only an `enter` encoding: `{ type, name, ...options, encode: { enter } }`, its keys in
 * that order (the options' in the order given).
 */
export function enterMark<T extends Mark["type"]>(type: T, name: string, enter: EnterEncoding<T>, options: MarkOptions = {}): Mark {
  return { type, name, ...options, encode: { enter } } as Mark;
}

/** The title text of a spec (for the SVG's `<title>`). */
export function specTitle(spec: Spec): string {
  const t = spec.title;
  if (typeof t === "string") return t;
  if (t !== undefined && !Array.isArray(t) && typeof t === "object" && "text" in t && typeof t.text === "string") return t.text;
  return "chart";
}

/** Escapes text for XML element content and attribute values. */
export function escapeXml(text: string): string {
  return text.replace(/&/g, "&amp;").replace(/</g, "&lt;").replace(/>/g, "&gt;").replace(/"/g, "&quot;");
}

/**
 * Renders a Vega spec to an SVG string. Vega is imported here (by `loadVega`), on first use, so that commands which
 * draw no chart never load it. The specs use no clip paths or gradients, so the SVG has no generated
 * ids and depends on the spec alone. Vega's own log is off: a pure function does not print.
 *
 * The root element gets role="img", the spec's title as `<title>` and its description as `<desc>`
 * (Vega's string renderer writes neither), so screen readers announce what the chart shows.
 */
export async function renderSvg(spec: Spec, title: string, loadVega: VegaLoader = importVega): Promise<string> {
  const vega = await loadVega();
  const view = new vega.View(vega.parse(spec), { renderer: "none", logLevel: vega.None });
  let svg: string;
  try {
    svg = await view.toSVG();
  } finally {
    view.finalize();
  }
  const description = spec.description ?? "";
  const accessible = `<title>${escapeXml(chartText(title))}</title><desc>${escapeXml(chartText(description))}</desc>`;
  return `${svg.replace(/^<svg([^>]*)>/, (_, attributes: string) => `<svg${attributes} role="img">${accessible}`)}\n`;
}

/**
 * The frame of a plot with a title and subtitle lines above it and a legend under its x axis: its
 * size, padding (the subtitle's lines, then `titleGap` above the plot; the axis, the legend and a
 * margin below), fixed layout and title. Sizes are computed here rather than by Vega, whose text
 * widths (without a canvas) are rough.
 */
export function plotFrame(frame: {
  readonly width: number;
  readonly height: number;
  readonly marginLeft: number;
  readonly marginRight: number;
  readonly title: string;
  readonly subtitle: readonly string[];
  readonly titleGap: number;
  readonly legendHeight: number;
}): Pick<Spec, "width" | "height" | "padding" | "autosize" | "config" | "title"> {
  return {
    width: frame.width,
    height: frame.height,
    padding: {
      left: frame.marginLeft,
      right: frame.marginRight,
      top: 12 + 22 + 8 + 16 * frame.subtitle.length + frame.titleGap,
      bottom: 50 + frame.legendHeight + 14,
    },
    autosize: { type: "none" },
    config: chartConfig(),
    title: { text: frame.title, subtitle: [...frame.subtitle], frame: "group", dx: 12 - frame.marginLeft },
  };
}

/** A chart that says why there is nothing to draw (a rejected model, no rolling windows). */
export function messageSpec(title: string, paragraphs: readonly string[], description: string): Spec {
  const width = 720;
  const lines = paragraphs.flatMap((p) => wrapToWidth(p, width, 13));
  return {
    description,
    width,
    height: 19 * lines.length,
    padding: { left: 16, right: 16, top: 52, bottom: 16 },
    autosize: { type: "none" },
    config: chartConfig(),
    title: { text: title, frame: "group" },
    marks: [
      {
        type: "text",
        name: "message",
        from: { data: "message-lines" },
        encode: {
          enter: {
            x: { value: 0 },
            y: { field: "y" },
            text: { field: "text" },
            fontSize: { value: 13 },
            baseline: { value: "top" },
          },
        },
      },
    ],
    data: [{ name: "message-lines", values: lines.map((text, i) => ({ text, y: 19 * i })) }],
  };
}
