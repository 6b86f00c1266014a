/**
 * The rolling-window chart: for each window (x = the window's last date) the band between the lower
 * and upper bounds of the low structural beta, the CAPM beta of the low book as a line inside it, and
 * optionally a lighter band for a sampling interval. A window without an identified set (the model
 * is rejected there) leaves a gap in the band and is marked with a cross under the plot.
 *
 * Pure: the SVG is a function of the windows and `meta` alone. Dates are read and drawn in UTC, so
 * the output does not depend on the machine's time zone.
 */

import type { Mark, Spec } from "vega";
import { DAY_MS } from "../../core/calendar.js";
import {
  assumptionsLine,
  cautionCaption,
  plotFrame,
  chartText,
  messageSpec,
  palette,
  renderSvg,
  specTitle,
  wrapToWidth,
} from "./common.js";
import { legendHeight, legendMarks, type LegendEntry } from "./legend.js";
import type { VegaLoader } from "./loadVega.js";
import { bandMarks, runs } from "./rollBands.js";

export interface RollWindowPoint {
  /** Last date of the window, ISO 8601 (YYYY-MM-DD, optionally with a time). */
  readonly end: string;
  /** Bounds of the low structural beta in this window; null when the window has no identified set. */
  readonly lowBetaMin: number | null;
  readonly lowBetaMax: number | null;
  /** The low book's CAPM beta on the market proxy in this window. */
  readonly capmLowBeta: number;
  /** A sampling interval for the low structural beta in this window, drawn as a lighter band. */
  readonly interval?: { readonly lower: number; readonly upper: number };
}

export interface RollChartMeta {
  /** Where the data came from (file name as given). */
  readonly source: string;
  /** The window length in words, e.g. "36 months" or "60 observations". */
  readonly window: string;
}

export const rollPlotWidth = 660;
export const rollPlotHeight = 300;
const marginLeft = 72;
const marginRight = 36;
const captionWidth = marginLeft + rollPlotWidth + marginRight - 40;

export const rollChartTitle = "How the identified set of the low book's structural beta moves over time";

/** Renders the chart as an SVG document (UTF-8 text, trailing newline). */
export async function renderRollChart(windows: readonly RollWindowPoint[], meta: RollChartMeta, loadVega?: VegaLoader): Promise<string> {
  const spec = rollChartSpec(windows, meta);
  return renderSvg(spec, specTitle(spec), loadVega);
}

interface Row {
  readonly t: number;
  readonly end: string;
  readonly min: number | null;
  readonly max: number | null;
  readonly capm: number;
  readonly lower: number | null;
  readonly upper: number | null;
}

/**
 * A window end date as a UTC timestamp at the start of its period, for every form the reader writes
 * (src/input/values/dates.ts): "2020", "2020-03", "2020-03-31", "2020-03-31T09:30", with seconds,
 * a fraction and "Z" or an offset. Anything else is a bug upstream: a RangeError.
 */
export function timestamp(end: string): number {
  const m = /^(\d{4})(?:-(\d{2})(?:-(\d{2})(?:[T ](\d{2}):(\d{2})(?::(\d{2})(\.\d+)?)?(Z|[+-]\d{2}:?\d{2})?)?)?)?$/.exec(end);
  let t = Number.NaN;
  if (m !== null) {
    const seconds = +(m[6] ?? 0) + +(m[7] ?? 0);
    t = Date.UTC(+m[1]!, +(m[2] ?? 1) - 1, +(m[3] ?? 1), +(m[4] ?? 0), +(m[5] ?? 0)) + seconds * 1000;
    const zone = m[8];
    if (zone !== undefined && zone !== "Z") {
      const sign = zone.startsWith("-") ? -1 : 1;
      const digits = zone.slice(1).replace(":", "");
      t -= sign * (+digits.slice(0, 2) * 60 + +digits.slice(2)) * 60_000;
    }
  }
  if (!Number.isFinite(t)) throw new RangeError(`renderRollChart: window end ${JSON.stringify(end)} is not an ISO date`);
  return t;
}

/** The Vega spec of the chart; exported for tests and for embedding elsewhere. */
export function rollChartSpec(windows: readonly RollWindowPoint[], meta: RollChartMeta): Spec {
  const source = chartText(meta.source);
  const windowText = chartText(meta.window);
  if (windows.length === 0) {
    return messageSpec(
      "No rolling windows to draw",
      [`Data: ${source}; window: ${windowText}. The sample is shorter than one window.`, assumptionsLine(null), cautionCaption],
      "No rolling windows to draw.",
    );
  }
  const rows: Row[] = windows
    .map((w) => ({
      t: timestamp(w.end),
      end: chartText(w.end),
      min: finiteOrNull(w.lowBetaMin),
      max: finiteOrNull(w.lowBetaMax),
      capm: w.capmLowBeta,
      lower: finiteOrNull(w.interval?.lower ?? null),
      upper: finiteOrNull(w.interval?.upper ?? null),
    }))
    .map((r) => (r.min === null || r.max === null ? { ...r, min: null, max: null } : r))
    .sort((a, b) => a.t - b.t);
  const band = runs(rows, (r) => r.min !== null).map(({ segment, length, row }) => ({
    t: row.t,
    min: row.min,
    max: row.max,
    segment,
    single: length === 1,
  }));
  const intervalBand = runs(rows, (r) => r.lower !== null && r.upper !== null).map(({ segment, length, row }) => ({
    t: row.t,
    lower: row.lower,
    upper: row.upper,
    segment,
    single: length === 1,
  }));
  const noSet = rows.filter((r) => r.min === null).map((r) => ({ t: r.t, description: `Window ending ${r.end}: no identified set.` }));
  const values = rows.flatMap((r) => [r.min, r.max, r.capm, r.lower, r.upper]).filter((v): v is number => v !== null && Number.isFinite(v));
  // No window with a number to draw (every one rejected): the axis spans the betas 0 to 1 around the gaps.
  const lo = values.length > 0 ? Math.min(...values) : 0;
  const hi = values.length > 0 ? Math.max(...values) : 1;
  const pad = hi > lo ? 0.08 * (hi - lo) : Math.max(0.05 * Math.abs(lo), 0.01);
  const first = rows[0]!;
  const last = rows[rows.length - 1]!;
  const xDomain = first.t === last.t ? [first.t - DAY_MS * 15, last.t + DAY_MS * 15] : [first.t, last.t];

  const hasInterval = intervalBand.length > 0;
  const legend: LegendEntry[] = [
    {
      swatch: { kind: "area", fill: palette.blue, stroke: palette.blue, opacity: 0.35 },
      label: "identified set of b_low in the window (every value fits equally well)",
    },
    { swatch: { kind: "line", stroke: palette.vermillion, dash: [], width: 2.2 }, label: "CAPM beta of the low book on the market proxy" },
    ...(hasInterval
      ? [
          {
            swatch: { kind: "area", fill: palette.skyBlueLight, stroke: palette.skyBlueEdge, opacity: 1 },
            label: "confidence interval for b_low in the window",
          } as const,
        ]
      : []),
    ...(noSet.length > 0
      ? [
          {
            swatch: { kind: "symbol", shape: "cross", fill: palette.grey, stroke: palette.grey },
            label: "no identified set in this window (gap)",
          } as const,
        ]
      : []),
  ];
  const legendWidth = rollPlotWidth + marginRight - 8;
  const dataLine =
    `Data: ${source}; ${windowText}; ${rows.length} windows ending ${first.end} to ${last.end}` +
    (noSet.length > 0 ? `; ${noSet.length} without an identified set.` : ".");
  const reading =
    "For each window the shaded band is the range of low structural betas that fit that window's sample moments; " +
    "the line is the low book's CAPM beta in the same window.";
  const subtitle = [dataLine, reading, assumptionsLine(null), cautionCaption].flatMap((line) => wrapToWidth(line, captionWidth, 12));
  const marks: Mark[] = [
    ...(hasInterval ? bandMarks("interval", "interval-band", "lower", "upper", palette.skyBlueLight, palette.skyBlueEdge, 1) : []),
    ...bandMarks("band", "set-band", "min", "max", palette.blue, palette.blue, 0.35),
    {
      type: "line",
      name: "capm-line",
      from: { data: "rows" },
      encode: {
        enter: {
          x: { scale: "x", field: "t" },
          y: { scale: "y", field: "capm" },
          stroke: { value: palette.vermillion },
          strokeWidth: { value: 2.2 },
          description: { value: "CAPM beta of the low book in each window" },
          ariaRoleDescription: { value: "line" },
        },
      },
    },
    ...(rows.length <= 40
      ? [
          {
            type: "symbol",
            name: "capm-point",
            aria: false,
            from: { data: "rows" },
            encode: {
              enter: {
                x: { scale: "x", field: "t" },
                y: { scale: "y", field: "capm" },
                shape: { value: "diamond" },
                size: { value: 30 },
                fill: { value: palette.vermillion },
                stroke: { value: "#FFFFFF" },
                strokeWidth: { value: 0.8 },
              },
            },
          } satisfies Mark,
        ]
      : []),
    {
      type: "symbol",
      name: "no-set-marker",
      from: { data: "no-set" },
      encode: {
        enter: {
          x: { scale: "x", field: "t" },
          y: { signal: "height - 7" },
          shape: { value: "cross" },
          size: { value: 40 },
          fill: { value: palette.grey },
          stroke: { value: palette.grey },
          angle: { value: 45 },
          description: { field: "description" },
          ariaRoleDescription: { value: "gap" },
        },
      },
    },
    ...legendMarks(legend, 0, rollPlotHeight + 50, legendWidth),
  ];
  return {
    description:
      `Chart of the identified set of the low structural beta in ${rows.length} windows (${windowText}), ` +
      `ending ${first.end} to ${last.end}, with the CAPM beta of the low book.`,
    ...plotFrame({
      width: rollPlotWidth,
      height: rollPlotHeight,
      marginLeft,
      marginRight,
      title: rollChartTitle,
      subtitle,
      titleGap: 18,
      legendHeight: legendHeight(legend, legendWidth),
    }),
    data: [
      { name: "rows", values: rows.map((r) => ({ ...r })) },
      { name: "band", values: band },
      { name: "band-single", source: "band", transform: [{ type: "filter", expr: "datum.single" }] },
      { name: "interval", values: intervalBand },
      { name: "interval-single", source: "interval", transform: [{ type: "filter", expr: "datum.single" }] },
      { name: "no-set", values: noSet },
    ],
    scales: [
      { name: "x", type: "utc", domain: xDomain, range: "width", nice: false },
      { name: "y", type: "linear", domain: [lo - pad, hi + pad], range: "height", nice: true, zero: false },
    ],
    axes: [
      { orient: "bottom", scale: "x", title: "window end date", tickCount: 8, labelFlush: true, grid: false, titlePadding: 6 },
      { orient: "left", scale: "y", title: "low structural beta (b_low)", tickCount: 6, grid: true, titlePadding: 10 },
    ],
    marks,
  };
}

function finiteOrNull(x: number | null): number | null {
  return x !== null && Number.isFinite(x) ? x : null;
}
