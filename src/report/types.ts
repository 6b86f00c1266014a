/**
 * What a report renders: the core's solution plus a description of where the numbers came from.
 * Renderers are pure functions of this value; they never read files, the clock or the terminal.
 */

import type { Units } from "../input/options.js";
import type { Uncertainty } from "../core/inference/uncertaintyTypes.js";
import type { Solution } from "../core/types.js";

export { type ReportFormat, reportFormats } from "./formats.js";

/** How the risk-free return was supplied. */
export type RiskFreeSource =
  | { readonly kind: "none" }
  | { readonly kind: "constant"; readonly rate: number }
  | { readonly kind: "column"; readonly column: string };

export interface InputDescription {
  /** File name as given on the command line, or "<stdin>". */
  readonly source: string;
  readonly dateColumn: string;
  readonly lowColumn: string;
  readonly highColumn: string;
  readonly riskFree: RiskFreeSource;
  /** Units of the file's numbers; every reported figure is in decimal units regardless. */
  readonly units: Units;
  readonly firstDate: string;
  readonly lastDate: string;
  /** Data rows in the file, and rows dropped because a used column had a missing value. */
  readonly rowsRead: number;
  readonly rowsDropped: number;
  readonly droppedDates: readonly string[];
  /** Detected (or given) data frequency; null when it could not be told from the dates. */
  readonly frequency: { readonly name: string; readonly periodsPerYear: number } | null;
  /** When low and high came from two files joined on date: each side's file, column and dates, and the match. */
  readonly join: JoinDescription | null;
}

export interface JoinDescription {
  readonly sides: readonly { readonly source: string; readonly column: string; readonly dates: number; readonly unmatched: number }[];
  /** Dates present in both files: the rows used before dropping missing values. */
  readonly matched: number;
}

export interface SolveReport {
  readonly tool: { readonly name: "betabound"; readonly version: string };
  readonly input: InputDescription;
  readonly solution: Solution;
  /** Standard errors and intervals; null when not computed (--no-uncertainty, or too few observations). */
  readonly uncertainty: Uncertainty | null;
}

/** Rendering switches that depend on where the output goes (decided by the CLI). */
export interface RenderOptions {
  /** ANSI colour for headings and warnings; only when writing to a terminal without NO_COLOR. */
  readonly colour: boolean;
}
