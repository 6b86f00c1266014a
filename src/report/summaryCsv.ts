/**
 * `solve --format summary-csv`: one row per (file, pair), from the same JSON documents `--format jsonl`
 * writes: what was read, the set of the low structural beta and its interval, both CAPM betas, both
 * CAPM alphas per period and annualised with their HAC intervals, the pricing verdict and its p-value,
 * and the diagnostic codes. A pair that failed has its status and its error codes, the rest empty.
 * Names from the data are written as text a spreadsheet will not run (csvText).
 */
import type { SolveFailureJson, SolveOutputJson } from "../schema/solveOutput.js";
import { csvField, csvText, exactNumber } from "./csv.js";

type Cell = number | string | null;

type Alpha = NonNullable<SolveOutputJson["pricing"]>["alpha"]["low"];

/** The columns, in order (the alphas for low, then high). */
export const summaryColumns: readonly string[] = [
  "source",
  "low",
  "high",
  "status",
  "n",
  "firstDate",
  "lastDate",
  "lowBetaMin",
  "lowBetaMax",
  "lowBetaLower",
  "lowBetaUpper",
  "capmLowBeta",
  "capmHighBeta",
  ...(["low", "high"] as const).flatMap((book) => [
    `${book}Alpha`,
    `${book}AlphaLower`,
    `${book}AlphaUpper`,
    `${book}AlphaAnnualised`,
    `${book}AlphaAnnualisedLower`,
    `${book}AlphaAnnualisedUpper`,
  ]),
  "verdict",
  "pValue",
  "diagnostics",
];

function alphaCells(observed: number, alpha: Alpha | undefined): Cell[] {
  const year = alpha?.annualised ?? null;
  return [
    observed,
    alpha?.observedLower ?? null,
    alpha?.observedUpper ?? null,
    year?.observed ?? null,
    year?.observedLower ?? null,
    year?.observedUpper ?? null,
  ];
}

function rowOf(document: SolveOutputJson | SolveFailureJson): Cell[] {
  const names = [document.input.source, document.input.lowColumn, document.input.highColumn];
  if (document.status === "failed") {
    const empty = summaryColumns.length - 5;
    return [...names, document.status, ...Array<Cell>(empty).fill(null), document.errors.map((e) => e.code).join(";")];
  }
  const { input, bounds, capm, pricing } = document;
  const interval = document.uncertainty?.lowBeta?.interval ?? null;
  return [
    ...names,
    document.status,
    document.observations,
    input.firstDate,
    input.lastDate,
    bounds?.lowBeta.min ?? null,
    bounds?.lowBeta.max ?? null,
    interval?.lower ?? null,
    interval?.upper ?? null,
    capm.low.beta,
    capm.high.beta,
    ...alphaCells(capm.low.alpha, pricing?.alpha.low),
    ...alphaCells(capm.high.alpha, pricing?.alpha.high),
    pricing?.test?.verdict ?? null,
    pricing?.test?.pValue ?? null,
    document.diagnostics.map((d) => d.code).join(";"),
  ];
}

/** The summary CSV of the documents of a run, one row each, in order. */
export function renderSummaryCsv(documents: readonly (SolveOutputJson | SolveFailureJson)[]): string {
  const lines = [summaryColumns.join(",")];
  for (const document of documents) {
    const cells = rowOf(document);
    // Source, columns and dates come from the data: text a spreadsheet shows rather than runs.
    lines.push(
      cells.map((cell) => (cell === null ? "" : typeof cell === "number" ? csvField(exactNumber(cell)) : csvText(cell))).join(","),
    );
  }
  return `${lines.join("\n")}\n`;
}
