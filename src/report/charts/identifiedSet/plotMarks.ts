/**
 * The identified-set chart's marks inside the plot: the shaded set and its label, the region where a
 * variance would be negative, the zero line, the curves, the grid markers and the curve labels.
 */

import type { Mark } from "vega";
import type { Candidate } from "../../../core/types.js";
import { dash, decorative, enterMark, labelNumber, palette } from "../common.js";
import type { CurvePiece, Series } from "./curves.js";
import type { YQuantity } from "./options.js";

/** Small italic text: the notes on the set, the negative region and the interval bars. */
export function noteText(fontSize: number, fill: string) {
  return { fontSize: { value: fontSize }, fontStyle: { value: "italic" }, fill: { value: fill } } as const;
}

/** The full width of the plot, at y = 0 (the top edge of the negative region, the zero line). */
const acrossFromZero = { x: { value: 0 }, x2: { signal: "width" }, y: { scale: "y", value: 0 } } as const;

export function setRangeMark(x: number, x2: number, min: number, max: number): Mark {
  return enterMark("rect", "identified-set-range", {
    x: { value: x },
    x2: { value: x2 },
    y: { value: 0 },
    y2: { signal: "height" },
    fill: { value: palette.setFill },
    description: { value: `Identified set: low structural beta from ${labelNumber(min)} to ${labelNumber(max)}.` },
    ariaRoleDescription: { value: "identified set" },
  });
}

export function setLabelMark(x: number): Mark {
  return enterMark(
    "text",
    "identified-set-label",
    {
      x: { value: x },
      y: { value: 6 },
      text: { value: "identified set" },
      align: { value: "center" },
      baseline: { value: "top" },
      ...noteText(11.5, "#1F4E79"),
    },
    decorative,
  );
}

/** Below zero a variance is impossible: a light grey band says so. */
export function negativeRegionMarks(labelX: number): Mark[] {
  return [
    enterMark(
      "rect",
      "negative-region",
      {
        ...acrossFromZero,
        y2: { signal: "height" },
        fill: { value: "#000000" },
        fillOpacity: { value: 0.07 },
      },
      decorative,
    ),
    enterMark(
      "text",
      "negative-region-label",
      {
        x: { value: labelX },
        y: { signal: "height - 5" },
        text: { value: "below 0: a negative noise variance is impossible" },
        align: { value: "center" },
        baseline: { value: "bottom" },
        ...noteText(11, "#444444"),
      },
      decorative,
    ),
  ];
}

export function zeroRuleMark(y: YQuantity): Mark {
  return enterMark(
    "rule",
    "zero-line",
    {
      ...acrossFromZero,
      stroke: { value: "#555555" },
      strokeWidth: { value: y === "variance" ? 1.2 : 1 },
    },
    decorative,
  );
}

/** A piece of a curve: solid (or the series' dash) inside the set, thinner and dotted outside it. */
export function curveMark({ key, points, series: ser, outside }: CurvePiece): Mark {
  return enterMark(
    "line",
    `curve-${key}`,
    {
      x: { scale: "x", field: "b" },
      y: { scale: "y", field: "value" },
      stroke: { value: ser.colour },
      strokeWidth: { value: outside ? 1.6 : 2.6 },
      strokeDash: { value: outside ? dash.dotted : ser.dash },
      strokeCap: { value: outside ? "round" : "butt" },
      description: {
        value: outside ? `${ser.label}, continued outside the identified set` : `${ser.label}, inside the identified set`,
      },
      ariaRoleDescription: { value: "line" },
    },
    { from: { data: `data-${key}` }, ...(points.length === 0 ? decorative : {}) },
  );
}

export function gridMarkersMark(series: readonly Series[], grid: readonly Candidate[]): Mark {
  return enterMark(
    "symbol",
    "grid-marker",
    {
      x: { scale: "x", field: "b" },
      y: { scale: "y", field: "value" },
      shape: { field: "shape" },
      fill: { field: "colour" },
      stroke: { value: "#FFFFFF" },
      strokeWidth: { value: 0.8 },
      size: { value: grid.length > 30 || series.length === 0 ? 0 : 34 },
    },
    { ...decorative, from: { data: "grid-markers" } },
  );
}

export function curveLabelMark(): Mark {
  return enterMark(
    "text",
    "curve-label",
    {
      x: { scale: "x", field: "b", offset: { signal: "datum.first ? 8 : -8" } },
      y: { scale: "y", field: "value", offset: { field: "dy" } },
      text: { field: "text" },
      align: { signal: "datum.first ? 'left' : 'right'" },
      baseline: { value: "alphabetic" },
      fontSize: { value: 12 },
      fontWeight: { value: "bold" },
      fill: { field: "colour" },
    },
    { ...decorative, from: { data: "curve-labels" } },
  );
}
