/**
 * What a report renders: the core's solution plus a description of where the numbers came from.
 * Renderers are pure functions of this value; they never read files, the clock or the terminal.
 */

import type { Uncertainty } from "../core/inference/uncertaintyTypes.js";
import type { NoiseSensitivity } from "../core/models/correlatedNoise.js";
import type { FactorModel } from "../core/models/factorModel.js";
import type { IndexSolution } from "../core/models/indexSolve.js";
import type { Solution } from "../core/types.js";
import type { InputWarningDiagnostic } from "../input/index.js";
import type { PricingJson } from "../schema/pricing.js";
import type { SolveOutputJson } from "../schema/solveOutput.js";

export { type ReportFormat, reportFormats } from "./formats.js";

/** Where the numbers came from, as the JSON output's `input` block describes it (its type is the schema's). */
export type InputDescription = SolveOutputJson["input"];

/** How the risk-free return was supplied. */
export type RiskFreeSource = InputDescription["riskFree"];

/** When low and high came from two files joined on date: each side's file, column and dates, and the match. */
export type JoinDescription = NonNullable<InputDescription["join"]>;

export interface SolveReport {
  readonly tool: { readonly name: "betabound"; readonly version: string };
  readonly input: InputDescription;
  readonly solution: Solution;
  /** Standard errors and intervals; null when not computed (--no-uncertainty, or too few observations). */
  readonly uncertainty: Uncertainty | null;
  /** Can noise explain the alpha? (methods §30); null when there is no set. */
  readonly pricing: PricingJson | null;
  /** The model with an independent index (--index); null when not asked for. */
  readonly index: IndexReport | null;
  /** The identified set under each assumed noise correlation (--noise-correlation); null when not asked for. */
  readonly sensitivity: SensitivityReport | null;
  /** The one-factor model on k portfolios (--portfolios); null when not asked for. */
  readonly factorModel: FactorModel | null;
  /** Warnings from reading the file(s), listed first among the report's diagnostics. */
  readonly inputWarnings: readonly InputWarningDiagnostic[];
}

/** The model with an independent index, and the column it was read from. */
export type IndexReport = IndexSolution & { readonly column: string };

/** One entry per assumed noise correlation, in the order asked. */
export type SensitivityReport = readonly NoiseSensitivity[];

/** Rendering switches that depend on where the output goes (decided by the CLI). */
export interface RenderOptions {
  /** ANSI colour for headings and warnings; only when writing to a terminal without NO_COLOR. */
  readonly colour: boolean;
  /** The text report's title, summary and caution alone (solve --brief); other formats ignore it. */
  readonly brief?: boolean;
}
