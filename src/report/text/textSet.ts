/**
 * Text report sections about the identified set: its ranges, the landmarks, the candidate grid and
 * the check that every candidate reproduces the observed CAPM regressions. Each returns its lines.
 */

import { landmarkNames, type Candidate, type IdentifiedBounds, type LandmarkName, type Landmarks } from "../../core/types.js";
import { largestCapmDiscrepancy, type CapmCheckInput } from "../check.js";
import { landmarkWords } from "../conventions.js";
import { formatNumber, notAvailable, tableDigits } from "../format.js";
import { fields, indent, printable, table, wrap, type Style } from "../layout.js";

/** Plain-language descriptions of the landmarks, for a reader who has never seen the tool. */
export const landmarkDescriptions: Record<LandmarkName, string> = {
  lowNoiseFree: "low book has no noise (the largest low beta in the set)",
  highNoiseFree: "high book has no noise (the smallest low beta in the set)",
  equalNoise: "both books have the same noise variance",
  capmConsistent: "structural betas equal the CAPM betas, so the expected alphas are zero",
  returnImplied: "betas implied by the mean returns if only the factor is priced",
};

/** A discrepancy above this is reported as a failed check rather than as rounding. */
export const reproductionTolerance = 1e-9;

/**
 * The candidate tables' columns: with a known frequency the factor and noise variances as volatilities
 * (square roots, times the square root of the periods per year) and the expected alphas per year, in
 * %; otherwise per-period standard deviations and alphas. A negative variance (a landmark outside
 * the set) shows as minus the root of its magnitude.
 */
export function candidateColumns(periodsPerYear: number | null): {
  readonly header: readonly string[];
  readonly cells: (c: Candidate) => string[];
  readonly note: string;
} {
  const root = (v: number): number => Math.sign(v) * Math.sqrt(Math.abs(v));
  const year = periodsPerYear;
  const vol = (v: number): number => (year === null ? root(v) : 100 * Math.sqrt(year) * root(v));
  const alpha = (a: number): number => (year === null ? a : 100 * year * a);
  const unit = year === null ? "stdev" : "vol";
  const header = [
    "low\nbeta",
    "high\nbeta",
    `factor\n${unit}`,
    `low\nnoise\n${unit}`,
    `high\nnoise\n${unit}`,
    "noise\nshare",
    "exp. low\nalpha",
    "exp. high\nalpha",
  ];
  const cells = (c: Candidate): string[] => [
    formatNumber(c.lowBeta, tableDigits),
    formatNumber(c.highBeta, tableDigits),
    formatNumber(vol(c.factorVariance), tableDigits),
    formatNumber(vol(c.lowNoiseVariance), tableDigits),
    formatNumber(vol(c.highNoiseVariance), tableDigits),
    formatNumber(c.noiseShare, tableDigits),
    formatNumber(alpha(c.expectedLowAlpha), tableDigits),
    formatNumber(alpha(c.expectedHighAlpha), tableDigits),
  ];
  const note =
    year === null
      ? "stdev: standard deviation per period (the square root of the variance); exp. alpha: expected alpha " +
        "per period (the frequency is unknown)."
      : `vol: volatility in % a year (the square root of the variance times sqrt(${year})); exp. alpha: expected ` +
        `alpha in % a year (times ${year}); ${year} periods per year.`;
  return { header, cells, note };
}

/** The Identified set section: the ranges and what they mean. */
export function boundsSection(bounds: IdentifiedBounds, style: Style): string[] {
  const range = (i: { readonly min: number; readonly max: number }): string => `${formatNumber(i.min)} to ${formatNumber(i.max)}`;
  const meaning =
    "Every pair of betas in this range fits the data equally well: the pairs differ only in how " +
    "each book's risk splits between the common factor and its own noise.";
  return [
    style.heading("The identified set"),
    ...fields([
      ["low structural beta", range(bounds.lowBeta)],
      ["high structural beta", range(bounds.highBeta)],
      ["factor variance", range(bounds.factorVariance)],
    ]),
    ...wrap(meaning, indent, indent),
  ];
}

/** What the set sections say instead when the model is rejected. */
export function rejectedSection(reason: string | null, style: Style): string[] {
  const text =
    "None: no one-factor structure fits these data, so no set, landmarks or candidates are shown." +
    (reason === null ? "" : ` Why: ${printable(reason)}.`);
  return [style.heading("The identified set"), ...wrap(text, indent, indent)];
}

/** The Landmarks section: one row per named point, then what each name means. */
export function landmarksSection(landmarks: Landmarks, style: Style, periodsPerYear: number | null = null): string[] {
  const columns = candidateColumns(periodsPerYear);
  const rows = landmarkNames.map((name) => {
    const c = landmarks[name];
    const label = landmarkWords[name];
    return c === null ? [label, ...columns.header.map(() => notAvailable)] : [label, ...columns.cells(c)];
  });
  const width = Math.max(...landmarkNames.map((name) => landmarkWords[name].length));
  const legend = landmarkNames.flatMap((name) => {
    const c = landmarks[name];
    const note = landmarkNote(c);
    return wrap(
      `${landmarkDescriptions[name]}${note}`,
      `${indent}${landmarkWords[name].padEnd(width)}  `,
      " ".repeat(indent.length + width + 2),
    );
  });
  return [
    style.heading("Landmarks"),
    ...table({ header: ["", ...columns.header], rows }),
    ...wrap(columns.note, indent, indent),
    "",
    ...legend,
  ];
}

/** The Candidate grid section and the CAPM reproduction check under it. */
export function gridSection(solution: CapmCheckInput, style: Style, periodsPerYear: number | null = null): string[] {
  const grid = solution.grid;
  const columns = candidateColumns(periodsPerYear);
  const rows = grid.map((c, i) => [String(i + 1), ...columns.cells(c)]);
  const lines = [
    style.heading("Candidate grid"),
    `${indent}${grid.length} structures with the low beta evenly spaced over the set, ends included.`,
    ...table({ header: ["#", ...columns.header], rows }),
    ...wrap(columns.note, indent, indent),
  ];
  const discrepancy = largestCapmDiscrepancy(solution);
  if (discrepancy !== null) {
    const ok = discrepancy <= reproductionTolerance;
    const difference = `largest relative difference across the grid: ${formatNumber(discrepancy, 2)}`;
    const text = ok
      ? `Check: every candidate reproduces the observed CAPM betas and residual variances (${difference}).`
      : `Check FAILED: the candidates do not reproduce the observed CAPM betas and residual variances (${difference}).`;
    lines.push("", ...wrap(text, indent, indent).map((line) => (ok ? line : style.warning(line))));
  }
  return lines;
}

/**
 * What the legend adds to a landmark: why it is missing, or that it lies outside the set by the point
 * estimates (whether significantly is the pricing test's to say, never the estimates').
 */
export function landmarkNote(c: { readonly insideSet: boolean } | null): string {
  if (c === null) return " (not reported: see Diagnostics)";
  return c.insideSet ? "" : " (outside the identified set by the point estimates; the pricing section tests whether significantly)";
}
