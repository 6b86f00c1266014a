/**
 * A legend drawn as ordinary marks at fixed pixel positions under the plot. Vega's own legends are
 * built from scales and cannot mix a shaded area, dashed lines, interval bars and symbols in one
 * list; this one can, and its layout is fully determined by the entries.
 */

import type { Mark } from "vega";
import { fontFamily, palette, textWidth } from "./common.js";

export type LegendSwatch =
  | { readonly kind: "area"; readonly fill: string; readonly stroke?: string; readonly opacity?: number }
  | {
      readonly kind: "line";
      readonly stroke: string;
      readonly dash: readonly number[];
      readonly width?: number;
      /** A marker drawn at the middle of the line. */
      readonly shape?: string;
    }
  | { readonly kind: "interval"; readonly stroke: string }
  | { readonly kind: "symbol"; readonly shape: string; readonly fill: string; readonly stroke: string };

export interface LegendEntry {
  readonly swatch: LegendSwatch;
  readonly label: string;
}

const fontSize = 11.5;
const rowHeight = 19;
const swatchWidth = 30;
const swatchGap = 8;

const columnGap = 28;

/** The height the legend takes for `entries` laid out within `width`. */
export function legendHeight(entries: readonly LegendEntry[], width: number): number {
  return legendLayout(entries, width).rows * rowHeight;
}

const entryWidth = (e: LegendEntry): number => swatchWidth + swatchGap + textWidth(e.label, fontSize);

/**
 * Two columns when they fit in `width` (the first filled top to bottom, then the second, each as
 * wide as its widest entry), otherwise one.
 */
function legendLayout(entries: readonly LegendEntry[], width: number): { rows: number; columnX: number[] } {
  const rows = Math.ceil(entries.length / 2);
  const first = Math.max(0, ...entries.slice(0, rows).map(entryWidth));
  const second = Math.max(0, ...entries.slice(rows).map(entryWidth));
  if (entries.length > 1 && first + columnGap + second <= width) return { rows, columnX: [0, first + columnGap] };
  return { rows: entries.length, columnX: [0] };
}

/** Marks drawing the legend with its top left corner at (x, y), entries in reading order. */
export function legendMarks(entries: readonly LegendEntry[], x: number, y: number, width: number): Mark[] {
  const { rows, columnX } = legendLayout(entries, width);
  const placed = entries.map((entry, i) => {
    // Fill down the first column, then the second, so related entries stay together.
    const column = Math.floor(i / rows);
    const row = i % rows;
    return { entry, x0: x + (columnX[column] ?? 0), yc: y + row * rowHeight + rowHeight / 2 };
  });
  const areas = placed.flatMap(({ entry, x0, yc }) =>
    entry.swatch.kind === "area"
      ? [
          {
            x: x0,
            y: yc - 6,
            fill: entry.swatch.fill,
            stroke: entry.swatch.stroke ?? entry.swatch.fill,
            opacity: entry.swatch.opacity ?? 1,
          },
        ]
      : [],
  );
  const lines = placed.flatMap(({ entry, x0, yc }) => {
    const s = entry.swatch;
    if (s.kind === "line")
      return [{ x: x0, x2: x0 + swatchWidth, y: yc, y2: yc, stroke: s.stroke, dash: [...s.dash], width: s.width ?? 2 }];
    if (s.kind === "interval") {
      const a = x0 + 3;
      const b = x0 + swatchWidth - 3;
      return [
        { x: a, x2: b, y: yc, y2: yc, stroke: s.stroke, dash: [], width: 1.6 },
        { x: a, x2: a, y: yc - 5, y2: yc + 5, stroke: s.stroke, dash: [], width: 1.6 },
        { x: b, x2: b, y: yc - 5, y2: yc + 5, stroke: s.stroke, dash: [], width: 1.6 },
      ];
    }
    return [];
  });
  const symbols = placed.flatMap(({ entry, x0, yc }) => {
    const s = entry.swatch;
    if (s.kind === "line" && s.shape !== undefined) {
      return [{ x: x0 + swatchWidth / 2, y: yc, shape: s.shape, fill: s.stroke, stroke: s.stroke, size: 30 }];
    }
    if (s.kind === "symbol") return [{ x: x0 + swatchWidth / 2, y: yc, shape: s.shape, fill: s.fill, stroke: s.stroke, size: 70 }];
    return [];
  });
  const labels = placed.map(({ entry, x0, yc }) => ({ x: x0 + swatchWidth + swatchGap, y: yc, text: entry.label }));
  const marks: Mark[] = [
    {
      type: "rect",
      name: "legend-area",
      aria: false,
      from: { data: "legend-areas" },
      encode: {
        enter: {
          x: { field: "x" },
          width: { value: swatchWidth },
          y: { field: "y" },
          height: { value: 12 },
          fill: { field: "fill" },
          stroke: { field: "stroke" },
          fillOpacity: { field: "opacity" },
        },
      },
    },
    {
      type: "rule",
      name: "legend-line",
      aria: false,
      from: { data: "legend-lines" },
      encode: {
        enter: {
          x: { field: "x" },
          x2: { field: "x2" },
          y: { field: "y" },
          y2: { field: "y2" },
          stroke: { field: "stroke" },
          strokeDash: { field: "dash" },
          strokeWidth: { field: "width" },
        },
      },
    },
    {
      type: "symbol",
      name: "legend-symbol",
      aria: false,
      from: { data: "legend-symbols" },
      encode: {
        enter: {
          x: { field: "x" },
          y: { field: "y" },
          shape: { field: "shape" },
          fill: { field: "fill" },
          stroke: { field: "stroke" },
          size: { field: "size" },
          strokeWidth: { value: 1.2 },
        },
      },
    },
    {
      type: "text",
      name: "legend-label",
      from: { data: "legend-labels" },
      encode: {
        enter: {
          x: { field: "x" },
          y: { field: "y" },
          text: { field: "text" },
          baseline: { value: "middle" },
          font: { value: fontFamily },
          fontSize: { value: fontSize },
          fill: { value: palette.text },
        },
      },
    },
  ];
  return wrapWithData(marks, { "legend-areas": areas, "legend-lines": lines, "legend-symbols": symbols, "legend-labels": labels });
}

/** Puts the legend's marks in a group that carries their data, so the caller adds one mark. */
function wrapWithData(marks: Mark[], data: Record<string, readonly object[]>): Mark[] {
  return [
    {
      type: "group",
      name: "legend",
      description: "Legend",
      data: Object.entries(data).map(([name, values]) => ({ name, values: [...values] })),
      marks,
    },
  ];
}
