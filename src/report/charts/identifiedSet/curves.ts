/**
 * The identified-set chart's data: the dense curves of what each b_low implies (inside the set and
 * its dotted extensions), the markers at the report's grid, the direct curve labels, and the x and
 * y domains that hold them.
 */

import { marketMoments, structureAt, summaryOfMoments, type MarketMoments, type MomentSummary } from "../../../core/identify.js";
import type { Candidate, IdentifiedBounds, Landmarks, Solution } from "../../../core/types.js";
import { dash, palette } from "../common.js";
import type { BetaInterval, IdentifiedSetUncertainty, YQuantity } from "./options.js";

/** Points of each curve inside the set (ends included). */
export const insidePoints = 101;
/** Points of each curve's extension on either side of the set. */
const outsidePoints = 60;

export interface CurvePoint {
  readonly b: number;
  readonly value: number;
}

export interface Series {
  readonly key: "low" | "high" | "share";
  readonly label: string;
  readonly colour: string;
  readonly dash: number[];
  readonly marker: string;
  readonly value: (c: Candidate) => number | null;
}

export const varianceSeries: readonly Series[] = [
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

export const shareSeries: readonly Series[] = [
  {
    key: "share",
    label: "low book's share of the noise, s_low / (s_low + s_high)",
    colour: palette.blue,
    dash: dash.solid,
    marker: "circle",
    value: (c) => c.noiseShare,
  },
];

/** One series' curve: inside the set, and its extensions left (below min) and right (above max) of it. */
export interface Curve {
  readonly series: Series;
  readonly inside: readonly CurvePoint[];
  readonly left: readonly CurvePoint[];
  readonly right: readonly CurvePoint[];
}

/** A drawn piece of a curve: the data set `data-${key}` and the line mark `curve-${key}`. */
export interface CurvePiece {
  readonly key: string;
  readonly points: readonly CurvePoint[];
  readonly series: Series;
  readonly outside: boolean;
}

/** A curve's pieces in drawing order: the two dotted extensions, then the part inside the set. */
export function curvePieces(curve: Curve): CurvePiece[] {
  const { series } = curve;
  return [
    { key: `${series.key}-outside-below`, points: curve.left, series, outside: true },
    { key: `${series.key}-outside-above`, points: curve.right, series, outside: true },
    { key: `${series.key}-inside`, points: curve.inside, series, outside: false },
  ];
}

/** The curves of `series` over the x domain, and the y domain that holds all that is drawn of them. */
export function chartCurves(
  s: Solution,
  bounds: IdentifiedBounds,
  landmarks: Landmarks,
  domain: readonly [number, number],
  series: readonly Series[],
  y: YQuantity,
): { curves: Curve[]; yDomain: [number, number] } {
  const summary: MomentSummary = summaryOfMoments(s.weight, s.moments);
  const market = marketMoments(summary);
  const { min, max } = bounds.lowBeta;

  // Curves: inside the set at `insidePoints` evenly spaced b_low (exact structures at the ends), and
  // the extensions from each end of the set to the edge of the x domain.
  const inside = insideStructures(summary, market, bounds, landmarks);
  const left = lineStructures(summary, market, min, domain[0], landmarks.highNoiseFree);
  const right = lineStructures(summary, market, max, domain[1], landmarks.lowNoiseFree);
  const insideValues = series.flatMap((ser) => inside.map(ser.value).filter((v): v is number => v !== null));
  const limits = extensionLimits(y, insideValues, summary);
  const curves = series.map((ser) => ({
    series: ser,
    inside: points(inside, ser.value),
    left: truncated(points(left, ser.value), limits),
    right: truncated(points(right, ser.value), limits),
  }));
  const drawn = curves.flatMap((c) => [...c.inside, ...c.left, ...c.right]).map((p) => p.value);
  const yDomain: [number, number] =
    y === "variance" ? [Math.min(0, ...drawn), Math.max(0, ...drawn)] : [Math.min(0, ...drawn), Math.max(1, ...drawn)];
  if (!(yDomain[1] > yDomain[0])) yDomain[1] = yDomain[0] + 1;
  return { curves, yDomain };
}

/** The grid markers' data: a symbol at each candidate of the report's grid, on each curve. */
export function gridMarkerValues(series: readonly Series[], grid: readonly Candidate[]): object[] {
  return series.flatMap((ser) =>
    grid.flatMap((c) => {
      const v = ser.value(c);
      return v === null ? [] : [{ b: c.lowBeta, value: v, shape: ser.marker, colour: ser.colour }];
    }),
  );
}

/**
 * The x domain: the set, the return-implied point, any interval and the low betas in `more` (the sets
 * under correlated noise), padded, inside 0 < b_low < 1/w.
 */
export function xDomain(
  min: number,
  max: number,
  weight: number,
  landmarks: Landmarks,
  uncertainty: IdentifiedSetUncertainty,
  more: readonly number[] = [],
): [number, number] {
  const xs = [min, max, ...more];
  if (landmarks.returnImplied !== null) xs.push(landmarks.returnImplied.lowBeta);
  const intervals = [uncertainty.lowBetaInterval, uncertainty.boundIntervals?.min, uncertainty.boundIntervals?.max].filter(
    (i): i is BetaInterval => i !== undefined,
  );
  for (const i of intervals) xs.push(i.lower, i.upper);
  const finite = xs.filter((x) => Number.isFinite(x));
  const lo = Math.min(...finite);
  const hi = Math.max(...finite);
  const pad = hi > lo ? 0.14 * (hi - lo) : Math.max(0.02 * Math.abs(lo), 1e-6);
  const ceiling = 1 / weight;
  return [Math.max(lo - pad, lo / 2), Math.min(hi + pad, (hi + ceiling) / 2)];
}

/** `insidePoints` structures evenly spaced over the set, b_high interpolated like the core's grid. */
function insideStructures(m: MomentSummary, market: MarketMoments, bounds: IdentifiedBounds, landmarks: Landmarks): Candidate[] {
  const { lowBeta, highBeta } = bounds;
  const out: Candidate[] = [landmarks.highNoiseFree];
  for (let k = 1; k < insidePoints - 1; k++) {
    const f = k / (insidePoints - 1);
    out.push(structureAt(lowBeta.min + (lowBeta.max - lowBeta.min) * f, m, market, highBeta.max + (highBeta.min - highBeta.max) * f));
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
function extensionLimits(y: YQuantity, insideValues: readonly number[], m: MomentSummary): [number, number] {
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
export function curveLabels(curves: readonly { series: Series; inside: readonly CurvePoint[] }[]): object[] {
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
