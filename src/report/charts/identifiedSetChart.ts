/**
 * The identified-set chart: the low structural beta b_low on the x axis against what each value of it
 * implies, either both noise variances (y "variance") or the low book's noise share
 * s_low / (s_low + s_high) (y "share"). The admissible range [min, max] is shaded; beyond it the
 * curves go on dotted, into the region where a noise variance would be negative. The landmarks sit in
 * a lane above the plot, each with a symbol, a guide line down through the curves and a label in
 * plain words; the CAPM-consistent point is drawn larger and its label in bold. Optional interval
 * bars show sampling uncertainty of b_low and of the two bounds.
 *
 * Pure: the SVG is a function of the report and the options alone (no ids, no clock, no random).
 */

import type { Mark, Spec } from "vega";
import { marketMoments, structureAt, type MarketMoments, type MomentSummary } from "../../core/identify.js";
import { landmarkNames, type Candidate, type LandmarkName, type Landmarks } from "../../core/types.js";
import type { SolveReport } from "../types.js";
import {
  assumptionsLine,
  cautionCaption,
  chartConfig,
  chartText,
  dash,
  fontFamily,
  labelNumber,
  messageSpec,
  palette,
  renderSvg,
  specTitle,
  textWidth,
  wrapToWidth,
} from "./common.js";
import { legendHeight, legendMarks, type LegendEntry } from "./legend.js";

export interface BetaInterval {
  readonly lower: number;
  readonly upper: number;
}

export interface IdentifiedSetUncertainty {
  /** An interval for the low structural beta itself (e.g. a confidence interval covering the set). */
  readonly lowBetaInterval?: BetaInterval;
  /** Intervals for each end of the identified set. */
  readonly boundIntervals?: { readonly min: BetaInterval; readonly max: BetaInterval };
  /** The intervals' confidence level (e.g. 0.95), shown in their labels when given. */
  readonly confidence?: number;
}

export interface IdentifiedSetChartOptions {
  /** What the y axis shows: both noise variances, or the low book's share of the noise. */
  readonly y: "variance" | "share";
  readonly uncertainty?: IdentifiedSetUncertainty;
}

/** Size of the plotting area in pixels (axes, lane, legend and caption come on top). */
export const plotWidth = 660;
export const plotHeight = 320;
/** Points of each curve inside the set (ends included). */
export const insidePoints = 101;
/** Points of each curve's extension on either side of the set. */
const outsidePoints = 60;

/** Margins around the plot for the axes and the labels that may run past its right edge. */
const marginLeft = 96;
const marginRight = 72;
/** Width the caption lines are wrapped to (the title block starts left of the y axis title). */
const captionWidth = marginLeft + plotWidth + marginRight - 40;

export const chartTitle = "Which structural betas fit the data? The identified set of the low book's beta";

/** Height of the title, the caption lines and the gap to the plot's contents (chartConfig's sizes). */
function titleBlockHeight(subtitleLines: number): number {
  return 22 + 8 + 16 * subtitleLines + 16;
}

const laneRowHeight = 21;
const laneGap = 10;
const labelFontSize = 11.5;

/** Plain-language chart labels of the landmarks (the report's tables give the full descriptions). */
export const landmarkLabels: Record<LandmarkName, string> = {
  lowNoiseFree: "low book has no noise",
  highNoiseFree: "high book has no noise",
  equalNoise: "equal noise in both books",
  capmConsistent: "CAPM betas: zero expected alpha",
  returnImplied: "implied by mean returns",
};

/** Appended to the return-implied label when that point lies outside the identified set. */
export const outsideLabel = "outside the set";

const landmarkShapes: Record<LandmarkName, string> = {
  highNoiseFree: "square",
  lowNoiseFree: "diamond",
  equalNoise: "triangle-up",
  capmConsistent: "circle",
  returnImplied: "triangle-down",
};

/** Renders the chart as an SVG document (UTF-8 text, trailing newline). */
export async function renderIdentifiedSetChart(report: SolveReport, options: IdentifiedSetChartOptions): Promise<string> {
  const spec = identifiedSetSpec(report, options);
  return renderSvg(spec, specTitle(spec));
}

interface CurvePoint {
  readonly b: number;
  readonly value: number;
}

interface Series {
  readonly key: "low" | "high" | "share";
  readonly label: string;
  readonly colour: string;
  readonly dash: number[];
  readonly marker: string;
  readonly value: (c: Candidate) => number | null;
}

const varianceSeries: readonly Series[] = [
  {
    key: "low",
    label: "low book noise variance s_low",
    colour: palette.blue,
    dash: dash.solid,
    marker: "circle",
    value: (c) => c.lowNoiseVariance,
  },
  {
    key: "high",
    label: "high book noise variance s_high",
    colour: palette.orange,
    dash: dash.dashed,
    marker: "square",
    value: (c) => c.highNoiseVariance,
  },
];

const shareSeries: readonly Series[] = [
  {
    key: "share",
    label: "low book's share of the noise, s_low / (s_low + s_high)",
    colour: palette.blue,
    dash: dash.solid,
    marker: "circle",
    value: (c) => c.noiseShare,
  },
];

/** The Vega spec of the chart; exported for tests and for embedding elsewhere. */
export function identifiedSetSpec(report: SolveReport, options: IdentifiedSetChartOptions): Spec {
  const s = report.solution;
  if (s.bounds === null || s.landmarks === null) {
    const reason = s.diagnostics.find((d) => d.severity === "error")?.message ?? "the model is rejected";
    return messageSpec(
      "No identified set to draw",
      [`No one-factor structure fits these data: ${chartText(reason)}.`, ...captionLines(report)],
      "No identified set: the one-factor model is rejected for these data.",
    );
  }
  const summary: MomentSummary = {
    weight: s.weight,
    lowMean: s.moments.low.mean,
    highMean: s.moments.high.mean,
    lowVariance: s.moments.low.variance,
    highVariance: s.moments.high.variance,
    covariance: s.moments.covariance.lowHigh,
  };
  const market = marketMoments(summary);
  const { min, max } = s.bounds.lowBeta;
  const landmarks = s.landmarks;
  const uncertainty = options.uncertainty ?? {};
  const series = options.y === "variance" ? varianceSeries : shareSeries;

  const domain = xDomain(min, max, s.weight, landmarks, uncertainty);
  const px = (b: number): number => ((b - domain[0]) / (domain[1] - domain[0])) * plotWidth;

  // Curves: inside the set at `insidePoints` evenly spaced b_low (exact structures at the ends), and
  // the extensions from each end of the set to the edge of the x domain.
  const inside = insideStructures(summary, market, s.bounds, landmarks);
  const left = lineStructures(summary, market, min, domain[0], landmarks.highNoiseFree);
  const right = lineStructures(summary, market, max, domain[1], landmarks.lowNoiseFree);
  const insideValues = series.flatMap((ser) => inside.map(ser.value).filter((v): v is number => v !== null));
  const limits = extensionLimits(options.y, insideValues, summary);
  const curves = series.map((ser) => ({
    series: ser,
    inside: points(inside, ser.value),
    left: truncated(points(left, ser.value), limits),
    right: truncated(points(right, ser.value), limits),
  }));
  const drawn = curves.flatMap((c) => [...c.inside, ...c.left, ...c.right]).map((p) => p.value);
  const yDomain: [number, number] =
    options.y === "variance"
      ? [Math.min(0, ...drawn), Math.max(0, ...drawn)]
      : [Math.min(0, ...drawn), Math.max(1, ...drawn)];
  if (!(yDomain[1] > yDomain[0])) yDomain[1] = yDomain[0] + 1;

  const lane = laneLayout(landmarks, uncertainty, px);
  const legend = legendEntries(series, min, max, uncertainty, lane.anyOutside);
  const legendTop = plotHeight + 54;
  const legendWidth = plotWidth + marginRight - 8;
  const subtitle = captionLines(report, options.y).flatMap((line) => wrapToWidth(line, captionWidth, 12));
  const padding = {
    left: marginLeft,
    right: marginRight,
    top: 12 + titleBlockHeight(subtitle.length) + lane.height,
    bottom: 54 + legendHeight(legend, legendWidth) + 14,
  };

  const marks: Mark[] = [
    setRangeMark(px(min), px(max), min, max),
    ...(yDomain[0] < 0 && options.y === "variance" ? negativeRegionMarks((px(min) + px(max)) / 2) : []),
    ...(yDomain[0] < 0 ? [zeroRuleMark(options.y)] : []),
    guideMark(yDomain[0] < 0 && options.y === "variance"),
    ...curves.flatMap(({ series: ser, inside: pts, left: l, right: r }) => [
      curveMark(`${ser.key}-outside-below`, l, ser, true),
      curveMark(`${ser.key}-outside-above`, r, ser, true),
      curveMark(`${ser.key}-inside`, pts, ser, false),
    ]),
    gridMarkersMark(series, s.grid),
    curveLabelMark(),
    setLabelMark((px(min) + px(max)) / 2),
    ...intervalMarks(lane),
    labelBackdropMark(),
    landmarkSymbolMark(),
    landmarkLabelMark(),
    ...legendMarks(legend, 0, legendTop, legendWidth),
  ];

  return {
    description: chartDescription(report, options.y),
    width: plotWidth,
    height: plotHeight,
    padding,
    // Sizes are computed here rather than by Vega, whose text widths (without a canvas) are rough.
    autosize: { type: "none" },
    config: chartConfig(),
    title: { text: chartTitle, subtitle, frame: "group", dx: 12 - marginLeft },
    data: [
      { name: "landmarks", values: lane.landmarks.map((l) => ({ ...l })) },
      { name: "intervals", values: lane.intervals.map((i) => ({ ...i })) },
      { name: "interval-labels", values: lane.intervalLabels.map((i) => ({ ...i })) },
      ...curves.flatMap(({ series: ser, inside: pts, left: l, right: r }) => [
        { name: `data-${ser.key}-outside-below`, values: l.map((p) => ({ ...p })) },
        { name: `data-${ser.key}-outside-above`, values: r.map((p) => ({ ...p })) },
        { name: `data-${ser.key}-inside`, values: pts.map((p) => ({ ...p })) },
      ]),
      { name: "curve-labels", values: curveLabels(curves.map((c) => ({ series: c.series, inside: c.inside }))) },
      {
        name: "grid-markers",
        values: series.flatMap((ser) =>
          s.grid.flatMap((c) => {
            const v = ser.value(c);
            return v === null ? [] : [{ b: c.lowBeta, value: v, shape: ser.marker, colour: ser.colour }];
          }),
        ),
      },
    ],
    scales: [
      { name: "x", type: "linear", domain: [...domain], range: "width", nice: false, zero: false },
      {
        name: "y",
        type: "linear",
        domain: yDomain,
        range: "height",
        nice: options.y === "variance",
        zero: options.y === "variance",
      },
    ],
    axes: [
      {
        orient: "bottom",
        scale: "x",
        title: "low structural beta (b_low)",
        tickCount: 8,
        grid: false,
        labelFlush: false,
        titlePadding: 6,
      },
      {
        orient: "left",
        scale: "y",
        title:
          options.y === "variance"
            ? "noise variance per period (decimal units)"
            : "noise share s_low / (s_low + s_high)",
        tickCount: 6,
        grid: true,
        titlePadding: 10,
      },
    ],
    marks,
  };
}

/** The caption under the title: the data, what the picture shows, the assumptions, the caution. */
function captionLines(report: SolveReport, y?: "variance" | "share"): string[] {
  const input = report.input;
  const frequency = input.frequency === null ? "" : ` ${chartText(input.frequency.name)}`;
  const data =
    `Data: ${chartText(input.source)}, low book "${chartText(input.lowColumn)}", high book "${chartText(input.highColumn)}"; ` +
    `${chartText(input.firstDate)} to ${chartText(input.lastDate)}, ${report.solution.observations}${frequency} observations.`;
  const reading =
    y === undefined
      ? null
      : "Every b_low in the shaded range fits the sample moments equally well; " +
        (y === "variance"
          ? "the lines show the noise variance of each book that it implies."
          : "the line shows the low book's share of the noise variance that it implies.");
  const missing =
    y !== undefined && report.solution.landmarks !== null && report.solution.landmarks.returnImplied === null
      ? ["Not shown: the point implied by mean returns (the mean excess market return is too close to zero, or the ratio gives no positive pair of betas)."]
      : [];
  return [data, ...(reading === null ? [] : [reading]), ...missing, assumptionsLine(report.solution.weight), cautionCaption];
}

function chartDescription(report: SolveReport, y: "variance" | "share"): string {
  const b = report.solution.bounds!.lowBeta;
  const what = y === "variance" ? "the low and high books' noise variances" : "the low book's noise share";
  return (
    `Chart of the identified set of the low structural beta, from ${labelNumber(b.min)} to ${labelNumber(b.max)}, ` +
    `with ${what} at each value and the landmarks marked.`
  );
}

/** The x domain: the set, the return-implied point and any interval, padded, inside 0 < b_low < 1/w. */
function xDomain(
  min: number,
  max: number,
  weight: number,
  landmarks: Landmarks,
  uncertainty: IdentifiedSetUncertainty,
): [number, number] {
  const xs = [min, max];
  if (landmarks.returnImplied !== null) xs.push(landmarks.returnImplied.lowBeta);
  const intervals = [
    uncertainty.lowBetaInterval,
    uncertainty.boundIntervals?.min,
    uncertainty.boundIntervals?.max,
  ].filter((i): i is BetaInterval => i !== undefined);
  for (const i of intervals) xs.push(i.lower, i.upper);
  const finite = xs.filter((x) => Number.isFinite(x));
  const lo = Math.min(...finite);
  const hi = Math.max(...finite);
  const pad = hi > lo ? 0.14 * (hi - lo) : Math.max(0.02 * Math.abs(lo), 1e-6);
  const ceiling = 1 / weight;
  return [Math.max(lo - pad, lo / 2), Math.min(hi + pad, (hi + ceiling) / 2)];
}

/** `insidePoints` structures evenly spaced over the set, b_high interpolated like the core's grid. */
function insideStructures(
  m: MomentSummary,
  market: MarketMoments,
  bounds: NonNullable<SolveReport["solution"]["bounds"]>,
  landmarks: Landmarks,
): Candidate[] {
  const { lowBeta, highBeta } = bounds;
  const out: Candidate[] = [landmarks.highNoiseFree];
  for (let k = 1; k < insidePoints - 1; k++) {
    const f = k / (insidePoints - 1);
    out.push(
      structureAt(lowBeta.min + (lowBeta.max - lowBeta.min) * f, m, market, highBeta.max + (highBeta.min - highBeta.max) * f),
    );
  }
  out.push(landmarks.lowNoiseFree);
  return out;
}

/** Structures from the set's end `from` (given exactly) out to `to`. */
function lineStructures(m: MomentSummary, market: MarketMoments, from: number, to: number, atEnd: Candidate): Candidate[] {
  if (to === from) return [];
  const out: Candidate[] = [atEnd];
  for (let k = 1; k <= outsidePoints; k++) out.push(structureAt(from + ((to - from) * k) / outsidePoints, m, market));
  return out;
}

function points(structures: readonly Candidate[], value: (c: Candidate) => number | null): CurvePoint[] {
  return structures.flatMap((c) => {
    const v = value(c);
    return v === null || !Number.isFinite(v) ? [] : [{ b: c.lowBeta, value: v }];
  });
}

/** How far the dotted extensions may run on the y axis, so they do not squash the set itself. */
function extensionLimits(y: "variance" | "share", insideValues: readonly number[], m: MomentSummary): [number, number] {
  if (y === "share") return [-0.2, 1.2];
  const top = Math.max(0, ...insideValues);
  const scale = top > 0 ? top : 0.05 * Math.max(m.lowVariance, m.highVariance);
  return [-0.75 * scale, 1.5 * scale];
}

/** The extension from the set outwards, stopped (at the limit, interpolated) where it leaves `limits`. */
function truncated(line: readonly CurvePoint[], [lo, hi]: [number, number]): CurvePoint[] {
  const out: CurvePoint[] = [];
  for (const p of line) {
    if (p.value >= lo && p.value <= hi) {
      out.push(p);
      continue;
    }
    const prev = out[out.length - 1];
    if (prev !== undefined) {
      const limit = p.value > hi ? hi : lo;
      const t = (limit - prev.value) / (p.value - prev.value);
      out.push({ b: prev.b + t * (p.b - prev.b), value: limit });
    }
    break;
  }
  return out.length >= 2 ? out : [];
}

/** Direct labels on the curves: the first at its left end (above), the second at its right end (below). */
function curveLabels(curves: readonly { series: Series; inside: readonly CurvePoint[] }[]): object[] {
  return curves.flatMap(({ series, inside }, i) => {
    const first = i === 0;
    const end = first ? inside[0] : inside[inside.length - 1];
    const next = first ? inside[Math.min(10, inside.length - 1)] : inside[Math.max(0, inside.length - 11)];
    if (end === undefined || next === undefined) return [];
    // The label runs away from the end along the curve; put it on the side the curve falls away from.
    const above = next.value <= end.value;
    const text = series.key === "share" ? "low book's noise share" : series.key === "low" ? "low book noise" : "high book noise";
    return [{ b: end.b, value: end.value, text, first, dy: above ? -10 : 17, colour: series.key === "high" ? "#8C5F00" : series.colour }];
  });
}

function curveLabelMark(): Mark {
  return {
    type: "text",
    name: "curve-label",
    aria: false,
    from: { data: "curve-labels" },
    encode: {
      enter: {
        x: { scale: "x", field: "b", offset: { signal: "datum.first ? 8 : -8" } },
        y: { scale: "y", field: "value", offset: { field: "dy" } },
        text: { field: "text" },
        align: { signal: "datum.first ? 'left' : 'right'" },
        baseline: { value: "alphabetic" },
        fontSize: { value: 12 },
        fontWeight: { value: "bold" },
        fill: { field: "colour" },
      },
    },
  };
}

interface LaneLandmark {
  readonly name: LandmarkName;
  readonly b: number;
  readonly px: number;
  readonly y: number;
  readonly labelX: number;
  readonly labelWidth: number;
  readonly align: "left" | "right";
  readonly text: string;
  readonly shape: string;
  readonly size: number;
  readonly fill: string;
  readonly stroke: string;
  readonly bold: boolean;
  readonly emphasised: boolean;
  readonly insideSet: boolean;
  readonly description: string;
}

interface LaneInterval {
  readonly kind: "lowBeta" | "lowerBound" | "upperBound";
  readonly x: number;
  readonly x2: number;
  readonly y: number;
  readonly description: string;
}

interface Lane {
  /** Height above the plot the lane takes. */
  readonly height: number;
  readonly landmarks: readonly LaneLandmark[];
  readonly intervals: readonly LaneInterval[];
  readonly intervalLabels: readonly { x: number; y: number; text: string; align: "left" | "right" }[];
  readonly anyOutside: boolean;
}

const laneY = (row: number): number => -(laneGap + laneRowHeight * (row + 0.5));

/**
 * The lane above the plot: the interval bars (if any) in the rows nearest the plot, then the
 * landmark symbols and labels in rows above them, placed by `placeLaneLabels`.
 */
function laneLayout(landmarks: Landmarks, uncertainty: IdentifiedSetUncertainty, px: (b: number) => number): Lane {
  const intervals: LaneInterval[] = [];
  const intervalLabels: { x: number; y: number; text: string; align: "left" | "right" }[] = [];
  let row = 0;
  // Right of the bar if the label fits there, else left of it; a label that fits neither side is
  // shortened (the legend explains the bars in full).
  const labelBar = (text: string, short: string, lower: number, upper: number, y: number): void => {
    for (const label of [text, short]) {
      const w = textWidth(label, 11);
      if (upper + 8 + w <= plotWidth + 40) return void intervalLabels.push({ x: upper + 8, y, text: label, align: "left" });
      if (lower - 8 - w >= 4 - marginLeft) return void intervalLabels.push({ x: lower - 8, y, text: label, align: "right" });
    }
    intervalLabels.push({ x: upper + 8, y, text: short, align: "left" });
  };
  const bounds = uncertainty.boundIntervals;
  if (bounds !== undefined) {
    const y = laneY(row++);
    intervals.push(
      { kind: "lowerBound", x: px(bounds.min.lower), x2: px(bounds.min.upper), y, description: intervalText("lower bound", bounds.min) },
      { kind: "upperBound", x: px(bounds.max.lower), x2: px(bounds.max.upper), y, description: intervalText("upper bound", bounds.max) },
    );
    labelBar(`${levelText(uncertainty)}intervals for the two ends`, `${levelText(uncertainty)}each end`, px(bounds.min.lower), px(bounds.max.upper), y);
  }
  const lowBeta = uncertainty.lowBetaInterval;
  if (lowBeta !== undefined) {
    const y = laneY(row++);
    intervals.push({ kind: "lowBeta", x: px(lowBeta.lower), x2: px(lowBeta.upper), y, description: intervalText("b_low", lowBeta) });
    labelBar(`${levelText(uncertainty)}interval for b_low`, `${levelText(uncertainty)}b_low`, px(lowBeta.lower), px(lowBeta.upper), y);
  }

  const present = landmarkNames
    .map((name) => ({ name, c: landmarks[name] }))
    .filter((l): l is { name: LandmarkName; c: Candidate } => l.c !== null)
    .sort((a, b) => a.c.lowBeta - b.c.lowBeta || landmarkNames.indexOf(a.name) - landmarkNames.indexOf(b.name));
  const items = present.map(({ name, c }) => {
    const emphasised = name === "capmConsistent";
    const text = `${landmarkLabels[name]}${c.insideSet ? "" : `, ${outsideLabel}`} (${labelNumber(c.lowBeta)})`;
    return { x: px(c.lowBeta), width: textWidth(text, labelFontSize, emphasised), radius: emphasised ? 9 : 7, text };
  });
  const placements = placeLaneLabels(items);
  const placed: LaneLandmark[] = [];
  for (const [i, { name, c }] of present.entries()) {
    const { x, text } = items[i]!;
    const chosen = placements[i]!;
    const emphasised = name === "capmConsistent";
    placed.push({
      name,
      b: c.lowBeta,
      px: x,
      y: laneY(row + chosen.row),
      labelX: chosen.labelX,
      labelWidth: items[i]!.width,
      align: chosen.align,
      text,
      shape: landmarkShapes[name],
      size: emphasised ? 190 : 80,
      fill: c.insideSet ? (emphasised ? palette.vermillion : palette.ink) : "#FFFFFF",
      stroke: palette.ink,
      bold: emphasised,
      emphasised,
      insideSet: c.insideSet,
      description:
        `Landmark ${name}: ${landmarkLabels[name]}, low structural beta ${labelNumber(c.lowBeta)}, ` +
        (c.insideSet ? "inside the identified set." : "outside the identified set."),
    });
  }
  const rows = row + Math.max(0, ...placements.map((p) => p.row + 1));
  return {
    height: laneGap + laneRowHeight * rows,
    landmarks: placed,
    intervals,
    intervalLabels,
    anyOutside: placed.some((l) => !l.insideSet),
  };
}

interface LaneItem {
  /** Pixel position of the symbol, its radius, and the label's estimated width. */
  readonly x: number;
  readonly radius: number;
  readonly width: number;
}

interface LanePlacement {
  readonly row: number;
  /** "left": the label starts right of the symbol; "right": it ends left of it. */
  readonly align: "left" | "right";
  readonly labelX: number;
  /** Pixels the symbol and label occupy in their row. */
  readonly span: readonly [number, number];
}

/**
 * Rows and sides for the landmark labels: no two labels overlap in a row, and as far as possible no
 * guide line (which runs from a symbol down to the plot) crosses a label in a lower row. Every order
 * of the (at most five) landmarks is tried with a greedy placement; the best is kept by fewest
 * crossings, then fewest rows, then fewest labels left of their symbol. Deterministic: ties keep the
 * first order found.
 */
function placeLaneLabels(items: readonly LaneItem[]): LanePlacement[] {
  const options = (item: LaneItem): Omit<LanePlacement, "row">[] => {
    const { x, radius: r, width: w } = item;
    const all: Omit<LanePlacement, "row">[] = [
      { align: "left", span: [x - r, x + r + 6 + w], labelX: x + r + 5 },
      { align: "right", span: [x - r - 6 - w, x + r], labelX: x - r - 5 },
    ];
    const fits = all.filter((o) => o.span[1] <= plotWidth + marginRight - 8 && o.span[0] >= 8 - marginLeft);
    return fits.length > 0 ? fits : all.slice(0, 1);
  };
  const greedy = (order: readonly number[]): LanePlacement[] => {
    const placed: (LanePlacement | undefined)[] = items.map(() => undefined);
    const done: { x: number; p: LanePlacement }[] = [];
    const free = (k: number, span: readonly [number, number]): boolean =>
      done.every(({ p }) => p.row !== k || span[1] + 10 <= p.span[0] || span[0] >= p.span[1] + 10);
    const clean = (k: number, x: number, span: readonly [number, number]): boolean =>
      free(k, span) &&
      done.every(({ x: gx, p }) => (p.row > k ? gx < span[0] - 2 || gx > span[1] + 2 : true)) &&
      done.every(({ p }) => (p.row < k ? x < p.span[0] - 2 || x > p.span[1] + 2 : true));
    for (const i of order) {
      const item = items[i]!;
      const rowsInUse = Math.max(0, ...done.map(({ p }) => p.row + 1));
      let chosen: LanePlacement | undefined;
      for (let k = 0; k <= rowsInUse && chosen === undefined; k++) {
        const o = options(item).find((c) => clean(k, item.x, c.span));
        if (o !== undefined) chosen = { ...o, row: k };
      }
      for (let k = 0; chosen === undefined; k++) {
        const o = options(item).find((c) => free(k, c.span));
        if (o !== undefined) chosen = { ...o, row: k };
      }
      placed[i] = chosen;
      done.push({ x: item.x, p: chosen });
    }
    return placed.map((p) => p!);
  };
  const crossings = (placement: readonly LanePlacement[]): number => {
    let n = 0;
    for (const [i, p] of placement.entries()) {
      const x = items[i]!.x;
      for (const [j, q] of placement.entries()) if (j !== i && q.row < p.row && x >= q.span[0] - 2 && x <= q.span[1] + 2) n++;
    }
    return n;
  };
  let best: { score: number; placement: LanePlacement[] } | null = null;
  for (const order of permutations(items.map((_, i) => i))) {
    const placement = greedy(order);
    const rows = Math.max(0, ...placement.map((p) => p.row + 1));
    const score = crossings(placement) * 10_000 + rows * 100 + placement.filter((p) => p.align === "right").length;
    if (best === null || score < best.score) best = { score, placement };
  }
  return best?.placement ?? [];
}

/** Every ordering of `xs`, in lexicographic order of positions. */
function permutations(xs: readonly number[]): number[][] {
  if (xs.length <= 1) return [[...xs]];
  return xs.flatMap((x, i) => permutations([...xs.slice(0, i), ...xs.slice(i + 1)]).map((rest) => [x, ...rest]));
}

/** "95% " for a confidence of 0.95, "" when none is given. */
function levelText(u: IdentifiedSetUncertainty): string {
  return u.confidence !== undefined && u.confidence > 0 && u.confidence < 1 ? `${Number((100 * u.confidence).toPrecision(4))}% ` : "";
}

function intervalText(what: string, i: BetaInterval): string {
  return `Interval for the ${what}: ${labelNumber(i.lower)} to ${labelNumber(i.upper)}.`;
}

function setRangeMark(x: number, x2: number, min: number, max: number): Mark {
  return {
    type: "rect",
    name: "identified-set-range",
    encode: {
      enter: {
        x: { value: x },
        x2: { value: x2 },
        y: { value: 0 },
        y2: { signal: "height" },
        fill: { value: palette.setFill },
        description: { value: `Identified set: low structural beta from ${labelNumber(min)} to ${labelNumber(max)}.` },
        ariaRoleDescription: { value: "identified set" },
      },
    },
  };
}

function setLabelMark(x: number): Mark {
  return {
    type: "text",
    name: "identified-set-label",
    aria: false,
    encode: {
      enter: {
        x: { value: x },
        y: { value: 6 },
        text: { value: "identified set" },
        align: { value: "center" },
        baseline: { value: "top" },
        fontSize: { value: 11.5 },
        fontStyle: { value: "italic" },
        fill: { value: "#1F4E79" },
      },
    },
  };
}

/** Below zero a variance is impossible: a light grey band says so. */
function negativeRegionMarks(labelX: number): Mark[] {
  return [
    {
      type: "rect",
      name: "negative-region",
      aria: false,
      encode: {
        enter: {
          x: { value: 0 },
          x2: { signal: "width" },
          y: { scale: "y", value: 0 },
          y2: { signal: "height" },
          fill: { value: "#000000" },
          fillOpacity: { value: 0.07 },
        },
      },
    },
    {
      type: "text",
      name: "negative-region-label",
      aria: false,
      encode: {
        enter: {
          x: { value: labelX },
          y: { signal: "height - 5" },
          text: { value: "below 0: a negative noise variance is impossible" },
          align: { value: "center" },
          baseline: { value: "bottom" },
          fontSize: { value: 11 },
          fontStyle: { value: "italic" },
          fill: { value: "#444444" },
        },
      },
    },
  ];
}

function zeroRuleMark(y: "variance" | "share"): Mark {
  return {
    type: "rule",
    name: "zero-line",
    aria: false,
    encode: {
      enter: {
        x: { value: 0 },
        x2: { signal: "width" },
        y: { scale: "y", value: 0 },
        stroke: { value: "#555555" },
        strokeWidth: { value: y === "variance" ? 1.2 : 1 },
      },
    },
  };
}

/** Guides run from each landmark's symbol down to the plot's bottom (to the zero line, below which variances are impossible). */
function guideMark(stopAtZero: boolean): Mark {
  return {
    type: "rule",
    name: "landmark-guide",
    aria: false,
    from: { data: "landmarks" },
    encode: {
      enter: {
        x: { field: "px" },
        y: { field: "y" },
        y2: stopAtZero ? { scale: "y", value: 0 } : { signal: "height" },
        stroke: { signal: `datum.emphasised ? '${palette.ink}' : '${palette.rule}'` },
        strokeWidth: { signal: "datum.emphasised ? 1.4 : 1" },
        strokeDash: { signal: `datum.emphasised ? [] : [${dash.guide.join(",")}]` },
      },
    },
  };
}

function curveMark(key: string, pts: readonly CurvePoint[], ser: Series, outside: boolean): Mark {
  return {
    type: "line",
    name: `curve-${key}`,
    from: { data: `data-${key}` },
    ...(pts.length === 0 ? { aria: false } : {}),
    encode: {
      enter: {
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
    },
  };
}

function gridMarkersMark(series: readonly Series[], grid: readonly Candidate[]): Mark {
  return {
    type: "symbol",
    name: "grid-marker",
    aria: false,
    from: { data: "grid-markers" },
    encode: {
      enter: {
        x: { scale: "x", field: "b" },
        y: { scale: "y", field: "value" },
        shape: { field: "shape" },
        fill: { field: "colour" },
        stroke: { value: "#FFFFFF" },
        strokeWidth: { value: 0.8 },
        size: { value: grid.length > 30 || series.length === 0 ? 0 : 34 },
      },
    },
  };
}

function intervalMarks(lane: Lane): Mark[] {
  if (lane.intervals.length === 0) return [];
  const enter = {
    stroke: { value: palette.ink },
    strokeWidth: { value: 1.8 },
  };
  return [
    {
      type: "rule",
      name: "interval-bar",
      from: { data: "intervals" },
      encode: {
        enter: {
          ...enter,
          x: { field: "x" },
          x2: { field: "x2" },
          y: { field: "y" },
          description: { field: "description" },
          ariaRoleDescription: { value: "interval" },
        },
      },
    },
    {
      type: "rule",
      name: "interval-cap-lower",
      aria: false,
      from: { data: "intervals" },
      encode: { enter: { ...enter, x: { field: "x" }, y: { signal: "datum.y - 5" }, y2: { signal: "datum.y + 5" } } },
    },
    {
      type: "rule",
      name: "interval-cap-upper",
      aria: false,
      from: { data: "intervals" },
      encode: { enter: { ...enter, x: { field: "x2" }, y: { signal: "datum.y - 5" }, y2: { signal: "datum.y + 5" } } },
    },
    {
      type: "text",
      name: "interval-label",
      aria: false,
      from: { data: "interval-labels" },
      encode: {
        enter: {
          x: { field: "x" },
          y: { field: "y" },
          text: { field: "text" },
          align: { field: "align" },
          baseline: { value: "middle" },
          fontSize: { value: 11 },
          fontStyle: { value: "italic" },
          fill: { value: palette.text },
        },
      },
    },
  ];
}

function landmarkSymbolMark(): Mark {
  return {
    type: "symbol",
    name: "landmark-symbol",
    from: { data: "landmarks" },
    encode: {
      enter: {
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
    },
  };
}

/** White boxes under the labels, so a guide line that must pass behind a label does not cut its text. */
function labelBackdropMark(): Mark {
  return {
    type: "rect",
    name: "landmark-label-backdrop",
    aria: false,
    from: { data: "landmarks" },
    encode: {
      enter: {
        x: { signal: "datum.align === 'left' ? datum.labelX - 2 : datum.labelX - datum.labelWidth - 2" },
        width: { signal: "datum.labelWidth + 4" },
        y: { signal: "datum.y - 8" },
        height: { value: 16 },
        fill: { value: "#FFFFFF" },
      },
    },
  };
}

function landmarkLabelMark(): Mark {
  return {
    type: "text",
    name: "landmark-label",
    aria: false,
    from: { data: "landmarks" },
    encode: {
      enter: {
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
    },
  };
}

function legendEntries(
  series: readonly Series[],
  min: number,
  max: number,
  uncertainty: IdentifiedSetUncertainty,
  anyOutside: boolean,
): LegendEntry[] {
  const entries: LegendEntry[] = [
    {
      swatch: { kind: "area", fill: palette.setFill, stroke: "#8FB3D9" },
      label: `identified set: b_low from ${labelNumber(min)} to ${labelNumber(max)}`,
    },
    ...series.map(
      (ser): LegendEntry => ({
        swatch: { kind: "line", stroke: ser.colour, dash: ser.dash, width: 2.6, shape: ser.marker },
        label: ser.label,
      }),
    ),
    {
      swatch: { kind: "line", stroke: palette.grey, dash: dash.dotted, width: 1.8 },
      label: "dotted: outside the set (a noise variance < 0)",
    },
    {
      swatch: { kind: "symbol", shape: "circle", fill: palette.vermillion, stroke: palette.ink },
      label: "large symbol: CAPM-consistent point",
    },
  ];
  if (anyOutside) {
    entries.push({
      swatch: { kind: "symbol", shape: "triangle-down", fill: "#FFFFFF", stroke: palette.ink },
      label: "hollow symbol: landmark outside the set",
    });
  }
  if (uncertainty.lowBetaInterval !== undefined || uncertainty.boundIntervals !== undefined) {
    const level = levelText(uncertainty);
    entries.push({
      swatch: { kind: "interval", stroke: palette.ink },
      label: level === "" ? "bar: sampling uncertainty interval" : `bar: ${level}confidence interval`,
    });
  }
  return entries;
}
