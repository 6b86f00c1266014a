/**
 * The landmark lane above the plot of the identified-set chart: the interval bars nearest the plot,
 * then a row or more of landmarks, each with its symbol and a plain-words label.
 */

import { landmarkWords } from "../../conventions.js";
import { landmarkNames, type Candidate, type LandmarkName, type Landmarks } from "../../../core/types.js";
import { labelNumber, palette, textWidth } from "../common.js";
import { intervalText, levelText } from "./captions.js";
import { labelFontSize, laneGap, laneRowHeight, marginLeft, plotWidth } from "./dimensions.js";
import { placeLaneLabels } from "./laneLabels.js";
import type { IdentifiedSetUncertainty } from "./options.js";

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

export interface Lane {
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
export function laneLayout(landmarks: Landmarks, uncertainty: IdentifiedSetUncertainty, px: (b: number) => number): Lane {
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
    labelBar(
      `${levelText(uncertainty)}intervals for the two ends`,
      `${levelText(uncertainty)}each end`,
      px(bounds.min.lower),
      px(bounds.max.upper),
      y,
    );
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
        `Landmark ${landmarkWords[name]}: ${landmarkLabels[name]}, low structural beta ${labelNumber(c.lowBeta)}, ` +
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
