/**
 * The identified set under each assumed noise correlation (solve --noise-correlation, docs/methods.md
 * §2), drawn as a strip under the plot on its x axis: one row per rho in the order given, a segment
 * over that set's low betas labelled with rho, or a line of text where there is no interval.
 */

import type { Mark } from "vega";
import type { SensitivityReport } from "../../types.js";
import { decorative, enterMark, palette, textWidth } from "../common.js";
import { labelFontSize } from "./dimensions.js";

export interface SensitivityRow {
  readonly noiseCorrelation: number;
  /** The set's low betas; null ends when there is no interval. */
  readonly min: number | null;
  readonly max: number | null;
  readonly label: string;
  /** The row's vertical centre in pixels (from the plot's top). */
  readonly y: number;
  /** Where the label goes: after the segment's right end, or before its left end when it would not fit. */
  readonly anchor: number | null;
  readonly align: "left" | "right";
  readonly dx: number;
}

const rowHeight = 18;
const headingHeight = 20;

const why = {
  "not-an-interval": "no interval (rho at or above the books' correlation)",
  "no-set": "no set to start from",
} as const;

/**
 * The rows of the strip, their first centre `top + headingHeight + rowHeight / 2`; `px` places a low
 * beta in pixels and `right` is the last pixel a label may reach.
 */
export function sensitivityRows(
  sensitivity: SensitivityReport | null,
  top: number,
  px: (b: number) => number,
  right: number,
): SensitivityRow[] {
  const entries = sensitivity ?? [];
  const labelOf = (entry: SensitivityReport[number]): string => {
    const rho = `rho = ${entry.noiseCorrelation}`;
    const { min, max } = entry.bounds.lowBeta;
    if (min === null || max === null) return `${rho}: ${entry.kind === "no-set" ? why["no-set"] : why["not-an-interval"]}`;
    return `${rho}${entry.kind === "unchanged" ? " (as uncorrelated)" : ""}`;
  };
  // Every label after its segment when all fit there, else every label before its segment.
  const allRight = entries.every(
    (e) => e.bounds.lowBeta.max === null || px(e.bounds.lowBeta.max) + 6 + textWidth(labelOf(e), labelFontSize) <= right,
  );
  return entries.map((entry, i) => {
    const { min, max } = entry.bounds.lowBeta;
    const label = labelOf(entry);
    const y = top + headingHeight + rowHeight * i + rowHeight / 2;
    const row = { noiseCorrelation: entry.noiseCorrelation, min, max, label, y };
    if (min === null || max === null) return { ...row, anchor: null, align: "left" as const, dx: 0 };
    return allRight ? { ...row, anchor: max, align: "left" as const, dx: 6 } : { ...row, anchor: min, align: "right" as const, dx: -6 };
  });
}

/** Height of the strip in pixels (0 without rows). */
export function sensitivityHeight(rows: readonly SensitivityRow[]): number {
  return rows.length === 0 ? 0 : headingHeight + rowHeight * rows.length + 8;
}

/** The low betas the x axis must show for the strip. */
export function sensitivityExtent(sensitivity: SensitivityReport | null): number[] {
  return (sensitivity ?? []).flatMap(({ bounds: { lowBeta } }) =>
    lowBeta.min === null || lowBeta.max === null ? [] : [lowBeta.min, lowBeta.max],
  );
}

/** The strip's data sets: the segments and the rows without an interval. */
export function sensitivityData(rows: readonly SensitivityRow[]): { name: string; values: object[] }[] {
  if (rows.length === 0) return [];
  return [
    { name: "sensitivity-sets", values: rows.filter((r) => r.min !== null).map((r) => ({ ...r })) },
    { name: "sensitivity-none", values: rows.filter((r) => r.min === null).map((r) => ({ ...r })) },
  ];
}

/** The strip's marks: its heading at `top`, a segment and label per set, a text per row without one. */
export function sensitivityMarks(rows: readonly SensitivityRow[], top: number): Mark[] {
  if (rows.length === 0) return [];
  const text = { fontSize: { value: labelFontSize }, fill: { value: palette.text }, baseline: { value: "middle" as const } };
  return [
    enterMark(
      "text",
      "sensitivity-heading",
      {
        x: { value: 0 },
        y: { value: top + headingHeight / 2 },
        text: { value: "The set of b_low if the books' noises are correlated (rho), on the same axis:" },
        fontWeight: { value: "bold" },
        ...text,
      },
      decorative,
    ),
    enterMark(
      "rule",
      "sensitivity-segments",
      {
        x: { scale: "x", field: "min" },
        x2: { scale: "x", field: "max" },
        y: { field: "y" },
        stroke: { value: palette.vermillion },
        strokeWidth: { value: 4 },
        strokeCap: { value: "butt" },
        description: { signal: "datum.label + ': low beta ' + format(datum.min, '.4') + ' to ' + format(datum.max, '.4')" },
      },
      { from: { data: "sensitivity-sets" } },
    ),
    enterMark(
      "text",
      "sensitivity-labels",
      {
        x: { scale: "x", field: "anchor" },
        dx: { field: "dx" },
        align: { field: "align" },
        y: { field: "y" },
        text: { field: "label" },
        ...text,
      },
      { ...decorative, from: { data: "sensitivity-sets" } },
    ),
    enterMark(
      "text",
      "sensitivity-missing",
      { x: { value: 0 }, y: { field: "y" }, text: { field: "label" }, fontStyle: { value: "italic" }, ...text },
      { from: { data: "sensitivity-none" } },
    ),
  ];
}
