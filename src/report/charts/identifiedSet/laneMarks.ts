/**
 * The identified-set chart's marks for the landmark lane: the guide lines down into the plot, the
 * interval bars and their labels, and the landmark symbols and labels (on white backdrops).
 */

import type { Mark } from "vega";
import { dash, decorative, enterMark, fontFamily, palette } from "../common.js";
import { labelFontSize } from "./dimensions.js";
import type { Lane } from "./lane.js";
import { noteText } from "./plotMarks.js";

const fromLandmarks = { from: { data: "landmarks" } } as const;
const fromIntervals = { from: { data: "intervals" } } as const;

/** Guides run from each landmark's symbol down to the plot's bottom (to the zero line, below which variances are impossible). */
export function guideMark(stopAtZero: boolean): Mark {
  return enterMark(
    "rule",
    "landmark-guide",
    {
      x: { field: "px" },
      y: { field: "y" },
      y2: stopAtZero ? { scale: "y", value: 0 } : { signal: "height" },
      stroke: { signal: `datum.emphasised ? '${palette.ink}' : '${palette.rule}'` },
      strokeWidth: { signal: "datum.emphasised ? 1.4 : 1" },
      strokeDash: { signal: `datum.emphasised ? [] : [${dash.guide.join(",")}]` },
    },
    { ...decorative, ...fromLandmarks },
  );
}

/** Each interval as a bar with a cap at either end, and the labels of the bars. */
export function intervalMarks(lane: Lane): Mark[] {
  if (lane.intervals.length === 0) return [];
  const enter = {
    stroke: { value: palette.ink },
    strokeWidth: { value: 1.8 },
  };
  const cap = (name: string, x: "x" | "x2"): Mark =>
    enterMark(
      "rule",
      name,
      { ...enter, x: { field: x }, y: { signal: "datum.y - 5" }, y2: { signal: "datum.y + 5" } },
      { ...decorative, ...fromIntervals },
    );
  return [
    enterMark(
      "rule",
      "interval-bar",
      {
        ...enter,
        x: { field: "x" },
        x2: { field: "x2" },
        y: { field: "y" },
        description: { field: "description" },
        ariaRoleDescription: { value: "interval" },
      },
      fromIntervals,
    ),
    cap("interval-cap-lower", "x"),
    cap("interval-cap-upper", "x2"),
    enterMark(
      "text",
      "interval-label",
      {
        x: { field: "x" },
        y: { field: "y" },
        text: { field: "text" },
        align: { field: "align" },
        baseline: { value: "middle" },
        ...noteText(11, palette.text),
      },
      { ...decorative, from: { data: "interval-labels" } },
    ),
  ];
}

export function landmarkSymbolMark(): Mark {
  return enterMark(
    "symbol",
    "landmark-symbol",
    {
      x: { field: "px" },
      y: { field: "y" },
      shape: { field: "shape" },
      size: { field: "size" },
      fill: { field: "fill" },
      stroke: { field: "stroke" },
      strokeWidth: { signal: "datum.emphasised ? 1.6 : 1.4" },
      description: { field: "description" },
      ariaRoleDescription: { value: "landmark" },
    },
    fromLandmarks,
  );
}

/** White boxes under the labels, so a guide line that must pass behind a label does not cut its text. */
export function labelBackdropMark(): Mark {
  return enterMark(
    "rect",
    "landmark-label-backdrop",
    {
      x: { signal: "datum.align === 'left' ? datum.labelX - 2 : datum.labelX - datum.labelWidth - 2" },
      width: { signal: "datum.labelWidth + 4" },
      y: { signal: "datum.y - 8" },
      height: { value: 16 },
      fill: { value: "#FFFFFF" },
    },
    { ...decorative, ...fromLandmarks },
  );
}

export function landmarkLabelMark(): Mark {
  return enterMark(
    "text",
    "landmark-label",
    {
      x: { field: "labelX" },
      y: { field: "y" },
      text: { field: "text" },
      align: { field: "align" },
      baseline: { value: "middle" },
      font: { value: fontFamily },
      fontSize: { value: labelFontSize },
      fontWeight: { signal: "datum.bold ? 'bold' : 'normal'" },
      fill: { signal: `datum.emphasised ? '${palette.ink}' : '${palette.text}'` },
    },
    { ...decorative, ...fromLandmarks },
  );
}
