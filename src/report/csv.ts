/**
 * The candidate grid and the landmarks as CSV (RFC 4180 quoting, LF line endings): one row per
 * structure, the first column `point` naming it (`grid-1` .. `grid-N`, then the landmark names).
 * Numbers are written so that they parse back to the identical double (String(x), and "-0" for
 * negative zero); a null is an empty field; booleans are `true` / `false`.
 */

import { landmarkNames, type Candidate, type Landmarks } from "../core/types.js";
import type { RenderOptions, SolveReport } from "./types.js";

type Cell = number | boolean | null;

/** The data columns, named as the JSON candidate fields (impliedCapm.* flattened to impliedCapm*). */
export const candidateColumns: readonly (readonly [name: string, value: (c: Candidate) => Cell])[] = [
  ["lowBeta", (c) => c.lowBeta],
  ["highBeta", (c) => c.highBeta],
  ["factorVariance", (c) => c.factorVariance],
  ["lowNoiseVariance", (c) => c.lowNoiseVariance],
  ["highNoiseVariance", (c) => c.highNoiseVariance],
  ["noiseShare", (c) => c.noiseShare],
  ["lowFactorRSquared", (c) => c.lowFactorRSquared],
  ["highFactorRSquared", (c) => c.highFactorRSquared],
  ["impliedCapmLowBeta", (c) => c.impliedCapm.lowBeta],
  ["impliedCapmHighBeta", (c) => c.impliedCapm.highBeta],
  ["impliedCapmLowResidualVariance", (c) => c.impliedCapm.lowResidualVariance],
  ["impliedCapmHighResidualVariance", (c) => c.impliedCapm.highResidualVariance],
  ["expectedLowAlpha", (c) => c.expectedLowAlpha],
  ["expectedHighAlpha", (c) => c.expectedHighAlpha],
  ["impliedLowSharpe", (c) => c.impliedLowSharpe],
  ["impliedHighSharpe", (c) => c.impliedHighSharpe],
  ["insideSet", (c) => c.insideSet],
];

/** The header row's names, `point` first. */
export const csvHeader: readonly string[] = ["point", ...candidateColumns.map(([name]) => name)];

/** A number in the shortest form that parses back to the same double, keeping the sign of zero. */
export function exactNumber(x: number): string {
  if (!Number.isFinite(x)) throw new RangeError(`renderCsv: non-finite number ${x}`);
  return Object.is(x, -0) ? "-0" : String(x);
}

/** Quotes a field when RFC 4180 requires it (comma, double quote, CR or LF), doubling inner quotes. */
export function csvField(text: string): string {
  return /[",\r\n]/.test(text) ? `"${text.replaceAll('"', '""')}"` : text;
}

/**
 * A text cell that came from outside (a file, column or series name): one that a spreadsheet would
 * run as a formula (it begins with =, +, -, @, a tab or a carriage return) gets a leading apostrophe
 * and quotes, as the OWASP guidance on CSV injection advises; then RFC 4180 quoting. Numbers are never
 * passed here: they are written as they are.
 */
export function csvText(text: string): string {
  return /^[=+\-@\t\r]/.test(text) ? `"'${text.replaceAll('"', '""')}"` : csvField(text);
}

function cellText(value: Cell): string {
  if (value === null) return "";
  return typeof value === "boolean" ? String(value) : exactNumber(value);
}

/** One CSV line (without the line end) for a named candidate, in the order of `csvHeader`. */
export function candidateRow(point: string, candidate: Candidate): string {
  return [csvText(point), ...candidateColumns.map(([, value]) => csvField(cellText(value(candidate))))].join(",");
}

/** A CSV table of named candidates: the header, then one row per (point, candidate). */
export function candidateCsv(rows: readonly (readonly [point: string, candidate: Candidate])[]): string {
  const lines = [csvHeader.map(csvField).join(","), ...rows.map(([point, candidate]) => candidateRow(point, candidate))];
  return `${lines.join("\n")}\n`;
}

/** The grid rows (`grid-1` ... `grid-N`) followed by the landmark rows that exist, by landmark name. */
export function namedCandidates(grid: readonly Candidate[], landmarks: Landmarks | null): [string, Candidate][] {
  const rows: [string, Candidate][] = grid.map((candidate, i) => [`grid-${i + 1}`, candidate]);
  if (landmarks !== null) {
    for (const name of landmarkNames) {
      const candidate = landmarks[name];
      if (candidate !== null) rows.push([name, candidate]);
    }
  }
  return rows;
}

/**
 * Renders the grid and the landmarks as CSV. With no identified set (the model is rejected) the
 * output is the header alone. A landmark the core did not compute (returnImplied null) has no row.
 * `options` is accepted for a uniform renderer signature; CSV is never coloured.
 */
export function renderCsv(report: SolveReport, _options: RenderOptions): string {
  const { bounds, grid, landmarks } = report.solution;
  return candidateCsv(bounds === null ? [] : namedCandidates(grid, landmarks));
}
